// The tolerance-sample worker when the command line runs from its TypeScript sources (the tests, tsx):
// the command line's entry loaded through tsx, which then serves the worker's task (see bin.ts).
// The bundled command line needs no such file: its worker is the bundle itself.
import { tsImport } from 'tsx/esm/api';

await tsImport('./bin.ts', import.meta.url);
