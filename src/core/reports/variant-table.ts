/**
 * The comparison table: one column per variant, one row per figure, grouped (model terms, limits,
 * envelope, sizing, each requirement's verdict hot and cold, efficiency at each requirement point,
 * load steps). Requirement points are matched across variants by their label; a point a variant
 * does not have, and a figure it has no data for (no losses, no scenario, out of reach), is a dash.
 * Cells are text (4 significant digits) so the CLI and the app show the same table.
 */
import type { SizingPoint } from '../steady-state/sizing';
import type { VariantLoadSteps, VariantSteady } from './variant-comparison';
import { RAD_S_TO_RPM } from '../base/units';

export const DASH = '-';

export interface ComparisonRow {
  group: 'model' | 'limits' | 'envelope' | 'sizing' | 'requirements' | 'efficiency' | 'load steps';
  label: string;
  unit: string;
  /** one per variant, in column order; DASH when the variant has no such figure */
  cells: string[];
}

export interface ComparisonTable {
  /** the variants' names, one per column */
  columns: string[];
  rows: ComparisonRow[];
}

/** A number as the table shows it: 4 significant digits, no exponent for ordinary magnitudes; null or non-finite: a dash. */
export function cell(x: number | null | undefined, digits = 4): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return DASH;
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e-3 && a < 1e7) return String(Number(x.toPrecision(digits)));
  return x.toPrecision(digits);
}

/** The requirement labels of every variant, first appearance first (a label repeated in one file: "label (2)"). */
export function requirementKeys(labelsPerVariant: readonly (readonly string[])[]): { keys: string[]; perVariant: string[][] } {
  const keys: string[] = [];
  const perVariant = labelsPerVariant.map((labels) => {
    const count = new Map<string, number>();
    return labels.map((l) => {
      const n = (count.get(l) ?? 0) + 1;
      count.set(l, n);
      const k = n === 1 ? l : `${l} (${n})`;
      if (!keys.includes(k)) keys.push(k);
      return k;
    });
  });
  return { keys, perVariant };
}

/** A sizing point's verdict in a cell: "met, +12.3 A / +4.1 V" (current and voltage headroom) or "NOT met, 5.2 N·m short". */
export function verdictCell(q: SizingPoint | undefined): string {
  if (q === undefined) return DASH;
  if (!q.met) return `NOT met, ${cell(q.torqueShortfall_Nm)} N·m short`;
  const room = (x: number | null, unit: string) => (x === null ? DASH : `${x >= 0 ? '+' : ''}${cell(Math.abs(x) < 1e-9 * Math.max(1, Math.abs(q.currentLimit_A)) ? 0 : x)} ${unit}`);
  return `met, ${room(q.currentHeadroom_A, 'A')} / ${room(q.voltageHeadroom_V, 'V')}`;
}

const rpm = (w: number | null) => (w === null ? null : w * RAD_S_TO_RPM);
const maxOf = (xs: Float64Array) => xs.reduce((a, b) => Math.max(a, b), -Infinity);

/** The table of the steady columns and, when given, their load steps (matched by position). */
export function comparisonTable(steady: readonly VariantSteady[], loads: readonly (VariantLoadSteps | null)[] = []): ComparisonTable {
  const rows: ComparisonRow[] = [];
  const row = (group: ComparisonRow['group'], label: string, unit: string, f: (v: VariantSteady, i: number) => string) => rows.push({ group, label, unit, cells: steady.map(f) });
  const num = (group: ComparisonRow['group'], label: string, unit: string, f: (v: VariantSteady, i: number) => number | null) => row(group, label, unit, (v, i) => cell(f(v, i)));

  num('model', 'pole pairs', '', (v) => v.machine20.polePairs);
  num('model', 'Rs at 20 °C', 'mΩ', (v) => v.machine20.Rs * 1e3);
  num('model', 'Ld', 'mH', (v) => v.machine20.Ld * 1e3);
  num('model', 'Lq', 'mH', (v) => v.machine20.Lq * 1e3);
  num('model', 'psiM at 20 °C', 'mWb', (v) => v.machine20.psiM * 1e3);
  num('model', 'Kt hot', 'N·m/A pk', (v) => v.constantsHot.Kt_Nm_per_Apeak);
  num('model', 'Kt cold', 'N·m/A pk', (v) => v.constantsCold.Kt_Nm_per_Apeak);
  num('model', 'Ke cold', 'V LL rms/krpm', (v) => v.constantsCold.Ke_VLLrms_per_krpm);
  num('model', 'characteristic current hot', 'A pk', (v) => v.constantsHot.characteristicCurrent_A);
  num('model', 'saliency Lq/Ld', '', (v) => v.constantsHot.saliency);

  num('limits', 'DC bus', 'V', (v) => v.limits.Vdc_V);
  num('limits', 'voltage limit', 'V pk', (v) => v.limits.Vmax_V);
  num('limits', 'peak current limit', 'A pk', (v) => v.limits.Imax_A);
  num('limits', 'continuous current limit', 'A pk', (v) => v.limits.Icont_A);

  num('envelope', 'peak torque hot', 'N·m', (v) => v.envelopes.hot.torque[0] ?? null);
  num('envelope', 'peak torque cold', 'N·m', (v) => v.envelopes.cold.torque[0] ?? null);
  num('envelope', 'base speed hot', 'rpm', (v) => rpm(v.envelopes.hot.baseSpeed));
  // unbounded: psiM/Ld inside the current limit, torque at every speed
  row('envelope', 'maximum speed hot', 'rpm', (v) => (v.envelopes.hot.maxSpeed === null ? 'unbounded' : cell(rpm(v.envelopes.hot.maxSpeed))));
  num('envelope', 'maximum power hot', 'kW', (v) => maxOf(v.envelopes.hot.power) / 1e3);

  // none: a point cannot be met at any current (beyond MTPV) or at any bus within the current limit
  const least = (x: number | null) => (x === null ? 'none' : cell(x));
  row('sizing', 'least Imax hot', 'A pk', (v) => least(v.sizing.hot.minImax));
  row('sizing', 'least Imax cold', 'A pk', (v) => least(v.sizing.cold.minImax));
  row('sizing', 'least Vdc hot', 'V', (v) => least(v.sizing.hot.minVdc));
  row('sizing', 'least Vdc cold', 'V', (v) => least(v.sizing.cold.minVdc));

  const { keys, perVariant } = requirementKeys(steady.map((v) => v.sizing.hot.points.map((q) => q.label)));
  const at = <T>(i: number, key: string, xs: readonly T[]): T | undefined => {
    const k = perVariant[i]!.indexOf(key);
    return k < 0 ? undefined : xs[k];
  };
  for (const key of keys) {
    row('requirements', `${key}: hot`, 'headroom', (v, i) => verdictCell(at(i, key, v.sizing.hot.points)));
    row('requirements', `${key}: cold`, 'headroom', (v, i) => verdictCell(at(i, key, v.sizing.cold.points)));
  }
  if (steady.some((v) => v.efficiency !== null)) {
    for (const key of keys) {
      row('efficiency', `${key}: system (motor and inverter)`, '%', (v, i) => {
        const e = v.efficiency === null ? undefined : at(i, key, v.efficiency);
        // out of reach: the shaft torque (the electromagnetic torque less the losses it must also make) is beyond the limits
        return e !== undefined && !e.feasible ? 'out of reach' : cell(e?.system == null ? null : 100 * e.system);
      });
      num('efficiency', `${key}: losses`, 'W', (v, i) => (v.efficiency === null ? null : at(i, key, v.efficiency)?.losses_W ?? null));
    }
  }
  if (loads.some((l) => l?.simulated)) {
    const m = (i: number) => (loads[i]?.simulated ? loads[i]!.metrics : null);
    num('load steps', 'load-step speed dip', 'rpm', (_, i) => m(i)?.loadStepDip_rpm ?? null);
    num('load steps', 'load-step recovery', 'ms', (_, i) => { const r = m(i)?.loadStepRecovery_s; return r == null ? null : r * 1e3; });
    num('load steps', 'settling time 2 %', 'ms', (_, i) => { const r = m(i)?.settlingTime_s; return r == null ? null : r * 1e3; });
    num('load steps', 'speed overshoot', '%', (_, i) => m(i)?.speedOvershoot_pct ?? null);
    num('load steps', 'peak phase current', 'A pk', (_, i) => m(i)?.peakCurrent_A ?? null);
    const nSteps = Math.max(0, ...loads.map((l) => l?.loadSteps.length ?? 0));
    for (let s = 1; s < nSteps; s++) {
      num('load steps', `load step ${s + 1} dip`, 'rpm', (_, i) => loads[i]?.loadSteps[s]?.dip_rpm ?? null);
      num('load steps', `load step ${s + 1} recovery`, 'ms', (_, i) => { const r = loads[i]?.loadSteps[s]?.recovery_s; return r == null ? null : r * 1e3; });
    }
  }
  return { columns: steady.map((v) => v.name), rows };
}
