// The layout a plot is exported with (PNG, SVG): the plot's own layout plus a title, the legend
// and the conditions block under it, so that the image reads on its own. Pure: no plotly, no DOM.
import type { Layout } from 'plotly.js-dist-min';

/** Exported image size, px (PNG is drawn at twice this). */
export const EXPORT_SIZE = { width: 1200, height: 900 } as const;

/** A caption line longer than this many characters (at 12 px in a 1200 px image) is wrapped. */
const WRAP = 150;

function wrap(line: string): string[] {
  const out: string[] = [];
  let cur = '';
  for (const w of line.split(' ')) {
    if (cur && (cur + ' ' + w).length > WRAP) {
      out.push(cur);
      cur = w;
    } else cur = cur ? `${cur} ${w}` : w;
  }
  if (cur) out.push(cur);
  return out;
}

const escapeText = (s: string): string => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

/**
 * @param layout the plot's current layout (not changed)
 * @param title what the figure shows, e.g. "Servo axis: torque against speed"
 * @param conditions lines from figureConditions (project, bus, temperatures, limits, date, version)
 */
export function exportLayout(layout: Partial<Layout>, title: string, conditions: string[], size: { width: number; height: number } = EXPORT_SIZE): Partial<Layout> {
  const lines = conditions.flatMap(wrap);
  const top = 64;
  // below the plot: tick labels and axis title (~56 px), the legend (up to 3 rows, ~66 px), the conditions (17 px a line)
  const bottom = 56 + 66 + 17 * lines.length + 16;
  const plotBottom = size.height - bottom;
  const annotations = [
    ...((layout.annotations as unknown[] | undefined) ?? []),
    {
      xref: 'paper',
      yref: 'paper',
      x: 0,
      y: 0,
      xanchor: 'left',
      yanchor: 'top',
      yshift: -(56 + 66),
      align: 'left',
      showarrow: false,
      font: { size: 12 },
      text: lines.map(escapeText).join('<br>'),
    },
  ];
  return {
    ...layout,
    width: size.width,
    height: size.height,
    title: { text: escapeText(title), x: 0.01, xanchor: 'left', y: 1 - 20 / size.height, yanchor: 'top', yref: 'container', font: { size: 18 } } as Layout['title'],
    margin: { ...(layout.margin ?? {}), t: top, b: bottom, l: Math.max(70, (layout.margin as { l?: number } | undefined)?.l ?? 0), r: 24 },
    showlegend: true,
    legend: { ...(layout.legend ?? {}), orientation: 'h', x: 0, xanchor: 'left', y: 1 - (plotBottom + 56) / size.height, yanchor: 'top', yref: 'container', font: { size: 12 } } as Layout['legend'],
    annotations: annotations as Layout['annotations'],
  };
}
