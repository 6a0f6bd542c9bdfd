import { describe, expect, it } from 'vitest';
import { chooseTextPositions, declutterShifts, overlaps, textBox, type TextPosition } from '../src/renderer/src/components/label-layout';

describe('label layout', () => {
  it('boxes for text positions', () => {
    expect(textBox(100, 100, 'ab', 'middle right')).toEqual([107, 92.5, 120, 107.5]);
    expect(textBox(100, 100, 'ab', 'top left')).toEqual([80, 78, 93, 93]);
    expect(overlaps([0, 0, 10, 10], [5, 5, 15, 15])).toBe(true);
    expect(overlaps([0, 0, 10, 10], [10, 0, 20, 10])).toBe(false);
  });

  it('two point labels that would run into each other take different positions', () => {
    // "highway" at 300 px and "overtake at top speed" at 420 px, same height: the second cannot sit left on the same line
    const pos = chooseTextPositions<TextPosition>(
      [
        { px: 300, py: 120, text: 'highway', candidates: ['middle right', 'middle left', 'top right', 'top left', 'bottom right', 'bottom left'] },
        { px: 420, py: 118, text: 'overtake at top speed', candidates: ['middle left', 'top left', 'bottom left', 'middle right'] },
      ],
      { width: 460, height: 260 },
    );
    expect(pos[0]).toBe('middle right');
    expect(pos[1]).not.toBe('middle left');
    const b0 = textBox(300, 120, 'highway', pos[0]!);
    const b1 = textBox(420, 118, 'overtake at top speed', pos[1]!);
    expect(overlaps(b0, b1)).toBe(false);
  });

  it('annotations on each other are shifted a line apart; clear ones stay', () => {
    const s = declutterShifts([
      { px: 100, py: 50, text: '303 N·m', xanchor: 'right', yanchor: 'bottom' },
      { px: 110, py: 52, text: '1700 rpm', xanchor: 'center', yanchor: 'bottom' },
      { px: 300, py: 200, text: 'far', xanchor: 'center', yanchor: 'bottom' },
    ]);
    expect(s[0]).toBe(0);
    expect(Math.abs(s[1]!)).toBeGreaterThanOrEqual(14);
    expect(s[2]).toBe(0);
  });
});

describe('label layout around a curve', () => {
  it('a label avoids a line drawn through its first choice', () => {
    // a horizontal line 12 px above the point: "top left" would sit on it, "bottom left" is clear
    const line = Array.from({ length: 60 }, (_, k) => [k * 8 - 1.5, 88 - 1.5, k * 8 + 1.5, 88 + 1.5] as [number, number, number, number]);
    const [pos] = chooseTextPositions([{ px: 400, py: 100, text: 'overtake at top speed', candidates: ['top left', 'bottom left', 'middle left'] }], { width: 460, height: 260 }, [], line);
    expect(pos).toBe('bottom left');
    // a label is never put on another label to keep off a line: the line is the lesser cost
    const other = textBox(400, 100, 'overtake at top speed', 'bottom left');
    const [pos2] = chooseTextPositions([{ px: 400, py: 100, text: 'overtake at top speed', candidates: ['top left', 'bottom left'] }], { width: 460, height: 260 }, [other], line);
    expect(pos2).toBe('top left');
  });
});
