import { describe, expect, it } from 'vitest';
import { placeSpeedMarks } from '../src/renderer/src/components/speed-marks';

describe('base and maximum speed labels', () => {
  it('sit beside their lines on the side with room', () => {
    const m = placeSpeedMarks([{ x: 3000, text: 'base 3000 rpm' }, { x: 12000, text: 'max 12000 rpm' }], 14000, 500);
    expect(m.map((x) => [x.position, x.row])).toEqual([['top right', 0], ['top left', 0]]);
  });

  it('two labels too close for one row take two rows', () => {
    // base and max 400 rpm apart on a 14 000 rpm axis 500 px wide: 14 px apart, labels about 90 px wide
    const m = placeSpeedMarks([{ x: 9000, text: 'max 9400 rpm' }, { x: 8600, text: 'base 8600 rpm' }], 14000, 500);
    expect(m.map((x) => x.row).sort()).toEqual([0, 1]);
    // and labels far apart share the lowest row
    expect(placeSpeedMarks([{ x: 1000, text: 'base' }, { x: 13000, text: 'max' }], 14000, 500).every((x) => x.row === 0)).toBe(true);
  });
});
