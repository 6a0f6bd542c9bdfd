/**
 * `npm run bench`: speed figures as ratios against baselines computed in the same run.
 * Each section is a module with a name and a run(); add a section by adding it to the list.
 */
import { envelopeBench } from './envelope';
import { simulateBench } from './simulate';

export interface BenchSection {
  name: string;
  run: () => void | Promise<void>;
}

const sections: BenchSection[] = [envelopeBench, simulateBench];

for (const s of sections) {
  console.log(`\n== ${s.name} ==`);
  await s.run();
}
