/**
 * A small SVG line chart as text (no DOM): title, axes with round ticks and labelled units, lines
 * (NaN breaks a line), point markers with labels kept apart, a legend and a caption of conditions.
 * Every text from a file is escaped. The SVG scales with its container (viewBox, width 100%).
 */
import { roundTicks } from '../mathematics/round-steps';

export interface ChartSeries {
  name: string;
  colour: string;
  /** SVG stroke-dasharray, e.g. "6 4"; solid when absent */
  dash?: string;
  width?: number;
  x: readonly number[];
  y: readonly number[];
  /** shown in the legend (default true) */
  legend?: boolean;
}

export interface ChartMarker {
  x: number;
  y: number;
  shape: 'circle' | 'cross' | 'dot';
  colour: string;
  label?: string;
  /** where the label goes relative to the point (default right) */
  side?: 'left' | 'right' | 'above' | 'below';
}

export interface ChartText {
  x: number;
  y: number;
  text: string;
  colour: string;
}

export interface ChartSpec {
  title: string;
  xLabel: string;
  yLabel: string;
  series: ChartSeries[];
  markers?: ChartMarker[];
  /** free text at data coordinates, centred there (e.g. the level of a contour line), over the lines */
  texts?: ChartText[];
  /** legend-only entries for the markers, e.g. requirement met / not met */
  markerLegend?: Array<{ name: string; shape: ChartMarker['shape']; colour: string }>;
  /** lines printed under the legend (conditions), wrapped to the width */
  caption?: string[];
  /** the x axis starts here (default: the data's least value) */
  xMin?: number;
  /** viewBox width in px (default 720) */
  width?: number;
  /** plot-area height in px (default 300) */
  plotHeight?: number;
  /** value of the data-testid attribute */
  testId?: string;
}

export const DEFAULT_CHART = { width: 720, plotHeight: 300 } as const;

/** Text for XML/HTML content and attribute values. */
export function escapeXml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

/** A rough width of a text in a sans-serif face, px (for layout only). */
export const textWidth = (s: string, size: number): number => s.length * size * 0.56;

/** A line broken into pieces of at most `max` characters, at ' · ' first, then at spaces. */
export function wrapText(line: string, max: number): string[] {
  if (line.length <= max) return [line];
  const out: string[] = [];
  let cur = '';
  for (const word of line.split(' ')) {
    const next = cur ? `${cur} ${word}` : word;
    if (next.length > max && cur) {
      out.push(cur);
      cur = word;
    } else cur = next;
  }
  if (cur) out.push(cur);
  return out;
}

/** Tick text: no float noise (0.30000000000000004 -> 0.3). */
const tick = (v: number, step: number): string => {
  const d = Math.max(0, -Math.floor(Math.log10(step)));
  const s = v.toFixed(d);
  return s === '-0' ? '0' : s;
};

const f = (x: number): string => (Math.round(x * 10) / 10).toString();

interface Box { x0: number; y0: number; x1: number; y1: number }
const overlaps = (a: Box, b: Box): boolean => a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1;

function markerSvg(m: { shape: ChartMarker['shape']; colour: string }, x: number, y: number): string {
  const c = escapeXml(m.colour);
  if (m.shape === 'cross') return `<path d="M${f(x - 5)} ${f(y - 5)}L${f(x + 5)} ${f(y + 5)}M${f(x - 5)} ${f(y + 5)}L${f(x + 5)} ${f(y - 5)}" stroke="${c}" stroke-width="2.4" fill="none"/>`;
  if (m.shape === 'dot') return `<circle cx="${f(x)}" cy="${f(y)}" r="3" fill="${c}"/>`;
  return `<circle cx="${f(x)}" cy="${f(y)}" r="5" fill="${c}" stroke="#ffffff" stroke-width="1.5"/>`;
}

export function svgChart(spec: ChartSpec): string {
  const W = spec.width ?? DEFAULT_CHART.width;
  const PH = spec.plotHeight ?? DEFAULT_CHART.plotHeight;
  const L = 66, R = 18;
  const PW = W - L - R;
  // a long title wraps (15 px type) and pushes the plot down
  const titleLines = wrapText(spec.title, Math.floor((W - 2 * 12) / (15 * 0.64)));
  const T = 40 + 19 * (titleLines.length - 1);
  let xlo = Infinity, xhi = -Infinity, ylo = Infinity, yhi = -Infinity;
  const take = (x: number, y: number) => {
    if (!Number.isFinite(x) || !Number.isFinite(y)) return;
    xlo = Math.min(xlo, x); xhi = Math.max(xhi, x); ylo = Math.min(ylo, y); yhi = Math.max(yhi, y);
  };
  for (const s of spec.series) for (let k = 0; k < Math.min(s.x.length, s.y.length); k++) take(s.x[k]!, s.y[k]!);
  for (const m of spec.markers ?? []) take(m.x, m.y);
  if (spec.xMin !== undefined) xlo = Math.min(xlo, spec.xMin);
  if (!Number.isFinite(xlo)) { xlo = 0; xhi = 1; ylo = 0; yhi = 1; }
  const pad = 0.04 * (yhi - ylo || 1);
  const xt = roundTicks(xlo, xhi, 8);
  const yt = roundTicks(ylo - (ylo < 0 ? pad : 0), yhi + (yhi > 0 ? pad : 0), 7);
  const X = (v: number) => L + ((v - xt.min) / (xt.max - xt.min)) * PW;
  const Y = (v: number) => T + PH - ((v - yt.min) / (yt.max - yt.min)) * PH;
  const parts: string[] = [];
  // one clip path per chart: two charts in one page must not share an id
  const clip = `clip-${(spec.testId ?? spec.title).replace(/[^A-Za-z0-9-]/g, '').slice(0, 40) || 'chart'}`;
  const ink = '#1d1d1f', muted = '#5a5a60', grid = '#d9d9de';
  // grid and ticks
  for (const v of xt.ticks) {
    const x = X(v);
    parts.push(`<line x1="${f(x)}" y1="${T}" x2="${f(x)}" y2="${T + PH}" stroke="${grid}" stroke-width="1"/>`);
    parts.push(`<text x="${f(x)}" y="${T + PH + 16}" text-anchor="middle" font-size="11" fill="${muted}">${tick(v, xt.step)}</text>`);
  }
  for (const v of yt.ticks) {
    const y = Y(v);
    parts.push(`<line x1="${L}" y1="${f(y)}" x2="${L + PW}" y2="${f(y)}" stroke="${v === 0 ? '#8a8a90' : grid}" stroke-width="${v === 0 ? 1.2 : 1}"/>`);
    parts.push(`<text x="${L - 6}" y="${f(y + 4)}" text-anchor="end" font-size="11" fill="${muted}">${tick(v, yt.step)}</text>`);
  }
  parts.push(`<rect x="${L}" y="${T}" width="${PW}" height="${PH}" fill="none" stroke="${muted}" stroke-width="1"/>`);
  parts.push(`<text x="${f(L + PW / 2)}" y="${T + PH + 34}" text-anchor="middle" font-size="12" fill="${ink}">${escapeXml(spec.xLabel)}</text>`);
  parts.push(`<text transform="translate(16 ${f(T + PH / 2)}) rotate(-90)" text-anchor="middle" font-size="12" fill="${ink}">${escapeXml(spec.yLabel)}</text>`);
  titleLines.forEach((t, i) => parts.push(`<text x="12" y="${22 + 19 * i}" font-size="15" font-weight="600" fill="${ink}">${escapeXml(t)}</text>`));
  // lines, clipped to the plot area
  parts.push(`<g clip-path="url(#${clip})" fill="none" stroke-linejoin="round" stroke-linecap="round">`);
  for (const s of spec.series) {
    let d = '';
    let pen = false;
    for (let k = 0; k < Math.min(s.x.length, s.y.length); k++) {
      const x = s.x[k]!, y = s.y[k]!;
      if (!Number.isFinite(x) || !Number.isFinite(y)) { pen = false; continue; }
      d += `${pen ? 'L' : 'M'}${f(X(x))} ${f(Y(y))}`;
      pen = true;
    }
    if (d) parts.push(`<path d="${d}" stroke="${escapeXml(s.colour)}" stroke-width="${s.width ?? 2}"${s.dash ? ` stroke-dasharray="${escapeXml(s.dash)}"` : ''}/>`);
  }
  parts.push('</g>');
  // free texts, on a white halo that parts the line beneath
  for (const t of spec.texts ?? []) {
    if (!Number.isFinite(t.x) || !Number.isFinite(t.y)) continue;
    parts.push(`<text x="${f(X(t.x))}" y="${f(Y(t.y) + 3.5)}" text-anchor="middle" font-size="10" fill="${escapeXml(t.colour)}" stroke="#ffffff" stroke-width="3" paint-order="stroke">${escapeXml(t.text)}</text>`);
  }
  // markers and their labels; a label that would cover another is moved down a line (a few tries)
  const placed: Box[] = [];
  for (const m of spec.markers ?? []) {
    const x = X(m.x), y = Y(m.y);
    parts.push(markerSvg(m, x, y));
    if (!m.label) continue;
    const w = textWidth(m.label, 11);
    // candidates: the preferred side, the others, then each a line further out; the first that
    // stays inside the plot and covers no placed label wins (else the preferred one)
    const pref = m.side ?? 'right';
    const sides = [pref, ...(['right', 'left', 'above', 'below'] as const).filter((q) => q !== pref)];
    const at = (side: string, shift: number): Box => {
      const x0 = side === 'right' ? x + 8 : side === 'left' ? x - 8 - w : x - w / 2;
      const base = side === 'above' ? y - 8 - shift : side === 'below' ? y + 16 + shift : y + 4 + (shift ? (shift / 12) % 2 ? -shift : shift : 0);
      return { x0, y0: base - 10, x1: x0 + w, y1: base + 2 };
    };
    const inside = (b: Box) => b.x0 >= L + 1 && b.x1 <= L + PW - 1 && b.y0 >= T + 1 && b.y1 <= T + PH - 1;
    let box = at(pref, 0);
    search: for (const shift of [0, 12, 24]) {
      for (const side of sides) {
        const b = at(side, shift);
        if (inside(b) && !placed.some((q) => overlaps(q, b))) { box = b; break search; }
      }
    }
    const lx = Math.max(L + 2, Math.min(L + PW - w - 2, box.x0));
    const ly = Math.max(T + 11, Math.min(T + PH - 3, box.y1 - 2));
    placed.push({ x0: lx, y0: ly - 10, x1: lx + w, y1: ly + 2 });
    parts.push(`<text x="${f(lx)}" y="${f(ly)}" font-size="11" fill="${escapeXml(m.colour)}" stroke="#ffffff" stroke-width="3" paint-order="stroke">${escapeXml(m.label)}</text>`);
  }
  // legend: entries flow in rows across the width
  let ly = T + PH + 58;
  let lx = L;
  const entries: Array<{ name: string; draw: (x: number, y: number) => string }> = [];
  for (const s of spec.series) {
    if (s.legend === false) continue;
    entries.push({ name: s.name, draw: (x, y) => `<line x1="${x}" y1="${y - 4}" x2="${x + 24}" y2="${y - 4}" stroke="${escapeXml(s.colour)}" stroke-width="${s.width ?? 2}"${s.dash ? ` stroke-dasharray="${escapeXml(s.dash)}"` : ''}/>` });
  }
  for (const m of spec.markerLegend ?? []) entries.push({ name: m.name, draw: (x, y) => markerSvg(m, x + 12, y - 4) });
  for (const e of entries) {
    const w = 30 + textWidth(e.name, 11) + 16;
    if (lx + w > W - R && lx > L) { lx = L; ly += 17; }
    parts.push(e.draw(lx, ly));
    parts.push(`<text x="${f(lx + 30)}" y="${ly}" font-size="11" fill="${ink}">${escapeXml(e.name)}</text>`);
    lx += w;
  }
  // caption: the conditions, wrapped
  let cy = ly + (entries.length ? 22 : 4);
  const maxChars = Math.floor((W - 2 * 8) / (10.5 * 0.56));
  for (const line of spec.caption ?? []) {
    for (const piece of wrapText(line, maxChars)) {
      parts.push(`<text x="8" y="${cy}" font-size="10.5" fill="${muted}">${escapeXml(piece)}</text>`);
      cy += 14;
    }
  }
  const H = Math.ceil(cy + 4);
  const test = spec.testId ? ` data-testid="${escapeXml(spec.testId)}"` : '';
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${W} ${H}" width="100%" preserveAspectRatio="xMidYMid meet" role="img" aria-label="${escapeXml(spec.title)}"${test} font-family="system-ui, 'Segoe UI', Roboto, Arial, sans-serif">` +
    `<defs><clipPath id="${clip}"><rect x="${L}" y="${T}" width="${PW}" height="${PH}"/></clipPath></defs>` +
    `<rect x="0" y="0" width="${W}" height="${H}" fill="#ffffff"/>` +
    parts.join('') +
    '</svg>'
  );
}
