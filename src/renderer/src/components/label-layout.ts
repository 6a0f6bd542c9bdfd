// Labels that do not sit on each other: estimated boxes in pixels (about 6.5 px a character at 11 px,
// 6 px at 10 px; 15 px a line), a position chosen from candidates, or a label shifted until clear.

export type Box = [number, number, number, number]; // left, top, right, bottom (px, y down)

export const overlaps = (a: Box, b: Box): boolean => a[0] < b[2] && b[0] < a[2] && a[1] < b[3] && b[1] < a[3];

export type TextPosition = 'middle right' | 'middle left' | 'top right' | 'top left' | 'bottom right' | 'bottom left' | 'top center' | 'bottom center';

/** The box of a scatter text label at (px, py) for a plotly textposition. */
export function textBox(px: number, py: number, text: string, pos: TextPosition, charPx = 6.5, lineH = 15, gap = 7): Box {
  const w = text.length * charPx;
  const [v, hz] = pos.split(' ') as [string, string];
  const left = hz === 'right' ? px + gap : hz === 'left' ? px - gap - w : px - w / 2;
  const top = v === 'middle' ? py - lineH / 2 : v === 'top' ? py - gap - lineH : py + gap;
  return [left, top, left + w, top + lineH];
}

/**
 * For each label (in order) the candidate position of least cost: a box over a label already placed
 * (or over a `taken` box) or outside the plot costs most, each `soft` obstacle it covers (points of
 * the drawn curves) a little, and a later candidate a very little (the order is the preference).
 * `boxOf` gives a candidate's box (by default a plotly textposition at the point).
 */
export function chooseTextPositions<C extends object | string = TextPosition>(
  items: Array<{ px: number; py: number; text: string; candidates: C[] }>,
  plot: { width: number; height: number },
  taken: Box[] = [],
  soft: Box[] = [],
  boxOf: (c: C, px: number, py: number, text: string) => Box = (c, px, py, text) => textBox(px, py, text, c as unknown as TextPosition),
): C[] {
  const placed = [...taken];
  return items.map((it) => {
    let pick = it.candidates[0]!;
    let best = Infinity;
    it.candidates.forEach((c, order) => {
      const b = boxOf(c, it.px, it.py, it.text);
      const outside = b[0] < 0 || b[2] > plot.width || b[1] < 0 || b[3] > plot.height;
      let cost = (outside ? 1e4 : 0) + order * 0.01;
      for (const p of placed) if (overlaps(p, b)) cost += 1e3;
      for (const p of soft) if (overlaps(p, b)) cost += 1;
      if (cost < best) {
        best = cost;
        pick = c;
      }
    });
    placed.push(boxOf(pick, it.px, it.py, it.text));
    return pick;
  });
}

/**
 * Vertical shifts (px, plotly's yshift: up is positive) that keep annotations off each other: each in
 * turn moves down, then up, a line at a time, until its box is clear of those before it.
 */
export function declutterShifts(
  items: Array<{ px: number; py: number; text: string; xanchor: 'left' | 'center' | 'right'; yanchor: 'top' | 'middle' | 'bottom'; yshift?: number }>,
  charPx = 6,
  lineH = 14,
): number[] {
  const placed: Box[] = [];
  return items.map((it) => {
    const w = it.text.length * charPx + 4;
    const left = it.xanchor === 'right' ? it.px - w : it.xanchor === 'left' ? it.px : it.px - w / 2;
    const base = it.yshift ?? 0;
    const boxAt = (shift: number): Box => {
      const y = it.py - shift;
      const top = it.yanchor === 'bottom' ? y - lineH : it.yanchor === 'top' ? y : y - lineH / 2;
      return [left, top, left + w, top + lineH];
    };
    let shift = base;
    for (let k = 0; k <= 12; k++) {
      const s = base + (k === 0 ? 0 : (k % 2 === 1 ? -1 : 1) * Math.ceil(k / 2) * (lineH + 1));
      if (!placed.some((p) => overlaps(p, boxAt(s)))) {
        shift = s;
        break;
      }
    }
    placed.push(boxAt(shift));
    return shift;
  });
}
