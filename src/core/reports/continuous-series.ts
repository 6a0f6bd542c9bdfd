/**
 * The continuous (S1) torque curves (datasheet-parts.ts, datasheetContinuousOf) as chart lines: split
 * into runs bound by the same limit (each later run starting at the last point of the one before, so
 * the line is unbroken), each drawn in that limit's dash, one legend entry per limit. Shared by the
 * datasheet's SVG charts and the app's envelope view.
 */
import type { ContinuousLimit, ContinuousPoint } from '../steady-state/continuous-torque';
import type { DatasheetContinuous } from './datasheet-parts';
import type { ChartSeries } from './svg-chart';

export const CONTINUOUS_LIMIT_NAME: Record<ContinuousLimit, string> = {
  winding: 'winding temperature',
  magnet: 'magnet temperature',
  junction: 'inverter junction temperature',
  current: 'continuous current',
  voltage: 'voltage',
};

/** The legend name of the S1 runs bound by a limit. */
export const continuousName = (l: ContinuousLimit): string => `S1 continuous (thermal): ${CONTINUOUS_LIMIT_NAME[l]} limit`;

/** SVG dash of each limit's runs (solid for the winding). */
export const CONTINUOUS_SVG_DASH: Record<ContinuousLimit, string | undefined> = { winding: undefined, magnet: '6 3', junction: '2 3', current: '10 4', voltage: '8 3 2 3' };

export interface ContinuousRun { limit: ContinuousLimit; k0: number; k1: number }

/** Runs of points bound by the same limit, as index ranges [k0, k1]. */
export function continuousRuns(points: readonly ContinuousPoint[]): ContinuousRun[] {
  const runs: ContinuousRun[] = [];
  for (let k = 0; k < points.length; k++) {
    const l = points[k]!.limitedBy;
    const last = runs[runs.length - 1];
    if (last && last.limit === l) last.k1 = k;
    else runs.push({ limit: l, k0: last ? k - 1 : k, k1: k });
  }
  return runs;
}

/** The S1 curves (motoring, then generating) as chart series of torque (N·m) or shaft power (kW) against speed (rpm). */
export function continuousSeries(c: DatasheetContinuous, quantity: 'torque' | 'power', colour: string): ChartSeries[] {
  const out: ChartSeries[] = [];
  const named = new Set<ContinuousLimit>();
  for (const pts of [c.motoring, c.generating]) {
    for (const run of continuousRuns(pts)) {
      const q = pts.slice(run.k0, run.k1 + 1);
      const dash = CONTINUOUS_SVG_DASH[run.limit];
      out.push({
        name: continuousName(run.limit), colour, width: 2.4, ...(dash !== undefined ? { dash } : {}),
        x: q.map((p) => p.speed_rpm),
        y: q.map((p) => (quantity === 'torque' ? p.torque_Nm : (p.torque_Nm * p.speed_rpm * Math.PI) / 30 / 1000)),
        legend: !named.has(run.limit),
      });
      named.add(run.limit);
    }
  }
  return out;
}
