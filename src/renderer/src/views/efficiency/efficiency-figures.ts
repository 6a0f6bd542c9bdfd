// The efficiency view's figures, built from the core's map (core/steady-state/efficiency-map.ts via
// core/reports/efficiency-map-grid.ts), the gain of loss-minimising control
// (core/steady-state/min-loss-gain-map.ts) and a loss point (core/steady-state/loss-point.ts): no
// physics here, only arranging for plotly (speed in rpm, efficiency in %, loss in W). Free of plotly's
// runtime, so the figures are checked in node (test/renderer-efficiency.test.ts).
import type { Data, Layout } from 'plotly.js-dist-min';
import type { EfficiencyMap } from '../../../../core/steady-state/efficiency-map';
import type { Envelope } from '../../../../core/steady-state/envelope';
import type { LossPoint } from '../../../../core/steady-state/loss-point';
import type { MinLossGainMap } from '../../../../core/steady-state/min-loss-gain-map';
import type { EfficiencyQuantity } from '../../../../core/reports/efficiency-map-grid';
import { RAD_S_TO_RPM } from '../../../../core/base/units';
import { axis, baseLayout, type CurveColours, type PlotTheme } from '../../components/plot-style';

export interface Figure {
  data: Data[];
  layout: Layout;
}

export const QUANTITY_LABEL: Record<EfficiencyQuantity, string> = { motor: 'motor', inverter: 'inverter', system: 'system (DC link to shaft)' };

/** What the view's map shows: an efficiency, or the loss saved by loss-minimising control (W). */
export type MapQuantity = EfficiencyQuantity | 'lossSaved';
export const LOSS_SAVED_LABEL = 'loss saved by loss-minimising control';

/** The point chosen on the map (clicked), marked on it. */
export interface ChosenMark {
  speed_rpm: number;
  torque_Nm: number;
}

/** Contour levels, %: from CONTOUR_FROM to 100 every CONTOUR_STEP (lower values take the lowest colour). */
export const CONTOUR_FROM = 70;
export const CONTOUR_STEP = 2;

/** The map's quantity as plotly's z (rows = torques, columns = speeds), in %, null outside the envelope. */
export function percentGrid(map: EfficiencyMap, q: EfficiencyQuantity): Array<Array<number | null>> {
  return zGrid(map, map[q], 100);
}

/** Values over a map's grid (index speed * torques + torque) as plotly's z times `scale`, null outside. */
function zGrid(map: { speeds: Float64Array; torques: Float64Array; feasible: Uint8Array }, a: Float64Array, scale: number): Array<Array<number | null>> {
  const nT = map.torques.length;
  const z: Array<Array<number | null>> = [];
  for (let j = 0; j < nT; j++) {
    const row: Array<number | null> = [];
    for (let i = 0; i < map.speeds.length; i++) {
      const k = i * nT + j;
      const v = a[k]!;
      row.push(map.feasible[k] && Number.isFinite(v) ? scale * v : null);
    }
    z.push(row);
  }
  return z;
}

/** The loss saved as plotly's z, W (rows = torques, columns = speeds), null outside the envelope. */
export function lossSavedGrid(gain: MinLossGainMap): Array<Array<number | null>> {
  return zGrid(gain, gain.lossSaved, 1);
}

/** A contour step of 1, 2 or 5 times a power of ten giving about ten levels up to `max` (> 0). */
export function niceStep(max: number): number {
  if (!(max > 0) || !Number.isFinite(max)) return 1;
  const raw = max / 10;
  const p = Math.pow(10, Math.floor(Math.log10(raw)));
  const f = raw / p;
  return (f <= 1 ? 1 : f <= 2 ? 2 : f <= 5 ? 5 : 10) * p;
}

export interface RequirementMark {
  label: string;
  speed_rpm: number;
  torque_Nm: number;
}

type EnvelopeSpec = { motoring: Envelope; generating: Envelope; corner: string };

/** The envelope (motoring and generating), the requirement points and the chosen point, over a map. */
function overlay(env: EnvelopeSpec, reqs: RequirementMark[], t: PlotTheme, col: CurveColours, chosen: ChosenMark | null): Data[] {
  const envColour = env.corner === 'cold' ? col.cold : col.hot;
  const envTrace = (e: Envelope, name: string, show: boolean): Data => ({
    type: 'scatter',
    mode: 'lines',
    x: Array.from(e.speed, (w) => w * RAD_S_TO_RPM),
    y: Array.from(e.torque),
    name,
    legendgroup: 'envelope',
    showlegend: show,
    line: { color: envColour, width: 2.5 },
    // no hover on the boundary: a hover picks the map's point under the pointer, not the nearest envelope point
    hoverinfo: 'skip',
  });
  const data: Data[] = [envTrace(env.motoring, `peak envelope, ${env.corner} magnet`, true), envTrace(env.generating, 'peak envelope, generating', false)];
  if (reqs.length) {
    data.push({
      type: 'scatter',
      mode: 'text+markers',
      x: reqs.map((r) => r.speed_rpm),
      y: reqs.map((r) => r.torque_Nm),
      text: reqs.map((r) => r.label),
      textposition: 'top right',
      textfont: { color: t.ink, size: 11 },
      name: 'requirements',
      marker: { symbol: 'diamond', size: 10, color: t.panel, line: { color: t.ink, width: 2 } },
      hovertemplate: '%{text}<br>%{x:.0f} rpm, %{y:.4g} N·m<extra></extra>',
    });
  }
  if (chosen) {
    data.push({
      type: 'scatter',
      mode: 'markers',
      x: [chosen.speed_rpm],
      y: [chosen.torque_Nm],
      name: 'chosen point',
      marker: { symbol: 'circle-x-open', size: 16, color: t.ink, line: { color: t.ink, width: 2.5 } },
      hoverinfo: 'skip',
    });
  }
  return data;
}

function mapLayout(t: PlotTheme, map: { speeds: Float64Array; torques: Float64Array }): Layout {
  const top = map.speeds[map.speeds.length - 1]! * RAD_S_TO_RPM;
  return baseLayout(t, {
    xaxis: axis(t, 'speed (rpm)', { range: [0, top] }),
    yaxis: axis(t, 'shaft torque (N·m), negative generating', { range: [map.torques[0], map.torques[map.torques.length - 1]] }),
    hovermode: 'closest',
    margin: { l: 70, r: 16, t: 20, b: 48 },
    legend: { orientation: 'h', x: 0, y: -0.14, font: { size: 11 } },
  } as Layout);
}

/** The contour map of one efficiency with the envelope (motoring above, generating below), the requirement points and the chosen point. */
export function efficiencyFigure(map: EfficiencyMap, q: EfficiencyQuantity, env: EnvelopeSpec, reqs: RequirementMark[], t: PlotTheme, col: CurveColours, chosen: ChosenMark | null = null): Figure {
  const data: Data[] = [
    {
      type: 'contour',
      x: Array.from(map.speeds, (w) => w * RAD_S_TO_RPM),
      y: Array.from(map.torques),
      z: percentGrid(map, q),
      name: `${QUANTITY_LABEL[q]} efficiency`,
      zmin: CONTOUR_FROM,
      zmax: 100,
      colorscale: 'Viridis',
      connectgaps: false,
      hoverongaps: false,
      contours: { start: CONTOUR_FROM, end: 100, size: CONTOUR_STEP, coloring: 'heatmap', showlabels: true, labelfont: { size: 10, color: '#ffffff' } },
      line: { width: 0.6, color: 'rgba(255,255,255,0.6)' },
      colorbar: { title: { text: `${q} efficiency, %`, side: 'right' }, ticksuffix: ' %', thickness: 14, outlinewidth: 0, tickfont: { color: t.ink } },
      hovertemplate: `%{x:.0f} rpm, %{y:.4g} N·m<br>${q} efficiency %{z:.2f} %<extra></extra>`,
      showlegend: true,
    } as unknown as Data,
    ...overlay(env, reqs, t, col, chosen),
  ];
  return { data, layout: mapLayout(t, map) };
}

/** The contour map of the loss saved by loss-minimising control over least-current control, W, with the same marks. */
export function lossSavedFigure(gain: MinLossGainMap, env: EnvelopeSpec, reqs: RequirementMark[], t: PlotTheme, col: CurveColours, chosen: ChosenMark | null = null): Figure {
  const z = lossSavedGrid(gain);
  let max = 0;
  for (const row of z) for (const v of row) if (v !== null && v > max) max = v;
  const step = niceStep(max);
  const top = Math.max(step, Math.ceil(max / step) * step);
  const data: Data[] = [
    {
      type: 'contour',
      x: Array.from(gain.speeds, (w) => w * RAD_S_TO_RPM),
      y: Array.from(gain.torques),
      z,
      name: LOSS_SAVED_LABEL,
      zmin: 0,
      zmax: top,
      colorscale: 'Viridis',
      connectgaps: false,
      hoverongaps: false,
      contours: { start: 0, end: top, size: step, coloring: 'heatmap', showlabels: true, labelfont: { size: 10, color: '#ffffff' } },
      line: { width: 0.6, color: 'rgba(255,255,255,0.6)' },
      colorbar: { title: { text: 'loss saved, W', side: 'right' }, ticksuffix: ' W', thickness: 14, outlinewidth: 0, tickfont: { color: t.ink } },
      hovertemplate: '%{x:.0f} rpm, %{y:.4g} N·m<br>loss saved %{z:.3g} W<extra></extra>',
      showlegend: true,
    } as unknown as Data,
    ...overlay(env, reqs, t, col, chosen),
  ];
  return { data, layout: mapLayout(t, gain) };
}

export const LOSS_LABELS = ['copper', 'iron', 'mechanical', 'inverter'] as const;

/**
 * The losses of one operating point as bars, W; with `other` (the same shaft torque and speed under
 * the other rule) both side by side, `pt` first, each named for its rule.
 */
export function lossBarFigure(pt: LossPoint, t: PlotTheme, col: CurveColours, other?: LossPoint): Figure {
  const ys = (p: LossPoint) => [p.losses.copper_W, p.losses.iron_W, p.losses.mechanical_W, p.losses.inverter_W];
  const rule = (p: LossPoint) => (p.control === 'min-loss' ? 'loss-minimising' : 'least current');
  const y = ys(pt);
  const data: Data[] = [
    {
      type: 'bar',
      x: [...LOSS_LABELS],
      y,
      name: other ? rule(pt) : 'loss',
      marker: { color: [col.hot, col.volt, col.load, col.cold] },
      text: y.map((v) => `${v.toFixed(0)} W`),
      textposition: 'outside',
      hovertemplate: '%{x} loss %{y:.4g} W<extra></extra>',
    },
  ];
  if (other) {
    const y2 = ys(other);
    data.push({
      type: 'bar',
      x: [...LOSS_LABELS],
      y: y2,
      name: rule(other),
      marker: { color: t.muted },
      text: y2.map((v) => `${v.toFixed(0)} W`),
      textposition: 'outside',
      hovertemplate: `%{x} loss %{y:.4g} W (${rule(other)})<extra></extra>`,
    });
  }
  return {
    data,
    layout: baseLayout(t, {
      xaxis: axis(t, 'loss'),
      yaxis: axis(t, 'power loss (W)', { rangemode: 'tozero' }),
      showlegend: other !== undefined,
      barmode: 'group',
      legend: { orientation: 'h', x: 0, y: 1.02, yanchor: 'bottom', font: { size: 11 } },
      margin: { l: 64, r: 16, t: other ? 40 : 16, b: 48 },
    } as Layout),
  };
}
