// Two plots that share the speed axis (torque and power against speed) zoom together: a zoom, pan
// or reset on either one gives a speed range (or a reset), and both layouts take it. Plain data
// functions, tested under Node; the wiring is in EnvelopeView.
import type { Layout } from 'plotly.js-dist-min';

export type SpeedRange = readonly [number, number];

/**
 * What a plotly relayout event means for the shared x axis: a new range, 'reset' (autorange,
 * double-click) or null (the event did not touch x: a y-only zoom, a legend click, a resize).
 */
export function xRangeFromRelayout(ev: Readonly<Record<string, unknown>> | null | undefined): SpeedRange | 'reset' | null {
  if (!ev) return null;
  if (ev['xaxis.autorange'] === true) return 'reset';
  const pair = ev['xaxis.range'];
  let a: unknown = ev['xaxis.range[0]'];
  let b: unknown = ev['xaxis.range[1]'];
  if (Array.isArray(pair) && pair.length === 2) [a, b] = pair;
  if (typeof a !== 'number' || typeof b !== 'number' || !Number.isFinite(a) || !Number.isFinite(b) || a === b) return null;
  return a < b ? [a, b] : [b, a];
}

/** Whether two ranges are the same to a part in 1e9 of their span (a plot echoing what it was given). */
export function sameRange(a: SpeedRange | null, b: SpeedRange | null): boolean {
  if (a === null || b === null) return a === b;
  const tol = 1e-9 * Math.max(Math.abs(a[1] - a[0]), Math.abs(b[1] - b[0]), 1e-300);
  return Math.abs(a[0] - b[0]) <= tol && Math.abs(a[1] - b[1]) <= tol;
}

/**
 * The layout with the shared speed range on its x axis (or as built, for null). `uirevision` keeps
 * what the user changed on other axes (a y zoom) when the plot is redrawn with new data.
 */
export function withXRange(layout: Layout, range: SpeedRange | null): Layout {
  const l = layout as Layout & { xaxis?: Record<string, unknown> };
  const base = { ...l, uirevision: 'speed-axis' } as Layout;
  if (range === null) return base;
  return { ...base, xaxis: { ...(l.xaxis ?? {}), range: [range[0], range[1]], autorange: false } } as Layout;
}
