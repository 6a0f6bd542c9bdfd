import type { Command } from '../command';
import { InputError } from '../../core/base/errors';
import { fmt, table } from '../table';
import { toleranceCorners } from '../../core/project/tolerance-corners';
import type { ResolvedProject } from '../../core/project/project';
import { terminalProgress } from '../terminal-progress';

/** The file's tolerances section, or an InputError saying how to give one. */
export function requireTolerances(p: ResolvedProject, command: string): void {
  if (p.file.tolerances === undefined) {
    throw new InputError('tolerances', `is required by ${command}: give bands by parameter path, e.g. "tolerances": { "inverter.Vdc": { "min": 300, "max": 400 }, "inverter.Imax": { "minus_pct": 5, "plus_pct": 5 } }`);
  }
}

/** Progress on a terminal: `corners: k of n (p %)` on standard error (terminal-progress.ts). */
export function cornersProgress(err: { isTTY?: boolean; write(s: string): unknown } = process.stderr): { onCorner?: (done: number, total: number) => void; end(): void } {
  const p = terminalProgress('corners', err);
  return p.onStep ? { onCorner: p.onStep, end: p.end } : { end: p.end };
}

const values = (x: Record<string, number>): string => Object.entries(x).map(([k, v]) => `${k} ${fmt(v)}`).join(', ') || 'nominal';

export const cornersCommand: Command = {
  name: 'corners',
  summary: 'worst case over the tolerance bands: every corner sized hot and cold, the binding corner, least Imax and Vdc over all corners',
  usage: 'corners <project.json> [--json]',
  flags: {},
  run(p) {
    requireTolerances(p, 'corners');
    const t0 = performance.now();
    const progress = cornersProgress();
    let r;
    try {
      r = toleranceCorners(p.file, progress.onCorner ? { onCorner: progress.onCorner } : {});
    } finally {
      progress.end();
    }
    const wall_s = (performance.now() - t0) / 1e3;
    const json = {
      minImax_A: r.minImax_A,
      minVdc_V: r.minVdc_V,
      allMet: r.allMet,
      plan: r.plan,
      parameters: r.parameters.map((q) => ({ path: q.path, nominal: q.nominal, min: q.min, max: q.max, unit: q.unit })),
      bindingCorner: r.bindingCorner,
      requirements: r.requirements,
      corners: r.corners,
      wall_s,
    };
    const b = r.corners[r.bindingCorner]!;
    const rows = r.requirements.map((q, k) => [q.label, q.metAtEveryCorner ? 'yes' : 'NO', `${r.corners.filter((c) => c.requirements[k]!.met).length} of ${r.corners.length}`, q.worstMargin_Nm, values(r.corners[q.bindingCorner]!.parameters)]);
    const lines = [
      `${p.name}: ${r.corners.length} corner${r.corners.length === 1 ? '' : 's'} of ${r.parameters.length} toleranced parameter${r.parameters.length === 1 ? '' : 's'} (${r.plan === 'every-combination' ? 'every combination of the band ends' : 'one at a time, and all at the lower and all at the upper ends'}), each sized hot and cold`,
      ...r.parameters.map((q) => `  ${q.path}: ${fmt(q.min)} to ${fmt(q.max)}${q.unit ? ` ${q.unit}` : ''} (nominal ${fmt(q.nominal)})`),
      '',
      ...table(['point', 'met at every corner', 'corners met', 'worst torque margin N·m', 'at the corner'], rows),
      '',
      `binding corner: ${values(b.parameters)}${b.met ? ' (every point met there)' : ' (a point is NOT met there)'}`,
      `least Imax meeting every point at every corner: ${r.minImax_A === null ? 'none (a point lies beyond MTPV at some corner)' : `${fmt(r.minImax_A)} A pk`}`,
      `least Vdc meeting every point at every corner: ${r.minVdc_V === null ? 'none (at some corner a point needs more than its current limit at any bus)' : `${fmt(r.minVdc_V)} V`}`,
      `computed in ${fmt(wall_s * 1e3)} ms`,
    ];
    return { json, lines };
  },
};
