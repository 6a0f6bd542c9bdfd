// The Load steps view's traces with a measured or estimated angle (src/renderer/src/views/load-steps/
// traces-figure.ts, angle-figures.ts): the estimated speed over the true one, the angle-error row in
// electrical degrees on the shared time axis, the metrics' rms and peak rows, the angle source named,
// the sensorless hand-over marked; nothing of it for the true angle; the traces' CSV with the columns.
import { describe, expect, it } from 'vitest';
import type { PlotTheme } from '../src/renderer/src/components/plot-style';
import { tracesFigure, traceRows, tracesHeight } from '../src/renderer/src/views/load-steps/traces-figure';
import { angleErrorRange, angleFindings, angleMetricRows, angleSourceText, degrees, handoverSpeed, runFile } from '../src/renderer/src/views/load-steps/angle-figures';
import { inputsKey } from '../src/renderer/src/views/load-steps/switching-figures';
import { tracesCsv } from '../src/renderer/src/components/exports';
import type { SimDone } from '../src/renderer/src/state/simulation-run';
import { parseCsv } from '../src/core/reports/csv';
import { loadProjectText } from '../src/core/project/project';
import { runSimulation } from '../src/core/simulation/simulate';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { demoJson } from './helpers';

const theme: PlotTheme = { ink: '#111111', muted: '#666666', line: '#dddddd', panel: '#ffffff', bg: '#f5f5f5', ok: '#2e7d32', bad: '#b3261e', dark: false };
type Tr = { name?: string; x: Float64Array; y: ArrayLike<number>; yaxis?: string; line?: { color?: string; dash?: string; width?: number }; legendgrouptitle?: { text: string } };
type Ax = { title: { text: string }; range?: [number, number]; domain: [number, number] };

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function run(f: Record<string, any>): SimDone {
  const p = loadProjectText(JSON.stringify(f));
  const r = runSimulation(simulationFromProject(p), { maxPoints: 4000 });
  return { ...r, findings: [], project: 'test', pwmModel: 'average', inputsKey: inputsKey(p.file) };
}

const servoFile = demoJson('demo-servo-axis');
const servo = run(servoFile);
const idealFile = demoJson('demo-servo-axis');
idealFile.control.angle = { source: 'ideal' };
const ideal = run(idealFile);

describe('the angle source named', () => {
  it('encoder: lines, counts per revolution, the electrical angle of one count, the speed window and filter', () => {
    // quadrature decoding counts 4 edges per line: one count = 360 / (4 N) mechanical degrees, times the pole pairs electrical (common practice (no source))
    expect(angleSourceText(servoFile)).toBe('encoder, 2048 lines (8192 counts per revolution, 0.176 ° electrical per count), speed over 8 control periods, speed filter 1 kHz');
  });

  it('resolver and sensorless: the tracking loop, the PLL with its hand-over and the observer\'s mismatches', () => {
    expect(angleSourceText(demoJson('demo-ipm-traction'))).toBe('resolver, tracking loop 300 Hz, damping 0.707');
    const f = demoJson('demo-spm-48v');
    expect(angleSourceText(f)).toBe('sensorless observer, PLL 1 kHz, open-loop start-up handing over at 700 rpm');
    expect(handoverSpeed(f)).toBe(700);
    f.control.angle.fluxError_pct = -20;
    expect(angleSourceText(f)).toMatch(/observer's parameters off the motor's: flux linkage -20 %$/);
  });

  it('the true angle (ideal, or no control.angle): nothing named', () => {
    expect(angleSourceText(idealFile)).toBeNull();
    // without a motor section the caller's pole pairs give the count's electrical angle
    const np = demoJson('demo-servo-axis');
    delete np.motor;
    expect(angleSourceText(np)).toMatch(/^encoder, 2048 lines \(8192 counts per revolution\), /);
    expect(angleSourceText(np, 4)).toMatch(/0\.176 ° electrical per count/);
    const f = demoJson('demo-servo-axis');
    delete f.control.angle;
    expect(angleSourceText(f)).toBeNull();
    expect(handoverSpeed(servoFile)).toBeNull();
  });

  it('the run\'s own file from its inputs key, not the project edited since', () => {
    expect(angleSourceText(runFile(servo.inputsKey, idealFile))).toMatch(/^encoder, 2048 lines/);
    expect(runFile(undefined, idealFile)).toBe(idealFile);
  });
});

describe('the traces with an encoder (servo demo)', () => {
  const fig = tracesFigure(servo, 'light', theme);
  const d = fig.data as unknown as Tr[];
  const layout = fig.layout as unknown as Record<string, Ax>;

  it('the estimated speed over the true speed on the speed row, named and in its own colour and dash', () => {
    const est = d.find((t) => t.name === 'speed, estimated')!;
    const tru = d.find((t) => t.name === 'speed (true)')!;
    expect(est.yaxis).toBe('y');
    expect(tru.yaxis).toBe('y');
    expect(est.y).toBe(servo.traces.speedEstimate_rpm);
    expect(est.line!.color).not.toBe(tru.line!.color);
    expect(est.line!.dash).toBe('dot');
    expect(tru.line!.dash).toBe('solid');
    // the estimate follows the true speed: within 1 % of the 2000 rpm step over the run's last half, where the speed is steady (common practice (no source))
    const t = servo.traces.t_s, s = servo.traces.speed_rpm, e = servo.traces.speedEstimate_rpm!;
    let worst = 0;
    for (let i = 0; i < t.length; i++) if (t[i]! > 0.06) worst = Math.max(worst, Math.abs(e[i]! - s[i]!));
    expect(worst).toBeGreaterThan(0);
    expect(worst).toBeLessThan(20);
  });

  it('the angle error in electrical degrees on its own row, on the time axis every row shares', () => {
    expect(traceRows(servo).map((r) => r.key)).toEqual(['speed', 'error', 'angle', 'torque', 'dq', 'volt', 'phase']);
    expect(tracesHeight(servo)).toBe(770);
    const a = d.find((t) => t.name === 'estimated − true angle')!;
    expect(a.yaxis).toBe('y3');
    expect(a.x).toBe(servo.traces.t_s);
    expect(a.y[100]).toBeCloseTo((servo.traces.thetaError_rad![100]! * 180) / Math.PI, 12);
    expect(layout.yaxis3!.title.text).toBe('angle error, ° el.');
    expect(a.legendgrouptitle!.text).toBe('angle error, ° electrical');
    expect((fig.layout as unknown as { xaxis: { anchor: string } }).xaxis.anchor).toBe('y7');
    // the quadrature count bounds the error: one count is 360 * 4 / 8192 = 0.1758 ° electrical (common practice (no source));
    // the axis holds the largest error with a margin, symmetric about zero
    let peak = 0;
    for (const v of a.y as Float64Array) peak = Math.max(peak, Math.abs(v));
    expect(peak).toBeGreaterThan(0.01);
    expect(peak).toBeLessThanOrEqual(0.17578125 + 1e-9);
    const [lo, hi] = layout.yaxis3!.range!;
    expect(hi).toBeCloseTo(1.15 * peak, 12);
    expect(lo).toBe(-hi);
  });

  it('the metrics gain the angle error\'s rms and peak, in electrical degrees and mrad, and the speed estimate\'s ripple in rpm', () => {
    const rows = angleMetricRows(servo.metrics);
    expect(rows.map((r) => r.key)).toEqual(['angleErrorRms_rad', 'angleErrorPeak_rad', 'speedEstimateRipple_rpm']);
    expect(rows[2]!.value).toBe(servo.metrics.speedEstimateRipple_rpm);
    expect(rows[2]!.text).toMatch(/^\d+(\.\d+)? rpm$/);
    expect(rows[1]!.value).toBe(servo.metrics.angleErrorPeak_rad);
    // the peak within one count (0.1758 ° electrical), the rms below it
    expect(rows[1]!.value * 180 / Math.PI).toBeLessThanOrEqual(0.17578125 + 1e-9);
    expect(rows[0]!.value).toBeLessThan(rows[1]!.value);
    expect(rows[1]!.text).toMatch(/^0\.17\d ° electrical \(3\.0\d mrad\)$/);
  });

  it('the traces\' CSV gains speedEstimate_rpm and thetaError_rad', () => {
    const rows = parseCsv(tracesCsv(servo.traces));
    expect(rows[0]).toContain('speedEstimate_rpm');
    expect(rows[0]).toContain('thetaError_rad');
    const k = rows[0]!.indexOf('thetaError_rad');
    expect(Number(rows[101]![k])).toBeCloseTo(servo.traces.thetaError_rad![100]!, 9);
    expect(parseCsv(tracesCsv(ideal.traces))[0]).not.toContain('thetaError_rad');
  });
});

describe('the true angle: the figure as before', () => {
  it('six rows, one speed, no estimate, no angle error, no metrics rows', () => {
    const fig = tracesFigure(ideal, 'light', theme);
    const d = fig.data as unknown as Tr[];
    expect(traceRows(ideal).map((r) => r.key)).toEqual(['speed', 'error', 'torque', 'dq', 'volt', 'phase']);
    expect(tracesHeight(ideal)).toBe(660);
    expect(d.map((t) => t.name)).toEqual(['reference', 'speed', 'reference − speed', 'motor torque', 'load torque', 'id reference', 'iq reference', 'id', 'iq', '|v| / Vmax', 'ia', 'ib', 'ic']);
    expect(d.map((t) => t.yaxis)).toEqual(['y', 'y', 'y2', 'y3', 'y3', 'y4', 'y4', 'y4', 'y4', 'y5', 'y6', 'y6', 'y6']);
    expect(angleMetricRows(ideal.metrics)).toEqual([]);
    expect((fig.layout as unknown as { margin: { r: number } }).margin.r).toBe(150);
  });
});

describe('the sensorless hand-over and findings', () => {
  it('a dotted line at the hand-over speed on the speed row, named', () => {
    const fig = tracesFigure(servo, 'light', theme, 700) as unknown as { layout: { shapes: Array<{ type: string; yref: string; y0: number }>; annotations: Array<{ text: string }> } };
    const line = fig.layout.shapes.find((s) => s.type === 'line')!;
    expect(line.yref).toBe('y');
    expect(line.y0).toBe(700);
    expect(fig.layout.annotations[0]!.text).toBe('sensorless hand-over 700 rpm');
  });

  it('the findings about the angle source picked out of the run\'s findings', () => {
    const f = [
      { code: 'sensorless-low-speed', severity: 'info' as const, field: 'control.angle.handoverSpeed_rpm', message: 'the sensorless observer is not valid below 300 rpm' },
      { code: 'load-step-unsettled', severity: 'warning' as const, field: 'scenario.loadSteps[0]', message: 'x' },
    ];
    expect(angleFindings(f)).toEqual([f[0]]);
  });

  it('the axis range: symmetric, at least ±0.05 °', () => {
    expect(angleErrorRange(new Float64Array([0, 0]))).toEqual([-0.05, 0.05]);
    expect(angleErrorRange(degrees([0.1, -0.2]))[1]).toBeCloseTo(1.15 * 0.2 * 180 / Math.PI, 12);
  });
});
