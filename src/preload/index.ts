// The sandboxed preload: exposes exactly the TorquewiseBridge as window.torquewise, nothing else
// (no ipcRenderer, no Node API).
import { contextBridge, ipcRenderer } from 'electron';
import { createBridge } from './bridge';

contextBridge.exposeInMainWorld('torquewise', createBridge(ipcRenderer));
