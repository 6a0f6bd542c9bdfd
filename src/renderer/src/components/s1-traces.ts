// The continuous (S1) torque curves from the thermal network as torque-speed (and power-speed)
// traces: one trace per run of the same binding limit, its line style naming the limit (one legend
// entry per limit kind), each point's hover text naming the limit and the temperatures reached. No
// physics here: the points come from the core (core/reports/datasheet-parts.ts, datasheetContinuousOf),
// split into runs as the datasheet's charts split them (core/reports/continuous-series.ts).
import type { Data } from 'plotly.js-dist-min';
import type { ContinuousLimit, ContinuousPoint } from '../../../core/steady-state/continuous-torque';
import type { DatasheetContinuous } from '../../../core/reports/datasheet-parts';
import { CONTINUOUS_LIMIT_NAME, continuousName, continuousRuns } from '../../../core/reports/continuous-series';

export const S1_LIMIT_NAME = CONTINUOUS_LIMIT_NAME;

export const S1_DASH: Record<ContinuousLimit, string> = { winding: 'solid', magnet: 'dash', junction: 'dot', current: 'longdash', voltage: 'dashdot' };

/** The legend name of the S1 runs bound by a limit. */
export const s1Name = continuousName;

/** Marks a power trace whose legend entry stays hidden (another run of the same limit carries it). */
export const S1_NO_LEGEND = 's1-no-legend';

/** Runs of points bound by the same limit (the core's rule, shared with the datasheet). */
export const s1Runs = continuousRuns;

const t1 = (x: number): string => (Number.isFinite(x) ? x.toFixed(1) : '–');

/** A point's hover text: direction, binding limit and the temperatures of its steady state. */
export function s1HoverText(q: ContinuousPoint, direction: 'motoring' | 'generating'): string {
  return `S1 ${direction}, limited by ${S1_LIMIT_NAME[q.limitedBy]}<br>winding ${t1(q.windingTemp_C)} °C, magnet ${t1(q.magnetTemp_C)} °C, junction ${t1(q.junctionTemp_C)} °C`;
}

/**
 * The S1 traces (motoring, and generating when asked): torque on the y axis, and with `withPower`
 * also the shaft power, kW, on y2 (those hidden from the legend, marked S1_NO_LEGEND where another
 * power run of the limit carries its entry).
 */
export function s1Traces(s1: DatasheetContinuous, colour: string, generating: boolean, withPower: boolean): Data[] {
  const torque: Data[] = [];
  const power: Data[] = [];
  const named = new Set<ContinuousLimit>();
  const dirs: Array<['motoring' | 'generating', ContinuousPoint[]]> = [['motoring', s1.motoring]];
  if (generating) dirs.push(['generating', s1.generating]);
  for (const [direction, pts] of dirs) {
    for (const run of s1Runs(pts)) {
      const q = pts.slice(run.k0, run.k1 + 1);
      const first = !named.has(run.limit);
      named.add(run.limit);
      const x = q.map((p) => p.speed_rpm);
      const line = { color: colour, width: 2.6, dash: S1_DASH[run.limit] };
      const text = q.map((p) => s1HoverText(p, direction));
      const name = s1Name(run.limit);
      const group = `s1-${run.limit}`;
      torque.push({ type: 'scatter', mode: 'lines', x, y: q.map((p) => p.torque_Nm), name, legendgroup: group, showlegend: first, line, text, hovertemplate: '%{text}<br>%{x:.0f} rpm, %{y:.4g} N·m<extra></extra>' });
      if (withPower) {
        power.push({
          type: 'scatter', mode: 'lines', x, y: q.map((p) => (p.torque_Nm * p.speed_rpm * Math.PI) / 30 / 1000), xaxis: 'x', yaxis: 'y2', name, legendgroup: group, showlegend: false,
          ...(first ? {} : { meta: S1_NO_LEGEND }), line, text, hovertemplate: '%{text}<br>%{x:.0f} rpm, %{y:.4g} kW<extra></extra>',
        } as Data);
      }
    }
  }
  return [...torque, ...power];
}
