// The efficiency map's worker thread in the built command line (out/cli/efficiency-worker.mjs, built
// from this entry by scripts/cli-bundle.mjs): only what the map needs, so that a worker starts in a
// fraction of the whole command line's time (src/cli/efficiency-workers.ts).
import { workerMain } from './efficiency-workers';

workerMain();
