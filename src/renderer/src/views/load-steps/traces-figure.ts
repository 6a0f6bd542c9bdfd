// The Load steps view's stacked traces on one time axis, pure (plotly's types only, testable in node):
// speed (true, and the controller's estimate when the angle source is not ideal) against its
// reference, the speed error, the angle error in electrical degrees (a measured or estimated angle
// only), torque, dq currents, the voltage's share of its limit, the phase currents; voltage
// saturation and the current limit shaded.
import type { Data, Layout } from 'plotly.js-dist-min';
import { axis, baseLayout, type PlotTheme } from '../../components/plot-style';
import { speedError, speedErrorRange } from '../../components/trace-scales';
import { num } from '../../components/format';
import type { SimDone } from '../../state/simulation-run';
import { angleErrorRange, degrees } from './angle-figures';

/** Colours of the traces: distinct within each plot and never one colour for two quantities. */
const TRACE = {
  light: { ref: '#555555', speed: '#0b5cad', estimate: '#8c510a', angle: '#222222', error: '#00796b', torque: '#6a3d9a', load: '#8d6e00', id: '#e65100', iq: '#00838f', volt: '#c51b7d', a: '#b3261e', b: '#558b2f', c: '#283593' },
  dark: { ref: '#bbbbbb', speed: '#79c0ff', estimate: '#e3b87f', angle: '#e6e6e6', error: '#4dd0c4', torque: '#d2a8ff', load: '#f2cc60', id: '#ffa657', iq: '#56d4dd', volt: '#ff8ccf', a: '#ff7b72', b: '#aed581', c: '#9fa8ff' },
} as const;

const GAP = 0.03;
const domainOf = (rows: number, i: number): [number, number] => {
  const h = (1 - GAP * (rows - 1)) / rows;
  const top = 1 - i * (h + GAP);
  return [Math.max(0, top - h), top];
};

type Row = { key: string; legend: string; title: string };
const ROW_SPEED: Row = { key: 'speed', legend: 'speed, rpm', title: 'speed, rpm' };
const ROW_ERROR: Row = { key: 'error', legend: 'speed error, rpm', title: 'error, rpm' };
const ROW_ANGLE: Row = { key: 'angle', legend: 'angle error, ° electrical', title: 'angle error, ° el.' };
const ROW_REST: Row[] = [
  { key: 'torque', legend: 'torque, N·m', title: 'torque, N·m' },
  { key: 'dq', legend: 'dq currents, A peak', title: 'id, iq, A peak' },
  { key: 'volt', legend: 'voltage', title: '|v| / Vmax' },
  { key: 'phase', legend: 'phase currents, A peak', title: 'ia, ib, ic, A' },
];

/** The rows of the figure, top down: the angle-error row only when the run has the trace. */
export function traceRows(r: Pick<SimDone, 'traces'>): Row[] {
  return [ROW_SPEED, ROW_ERROR, ...(r.traces.thetaError_rad ? [ROW_ANGLE] : []), ...ROW_REST];
}

/**
 * The figure: `handover_rpm` the sensorless start-up's hand-over speed (a dotted line on the speed
 * row), when there is one.
 */
export function tracesFigure(r: SimDone, theme: 'light' | 'dark', t: PlotTheme, handover_rpm: number | null = null): { data: Data[]; layout: Layout } {
  const col = TRACE[theme];
  const tr = r.traces;
  const x = tr.t_s;
  const rows = traceRows(r);
  const at = (key: string) => rows.findIndex((w) => w.key === key);
  const data: Data[] = [];
  const line = (y: Float64Array | undefined, name: string, key: string, colour: string, dash = 'solid', width = 1.6, digits = '.4g') => {
    if (!y) return;
    const row = at(key);
    data.push({
      type: 'scatter',
      mode: 'lines',
      x,
      y,
      name,
      xaxis: 'x',
      yaxis: row === 0 ? 'y' : `y${row + 1}`,
      line: { color: colour, width, dash },
      legendgroup: `row${row}`,
      legendgrouptitle: { text: rows[row]!.legend },
      hovertemplate: `${name}: %{y:${digits}}<extra>%{x:.4f} s</extra>`,
    } as Data);
  };
  const est = tr.speedEstimate_rpm;
  line(tr.speedRef_rpm, 'reference', 'speed', col.ref, 'dash', 1.4, '.0f');
  line(tr.speed_rpm, est ? 'speed (true)' : 'speed', 'speed', col.speed, 'solid', 2, '.1f');
  // the controller's estimate over the true speed: thinner, in its own colour, dotted so the true one shows through
  line(est, 'speed, estimated', 'speed', col.estimate, 'dot', 1.6, '.1f');
  if (tr.speedRef_rpm && tr.speed_rpm) line(speedError(tr.speedRef_rpm, tr.speed_rpm), 'reference − speed', 'error', col.error, 'solid', 1.6, '.2f');
  const angleDeg = tr.thetaError_rad ? degrees(tr.thetaError_rad) : null;
  if (angleDeg) line(angleDeg, 'estimated − true angle', 'angle', col.angle, 'solid', 1.3, '.3f');
  line(tr.torque_Nm, 'motor torque', 'torque', col.torque, 'solid', 1.6, '.3g');
  line(tr.loadTorque_Nm, 'load torque', 'torque', col.load, 'dash', 1.6, '.3g');
  line(tr.idRef_A, 'id reference', 'dq', col.id, 'dot', 1.3, '.3g');
  line(tr.iqRef_A, 'iq reference', 'dq', col.iq, 'dot', 1.3, '.3g');
  line(tr.id_A, 'id', 'dq', col.id, 'solid', 1.6, '.3g');
  line(tr.iq_A, 'iq', 'dq', col.iq, 'solid', 1.6, '.3g');
  line(tr.vNorm, '|v| / Vmax', 'volt', col.volt, 'solid', 1.6, '.3f');
  line(tr.ia_A, 'ia', 'phase', col.a, 'solid', 1.1, '.3g');
  line(tr.ib_A, 'ib', 'phase', col.b, 'solid', 1.1, '.3g');
  line(tr.ic_A, 'ic', 'phase', col.c, 'solid', 1.1, '.3g');
  const zoom = speedErrorRange(r.loadSteps);
  // the error row is zoomed to the load dips: its legend group says so
  if (zoom) for (const d of data as Array<{ legendgroup?: string; legendgrouptitle?: { text: string } }>) if (d.legendgroup === `row${at('error')}`) d.legendgrouptitle = { text: 'speed error (zoomed), rpm' };
  const n = rows.length;
  const layout: Record<string, unknown> = baseLayout(t, {
    margin: { l: 84, r: est ? 170 : 150, t: 10, b: 44 },
    hovermode: 'x',
    legend: { orientation: 'v', x: 1.01, y: 1, font: { size: 11 }, tracegroupgap: 14, groupclick: 'toggleitem' },
    xaxis: axis(t, 'time, s', { anchor: `y${n}`, range: [x[0], x[x.length - 1]] }),
  } as Layout);
  for (let i = 0; i < n; i++) {
    const extra: Record<string, unknown> = { domain: domainOf(n, i) };
    const k = rows[i]!.key;
    if (k === 'volt') extra.range = [0, 1.15];
    if (k === 'error' && zoom) extra.range = zoom;
    if (k === 'angle' && angleDeg) extra.range = angleErrorRange(angleDeg);
    layout[i === 0 ? 'yaxis' : `yaxis${i + 1}`] = axis(t, rows[i]!.title, extra);
  }
  // the x axis ticks appear once at the bottom; every row shares it
  const fill = theme === 'dark' ? 'rgba(255,179,64,0.16)' : 'rgba(224,138,0,0.16)';
  const fillI = theme === 'dark' ? 'rgba(255,123,114,0.13)' : 'rgba(179,38,30,0.10)';
  const shapes: Record<string, unknown>[] = [];
  const annotations: Record<string, unknown>[] = [];
  const end = x[x.length - 1] ?? 0;
  for (const e of r.events) {
    if (e.kind !== 'voltage-saturation' && e.kind !== 'current-limit') continue;
    shapes.push({ type: 'rect', xref: 'x', yref: 'paper', x0: e.t_s, x1: e.tEnd_s ?? end, y0: 0, y1: 1, fillcolor: e.kind === 'voltage-saturation' ? fill : fillI, line: { width: 0 }, layer: 'below' });
  }
  if (handover_rpm !== null && est) {
    // the sensorless start-up runs open loop below the hand-over speed: the line says where the observer takes over
    shapes.push({ type: 'line', xref: 'paper', yref: 'y', x0: 0, x1: 1, y0: handover_rpm, y1: handover_rpm, line: { color: col.estimate, width: 1, dash: 'dot' } });
    annotations.push({ xref: 'paper', yref: 'y', x: 0.995, y: handover_rpm, xanchor: 'right', yanchor: 'bottom', showarrow: false, text: `sensorless hand-over ${num(handover_rpm)} rpm`, font: { size: 10, color: col.estimate } });
  }
  layout.shapes = shapes;
  if (annotations.length) layout.annotations = annotations;
  return { data, layout: layout as Layout };
}

/** The figure's height, px: 110 per row. */
export const tracesHeight = (r: Pick<SimDone, 'traces'>): number => 110 * traceRows(r).length;
