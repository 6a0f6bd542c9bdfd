// The Duty cycle view's figures, built from the core's duty-cycle result (core/simulation/duty-cycle.ts)
// and the peak envelope (core/steady-state/envelope.ts): no physics here, only arranging for plotly
// (speed in rpm, time in s, temperature in °C, energy in kJ). Free of plotly's runtime, so the figures
// are checked in node (test/renderer-duty-cycle.test.ts).
import type { Data, Layout } from 'plotly.js-dist-min';
import type { DutyCycleResult } from '../../../../core/simulation/duty-cycle';
import type { Envelope } from '../../../../core/steady-state/envelope';
import type { ThermalNetworkSpec } from '../../../../core/machine/thermal-network-spec';
import { OUTSIDE } from '../../../../core/simulation/instant-losses';
import { RAD_S_TO_RPM } from '../../../../core/base/units';
import { axis, baseLayout, type CurveColours, type PlotTheme } from '../../components/plot-style';

export interface Figure {
  data: Data[];
  layout: Layout;
}

/** Most points drawn per trace (a longer cycle is drawn at every n-th instant; its peaks kept). */
export const DRAWN_MAX = 4000;

/** The instants drawn: every one up to DRAWN_MAX, else a stride through them that keeps each stride's extreme of `keep` (and the last instant). */
export function drawnInstants(n: number, keep?: Float64Array): number[] {
  if (n <= DRAWN_MAX) return Array.from({ length: n }, (_, k) => k);
  const stride = Math.ceil(n / DRAWN_MAX);
  const out: number[] = [];
  for (let k0 = 0; k0 < n; k0 += stride) {
    let at = k0;
    if (keep) for (let k = k0; k < Math.min(n, k0 + stride); k++) if (keep[k]! > keep[at]!) at = k;
    out.push(at);
  }
  if (out[out.length - 1] !== n - 1) out.push(n - 1);
  return out;
}

const pick = (a: ArrayLike<number>, idx: readonly number[]): number[] => idx.map((k) => a[k]!);

/**
 * The peak envelope (motoring above, generating below) as one line: rpm and N·m, a gap between the
 * branches; with `reverse` also its reflection through the origin for negative speeds (the machine's
 * limits are the same turning backwards: reverse motoring is (−speed, −torque) of forward motoring).
 */
export function envelopeLine(motoring: Envelope, generating: Envelope, reverse = false): { x: Array<number | null>; y: Array<number | null> } {
  const x: Array<number | null> = [];
  const y: Array<number | null> = [];
  for (const sign of reverse ? [1, -1] : [1]) {
    for (const e of [motoring, generating]) {
      if (x.length) { x.push(null); y.push(null); }
      for (let k = 0; k < e.speed.length; k++) if (e.feasible[k]) { x.push(sign * e.speed[k]! * RAD_S_TO_RPM); y.push(sign * e.torque[k]!); }
    }
  }
  return { x, y };
}

/**
 * The cycle on the torque-speed plane over the hot peak envelope: its instants coloured by time, joined
 * in order by a faint line; the instants outside the envelope (at the temperatures reached) marked.
 * The speed axis holds both quadrants the cycle uses (a negative speed is reversing).
 */
export function cyclePlaneFigure(r: DutyCycleResult, env: { motoring: Envelope; generating: Envelope }, t: PlotTheme, col: CurveColours): Figure {
  const idx = drawnInstants(r.t_s.length);
  const x = pick(r.speed_rpm, idx), y = pick(r.torque_Nm, idx), time = pick(r.t_s, idx);
  let reverse = false;
  for (let k = 0; k < r.speed_rpm.length && !reverse; k++) reverse = r.speed_rpm[k]! < 0;
  const e = envelopeLine(env.motoring, env.generating, reverse);
  const data: Data[] = [
    { type: 'scatter', mode: 'lines', x: e.x, y: e.y, name: 'peak envelope, hot magnet', line: { color: col.hot, width: 2.2 }, hoverinfo: 'skip' },
    { type: 'scatter', mode: 'lines', x, y, name: 'cycle path', line: { color: t.muted, width: 0.8 }, opacity: 0.5, hoverinfo: 'skip', showlegend: false },
    {
      type: 'scatter', mode: 'markers', x, y, name: 'cycle instants (colour: time)',
      marker: { size: 5, color: time, colorscale: 'Viridis', colorbar: { title: { text: 'time, s', side: 'right' }, thickness: 14, outlinewidth: 0, tickfont: { color: t.ink } } },
      text: time.map((s) => s.toFixed(2)),
      hovertemplate: 't %{text} s: %{x:.0f} rpm, %{y:.4g} N·m<extra></extra>',
    } as Data,
  ];
  const out = idx.filter((k) => r.traces.outside[k] !== 0);
  // every instant outside, not only the drawn ones: an instant outside is never hidden by the stride
  const outAll: number[] = [];
  for (let k = 0; k < r.t_s.length; k++) if (r.traces.outside[k] !== 0) outAll.push(k);
  const outIdx = outAll.length <= DRAWN_MAX ? outAll : out;
  if (outIdx.length > 0) {
    data.push({
      type: 'scatter', mode: 'markers', x: pick(r.speed_rpm, outIdx), y: pick(r.torque_Nm, outIdx), name: 'outside the envelope (hot, at the temperatures reached)',
      marker: { symbol: 'x-thin-open', size: 11, color: t.bad, line: { width: 2.5, color: t.bad } },
      text: outIdx.map((k) => `t ${r.t_s[k]!.toFixed(2)} s, ${OUTSIDE[r.traces.outside[k]!]} limit`),
      hovertemplate: '%{text}: %{x:.0f} rpm, %{y:.4g} N·m<extra></extra>',
    });
  }
  return {
    data,
    layout: baseLayout(t, {
      margin: { l: 70, r: 16, t: 16, b: 40 },
      hovermode: 'closest',
      showlegend: true,
      legend: { orientation: 'h', x: 0, y: -0.18, font: { size: 11 } },
      xaxis: axis(t, 'speed, rpm (mechanical)'),
      yaxis: axis(t, 'shaft torque, N·m'),
    }),
  };
}

export type TempTrace = 'winding' | 'stator' | 'magnet' | 'junction';
export const TEMP_NAME: Record<TempTrace, string> = { winding: 'winding', stator: 'stator', magnet: 'magnet', junction: 'inverter junction' };

/** The limits drawn as dashed lines: winding and magnet always, the junction when the inverter is rated. */
export function temperatureLimits(th: ThermalNetworkSpec): Array<{ trace: TempTrace; max_C: number }> {
  const out: Array<{ trace: TempTrace; max_C: number }> = [{ trace: 'winding', max_C: th.windingMax_C }, { trace: 'magnet', max_C: th.magnetMax_C }];
  if (th.junctionToCoolant_K_per_W !== undefined && th.junctionMax_C !== undefined) out.push({ trace: 'junction', max_C: th.junctionMax_C });
  return out;
}

/** The temperature traces of the last repeat against time, with their limits as dashed lines of the same colour and the coolant dotted. */
export function temperatureFigure(r: DutyCycleResult, th: ThermalNetworkSpec, t: PlotTheme, col: CurveColours): Figure {
  const colour: Record<TempTrace, string> = { winding: col.hot, stator: col.hotCont, magnet: col.mtpa, junction: col.cold };
  const series: Record<TempTrace, Float64Array> = { winding: r.traces.winding_C, stator: r.traces.stator_C, magnet: r.magnet_C, junction: r.junction_C };
  const rated = temperatureLimits(th);
  const data: Data[] = [];
  const t0 = r.t_s[0]!, t1 = r.t_s[r.t_s.length - 1]!;
  for (const k of ['winding', 'stator', 'magnet', 'junction'] as const) {
    if (k === 'junction' && !rated.some((l) => l.trace === 'junction')) continue;
    const idx = drawnInstants(r.t_s.length, series[k]);
    data.push({ type: 'scatter', mode: 'lines', x: pick(r.t_s, idx), y: pick(series[k], idx), name: TEMP_NAME[k], line: { color: colour[k], width: 2 }, hovertemplate: `${TEMP_NAME[k]} %{y:.1f} °C at %{x:.2f} s<extra></extra>` });
  }
  for (const l of rated) {
    data.push({ type: 'scatter', mode: 'lines', x: [t0, t1], y: [l.max_C, l.max_C], name: `${TEMP_NAME[l.trace]} limit ${l.max_C} °C`, line: { color: colour[l.trace], width: 1.4, dash: 'dash' }, hovertemplate: `${TEMP_NAME[l.trace]} limit %{y} °C<extra></extra>` });
  }
  data.push({ type: 'scatter', mode: 'lines', x: [t0, t1], y: [th.coolantTemp_C, th.coolantTemp_C], name: `coolant ${th.coolantTemp_C} °C`, line: { color: t.muted, width: 1, dash: 'dot' }, hoverinfo: 'skip' });
  return {
    data,
    layout: baseLayout(t, {
      margin: { l: 64, r: 16, t: 16, b: 40 },
      hovermode: 'closest',
      showlegend: true,
      legend: { orientation: 'h', x: 0, y: -0.18, font: { size: 11 } },
      xaxis: axis(t, 'time in the periodic cycle, s', { range: [t0, t1] }),
      yaxis: axis(t, 'temperature, °C'),
    }),
  };
}

/** The energy balance's bars, kJ per cycle: in from the DC link, out to the shaft, and the losses by kind. */
export const ENERGY_BARS = ['DC link in', 'shaft out', 'copper', 'iron', 'mechanical', 'inverter'] as const;

export function energyValues_kJ(r: DutyCycleResult): number[] {
  const e = r.energies;
  return [e.dcLink_J, e.shaft_J, e.copper_J, e.iron_J, e.mechanical_J, e.inverter_J].map((j) => j / 1000);
}

export function energyFigure(r: DutyCycleResult, t: PlotTheme, col: CurveColours): Figure {
  const y = energyValues_kJ(r);
  return {
    data: [{
      type: 'bar', x: [...ENERGY_BARS], y,
      marker: { color: [t.ink, t.muted, col.hot, col.volt, col.load, col.cold] },
      text: y.map((v) => `${Number(v.toPrecision(3))} kJ`), textposition: 'outside',
      hovertemplate: '%{x}: %{y:.4g} kJ per cycle<extra></extra>',
    }],
    layout: baseLayout(t, {
      margin: { l: 64, r: 16, t: 24, b: 48 },
      showlegend: false,
      xaxis: axis(t, ''),
      yaxis: axis(t, 'energy per cycle, kJ', { rangemode: 'tozero' }),
    }),
  };
}

/** The app's evaluation step for a cycle of `period_s`: about period / 2000, rounded down to 1, 2 or 5 times a power of ten, s. */
export function defaultStep(period_s: number): number {
  const raw = period_s / 2000;
  if (!(raw > 0) || !Number.isFinite(raw)) return 0.01;
  const p = Math.pow(10, Math.floor(Math.log10(raw)));
  const f = raw / p;
  // the factor rounded in the last place, so that 0.06 / 0.01 = 5.999... still rounds to 5
  const g = Math.round(f * 1e9) / 1e9;
  return (g >= 5 ? 5 : g >= 2 ? 2 : 1) * p;
}
