// One background run in a Web Worker, as the views start it: progress, a result, an error, cancel
// (the worker is terminated at once). The view makes the worker (its constructor call with the module URL stays
// in the view, where the bundler finds it) and hands it here with the request; the run owns it.
import { useCallback, useEffect, useRef, useState } from 'react';

export type WorkerRunState =
  | { kind: 'idle' }
  | { kind: 'running'; fraction: number; started: number }
  | { kind: 'cancelled' }
  | { kind: 'error'; message: string };

/** What a worker of ours posts: progress, its result (kind 'done'), or a failure in our words. */
export type WorkerReplyOf<Done> = { kind: 'progress'; fraction: number } | ({ kind: 'done' } & Done) | { kind: 'error'; message: string };

export function useWorkerRun<Request, Done>(what: string, onDone: (d: { kind: 'done' } & Done) => void): {
  run: WorkerRunState;
  start: (w: Worker, req: Request) => void;
  cancel: () => void;
} {
  const worker = useRef<Worker | null>(null);
  const [run, setRun] = useState<WorkerRunState>({ kind: 'idle' });
  const done = useRef(onDone);
  done.current = onDone;
  const stop = useCallback(() => {
    worker.current?.terminate();
    worker.current = null;
  }, []);
  useEffect(() => stop, [stop]);

  const start = useCallback((w: Worker, req: Request) => {
    stop();
    worker.current = w;
    setRun({ kind: 'running', fraction: 0, started: performance.now() });
    w.onmessage = (ev: MessageEvent<WorkerReplyOf<Done>>) => {
      const m = ev.data;
      if (m.kind === 'progress') setRun((r) => (r.kind === 'running' ? { ...r, fraction: m.fraction } : r));
      else if (m.kind === 'done') {
        done.current(m);
        setRun({ kind: 'idle' });
        stop();
      } else {
        setRun({ kind: 'error', message: m.message });
        stop();
      }
    };
    w.onerror = (ev) => {
      ev.preventDefault();
      setRun({ kind: 'error', message: `The ${what} worker failed: ${ev.message || 'unknown error'}` });
      stop();
    };
    w.postMessage(req);
  }, [stop, what]);

  const cancel = useCallback(() => {
    stop();
    setRun({ kind: 'cancelled' });
  }, [stop]);

  return { run, start, cancel };
}
