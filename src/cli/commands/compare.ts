import type { Command, CommandInput } from '../command';
import type { ResolvedProject } from '../../core/project/project';
import { loadProject } from '../../core/project/project';
import { resolveVariants } from '../../core/project/variant-overrides';
import { compareVariants, type VariantColumn, type VariantInput } from '../../core/reports/variant-comparison';
import { comparisonTable } from '../../core/reports/variant-table';
import { radSToRpm } from '../../core/base/units';
import { InputError } from '../../core/base/errors';
import { inFile } from '../file-refusal';
import { table } from '../table';
import { visible } from '../terminal';

/** The file's name without its folders and its .json: a column's heading (the project's own name is often a sentence). */
const baseName = (path: string): string => path.replace(/^.*[\\/]/, '').replace(/\.json$/i, '') || path;

/** Column names made unique: a repeated name gets " (2)", " (3)". */
function uniqueNames(names: string[]): string[] {
  const seen = new Map<string, number>();
  return names.map((n) => {
    const k = (seen.get(n) ?? 0) + 1;
    seen.set(n, k);
    return k === 1 ? n : `${n} (${k})`;
  });
}

/** Every variant of the command line: each file, then its named variants (named "file / variant" when there are several files). */
export function variantsOfFiles(files: Array<{ path: string; text: string; project?: ResolvedProject }>): Array<VariantInput & { file: string }> {
  const out: Array<VariantInput & { file: string }> = [];
  for (const f of files) {
    const loaded = inFile(f.path, () => loadProject(f.text));
    const p = f.project ?? loaded.resolved;
    const own = baseName(f.path);
    out.push({ name: own, project: p, file: f.path });
    for (const v of inFile(f.path, () => resolveVariants(loaded.file))) out.push({ name: files.length > 1 ? `${own} / ${v.name}` : v.name, project: v.project, file: f.path });
  }
  const names = uniqueNames(out.map((v) => v.name));
  return out.map((v, i) => ({ ...v, name: names[i]! }));
}

/** One variant's JSON object: its figures by the same keys the size and simulate commands use. */
function variantJson(c: VariantColumn, file: string) {
  const env = (e: VariantColumn['envelopes']['hot']) => ({
    peakTorque_Nm: e.torque[0] ?? null,
    baseSpeed_rpm: radSToRpm(e.baseSpeed),
    maxSpeed_rpm: e.maxSpeed === null ? null : radSToRpm(e.maxSpeed),
    maxPower_W: e.power.reduce((a, b) => Math.max(a, b), -Infinity),
    speed_rpm: Array.from(e.speed, radSToRpm),
    torque_Nm: Array.from(e.torque),
  });
  const sizing = (s: VariantColumn['sizing']['hot']) => ({ minImax_A: s.minImax, minVdc_V: s.minVdc, ...(s.minIcont !== undefined ? { minIcont_A: s.minIcont } : {}), points: s.points });
  return {
    name: c.name,
    file,
    projectName: c.projectName,
    model: { polePairs: c.machine20.polePairs, Rs_ohm: c.machine20.Rs, Ld_H: c.machine20.Ld, Lq_H: c.machine20.Lq, psiM_Wb: c.machine20.psiM, constantsHot: c.constantsHot, constantsCold: c.constantsCold },
    limits: c.limits,
    envelope: { hot: env(c.envelopes.hot), cold: env(c.envelopes.cold) },
    sizing: { hot: sizing(c.sizing.hot), cold: sizing(c.sizing.cold) },
    efficiency: c.efficiency,
    loadSteps: c.loadSteps.simulated ? { metrics: c.loadSteps.metrics, steps: c.loadSteps.loadSteps } : null,
  };
}

export const compareCommand: Command = {
  name: 'compare',
  summary: 'design variants side by side: files, or one file\'s named variants (envelopes, sizing, efficiency, load steps)',
  usage: 'compare <project.json> [more.json ...] [--json]',
  flags: {},
  moreFiles: true,
  run(p, _args, input?: CommandInput) {
    const first = { path: input?.projectPath ?? 'project file', text: input?.projectText ?? '', project: p };
    const files = [first, ...(input?.moreFiles ?? [])];
    const variants = variantsOfFiles(files);
    if (variants.length < 2) throw new InputError('variants', `are needed to compare: give a second project file, or a variants section in '${visible(first.path)}' ([{"name": "...", "overrides": {"motor.psiM": 0.07}}])`);
    const columns = compareVariants(variants);
    const t = comparisonTable(columns, columns.map((c) => c.loadSteps));
    const json = { variants: columns.map((c, i) => variantJson(c, variants[i]!.file)), table: t };
    const lines: string[] = [`comparison of ${columns.length} variants (envelopes at the peak current, motoring, over the same speed range; efficiency hot corner, least current)`, ''];
    let group = '';
    const rows: string[][] = [];
    for (const r of t.rows) {
      if (r.group !== group) {
        group = r.group;
        rows.push([`[${group}]`, '', ...t.columns.map(() => '')]);
      }
      rows.push([r.label, r.unit, ...r.cells]);
    }
    lines.push(...table(['', 'unit', ...t.columns], rows));
    lines.push('', 'requirement cells: met with the current headroom / voltage headroom (0 V in field weakening), or the torque short; a dash: the variant has no such point or figure');
    return { json, lines };
  },
};
