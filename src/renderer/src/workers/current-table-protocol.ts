// Messages between the window and the current-table worker: the window sends the project text, the
// grid and control chosen and the date for the header; the worker loads the project as every reader
// does (src/core/project loadProjectText), builds the table a speed row at a time with progress (rows
// done / rows), and answers with the C header, its file name and the summary line, or the reason it
// could not run. Cancel = the window terminates the worker.
import type { CurrentTableChoice } from './current-table-job';

export type CurrentTableRequest = { kind: 'current-table'; projectText: string; choice: CurrentTableChoice; date: string };

export type CurrentTableDone = { header: string; fileName: string; summary: string; compute_ms: number };

export type CurrentTableReply =
  | { kind: 'progress'; fraction: number }
  | ({ kind: 'done' } & CurrentTableDone)
  | { kind: 'error'; message: string };
