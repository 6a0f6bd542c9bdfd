// The command line's lean worker thread (out/cli/efficiency-worker.mjs, built from this entry by
// scripts/cli-bundle.mjs): only what the efficiency map and the tolerance samples need, so that a
// worker starts in a fraction of the whole command line's time (src/cli/efficiency-workers.ts,
// src/cli/tolerance-workers.ts); workerData names the task.
import { workerMain } from './efficiency-workers';
import { isToleranceWorker, toleranceWorkerMain } from './tolerance-workers';

if (isToleranceWorker()) toleranceWorkerMain();
else workerMain();
