// How every plot looks: the theme read from the CSS variables, the curve colours, the base layout and
// the axis style. Free of plotly's runtime (types only), so figure builders can be tested in node.
import type { Layout } from 'plotly.js-dist-min';

export interface PlotTheme {
  ink: string;
  muted: string;
  line: string;
  panel: string;
  bg: string;
  ok: string;
  bad: string;
  dark: boolean;
}

/** Colours of the curves: chosen for contrast on both themes. */
export const CURVE = {
  light: { hot: '#b3261e', cold: '#0b5cad', hotCont: '#e27a2f', coldCont: '#3aa0a8', mtpa: '#6a3d9a', mtpv: '#c51b7d', volt: '#2e7d32', iq: '#0b5cad', id: '#b3261e', ref: '#555555', a: '#b3261e', b: '#2e7d32', c: '#0b5cad', load: '#8d6e00', s1: '#00695c' },
  dark: { hot: '#ff7b72', cold: '#79c0ff', hotCont: '#ffb36b', coldCont: '#7ee0e6', mtpa: '#d2a8ff', mtpv: '#ff8ccf', volt: '#7ee787', iq: '#79c0ff', id: '#ff7b72', ref: '#bbbbbb', a: '#ff7b72', b: '#7ee787', c: '#79c0ff', load: '#f2cc60', s1: '#4dd0b1' },
} as const;
export type CurveColours = (typeof CURVE)['light'] | (typeof CURVE)['dark'];

export const REGION_FILL = {
  light: { mtpa: 'rgba(11,92,173,0.07)', 'field-weakening': 'rgba(224,138,0,0.10)', mtpv: 'rgba(197,27,125,0.10)' },
  dark: { mtpa: 'rgba(121,192,255,0.07)', 'field-weakening': 'rgba(255,179,64,0.10)', mtpv: 'rgba(255,140,207,0.12)' },
} as const;

export function readTheme(): PlotTheme {
  const s = getComputedStyle(document.documentElement);
  const v = (n: string) => s.getPropertyValue(n).trim();
  return {
    ink: v('--ink'),
    muted: v('--muted'),
    line: v('--line'),
    panel: v('--panel'),
    bg: v('--bg'),
    ok: v('--ok'),
    bad: v('--bad'),
    dark: document.documentElement.dataset.theme === 'dark',
  };
}

/** Base layout for every plot: fonts, grid and colours from the theme. */
export function baseLayout(t: PlotTheme, extra: Layout): Layout {
  return {
    paper_bgcolor: t.panel,
    plot_bgcolor: t.panel,
    font: { family: 'system-ui, Segoe UI, Roboto, Arial, sans-serif', size: 12, color: t.ink },
    margin: { l: 64, r: 16, t: 30, b: 48 },
    legend: { orientation: 'h', x: 0, y: -0.16, font: { size: 11 } },
    hoverlabel: { font: { family: 'ui-monospace, DejaVu Sans Mono, monospace', size: 11 } },
    ...extra,
  };
}

export function axis(t: PlotTheme, title: string, extra: Record<string, unknown> = {}): Record<string, unknown> {
  return {
    title: { text: title, font: { size: 12 } },
    gridcolor: t.dark ? 'rgba(255,255,255,0.12)' : 'rgba(0,0,0,0.12)',
    zerolinecolor: t.dark ? 'rgba(255,255,255,0.45)' : 'rgba(0,0,0,0.45)',
    linecolor: t.muted,
    showline: true,
    mirror: true,
    ticks: 'outside',
    tickcolor: t.muted,
    // no per-label overflow test: each redraw would measure every tick label against the plot's edges
    // (a tenth of a redraw's time); the margins keep the labels inside the plot
    ticklabeloverflow: 'allow',
    ...extra,
  };
}
