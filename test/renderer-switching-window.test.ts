// Where the switching panel's zoom window sits, as the PWM control edits it (src/renderer/src/views/
// load-steps/switching-figures.ts): the mode read from control.pwm (the run's end, the first load
// step, times), the times offered when the user asks for times, and the load step marked in the ripple
// window when it falls inside. Common practice (no source): a scope's trigger marked on its time axis.
import { describe, expect, it } from 'vitest';
import { switchingResultFixture } from './switching-result-fixture';
import { CURVE, type PlotTheme } from '../src/renderer/src/components/plot-style';
import { rippleWindowFigure, suggestedWindow, WINDOW_MODES, windowModeOf } from '../src/renderer/src/views/load-steps/switching-figures';
import { parseProject } from '../src/core/project/schema';
import { demoJson } from './helpers';

const theme: PlotTheme = { ink: '#111111', muted: '#666666', line: '#dddddd', panel: '#ffffff', bg: '#f5f5f5', ok: '#2e7d32', bad: '#b3261e', dark: false };
const s = switchingResultFixture();
type L = { shapes?: Array<{ x0: number; yref: string; line: { dash: string } }>; annotations?: Array<{ text: string; x: number }> };

describe('the window mode of control.pwm', () => {
  it('times when window_s is given, the load step for windowAt "load-step", else the run\'s end', () => {
    expect(windowModeOf(undefined)).toBe('end');
    expect(windowModeOf({ model: 'switching' })).toBe('end');
    expect(windowModeOf({ model: 'switching', windowAt: 'end' })).toBe('end');
    expect(windowModeOf({ model: 'switching', windowAt: 'load-step' })).toBe('load-step');
    expect(windowModeOf({ model: 'switching', window_s: { from: 0.1, to: 0.2 } })).toBe('times');
    expect(Object.keys(WINDOW_MODES)).toEqual(['end', 'load-step', 'times']);
  });

  it('the times offered lie inside the run, the end after the start: the schema takes them on every demo', () => {
    expect(suggestedWindow(0.1)).toEqual({ from: 0.05, to: 0.06 });
    expect(suggestedWindow(null)).toEqual({ from: 0.05, to: 0.06 });
    for (const d of ['demo-servo-axis', 'demo-ipm-traction', 'demo-spm-48v']) {
      const j = demoJson(d);
      j.control.pwm = { model: 'switching', window_s: suggestedWindow(j.scenario.duration_s) };
      expect(parseProject(j).control?.pwm?.window_s).toEqual(suggestedWindow(j.scenario.duration_s));
    }
  });
});

describe('the load step in the ripple window', () => {
  it('a dashed line across the rows and its label at the step, in ms, only when the window holds it', () => {
    const w = s.window;
    const mid = (w.t_s[0]! + w.t_s[w.t_s.length - 1]!) / 2;
    const l = rippleWindowFigure(s, theme, CURVE.light, null, [{ t_s: mid, label: 'load step' }, { t_s: w.t_s[0]! - 1, label: 'outside' }]).layout as unknown as L;
    expect(l.shapes!.length).toBe(1);
    expect(l.shapes![0]!.x0).toBeCloseTo(mid * 1e3, 9);
    expect(l.shapes![0]!.yref).toBe('paper');
    expect(l.shapes![0]!.line.dash).toBe('dash');
    expect(l.annotations!.map((a) => a.text)).toEqual(['load step']);
    const none = rippleWindowFigure(s, theme, CURVE.light).layout as unknown as L;
    expect(none.shapes).toBeUndefined();
  });
});
