// The Tolerances view's tables and figures, built from the core's results (core/project/tolerance-corners.ts,
// core/reports/tolerance-statistics.ts): no physics here, only arranging (corners ranked by their least
// relative margin, pass fractions in %, margins in N·m, sensitivities as a heat table). Free of
// plotly's runtime, so they are checked in node (test/renderer-tolerances.test.ts).
import type { Data, Layout } from 'plotly.js-dist-min';
import type { CornersResult } from '../../../../core/project/tolerance-corners';
import type { MonteCarloSummary } from '../../../../core/reports/tolerance-statistics';
import { relativeMargin } from '../../../../core/project/tolerance-evaluate';
import { axis, baseLayout, type CurveColours, type PlotTheme } from '../../components/plot-style';

export interface Figure {
  data: Data[];
  layout: Layout;
}

export interface CornerRow {
  /** the corner's index in the core's result */
  index: number;
  /** the parameters' values, in the order of the result's parameters */
  values: number[];
  met: boolean;
  /** per requirement: met, and the least torque margin (the S1 margin where checked and less), N·m */
  requirements: Array<{ met: boolean; margin_Nm: number }>;
  /** the least margin over the requirements relative to each one's torque asked */
  worstRelative: number;
  /** the corner that binds (least relative margin over every requirement) */
  binding: boolean;
}

/** The corners as table rows, the binding corner first and the rest by their least relative margin (ties in the core's order). */
export function cornerRows(r: CornersResult, torques_Nm: readonly number[]): CornerRow[] {
  const rows = r.corners.map((c, index): CornerRow => ({
    index,
    values: r.parameters.map((p) => c.parameters[p.path]!),
    met: c.met,
    requirements: c.requirements.map((q) => ({ met: q.met, margin_Nm: Math.min(q.margins.torque_Nm, q.margins.s1Torque_Nm ?? Infinity) })),
    worstRelative: Math.min(...c.requirements.map((q, k) => relativeMargin(q, torques_Nm[k]!))),
    binding: index === r.bindingCorner,
  }));
  return rows.sort((a, b) => (a.binding !== b.binding ? (a.binding ? -1 : 1) : a.worstRelative - b.worstRelative || a.index - b.index));
}

export interface PassRow {
  label: string;
  /** % of the samples */
  pct: number;
  /** its standard error, % */
  sePct: number;
  leastMargin_Nm: number;
  meanMargin_Nm: number;
}

/** Pass fraction per requirement and overall ('every point' last), in %. */
export function passRows(s: MonteCarloSummary): PassRow[] {
  const rows = s.requirements.map((q) => ({ label: q.label, pct: 100 * q.fraction, sePct: 100 * q.standardError, leastMargin_Nm: q.margin.min, meanMargin_Nm: q.margin.mean }));
  const least = Math.min(...s.requirements.map((q) => q.margin.min));
  return [...rows, { label: 'every point', pct: 100 * s.allMet.fraction, sePct: 100 * s.allMet.standardError, leastMargin_Nm: least, meanMargin_Nm: NaN }];
}

/** A line under a figure (the bands sampled), kept in its exported image: below the axis titles, left-aligned. */
function captionAnnotation(text: string, t: PlotTheme, yshift: number, xshift = 0): Record<string, unknown> {
  return { text, xref: 'paper', yref: 'paper', x: 0, y: 0, xanchor: 'left', yanchor: 'top', yshift, xshift, align: 'left', showarrow: false, font: { size: 11, color: t.muted } };
}

/** The bands of a run as a caption: "bands: R 0.0342–0.0378 ohm, …" (each parameter without its section). */
export function bandsCaption(params: ReadonlyArray<{ path: string; min: number; max: number; unit: string }>, fmt: (x: number) => string): string {
  return `bands: ${params.map((p) => `${shortPath(p.path)} ${fmt(p.min)}–${fmt(p.max)}${p.unit ? ` ${p.unit}` : ''}`).join(', ')}`;
}

/** Columns of the histogram grid. */
export const HISTOGRAM_COLUMNS = 3;

/**
 * One histogram of the torque margin per requirement, in a grid (each its own axes: the margins of a
 * hill start and of a top-speed point differ by an order of magnitude), bars red left of zero (not
 * met) and a dashed line at zero margin.
 */
export function marginHistogramFigure(s: MonteCarloSummary, t: PlotTheme, c: CurveColours, caption?: string): Figure {
  const n = s.requirements.length;
  const cols = Math.min(HISTOGRAM_COLUMNS, Math.max(1, n));
  const rows = Math.max(1, Math.ceil(n / cols));
  const data: Data[] = [];
  const layout: Record<string, unknown> = baseLayout(t, {
    showlegend: false,
    grid: { rows, columns: cols, pattern: 'independent', xgap: 0.12, ygap: 0.38 },
    margin: { l: 56, r: 16, t: 30, b: caption ? 84 : 44 },
    bargap: 0.04,
  });
  const annotations: Array<Record<string, unknown>> = [];
  const shapes: Array<Record<string, unknown>> = [];
  s.requirements.forEach((q, i) => {
    const sfx = i === 0 ? '' : String(i + 1);
    const h = q.margin.histogram;
    const centres = h.counts.map((_, b) => (h.edges[b]! + h.edges[b + 1]!) / 2);
    const widths = h.counts.map((_, b) => Math.max(h.edges[b + 1]! - h.edges[b]!, 1e-9));
    data.push({
      type: 'bar', x: centres, y: h.counts, width: widths, xaxis: `x${sfx}`, yaxis: `y${sfx}`, name: q.label, showlegend: false,
      marker: { color: centres.map((x) => (x < 0 ? c.hot : c.cold)) },
      hovertemplate: `${q.label}<br>margin %{x:.3g} N·m<br>%{y} samples<extra></extra>`,
    } as Data);
    layout[`xaxis${sfx}`] = axis(t, i >= n - cols ? 'torque margin, N·m' : '', { zeroline: false });
    layout[`yaxis${sfx}`] = axis(t, i % cols === 0 ? 'samples' : '', { rangemode: 'tozero' });
    annotations.push({ text: `<b>${q.label}</b> (${(100 * q.fraction).toFixed(1)} % met)`, xref: `x${sfx} domain`, yref: `y${sfx} domain`, x: 0.5, y: 1.0, yanchor: 'bottom', showarrow: false, font: { size: 11 } });
    if (q.margin.min <= 0 && q.margin.max >= 0) shapes.push({ type: 'line', xref: `x${sfx}`, yref: `y${sfx} domain`, x0: 0, x1: 0, y0: 0, y1: 1, line: { color: t.ink, dash: 'dash', width: 1 } });
  });
  if (caption) annotations.push(captionAnnotation(caption, t, -58));
  layout.annotations = annotations;
  layout.shapes = shapes;
  return { data, layout: layout as Layout };
}

/** A parameter's path without its section (Ke for nameplate.Ke): a file has only one motor form, so the name stays unique. */
export const shortPath = (path: string): string => path.replace(/^(motor|nameplate|inverter|thermal)\./, '');

/** The rank correlations as a matrix: requirements down, parameters across (null where a column is constant). */
export function sensitivityMatrix(s: MonteCarloSummary, paths: readonly string[]): { z: Array<Array<number | null>>; rows: string[]; columns: string[] } {
  return { z: s.requirements.map((q) => paths.map((p) => q.sensitivity[p] ?? null)), rows: s.requirements.map((q) => q.label), columns: [...paths] };
}

/** The sensitivities as a heat table: red where a larger parameter lowers the margin, blue where it raises it, the value written in each cell. */
export function sensitivityFigure(s: MonteCarloSummary, paths: readonly string[], t: PlotTheme, caption?: string): Figure {
  const m = sensitivityMatrix(s, paths);
  const text = m.z.map((row) => row.map((v) => (v === null ? '–' : v.toFixed(2))));
  return {
    data: [{
      type: 'heatmap', z: m.z, x: m.columns.map(shortPath), y: m.rows, zmin: -1, zmax: 1, text, texttemplate: '%{text}', textfont: { size: 12 },
      colorscale: [[0, '#b3261e'], [0.5, t.dark ? '#333333' : '#f5f5f5'], [1, '#0b5cad']],
      colorbar: { title: { text: 'rank<br>correlation' }, thickness: 12 },
      hovertemplate: '%{y} margin against %{x}: %{text}<extra></extra>',
      xgap: 2, ygap: 2,
    } as Data],
    layout: baseLayout(t, {
      margin: { l: 150, r: 16, t: 16, b: caption ? 56 : 40 },
      xaxis: axis(t, '', { showgrid: false, showline: false, ticks: '', side: 'bottom' }) as Layout['xaxis'],
      yaxis: axis(t, '', { showgrid: false, showline: false, ticks: '', autorange: 'reversed' }) as Layout['yaxis'],
      ...(caption ? { annotations: [captionAnnotation(caption, t, -28, -140)] as Layout['annotations'] } : {}),
    }),
  };
}
