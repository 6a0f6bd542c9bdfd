/**
 * `npm run bench`: speed figures as ratios against baselines computed in the same run.
 * Each section is a module with a name and a run(); add a section by adding it to the list.
 * `--against DIR` times this tree's envelope and simulation against another checkout (see against-checkout.ts);
 * with `--same-demos` both run that checkout's demo files (like for like).
 * `--only WORD` runs only the sections whose name contains WORD (e.g. `npm run bench -- --only simulation`).
 */
import { envelopeBench } from './envelope';
import { fluxMapEnvelopeBench } from './flux-map-envelope';
import { simulateBench, simulateMapBench } from './simulate';
import { switchingBench } from './switching';
import { cliStartBench } from './cli-start';
import { efficiencyMapBench } from './efficiency-map';
import { cliEfficiencyThreadsBench } from './cli-efficiency-threads';
import { dutyCycleBench } from './duty-cycle';
import { againstCheckout } from './against-checkout';
import { continuousTorqueBench, peakDurationBench } from './continuous-torque';
import { toleranceSampleBench } from './tolerance-sample';
import { sensorlessBench } from './sensorless';
import { angleSourcesBench } from './angle-sources';

export interface BenchSection {
  name: string;
  run: () => void | Promise<void>;
}

const sections: BenchSection[] = [envelopeBench, fluxMapEnvelopeBench, simulateBench, simulateMapBench, switchingBench, cliStartBench, efficiencyMapBench, cliEfficiencyThreadsBench, continuousTorqueBench, peakDurationBench, dutyCycleBench, toleranceSampleBench, sensorlessBench, angleSourcesBench];

const argv = process.argv.slice(2);
const onlyAt = argv.indexOf('--only');
const only = onlyAt >= 0 ? (argv[onlyAt + 1] ?? '').toLowerCase() : '';
const againstAt = argv.indexOf('--against');
const against = againstAt >= 0 ? argv[againstAt + 1] : undefined;
const chosen = against ? [againstCheckout(against, only, argv.includes('--same-demos'))] : only ? sections.filter((s) => s.name.toLowerCase().includes(only)) : sections;
if (chosen.length === 0) console.log(`no bench section matches "${only}": ${sections.map((s) => s.name).join('; ')}`);

for (const s of chosen) {
  console.log(`\n== ${s.name} ==`);
  await s.run();
}
