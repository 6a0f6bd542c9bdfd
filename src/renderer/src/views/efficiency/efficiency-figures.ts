// The efficiency view's figures, built from the core's map (core/steady-state/efficiency-map.ts via
// core/reports/efficiency-map-grid.ts) and a loss point (core/steady-state/loss-point.ts): no physics
// here, only arranging for plotly (speed in rpm, efficiency in %). Free of plotly's runtime, so the
// figures are checked in node (test/renderer-efficiency.test.ts).
import type { Data, Layout } from 'plotly.js-dist-min';
import type { EfficiencyMap } from '../../../../core/steady-state/efficiency-map';
import type { Envelope } from '../../../../core/steady-state/envelope';
import type { LossPoint } from '../../../../core/steady-state/loss-point';
import type { EfficiencyQuantity } from '../../../../core/reports/efficiency-map-grid';
import { RAD_S_TO_RPM } from '../../../../core/base/units';
import { axis, baseLayout, type CurveColours, type PlotTheme } from '../../components/plot-style';

export interface Figure {
  data: Data[];
  layout: Layout;
}

export const QUANTITY_LABEL: Record<EfficiencyQuantity, string> = { motor: 'motor', inverter: 'inverter', system: 'system (DC link to shaft)' };

/** Contour levels, %: from CONTOUR_FROM to 100 every CONTOUR_STEP (lower values take the lowest colour). */
export const CONTOUR_FROM = 70;
export const CONTOUR_STEP = 2;

/** The map's quantity as plotly's z (rows = torques, columns = speeds), in %, null outside the envelope. */
export function percentGrid(map: EfficiencyMap, q: EfficiencyQuantity): Array<Array<number | null>> {
  const nT = map.torques.length;
  const z: Array<Array<number | null>> = [];
  for (let j = 0; j < nT; j++) {
    const row: Array<number | null> = [];
    for (let i = 0; i < map.speeds.length; i++) {
      const k = i * nT + j;
      const v = map[q][k]!;
      row.push(map.feasible[k] && Number.isFinite(v) ? 100 * v : null);
    }
    z.push(row);
  }
  return z;
}

export interface RequirementMark {
  label: string;
  speed_rpm: number;
  torque_Nm: number;
}

/** The contour map of one efficiency with the envelope (motoring above, generating below) and the requirement points. */
export function efficiencyFigure(map: EfficiencyMap, q: EfficiencyQuantity, env: { motoring: Envelope; generating: Envelope; corner: string }, reqs: RequirementMark[], t: PlotTheme, col: CurveColours): Figure {
  const rpm = Array.from(map.speeds, (w) => w * RAD_S_TO_RPM);
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
  const data: Data[] = [
    {
      type: 'contour',
      x: rpm,
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
    envTrace(env.motoring, `peak envelope, ${env.corner} magnet`, true),
    envTrace(env.generating, 'peak envelope, generating', false),
  ];
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
  const layout = baseLayout(t, {
    xaxis: axis(t, 'speed (rpm)', { range: [0, rpm[rpm.length - 1]] }),
    yaxis: axis(t, 'shaft torque (N·m), negative generating', { range: [map.torques[0], map.torques[map.torques.length - 1]] }),
    hovermode: 'closest',
    margin: { l: 70, r: 16, t: 20, b: 48 },
    legend: { orientation: 'h', x: 0, y: -0.14, font: { size: 11 } },
  } as Layout);
  return { data, layout };
}

export const LOSS_LABELS = ['copper', 'iron', 'mechanical', 'inverter'] as const;

/** The losses of one operating point as bars, W. */
export function lossBarFigure(pt: LossPoint, t: PlotTheme, col: CurveColours): Figure {
  const y = [pt.losses.copper_W, pt.losses.iron_W, pt.losses.mechanical_W, pt.losses.inverter_W];
  return {
    data: [
      {
        type: 'bar',
        x: [...LOSS_LABELS],
        y,
        name: 'loss',
        marker: { color: [col.hot, col.volt, col.load, col.cold] },
        text: y.map((v) => `${v.toFixed(0)} W`),
        textposition: 'outside',
        hovertemplate: '%{x} loss %{y:.4g} W<extra></extra>',
      },
    ],
    layout: baseLayout(t, {
      xaxis: axis(t, 'loss'),
      yaxis: axis(t, 'power loss (W)', { rangemode: 'tozero' }),
      showlegend: false,
      margin: { l: 64, r: 16, t: 16, b: 48 },
    } as Layout),
  };
}
