// Where the base- and maximum-speed labels of the torque plot sit: each beside its dotted line, on
// the side with room, and never over each other (two labels too close for one row take two rows).

export interface SpeedMark {
  x: number;
  text: string;
  /** plotly textposition */
  position: 'top right' | 'top left';
  /** row above the bottom of the plot, 0 = lowest */
  row: number;
}

/** about 6.5 px per character at 11 px, plus the gap to the line */
const widthOf = (text: string): number => text.length * 6.5 + 8;

/**
 * Labels for marks at speeds x (rpm) on an axis 0..top (rpm) drawn `plotWidth` px wide: right of the
 * line in the left part of the plot, left of it in the right part; a label that would run into the one
 * before goes to the next row.
 */
export function placeSpeedMarks(marks: Array<{ x: number; text: string }>, top: number, plotWidth: number): SpeedMark[] {
  const pxPerRpm = plotWidth / top;
  const out: SpeedMark[] = [];
  const sorted = [...marks].sort((a, b) => a.x - b.x);
  const spans: Array<{ row: number; lo: number; hi: number }> = [];
  for (const m of sorted) {
    const w = widthOf(m.text);
    const px = m.x * pxPerRpm;
    // right of the line if it fits before the right edge and the plot's left half holds the line
    const right = px + w <= plotWidth && m.x < 0.5 * top;
    const lo = right ? px : px - w;
    const hi = right ? px + w : px;
    let row = 0;
    while (spans.some((s) => s.row === row && s.lo < hi && lo < s.hi)) row++;
    spans.push({ row, lo, hi });
    out.push({ x: m.x, text: m.text, position: right ? 'top right' : 'top left', row });
  }
  return out;
}
