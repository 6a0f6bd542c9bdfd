import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { figureConditions, limitWords } from '../src/core/reports/figure-conditions';
import { loadProjectText } from '../src/core/project/project';
import { TOOL_VERSION } from '../src/core/base/version';

const demo = (n: string) => loadProjectText(readFileSync(join(__dirname, '..', 'resources', `${n}.json`), 'utf8'));

describe('figure conditions', () => {
  it('names the project, bus, modulation, temperatures, effective limits with which binds, date and version', () => {
    const p = demo('demo-servo-axis');
    const lines = figureConditions(p, { date: '2026-12-03' });
    expect(lines).toHaveLength(3);
    expect(lines[0]).toBe(`Invented demo: servo axis on a 320 V rectified bus · Torquewise ${TOOL_VERSION} · 2026-12-03`);
    // demo file: Vdc 320 V, svpwm, winding 120 °C, magnet 100 °C, cold 0 °C
    expect(lines[1]).toContain('Vdc 320 V, SVPWM');
    expect(lines[1]).toContain('hot: winding 120 °C, magnet 100 °C · cold: 0 °C');
    // SVPWM: Vmax = u (Vdc - 2 drop) / sqrt(3) = 0.95 (320 - 3) / sqrt(3) = 173.87 V
    expect(lines[1]).toContain(`Vmax ${Number(((0.95 * 317) / Math.sqrt(3)).toPrecision(4))} V peak phase`);
    // the servo demo gives no motor currents in model terms: the inverter binds, 15 A peak = 10.61 A rms
    expect(lines[2]).toBe('peak current 15 A peak (10.61 A rms), inverter binds (motor 16 A peak) · continuous 5.5 A peak (3.889 A rms), inverter binds (motor 5.5 A peak)');
  });
  it('says when the motor binds, and the inverter figure beside it', () => {
    expect(limitWords({ A: 100, binds: 'motor', inverter_A: 150, motor_A: 100 })).toBe('100 A peak (70.71 A rms), motor binds (inverter 150 A peak)');
    expect(limitWords({ A: 150, binds: 'inverter', inverter_A: 150, motor_A: 200 })).toBe('150 A peak (106.1 A rms), inverter binds (motor 200 A peak)');
  });
  it('uses the peak and continuous limits the solvers use', () => {
    const p = demo('demo-ipm-traction');
    const [, , limits] = figureConditions(p, { date: 'd', version: '9.9.9' });
    expect(limits).toContain(`peak current ${Number(p.peak.Imax.toPrecision(4))} A peak`);
    expect(limits).toContain(`continuous ${Number(p.continuous.Imax.toPrecision(4))} A peak`);
    expect(figureConditions(p, { date: 'd', version: '9.9.9' })[0]).toContain('Torquewise 9.9.9');
  });
});
