// The flux-map view's figures, built from the core's curves (core/reports/flux-map-curves.ts): no
// physics here, only arranging (and flux in mWb, inductance in mH) for plotly. Free of plotly's
// runtime, so the figures are checked in node (test/renderer-flux-map.test.ts).
import type { Data, Layout } from 'plotly.js-dist-min';
import type { FluxLine, FluxMapCurves } from '../../../../core/reports/flux-map-curves';
import { axis, baseLayout, type CurveColours, type PlotTheme } from '../../components/plot-style';
import { num } from '../../components/format';

export interface Figure {
  data: Data[];
  layout: Layout;
}

export interface FluxMapFigures {
  psid: Figure;
  psiq: Figure;
  inductance: Figure;
  plane: Figure;
}

/** The colours of a family of lines, from no current on the other axis (cool) to the limit (warm). */
export const familyColours = (col: CurveColours): string[] => [col.cold, col.coldCont, col.volt, col.hotCont, col.hot];

/** A current to 3 significant digits, with a typographic minus. */
const rounded = (x: number): string => num(x, 3).replace('-', '−');
const mWb = (v: number[]): number[] => v.map((x) => x * 1e3);
const mH = (v: number[]): number[] => v.map((x) => x * 1e3);

function family(lines: FluxLine[], other: 'iq' | 'id', col: CurveColours): Data[] {
  const colours = familyColours(col);
  return lines.map((l, i) => ({
    type: 'scatter',
    mode: 'lines',
    x: l.current_A,
    y: mWb(l.psi_Wb),
    name: `${other} = ${rounded(l.level_A)} A`,
    line: { color: colours[Math.min(i, colours.length - 1)]!, width: 2 },
    hovertemplate: `${other} = ${rounded(l.level_A)} A<br>%{x:.4g} A, %{y:.4g} mWb<extra></extra>`,
  }));
}

// the legend at the foot of the figure (below the axis title, however many rows it wraps into in a narrow card)
const legendTop = { orientation: 'h' as const, x: 0, xanchor: 'left' as const, y: 0, yanchor: 'bottom' as const, yref: 'container', font: { size: 10 } } as Layout['legend'];

/**
 * The four figures: psi_d against id (one line per iq), psi_q against iq (one line per id), the
 * apparent and incremental inductances along MTPA, and the MTPA trajectory on the (id, iq) plane
 * with the torque contours, the current limit and the map's own grid points (`grid`, when given).
 */
export function fluxMapFigures(c: FluxMapCurves, grid: { id_A: readonly number[]; iq_A: readonly number[] } | null, t: PlotTheme, col: CurveColours): FluxMapFigures {
  const margin = { l: 64, r: 16, t: 16, b: 100 };
  const psid: Figure = {
    data: family(c.psid, 'iq', col),
    layout: baseLayout(t, {
      margin,
      showlegend: true,
      legend: legendTop,
      hovermode: 'closest',
      xaxis: axis(t, 'id, A peak'),
      yaxis: axis(t, 'ψd, mWb peak'),
    }),
  };
  const psiq: Figure = {
    data: family(c.psiq, 'id', col),
    layout: baseLayout(t, {
      margin,
      showlegend: true,
      legend: legendTop,
      hovermode: 'closest',
      xaxis: axis(t, 'iq, A peak', { rangemode: 'tozero' }),
      yaxis: axis(t, 'ψq, mWb peak', { rangemode: 'tozero' }),
    }),
  };

  const L = c.inductance;
  const ind = (y: number[], name: string, color: string, dash: string): Data => ({
    type: 'scatter',
    mode: 'lines',
    x: L.current_A,
    y: mH(y),
    name,
    line: { color, width: 2, dash },
    hovertemplate: `${name}<br>|i| %{x:.4g} A: %{y:.4g} mH<extra></extra>`,
  });
  const inductance: Figure = {
    data: [
      ind(L.LdApparent_H, 'Ld apparent', col.id, 'solid'),
      ind(L.LdIncremental_H, 'Ld incremental', col.id, 'dash'),
      ind(L.LqApparent_H, 'Lq apparent', col.iq, 'solid'),
      ind(L.LqIncremental_H, 'Lq incremental', col.iq, 'dash'),
      ind(L.LdqIncremental_H, 'Ldq incremental (cross)', t.muted, 'dot'),
    ],
    layout: baseLayout(t, {
      margin,
      showlegend: true,
      legend: legendTop,
      hovermode: 'closest',
      xaxis: axis(t, 'current |i| along MTPA, A peak', { rangemode: 'tozero' }),
      yaxis: axis(t, 'inductance, mH', { rangemode: 'tozero' }),
    }),
  };

  const Imax = c.Imax;
  const tq = c.torque;
  const x0 = tq.id_A[0]!, x1 = tq.id_A[tq.id_A.length - 1]!, y1 = tq.iq_A[tq.iq_A.length - 1]!;
  const arc = { x: [] as number[], y: [] as number[] };
  for (let k = 0; k <= 90; k++) {
    const a = Math.PI / 2 + (k / 90) * (Math.PI / 2);
    arc.x.push(Imax * Math.cos(a));
    arc.y.push(Imax * Math.sin(a));
  }
  const plane: Data[] = [
    {
      type: 'contour',
      x: tq.id_A,
      y: tq.iq_A,
      z: tq.torque_Nm,
      name: 'constant torque, N·m',
      showlegend: true,
      showscale: false,
      colorscale: [[0, t.muted], [1, t.muted]],
      contours: { coloring: 'lines', showlabels: true, labelfont: { size: 10, color: t.muted } },
      line: { width: 1, dash: 'dot' },
      hoverinfo: 'skip',
    } as Data,
    { type: 'scatter', mode: 'lines', x: arc.x, y: arc.y, name: `|i| = ${rounded(Imax)} A peak`, line: { color: t.ink, width: 2 }, hoverinfo: 'skip' },
    {
      type: 'scatter',
      mode: 'lines',
      x: c.mtpa.id_A,
      y: c.mtpa.iq_A,
      name: 'MTPA',
      line: { color: col.mtpa, width: 2.5 },
      customdata: c.mtpa.torque_Nm,
      hovertemplate: 'MTPA<br>id %{x:.4g} A, iq %{y:.4g} A: %{customdata:.4g} N·m<extra></extra>',
    },
  ];
  if (grid) {
    const gx: number[] = [];
    const gy: number[] = [];
    for (const id of grid.id_A) for (const iq of grid.iq_A) if (id >= x0 && id <= x1 && iq >= 0 && iq <= y1) {
      gx.push(id);
      gy.push(iq);
    }
    if (gx.length) plane.unshift({ type: 'scatter', mode: 'markers', x: gx, y: gy, name: 'map points', marker: { size: 3, color: t.muted, opacity: 0.6 }, hoverinfo: 'skip' });
  }
  const planeFig: Figure = {
    data: plane,
    layout: baseLayout(t, {
      margin,
      showlegend: true,
      legend: legendTop,
      hovermode: 'closest',
      xaxis: axis(t, 'id, A peak', { range: [x0, x1], autorange: false, constrain: 'domain' }),
      yaxis: axis(t, 'iq, A peak', { range: [0, y1], autorange: false, scaleanchor: 'x', scaleratio: 1, constrain: 'domain' }),
    }),
  };
  return { psid, psiq, inductance, plane: planeFig };
}

/** The readout rows: at zero current and at the peak current along MTPA, inductances in mH. */
export function inductanceRows(c: FluxMapCurves): Array<{ label: string; at0: string; atPeak: string }> {
  const L = c.inductance;
  const k = L.current_A.length - 1;
  const mH = (v: number[], i: number) => num(v[i]! * 1e3, 3);
  return [
    { label: 'Ld apparent', at0: mH(L.LdApparent_H, 0), atPeak: mH(L.LdApparent_H, k) },
    { label: 'Ld incremental', at0: mH(L.LdIncremental_H, 0), atPeak: mH(L.LdIncremental_H, k) },
    { label: 'Lq apparent', at0: mH(L.LqApparent_H, 0), atPeak: mH(L.LqApparent_H, k) },
    { label: 'Lq incremental', at0: mH(L.LqIncremental_H, 0), atPeak: mH(L.LqIncremental_H, k) },
  ];
}
