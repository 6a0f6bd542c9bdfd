// The thermal and dutyCycle sections resolved (src/core/project/thermal-resolve.ts, through
// resolveProject): the network's specification key for key (the shape of issue 13 of this project),
// the junction pair passed on together, the speed table copied, the cycle as Float64Array columns.
// The demos' networks are invented; that a traction motor's capacities and conductances are far above a
// servo's, and that a self-ventilated motor cools better with speed: common practice (no source).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { loadProjectText, resolveProject } from '../src/core/project/project';
import { parseProject } from '../src/core/project/schema';
import { dutyCycleOf, thermalNetworkOf } from '../src/core/project/thermal-resolve';

const minimal = (): Record<string, any> => ({
  format: 'torquewise-project',
  version: 1,
  motor: { polePairs: 4, Rs: 0.05, Ld: 1e-4, Lq: 1.2e-4, psiM: 0.01, inertia: 1e-4 },
  inverter: { Vdc: 48, Imax: 100, Icont: 50, modulation: 'svpwm' },
});
const THERMAL = {
  coolantTemp_C: 40,
  windingCapacity_J_per_K: 900, windingToStator_K_per_W: 0.05,
  statorCapacity_J_per_K: 9000, statorToCoolant_K_per_W: 0.02,
  magnetAboveStator_K: 10,
  windingMax_C: 155, magnetMax_C: 140,
  junctionToCoolant_K_per_W: 0.15, junctionMax_C: 150,
};

describe('the thermal and dutyCycle sections resolved', () => {
  it('a file without them resolves without them', () => {
    const p = resolveProject(parseProject(minimal()));
    expect(p.thermal).toBeUndefined();
    expect(p.dutyCycle).toBeUndefined();
  });

  it('the network: every key of the section, the magnet offset defaulted to 0, the junction pair together or not at all', () => {
    expect(resolveProject(parseProject({ ...minimal(), thermal: THERMAL })).thermal).toEqual(THERMAL);
    const { magnetAboveStator_K: _m, junctionToCoolant_K_per_W: _j, junctionMax_C: _x, ...bare } = THERMAL;
    const spec = resolveProject(parseProject({ ...minimal(), thermal: bare })).thermal!;
    expect(spec).toEqual({ ...bare, magnetAboveStator_K: 0 });
    expect('junctionToCoolant_K_per_W' in spec).toBe(false);
    expect('junctionMax_C' in spec).toBe(false);
  });

  it('the speed table is the spec\'s own copy', () => {
    const section = parseProject({ ...minimal(), thermal: { ...THERMAL, statorToCoolantBySpeed: { speed_rpm: [0, 3000], K_per_W: [0.3, 0.15] } } }).thermal!;
    const spec = thermalNetworkOf(section);
    expect(spec.statorToCoolantBySpeed).toEqual({ speed_rpm: [0, 3000], K_per_W: [0.3, 0.15] });
    expect(spec.statorToCoolantBySpeed!.speed_rpm).not.toBe(section.statorToCoolantBySpeed!.speed_rpm);
  });

  it('the duty cycle: its label and its columns as Float64Arrays, value for value', () => {
    const d = { label: 'move (invented)', t_s: [0, 0.1, 0.35], speed_rpm: [0, 3000, -50.5], torque_Nm: [2.5, -1, 0] };
    const r = loadProjectText(JSON.stringify({ ...minimal(), dutyCycle: d })).dutyCycle!;
    expect(r.label).toBe('move (invented)');
    expect(r.t_s).toBeInstanceOf(Float64Array);
    expect(Array.from(r.t_s)).toEqual(d.t_s);
    expect(Array.from(r.speed_rpm)).toEqual(d.speed_rpm);
    expect(Array.from(r.torque_Nm)).toEqual(d.torque_Nm);
    expect(dutyCycleOf({ ...d, label: '' }).label).toBe('');
  });
});

describe('the demos: invented thermal data and an invented duty cycle each', () => {
  const demo = (name: string) => loadProjectText(readFileSync(new URL(`../resources/${name}`, import.meta.url), 'utf8'));
  it('every demo resolves with a network and a cycle, both said invented in its note and the cycle\'s label', () => {
    for (const name of ['demo-servo-axis.json', 'demo-spm-48v.json', 'demo-ipm-traction.json', 'demo-ipm-saturated.json']) {
      const p = demo(name);
      expect(p.thermal, name).toBeDefined();
      expect(p.dutyCycle!.label, name).toMatch(/\(invented\)$/);
      expect(p.dutyCycle!.t_s.length, name).toBeGreaterThanOrEqual(20);
      expect(p.file.note, name).toMatch(/thermal network \(thermal\)/);
      expect(p.file.note, name).toMatch(/duty cycle \(dutyCycle/);
    }
  });

  it('sizes that fit each motor: the traction motor\'s capacities far above the servo\'s, the 48 V motor self-ventilated', () => {
    const servo = demo('demo-servo-axis.json').thermal!, spm = demo('demo-spm-48v.json').thermal!, ipm = demo('demo-ipm-traction.json').thermal!;
    expect(ipm.windingCapacity_J_per_K / servo.windingCapacity_J_per_K).toBeGreaterThan(5);
    expect(ipm.statorToCoolant_K_per_W).toBeLessThan(servo.statorToCoolant_K_per_W / 10);
    // a self-ventilated motor cools better the faster it turns
    const k = spm.statorToCoolantBySpeed!.K_per_W;
    for (let i = 1; i < k.length; i++) expect(k[i]!).toBeLessThan(k[i - 1]!);
    // the saturated demo takes the traction demo's network and cycle
    const sat = demo('demo-ipm-saturated.json'), trac = demo('demo-ipm-traction.json');
    expect(sat.thermal).toEqual(trac.thermal);
    expect(sat.dutyCycle).toEqual(trac.dutyCycle);
  });
});
