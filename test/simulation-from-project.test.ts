import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { loadProjectText } from '../src/core/project/project';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { modulationLimit } from '../src/core/drive/inverter';

const demo = (f: string): any => JSON.parse(readFileSync(resolve(__dirname, '..', 'resources', `${f}.json`), 'utf8'));

// The defaults are the schema's (common practice, no source); the voltage limit per modulation is
// Holmes and Lipo (2003), Pulse Width Modulation for Power Converters.
describe('simulation setup of a project', () => {
  it('a file without a control section simulates with the schema defaults', () => {
    const o = demo('demo-servo-axis');
    delete o.control;
    const withDefaults = demo('demo-servo-axis');
    withDefaults.control = {};
    const a = simulationFromProject(loadProjectText(JSON.stringify(o)));
    const b = simulationFromProject(loadProjectText(JSON.stringify(withDefaults)));
    expect(a.controller.Ts).toBe(1e-4);
    expect(a.controller.delaySamples).toBe(1);
    expect(a.controller.mode).toBe('speed');
    expect(a.controller.antiWindup).toBe('clamping');
    expect(a.controller.decoupling).toBe(true);
    expect(a.controller.speedRefPrefilter_s).toBe(0);
    expect(a.controller.currentD).toEqual(b.controller.currentD);
    expect(a.tuning!.current.design_Hz).toBe(500);
  });
  it('overrides win over the file; the voltage limit is the inverter\'s modulation limit', () => {
    const p = loadProjectText(JSON.stringify(demo('demo-servo-axis')));
    const s = simulationFromProject(p, { control: { fCtrl_Hz: 20000, delaySamples: 0 }, scenario: { duration_s: 0.01 } });
    expect(s.controller.Ts).toBe(5e-5);
    expect(s.controller.delaySamples).toBe(0);
    expect(s.duration_s).toBe(0.01);
    expect(s.controller.voltage).toEqual(modulationLimit(p.inverter));
    expect(s.tripCurrent_A).toBe(3 * s.Imax);
  });
  it('no scenario: refused, naming the field', () => {
    const o = demo('demo-servo-axis');
    delete o.scenario;
    expect(() => simulationFromProject(loadProjectText(JSON.stringify(o)))).toThrow(/scenario is required/);
  });
});
