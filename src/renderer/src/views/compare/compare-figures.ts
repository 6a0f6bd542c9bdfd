// The comparison's figure: the peak-current motoring envelopes of every variant overlaid, one colour per
// variant, hot corner solid and cold corner dashed, on one speed range; each variant's requirement
// points as markers of its colour. Free of plotly's runtime (types only).
import type { Data, Layout } from 'plotly.js-dist-min';
import type { VariantSteady } from '../../../../core/reports/variant-comparison';
import { RAD_S_TO_RPM } from '../../../../core/base/units';
import { axis, baseLayout, type PlotTheme } from '../../components/plot-style';

/** One colour per variant, distinct on both themes (cycled beyond eight). */
export const VARIANT_COLOURS = {
  light: ['#b3261e', '#0b5cad', '#2e7d32', '#8d6e00', '#6a3d9a', '#c51b7d', '#00695c', '#555555'],
  dark: ['#ff7b72', '#79c0ff', '#7ee787', '#f2cc60', '#d2a8ff', '#ff8ccf', '#4dd0b1', '#bbbbbb'],
} as const;

export const variantColour = (i: number, dark: boolean): string => {
  const list = dark ? VARIANT_COLOURS.dark : VARIANT_COLOURS.light;
  return list[i % list.length]!;
};

/** Torque against speed: each variant's envelopes hot (solid) and cold (dashed), and its requirement points. */
export function compareEnvelopeFigure(steady: readonly VariantSteady[], t: PlotTheme): { data: Data[]; layout: Layout } {
  const data: Data[] = [];
  steady.forEach((v, i) => {
    const colour = variantColour(i, t.dark);
    for (const corner of ['hot', 'cold'] as const) {
      const e = v.envelopes[corner];
      data.push({
        type: 'scatter', mode: 'lines', name: `${v.name}, ${corner}`, legendgroup: v.name,
        x: Array.from(e.speed, (w) => w * RAD_S_TO_RPM), y: Array.from(e.torque),
        line: { color: colour, width: corner === 'hot' ? 2.2 : 1.6, dash: corner === 'hot' ? 'solid' : 'dash' },
        hovertemplate: `${v.name}, ${corner}<br>%{x:.0f} rpm, %{y:.1f} N·m<extra></extra>`,
      } as Data);
    }
    const reqs = v.sizing.hot.points;
    if (reqs.length > 0) {
      data.push({
        type: 'scatter', mode: 'markers', name: `${v.name}, requirements`, legendgroup: v.name, showlegend: false,
        x: reqs.map((q) => q.speed_rpm), y: reqs.map((q) => q.torque_Nm), text: reqs.map((q) => q.label),
        marker: { color: colour, size: 8, symbol: 'x', line: { width: 1 } },
        hovertemplate: `${v.name}: %{text}<br>%{x:.0f} rpm, %{y:.1f} N·m<extra></extra>`,
      } as Data);
    }
  });
  const layout = baseLayout(t, {
    xaxis: axis(t, 'speed, rpm', { rangemode: 'tozero' }),
    yaxis: axis(t, 'torque, N·m (peak current, motoring)', { rangemode: 'tozero' }),
    margin: { l: 64, r: 16, t: 16, b: 80 },
    legend: { orientation: 'h', x: 0, y: -0.18, font: { size: 11 } },
  } as Layout);
  return { data, layout };
}
