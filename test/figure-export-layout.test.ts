import { describe, expect, it } from 'vitest';
import { EXPORT_SIZE, exportLayout } from '../src/renderer/src/components/figure-export-layout';

const conditions = [
  'Servo <demo> · Torquewise 0.1.0 · 2026-12-03',
  'Vdc 320 V, SVPWM (Vmax 173.9 V peak phase) · hot: winding 120 °C, magnet 100 °C · cold: 0 °C',
  'peak current 15 A peak (10.61 A rms), inverter binds (no motor rating given) · continuous 5.5 A peak (3.889 A rms), inverter binds (no motor rating given) and then some more words to wrap',
];

describe('exported figure layout', () => {
  const base = { margin: { l: 64, r: 16, t: 8, b: 40 }, showlegend: false, annotations: [{ text: 'MTPA' }], xaxis: { range: [0, 6300] } };
  const l = exportLayout(base as never, 'Servo <demo>: torque against speed', conditions) as Record<string, any>;
  it('gives the image a title, shows the legend and keeps the plot as it was', () => {
    expect(l.title.text).toBe('Servo &lt;demo&gt;: torque against speed');
    expect(l.showlegend).toBe(true);
    expect(l.xaxis).toEqual({ range: [0, 6300] });
    expect(l.annotations[0]).toEqual({ text: 'MTPA' });
    expect(base.showlegend).toBe(false); // the screen's layout is not touched
    expect(l.width).toBe(EXPORT_SIZE.width);
    expect(l.height).toBe(EXPORT_SIZE.height);
  });
  it('prints every conditions line under the legend, wrapped, with room kept for it', () => {
    const block = l.annotations[1];
    const text: string = block.text;
    const lines = text.split('<br>');
    expect(lines.length).toBe(4); // the third line (165 characters) wraps once
    expect(lines[0]).toBe('Servo &lt;demo&gt; · Torquewise 0.1.0 · 2026-12-03');
    expect(text.replace(/<br>/g, ' ')).toContain('inverter binds (no motor rating given) · continuous 5.5 A peak');
    // the bottom margin holds ticks, legend and the 4 lines at 17 px
    expect(l.margin.b).toBe(56 + 66 + 4 * 17 + 16);
    // the legend sits below the axis title, the block below the legend
    const plotBottom = EXPORT_SIZE.height - l.margin.b;
    expect((1 - l.legend.y) * EXPORT_SIZE.height).toBeCloseTo(plotBottom + 56, 9);
    expect(block.yshift).toBe(-(56 + 66));
  });
});
