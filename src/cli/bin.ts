#!/usr/bin/env node
// The command line's process entry (the built `torquewise` bin): run main on argv, set the exit code;
// started as a worker thread of the efficiency map (src/cli/efficiency-workers.ts), serve its rows;
// of a tolerance study's Monte Carlo run (src/cli/tolerance-workers.ts), its samples.
// First of all, an efficiency command's workers are started (src/cli/bin-prestart.ts).
import './bin-prestart';
import { runProcess } from './index';
import { isMapWorker, workerMain } from './efficiency-workers';
import { isToleranceWorker, toleranceWorkerMain } from './tolerance-workers';

if (isMapWorker()) workerMain();
else if (isToleranceWorker()) toleranceWorkerMain();
else runProcess();
