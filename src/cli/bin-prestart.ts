// Imported first by the process's entry (src/cli/bin.ts), so that in the bundle this runs before the
// rest of the command line is evaluated: an efficiency command's workers start now (src/cli/map-prestart.ts),
// and a tolerance-sample command's (src/cli/tolerance-prestart.ts).
import { isMainThread } from 'node:worker_threads';
import { prestartMapWorkers } from './map-prestart';
import { prestartToleranceWorkers } from './tolerance-prestart';

if (isMainThread) {
  prestartMapWorkers(process.argv.slice(2));
  prestartToleranceWorkers(process.argv.slice(2));
}
