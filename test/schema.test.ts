import { messageOf } from './helpers';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { CAPPED_LISTS, KEYS, MAX_LIST_ENTRIES, checkProject, listCapProblem, parseProject, projectSchema } from '../src/core/project/schema';
import { InputError } from '../src/core/base/errors';
import { DEFAULT_COLD_TEMP_C, DEFAULT_DUTY, DEFAULT_MODULATION, DEFAULT_TEMP_C, PARSE_OPTIONS, defaultConditions } from '../src/core/project/schema';
import { readFileSync, readdirSync } from 'node:fs';
import { resolve } from 'node:path';
import { resolveProject } from '../src/core/project/project';

const minimal = (): Record<string, any> => ({
  format: 'torquewise-project',
  version: 1,
  name: 'test (invented)',
  motor: { polePairs: 4, Rs: 0.05, Ld: 1e-4, Lq: 1.2e-4, psiM: 0.01, inertia: 1e-4 },
  inverter: { Vdc: 48, Imax: 100, Icont: 50, modulation: 'svpwm' },
  conditions: { windingTemp_C: 100 },
  requirements: [{ label: 'rated', speed_rpm: 3000, torque_Nm: 1 }],
});


describe('parseProject', () => {
  it('fills the documented defaults', () => {
    const p = parseProject(minimal());
    expect(p.inverter.voltageUtilization).toBe(1);
    expect(p.inverter.deviceDrop).toBe(0);
    expect(p.conditions?.magnetTemp_C).toBe(20);
    expect(p.conditions?.coldTemp_C).toBeUndefined(); // resolved to 20 °C with a finding (project.test)
    expect(p.conditions?.magnetTempCoeff).toBe(-0.0012);
    expect(p.motor?.viscousFriction).toBe(0);
    expect(p.motor?.coulombFriction).toBe(0);
    expect(p.note).toBe('');
    expect(p.control).toBeUndefined();
  });

  it('control and scenario defaults', () => {
    const j = minimal();
    j.control = { currentBandwidth_Hz: 1000, speedTuning: { method: 'symmetric-optimum' } };
    j.scenario = { duration_s: 0.5, speedSteps: [{ t_s: 0.01, speed_rpm: 1000 }] };
    const p = parseProject(j);
    expect(p.control).toEqual({
      mode: 'speed',
      fCtrl_Hz: 10000,
      delaySamples: 1,
      currentBandwidth_Hz: 1000,
      speedTuning: { method: 'symmetric-optimum', a: 2 },
      antiWindup: 'clamping',
      decoupling: true,
      speedPrefilter: false,
      speedLoopDivider: 1,
    });
    expect(p.scenario?.initialSpeed_rpm).toBe(0);
    expect(p.scenario?.loadSteps).toEqual([]);
    expect(p.scenario?.loadInertia).toBe(0);
  });

  it('refuses denormal and vanishing values that would turn a ratio into Infinity, naming the field', () => {
    const cases: Array<[(j: any) => void, string]> = [
      [(j) => (j.motor.Ld = 5e-324), 'motor.Ld must be >= 1e-9 H'],
      [(j) => (j.motor.Lq = 1e-300), 'motor.Lq must be >= 1e-9 H'],
      [(j) => (j.motor.psiM = 1e-308), 'motor.psiM must be 0 (no magnet) or >= 0.000001 Wb'],
      [(j) => (j.motor.inertia = 1e-320), 'motor.inertia must be >= 1e-9 kg·m²'],
      [(j) => (j.inverter.voltageUtilization = 1e-310), 'inverter.voltageUtilization must be >= 0.001'],
    ];
    for (const [edit, msg] of cases) {
      const j = minimal();
      edit(j);
      expect(messageOf(() => parseProject(j))).toBe(msg);
    }
    const ok = minimal();
    ok.motor.psiM = 0; // a reluctance machine: no magnet is legal
    ok.motor.Lq = 3 * ok.motor.Ld;
    expect(parseProject(ok).motor!.psiM).toBe(0);
  });

  it('one clear message naming the path, with the unit', () => {
    const j = minimal();
    j.motor.Ld = -1e-4;
    expect(messageOf(() => parseProject(j))).toBe('motor.Ld must be >= 1e-9 H');
    const k = minimal();
    k.motor.polePairs = 3.5;
    expect(messageOf(() => parseProject(k))).toBe('motor.polePairs must be a whole number');
    const l = minimal();
    l.inverter.voltageUtilization = 1.2;
    expect(messageOf(() => parseProject(l))).toBe('inverter.voltageUtilization must be <= 1');
    const m = minimal();
    m.requirements[0].speed_rpm = -5;
    expect(messageOf(() => parseProject(m))).toBe('requirements[0].speed_rpm must be >= 0 rpm');
    const n = minimal();
    n.inverter.modulation = 'svm';
    expect(messageOf(() => parseProject(n))).toBe('inverter.modulation must be one of "sinusoidal", "svpwm", "six-step"');
    const o = minimal();
    o.motor.Rs = '0.05';
    expect(messageOf(() => parseProject(o))).toBe('motor.Rs must be a number in ohm');
    const q = minimal();
    delete q.motor.psiM;
    expect(messageOf(() => parseProject(q))).toBe('motor.psiM is required (peak magnet flux linkage per phase at 20 °C in Wb)');
    const r = minimal();
    r.motor.Lq = Infinity;
    expect(messageOf(() => parseProject(r))).toMatch(/^motor\.Lq must be/);
  });

  it('an unknown key is rejected, naming the key and the known ones', () => {
    const j = minimal();
    j.motor.Lx = 1;
    const msg = messageOf(() => parseProject(j));
    expect(msg).toMatch(/^motor\.Lx is not a known key \(known here: polePairs, Rs, Ld, Lq, psiM, inertia/);
    const k = minimal();
    k.extra = true;
    expect(messageOf(() => parseProject(k))).toMatch(/^extra is not a known key/);
  });

  it('magnet coefficient range keeps psiM positive at every allowed temperature', () => {
    const j = minimal();
    j.conditions.magnetTempCoeff = -0.01;
    expect(messageOf(() => parseProject(j))).toBe('conditions.magnetTempCoeff must be >= -0.003 /K');
    // worst corner allowed: 1 + (-0.003)(250 - 20) = 0.31 > 0, so the hottest allowed file still parses
    const k = minimal();
    k.conditions = { windingTemp_C: 250, magnetTemp_C: 250, magnetTempCoeff: -0.003 };
    expect(parseProject(k).conditions?.magnetTemp_C).toBe(250);
  });

  it('Icont <= Imax, motor or nameplate', () => {
    const j = minimal();
    j.inverter.Icont = 200;
    expect(messageOf(() => parseProject(j))).toBe('inverter.Icont must be <= inverter.Imax (100 A)');
    const k = minimal();
    delete k.motor;
    expect(messageOf(() => parseProject(k))).toBe('motor is required (or a nameplate section)');
  });

  it('a newer version gets a plain message, not a raw error', () => {
    const j = minimal();
    j.version = 2;
    expect(messageOf(() => parseProject(j))).toBe(
      'version is 2: the file was written by a newer Torquewise (version 2); this one reads version 1',
    );
    expect(messageOf(() => parseProject({ ...minimal(), format: 'other' }))).toMatch(/^format must be "torquewise-project"/);
    expect(messageOf(() => parseProject(null))).toBe('file must be a JSON object { ... }');
    expect(messageOf(() => parseProject([]))).toBe('file must be a JSON object { ... }');
  });

  it('nameplate section: poles must be even', () => {
    const j = minimal();
    delete j.motor;
    j.nameplate = { poles: 7, R: { value: 0.1, basis: 'phase' }, Ld: { value: 1e-4, basis: 'phase' }, Ke: { value: 5, unit: 'V_LL_rms/krpm' }, inertia: 1e-4 };
    expect(messageOf(() => parseProject(j))).toBe('nameplate.poles must be even (poles, not pole pairs)');
    j.nameplate.poles = 8;
    j.nameplate.Ke.unit = 'V/krpm';
    expect(messageOf(() => parseProject(j))).toBe('nameplate.Ke.unit must be one of "V_LL_rms/krpm", "V_LL_peak/krpm", "V_ph_peak*s/rad"');
  });

  it('control: gains or bandwidth, not both; current-step needs a step', () => {
    const j = minimal();
    j.control = { currentBandwidth_Hz: 1000, currentKp: 1, currentKi: 100 };
    expect(messageOf(() => parseProject(j))).toBe('control.currentBandwidth_Hz give either currentBandwidth_Hz or currentKp/currentKi, not both');
    j.control = { mode: 'current-step' };
    j.scenario = { duration_s: 0.01 };
    expect(messageOf(() => parseProject(j))).toBe('scenario.currentStep is required by control.mode "current-step"');
    j.scenario = { duration_s: 0.01, loadSteps: [{ t_s: 0.02, torque_Nm: 1 }] };
    expect(messageOf(() => parseProject(j))).toBe('scenario.loadSteps[0].t_s must be <= scenario.duration_s (0.01 s)');
  });
});

describe('checkProject', () => {
  it('lists every problem with its path', () => {
    const j = minimal();
    j.motor.Ld = 0;
    j.motor.polePairs = 0;
    j.inverter.Vdc = -1;
    j.conditions.windingTemp_C = 900;
    j.requirements.push({ label: '', speed_rpm: 1, torque_Nm: 1 });
    expect(checkProject(j)).toEqual([
      { path: 'motor.polePairs', message: 'must be >= 1' },
      { path: 'motor.Ld', message: 'must be >= 1e-9 H' },
      { path: 'inverter.Vdc', message: 'must be > 0 V' },
      { path: 'conditions.windingTemp_C', message: 'must be <= 250 °C' },
      { path: 'requirements[1].label', message: 'must not be empty' },
    ]);
    expect(checkProject(minimal())).toEqual([]);
  });

  it('never throws and speaks plainly, whatever a section holds', () => {
    const sections = ['motor', 'nameplate', 'inverter', 'conditions', 'requirements', 'control', 'scenario', 'version'];
    fc.assert(
      fc.property(fc.constantFrom(...sections), fc.jsonValue(), fc.constantFrom(...sections), fc.jsonValue(), (s1, v1, s2, v2) => {
        const obj = { ...minimal(), [s1]: v1, [s2]: v2 };
        const problems = checkProject(obj);
        for (const p of problems) expect(p.message).not.toMatch(/invalid_|ZodError|Expected|received|union|NaN/i);
        if (problems.length > 0) expect(() => parseProject(obj)).toThrow(InputError);
      }),
      { numRuns: 500 },
    );
    // scenario shapes near the valid one
    const step = fc.record({ t_s: fc.oneof(fc.double(), fc.constant(null), fc.string()), torque_Nm: fc.double() }, { requiredKeys: [] });
    fc.assert(
      fc.property(fc.array(fc.oneof(step, fc.constant(null))), fc.oneof(fc.double(), fc.constant(undefined)), (loadSteps, duration_s) => {
        const obj = { ...minimal(), scenario: { duration_s, loadSteps } };
        expect(() => checkProject(obj)).not.toThrow();
      }),
    );
  });

  it('no zod jargon and never throws, for arbitrary JSON', () => {
    fc.assert(
      fc.property(fc.jsonValue(), (v) => {
        const obj = { ...minimal(), motor: v };
        const problems = checkProject(obj);
        for (const p of problems) {
          expect(p.message).not.toMatch(/invalid_|ZodError|Expected|received|union/i);
          expect(p.path.length).toBeGreaterThan(0);
        }
      }),
    );
  });
});

/** every key path of the schema, arrays as [] (walks zod's definitions) */
function schemaPaths(schema: any, prefix: string, out: string[]): string[] {
  const def = schema._zod.def;
  if (def.type === 'optional' || def.type === 'default' || def.type === 'nullable' || def.type === 'prefault') return schemaPaths(def.innerType, prefix, out);
  if (def.type === 'pipe') return schemaPaths(def.in, prefix, out);
  if (def.type === 'array') {
    out.push(`${prefix}[]`);
    return schemaPaths(def.element, `${prefix}[]`, out);
  }
  if (def.type === 'object') {
    for (const [k, v] of Object.entries(def.shape)) {
      const path = prefix ? `${prefix}.${k}` : k;
      out.push(path);
      schemaPaths(v, path, out);
    }
  }
  return out;
}

describe('KEYS table', () => {
  it('documents exactly the keys of the schema', () => {
    const paths = schemaPaths(projectSchema, '', []).filter((p) => !p.endsWith('[]') || KEYS[p] !== undefined);
    expect(paths.length).toBeGreaterThan(80);
    for (const p of paths) expect(KEYS[p], p).toBeDefined();
    const all = new Set(schemaPaths(projectSchema, '', []));
    for (const k of Object.keys(KEYS)) expect(all.has(k), k).toBe(true);
  });

  it('documents a unit or a doc for every key', () => {
    for (const [k, v] of Object.entries(KEYS)) {
      expect(v.doc.length, k).toBeGreaterThan(0);
    }
    expect(KEYS['motor.Ld'].unit).toBe('H');
    expect(KEYS['scenario.loadModel.k'].unit).toBe('N·m·s²/rad²');
  });
});

describe('one cap for every list, checked by length before any entry', () => {
  // every entry of the huge list is invalid: a walk over the entries would report them
  const bad = { label: 7, speed_rpm: -1, torque_Nm: 'x', extra: true };
  it('a project with a million requirements is refused by the list, naming it and the cap', () => {
    const p = { ...minimal(), requirements: Array.from({ length: 1_000_000 }, () => bad) };
    expect(messageOf(() => parseProject(p))).toBe(`requirements must have at most ${MAX_LIST_ENTRIES} entries (it has 1000000)`);
    expect(checkProject(p)).toEqual([{ path: 'requirements', message: `must have at most ${MAX_LIST_ENTRIES} entries (it has 1000000)` }]);
  });
  it('requirement, step and load lists share the cap, each named in its refusal and its KEYS entry', () => {
    expect(CAPPED_LISTS.map((l) => l.join('.'))).toEqual(['requirements', 'scenario.speedSteps', 'scenario.torqueSteps', 'scenario.loadSteps', 'scenario.loadRamps']);
    for (const path of CAPPED_LISTS) {
      const p = minimal();
      p.scenario = { duration_s: 1 };
      const over = Array.from({ length: MAX_LIST_ENTRIES + 1 }, () => bad);
      if (path.length === 1) p[path[0]!] = over;
      else p.scenario[path[1]!] = over;
      const name = path.join('.');
      expect(listCapProblem(p)).toEqual({ path: name, message: `must have at most ${MAX_LIST_ENTRIES} entries (it has ${MAX_LIST_ENTRIES + 1})` });
      expect(checkProject(p)).toEqual([listCapProblem(p)]);
      expect(KEYS[name]!.doc).toContain(`at most ${MAX_LIST_ENTRIES}`);
    }
  });
  it('a list at the cap is checked entry by entry as before', () => {
    const p = { ...minimal(), requirements: Array.from({ length: MAX_LIST_ENTRIES }, (_, i) => ({ label: `p${i}`, speed_rpm: i, torque_Nm: 0.1 })) };
    expect(listCapProblem(p)).toBeNull();
    expect(parseProject(p).requirements).toHaveLength(MAX_LIST_ENTRIES);
    p.requirements[999] = { label: 'p999', speed_rpm: -1, torque_Nm: 0 };
    expect(messageOf(() => parseProject(p))).toBe('requirements[999].speed_rpm must be >= 0 rpm');
  });
});

describe('every problem at once, each naming its field', () => {
  const refusal = (j: unknown): InputError => {
    try {
      parseProject(j);
    } catch (e) {
      if (e instanceof InputError) return e;
      throw e;
    }
    throw new Error('accepted');
  };

  it('a file with several problems lists them all, in file order', () => {
    const j = minimal();
    j.motor.Rs = -1;
    j.motor.Ld = 0;
    j.inverter.modulation = 'spwm';
    j.requirements[0].torque_Nm = '2';
    const e = refusal(j);
    expect(e.problems.map((p) => p.path)).toEqual(['motor.Rs', 'motor.Ld', 'inverter.modulation', 'requirements[0].torque_Nm']);
    expect(e.problems[0]).toEqual({ path: 'motor.Rs', message: 'must be >= 0 ohm' });
    expect(e.message).toBe('motor.Rs must be >= 0 ohm'); // the first, as before
    expect(e.field).toBe('motor.Rs');
    expect(e.moreProblems).toBe(0);
    // the app's list is the same
    expect(checkProject(j)).toEqual(e.problems);
  });

  it('is bounded: 20 problems listed, the count of the rest said', () => {
    const j = minimal();
    j.requirements = Array.from({ length: 30 }, (_, i) => ({ label: `p${i}`, speed_rpm: -1, torque_Nm: 1 }));
    const e = refusal(j);
    expect(e.problems).toHaveLength(20);
    expect(e.moreProblems).toBe(10);
    expect(e.problems[19]!.path).toBe('requirements[19].speed_rpm');
  });

  it('a current given as {value, basis} outside the nameplate says where a basis is accepted', () => {
    const j = minimal();
    j.inverter.Imax = { value: 10, basis: 'rms' };
    j.motor.peakCurrent = { value: 20, basis: 'peak' };
    const e = refusal(j);
    const byPath = Object.fromEntries(e.problems.map((p) => [p.path, p.message]));
    // 10 A rms = 14.14 A peak (a sine's peak is √2 times its rms: common practice (no source))
    expect(byPath['inverter.Imax']).toBe('must be a plain number in A peak (10 A rms = 14.14 A peak): a current with a basis {value, basis} ("rms" or "peak") is accepted only in nameplate.ratedCurrent and nameplate.peakCurrent; everywhere else a current is a number in A peak');
    expect(byPath['motor.peakCurrent']).toMatch(/^must be a plain number in A peak: a current with a basis .* only in nameplate\.ratedCurrent and nameplate\.peakCurrent/);
    // a basis object on a quantity that is not a current
    const k = minimal();
    k.motor.Ld = { value: 1e-4, basis: 'phase' };
    expect(messageOf(() => parseProject(k))).toBe('motor.Ld must be a plain number in H: {value, basis} objects belong to the nameplate section only');
  });

  it('motor and nameplate together: choose one, first, even when the sections have problems of their own', () => {
    const j = minimal();
    j.nameplate = { poles: 8 };
    const e = refusal(j);
    expect(e.problems[0]).toEqual({ path: 'nameplate', message: 'and motor are both given: choose one, motor (the dq model) or nameplate (datasheet terms), and remove the other' });
    expect(e.problems.length).toBeGreaterThan(1); // the nameplate's own gaps follow
    // a complete nameplate beside the motor: the one problem
    const k = minimal();
    k.nameplate = { poles: 8, R: { value: 0.1, basis: 'phase' }, L: { value: 1e-4, basis: 'phase' }, Ke: { value: 5, unit: 'V_LL_rms/krpm' }, inertia: 1e-4 };
    expect(refusal(k).problems).toEqual([{ path: 'nameplate', message: 'and motor are both given: choose one, motor (the dq model) or nameplate (datasheet terms), and remove the other' }]);
  });

  it('requirements[].duty: "peak" or "continuous", absent = peak', () => {
    const j = minimal();
    j.requirements[0].duty = 'continuous';
    expect(parseProject(j).requirements[0]!.duty).toBe('continuous');
    j.requirements[0].duty = 'short';
    expect(messageOf(() => parseProject(j))).toBe('requirements[0].duty must be one of "peak", "continuous"');
    expect(KEYS['requirements[].duty']).toBeDefined();
  });
});

describe('the values a file leaves out, once, in the schema', () => {
  it('20 °C everywhere, space-vector PWM, peak duty; the resolution takes them from here', () => {
    expect([DEFAULT_TEMP_C, DEFAULT_COLD_TEMP_C, DEFAULT_MODULATION, DEFAULT_DUTY]).toEqual([20, 20, 'svpwm', 'peak']);
    expect(defaultConditions()).toEqual({ magnetTemp_C: DEFAULT_TEMP_C, magnetTempCoeff: -0.0012 });
    const j = minimal();
    delete j['conditions'];
    delete j['inverter'].modulation;
    const rp = resolveProject(parseProject(j));
    expect(rp.conditions).toEqual({ windingTemp_C: 20, magnetTemp_C: 20, coldTemp_C: 20, magnetTempCoeff: -0.0012 });
    expect(rp.inverter.modulation).toBe('svpwm');
    expect(rp.requirements[0]!.duty).toBe('peak');
    expect(rp.findings.map((f) => f.code)).toEqual(expect.arrayContaining(['conditions-assumed', 'modulation-assumed']));
  });

  it('parsed without generated parsers (PARSE_OPTIONS): the same file, keys in the same order, and the same problems as with them', () => {
    // common practice (no source): the two parsing routes of the validation library must agree
    const dir = resolve(__dirname, '..', 'resources');
    for (const f of readdirSync(dir).filter((n) => /^demo-.*\.json$/.test(n))) {
      const json = JSON.parse(readFileSync(resolve(dir, f), 'utf8'));
      const a = projectSchema.safeParse(json, PARSE_OPTIONS);
      const b = projectSchema.safeParse(json);
      expect(a.success).toBe(true);
      expect(JSON.stringify(a.data)).toBe(JSON.stringify(b.data));
      // a broken copy: a wrong type, a value out of range, an unknown key, a missing required field
      const bad = { ...json, inverter: { ...json.inverter, Vdc: 'high' }, conditions: { ...json.conditions, windingTemp_C: 1e6 }, surprise: 1, name: undefined };
      const ea = projectSchema.safeParse(bad, PARSE_OPTIONS);
      const eb = projectSchema.safeParse(bad);
      expect(ea.success).toBe(false);
      expect(ea.error!.issues.map((i) => [i.code, i.path.join('.')])).toEqual(eb.error!.issues.map((i) => [i.code, i.path.join('.')]));
      expect(ea.error!.issues.length).toBeGreaterThanOrEqual(3);
    }
  });
});
