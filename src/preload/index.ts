import { contextBridge } from 'electron';

contextBridge.exposeInMainWorld('torquewise', { version: 1 });
