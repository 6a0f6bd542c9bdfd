import { messageOf, refusal } from './helpers';
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { loadProject, loadProjectJson, loadProjectText, resolveProject } from '../src/core/project/project';
import { parseProject } from '../src/core/project/schema';
import { solveOperatingPoint } from '../src/core/steady-state/operating-point';
import { InputError } from '../src/core/base/errors';
import fc from 'fast-check';

const demoText = (name: string): string => readFileSync(fileURLToPath(new URL(`../resources/${name}.json`, import.meta.url)), 'utf8');
const demoJson = (name: string): Record<string, any> => JSON.parse(demoText(name));
const DEMOS = ['demo-spm-48v', 'demo-ipm-traction', 'demo-servo-axis'];


describe('demo projects', () => {
  for (const name of DEMOS) {
    it(`${name} parses, resolves, is labelled invented and has a control section and a scenario`, () => {
      const rp = loadProjectText(demoText(name));
      expect(rp.name).toMatch(/invented/i);
      expect(rp.file.note).toMatch(/invented/i);
      expect(rp.file.control).toBeDefined();
      expect(rp.file.scenario?.speedSteps.length).toBeGreaterThan(0);
      expect(rp.file.scenario?.loadSteps.length).toBeGreaterThan(0);
      // the speed step comes before the load step
      expect(rp.file.scenario!.speedSteps[0].t_s).toBeLessThan(rp.file.scenario!.loadSteps[0].t_s);
      expect(rp.findings.filter((f) => f.severity !== 'info')).toEqual([]);
      for (const m of [rp.machine20, rp.hot, rp.cold]) {
        for (const v of Object.values(m)) expect(Number.isFinite(v)).toBe(true);
      }
    });
  }

  it('requirement points mostly pass, one is tight or fails (hot corner, peak current)', () => {
    const verdict = (name: string) => {
      const rp = loadProjectText(demoText(name));
      return rp.requirements.map((r) => ({ label: r.label, op: solveOperatingPoint(rp.hot, rp.peak, (r.speed_rpm * Math.PI) / 30, r.torque_Nm), Imax: rp.peak.Imax }));
    };
    const spm = verdict('demo-spm-48v');
    expect(spm.every((x) => x.op.feasible)).toBe(true);
    const start = spm.find((x) => x.label === 'start-up')!;
    expect(start.op.current / start.Imax).toBeGreaterThan(0.97); // tight
    expect(verdict('demo-ipm-traction').filter((x) => !x.op.feasible).map((x) => x.label)).toEqual(['overtake at top speed']);
    expect(verdict('demo-servo-axis').filter((x) => !x.op.feasible).map((x) => x.label)).toEqual(['peak above rated speed']);
  });

  it('traction demo: saliency 2.5, characteristic current below Imax, converted from mixed datasheet terms', () => {
    const rp = loadProjectText(demoText('demo-ipm-traction'));
    expect(rp.machine20.polePairs).toBe(4);
    expect(rp.machine20.Lq / rp.machine20.Ld).toBeCloseTo(2.5, 12);
    expect(rp.hot.psiM / rp.hot.Ld).toBeLessThan(rp.peak.Imax);
    expect(rp.cold.psiM / rp.cold.Ld).toBeLessThan(rp.peak.Imax);
    // R 0.036 ohm line-to-line at 25 °C -> 0.018 ohm/phase at 25 °C -> /(1 + 0.00393·5) at 20 °C (IEC 60028)
    expect(rp.machine20.Rs).toBeCloseTo(0.018 / 1.01965, 12);
    // Ke 33.1 V_LL,rms/krpm: psiM = 33.1·sqrt(2/3)/(4·104.72) at 25 °C, /(1 - 0.0012·5) at 20 °C
    expect(rp.machine20.psiM).toBeCloseTo((33.1 * Math.sqrt(2 / 3)) / (4 * ((1000 * 2 * Math.PI) / 60)) / 0.994, 12);
    expect(rp.interpretation.map((x) => x.field)).toContain('nameplate.R');
    expect(rp.rated.current_A).toBeCloseTo(160 * Math.SQRT2, 10);
    expect(rp.findings).toEqual([]); // Kt 0.54 N·m/A rms agrees with Ke within 5 %
  });
});

describe('demo projects: invented loss data', () => {
  // what each demo's note says its invented losses give at top speed without load: iron loss
  // P_fe = kh f psi^beta + ke f² psi² at the magnet's flux linkage (20 °C), the Steinmetz hysteresis
  // term (Steinmetz, 1892, "On the law of hysteresis") with the classical eddy term (Bertotti, 1988,
  // "General properties of power losses in soft ferromagnetic materials", IEEE Trans. Magn. 24(1)),
  // and windage kw omega_m³; the sizes are common practice (no source) for such machines
  const AT_TOP_SPEED: Record<string, { iron_W: number; windage_W: number; fsw_Hz: number }> = {
    'demo-ipm-traction': { iron_W: 400, windage_W: 100, fsw_Hz: 10000 },
    'demo-ipm-saturated': { iron_W: 400, windage_W: 100, fsw_Hz: 10000 },
    'demo-spm-48v': { iron_W: 43, windage_W: 5, fsw_Hz: 20000 },
    'demo-servo-axis': { iron_W: 34, windage_W: 1, fsw_Hz: 16000 },
  };
  for (const [name, want] of Object.entries(AT_TOP_SPEED)) {
    it(`${name} loads with its losses section, labelled invented, of the size its note says`, () => {
      const rp = loadProjectText(demoText(name));
      expect(rp.file.note).toMatch(/loss coefficients \(losses\) are .*invented too/);
      const { iron, windage, inverter } = rp.losses;
      expect(iron && windage && inverter).toBeTruthy();
      expect(iron!.beta).toBe(2);
      expect(inverter!.fsw_Hz).toBe(want.fsw_Hz);
      const wm = rp.rated.maxSpeed_rad_s!;
      const f = (rp.machine20.polePairs * wm) / (2 * Math.PI);
      const psi = rp.machine20.psiM;
      const pFe = iron!.kh * f * psi ** iron!.beta + iron!.ke * f * f * psi * psi;
      expect(Math.abs(pFe / want.iron_W - 1)).toBeLessThan(0.15);
      expect(Math.abs((windage!.kw * wm ** 3) / want.windage_W - 1)).toBeLessThan(0.15);
    });
  }

  it('the traction demos use an IGBT module, the 48 V demo MOSFETs (Vce0 0, rce only, the body diode)', () => {
    const traction = loadProjectText(demoText('demo-ipm-traction')).losses;
    expect(traction.inverter).toEqual({ Vce0: 0.8, rce: 0.002, Vf0: 0.9, rd: 0.0015, EonEoff_J: 0.02, Err_J: 0.005, Vref_V: 300, Iref_A: 200, fsw_Hz: 10000 });
    expect(loadProjectText(demoText('demo-ipm-saturated')).losses).toEqual(traction);
    const spm = loadProjectText(demoText('demo-spm-48v')).losses.inverter!;
    expect(spm.Vce0).toBe(0);
    expect(spm.rce).toBe(0.0015);
    expect(spm.Vf0).toBe(0.7);
    expect(loadProjectText(demoText('demo-servo-axis')).losses.inverter!.Vref_V).toBe(300);
  });
});

describe('resolveProject', () => {
  it('hot and cold machines, peak and continuous limits', () => {
    const rp = loadProjectText(demoText('demo-spm-48v'));
    // R(T) = R20 (1 + 0.00393 (T - 20)), IEC 60028; psi(T) = psi20 (1 + alpha (T - 20)), conventions page
    expect(rp.hot.Rs).toBeCloseTo(0.012 * (1 + 0.00393 * 90), 14);
    expect(rp.hot.psiM).toBeCloseTo(0.0095 * (1 - 0.0012 * 70), 14);
    expect(rp.cold.Rs).toBeCloseTo(0.012 * (1 - 0.00393 * 40), 14);
    expect(rp.cold.psiM).toBeCloseTo(0.0095 * (1 + 0.0012 * 40), 14);
    expect(rp.hot.Ld).toBe(4.5e-5);
    // SVPWM Vdc/sqrt3 (Holmes and Lipo, 2003, Pulse Width Modulation for Power Converters), utilisation 0.95, two 0.2 V drops
    expect(rp.peak.Vmax).toBeCloseTo((0.95 * (48 - 0.4)) / Math.sqrt(3), 12);
    expect(rp.peak.Imax).toBe(200);
    expect(rp.continuous.Imax).toBe(100);
    expect(rp.continuous.Vmax).toBe(rp.peak.Vmax);
    expect(rp.mechanics).toEqual({ inertia: 0.0004, viscousFriction: 0.00005, coulombFriction: 0.05 });
    expect(rp.conditions).toEqual({ windingTemp_C: 110, magnetTemp_C: 90, coldTemp_C: -20, magnetTempCoeff: -0.0012 });
    expect(rp.requirements.length).toBe(5);
    expect(rp.interpretation).toEqual([]);
  });

  it('rated current above the inverter current is a finding', () => {
    const j = demoJson('demo-ipm-traction');
    j.inverter.Imax = 200;
    j.inverter.Icont = 150;
    const rp = resolveProject(parseProject(j));
    expect(rp.findings.map((f) => f.code)).toContain('rated-current-above-imax');
    const k = demoJson('demo-ipm-traction');
    k.inverter.Icont = 200;
    expect(resolveProject(parseProject(k)).findings.map((f) => f.code)).toEqual(['rated-current-above-icont']);
  });

  it('an inverter current above the motor peak current is a demagnetisation caution on inverter.Imax', () => {
    // traction demo: the motor's peak is 318 A rms = 449.7 A peak, the inverter 450 A peak (within 1 %)
    const ok = resolveProject(parseProject(demoJson('demo-ipm-traction')));
    expect(ok.findings.some((f) => f.code === 'imax-above-motor-peak')).toBe(false);
    const j = demoJson('demo-ipm-traction');
    j.inverter.Imax = 600;
    const f = resolveProject(parseProject(j)).findings.find((x) => x.code === 'imax-above-motor-peak');
    expect(f?.severity).toBe('danger');
    expect(f?.field).toBe('inverter.Imax');
    expect(f?.message).toMatch(/600 A peak \(424.3 A rms\) is above the motor.s peak current 449.7 A peak \(318 A rms\).*demagnetising/);
  });

  it('a missing cold-corner temperature is taken as 20 °C and said so', () => {
    const j = demoJson('demo-spm-48v');
    delete j.conditions.coldTemp_C;
    const rp = resolveProject(parseProject(j));
    expect(rp.conditions.coldTemp_C).toBe(20);
    expect(rp.findings.find((f) => f.code === 'cold-corner-assumed')?.field).toBe('conditions.coldTemp_C');
    // at 20 °C the cold machine is the 20 °C machine (common practice (no source): no correction at the reference temperature)
    expect(rp.cold.psiM).toBeCloseTo(rp.machine20.psiM, 12);
    expect(resolveProject(parseProject(demoJson('demo-spm-48v'))).findings.some((f) => f.code === 'cold-corner-assumed')).toBe(false);
  });

  it('a minimal file works: no conditions (every temperature 20 °C) and no modulation (SVPWM), each said as a finding', () => {
    const rp = loadProjectText(JSON.stringify({
      format: 'torquewise-project', version: 1, name: 'minimal (invented)',
      motor: { polePairs: 4, Rs: 0.5, Ld: 0.001, Lq: 0.001, psiM: 0.05, inertia: 0.001 },
      inverter: { Vdc: 300, Imax: 20, Icont: 10 },
    }));
    expect(rp.conditions).toEqual({ windingTemp_C: 20, magnetTemp_C: 20, coldTemp_C: 20, magnetTempCoeff: -0.0012 });
    // at 20 °C the hot and cold machines are the 20 °C machine (common practice (no source): no correction at the reference temperature)
    expect(rp.hot).toEqual(rp.machine20);
    expect(rp.cold).toEqual(rp.machine20);
    expect(rp.inverter.modulation).toBe('svpwm');
    expect(rp.peak.Vmax).toBeCloseTo(300 / Math.sqrt(3), 9); // SVPWM linear range Vdc/√3 (conventions.md)
    const codes = rp.findings.map((f) => [f.code, f.field, f.severity]);
    expect(codes).toContainEqual(['conditions-assumed', 'conditions', 'info']);
    expect(codes).toContainEqual(['modulation-assumed', 'inverter.modulation', 'info']);
    // one finding for the whole section, not a second one for the cold corner
    expect(rp.findings.some((f) => f.code === 'cold-corner-assumed')).toBe(false);
    expect(rp.findings.find((f) => f.code === 'conditions-assumed')?.message).toMatch(/every temperature \(winding, magnet, cold corner\) is taken at 20 °C/);
    // conditions without a winding temperature: that one at 20 °C, said on its field
    const j = demoJson('demo-spm-48v');
    delete j.conditions.windingTemp_C;
    const w = resolveProject(parseProject(j));
    expect(w.conditions.windingTemp_C).toBe(20);
    expect(w.hot.Rs).toBeCloseTo(w.machine20.Rs, 12);
    expect(w.findings.find((f) => f.code === 'winding-temp-assumed')?.field).toBe('conditions.windingTemp_C');
    // the demos give both: no such findings
    for (const name of DEMOS) {
      const d = loadProjectText(demoText(name)).findings.map((f) => f.code);
      expect(d).not.toContain('conditions-assumed');
      expect(d).not.toContain('modulation-assumed');
    }
  });

  it('a requirement carries its duty into the resolved project, peak when not given', () => {
    const j = demoJson('demo-servo-axis');
    j.requirements[0].duty = 'continuous';
    const rp = resolveProject(parseProject(j));
    expect(rp.requirements.map((r) => r.duty)).toEqual(['continuous', 'peak', 'peak', 'peak']);
  });

  it('rated point outside the voltage is a finding', () => {
    const j = demoJson('demo-ipm-traction');
    j.inverter.Vdc = 120;
    const f = resolveProject(parseProject(j)).findings.find((x) => x.code === 'rated-point-infeasible');
    expect(f?.severity).toBe('warning');
    expect(f?.message).toMatch(/^The rated point \(90 N·m at 4000 rpm\) is outside this inverter/);
  });

  it('a Kt far from Ke is carried into the project findings', () => {
    const j = demoJson('demo-ipm-traction');
    j.nameplate.Kt = { value: 0.54, unit: 'Nm/A_peak' };
    expect(resolveProject(parseProject(j)).findings.map((f) => f.code)).toEqual(['kt-ke-mismatch']);
  });
});

describe('loadProjectText', () => {
  it('a JSON syntax error names the line and column', () => {
    const text = demoText('demo-servo-axis').replace('"polePairs": 4,', '"polePairs": 4,,');
    const msg = messageOf(() => loadProjectText(text));
    const line = text.split('\n').findIndex((l) => l.includes('"polePairs": 4,,')) + 1;
    const col = text.split('\n')[line - 1].indexOf(',,') + 2;
    expect(msg).toMatch(/^file is not valid JSON: /);
    expect(msg).toContain(`at line ${line} column ${col}`);
    expect(messageOf(() => loadProjectText('{"format": "torquewise-project"'))).toMatch(/^file is not valid JSON: .* at line 1 column 32$/);
    expect(messageOf(() => loadProjectText(''))).toBe('file is not valid JSON: Unexpected end of JSON input at line 1 column 1');
    // a bad literal: the parser gives no position, so it is located by bisection
    const bad = '{\n  "format": "torquewise-project",\n  "version": tru\n}';
    const m2 = messageOf(() => loadProjectText(bad));
    expect(m2).toMatch(/^file is not valid JSON: /);
    expect(m2).toBe("file is not valid JSON: Unexpected token '\\n' at line 3 column 17");
    expect(m2).not.toContain('torquewise-project'); // no echo of the text
  });

  it('an invisible character in the text is named by its code point', () => {
    const m = messageOf(() => loadProjectText('{"format": \u0000}'));
    expect(m).toMatch(/^file is not valid JSON: .*U\+0000.* at line 1 column 12$/);
    expect(m).not.toMatch(/\u0000/);
    const twice = messageOf(() => loadProjectText('\ufeff\ufeff{}'));
    expect(twice).toMatch(/U\+FEFF/);
  });

  it('a leading byte-order mark is ignored', () => {
    expect(loadProjectText('\uFEFF' + demoText('demo-servo-axis')).machine20.Rs).toBe(1.1);
  });

  it('schema problems come through as InputError naming the path', () => {
    const j = demoJson('demo-servo-axis');
    j.motor.Ld = 0;
    expect(messageOf(() => loadProjectText(JSON.stringify(j)))).toBe('motor.Ld must be >= 1e-9 H');
  });
});

describe('loadProject (the one pipeline: JSON with the duplicate-key check, migrate, schema, resolve)', () => {
  it('gives the file as written at the current version and what it resolves to', () => {
    const text = demoText('demo-servo-axis');
    const { file, resolved } = loadProject(text);
    expect(file).toEqual(JSON.parse(text));
    expect(resolved.machine20.Rs).toBe(1.1);
    expect(resolved).toEqual(loadProjectText(text));
    expect(loadProjectJson(JSON.parse(text)).resolved).toEqual(resolved);
  });

  it('a newer file is brought to the current version (read-only, said first)', () => {
    const j = { ...demoJson('demo-spm-48v'), version: 7 };
    const { file, resolved } = loadProject(JSON.stringify(j));
    expect(file['version']).toBe(1);
    expect(j.version).toBe(7); // the input is not changed
    expect(resolved.readOnly).toBe(true);
    expect(resolved.findings[0]!.code).toBe('newer-format');
    expect(resolved.inverter.Vdc).toBe(48);
  });

  it('lists every problem of the file, each naming its path', () => {
    const j = demoJson('demo-servo-axis');
    j.motor.Ld = 0;
    j.inverter.Vdc = -1;
    const e = refusal(() => loadProject(JSON.stringify(j)));
    expect(e.problems).toEqual([
      { path: 'motor.Ld', message: 'must be >= 1e-9 H' },
      { path: 'inverter.Vdc', message: 'must be > 0 V' },
    ]);
  });

  it('refuses a key given twice, by its path', () => {
    const text = demoText('demo-servo-axis').replace('"Vdc": ', '"Vdc": 1, "Vdc": ');
    const e = refusal(() => loadProject(text));
    expect(e.field).toBe('inverter.Vdc');
    expect(e.message).toBe('inverter.Vdc is given twice in one object; give each key once (which of the values was meant is a guess)');
  });
});

describe('no NaN escapes', () => {
  it('any valid motor, inverter and conditions resolve to finite machines and limits', () => {
    const d = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });
    fc.assert(
      fc.property(
        fc.record({
          polePairs: fc.integer({ min: 1, max: 200 }),
          Rs: d(1e-6, 1000),
          Ld: d(1e-9, 10),
          Lq: d(1e-9, 10),
          psiM: d(1e-6, 100),
          inertia: d(1e-9, 1e5),
        }),
        fc.record({ Vdc: d(1, 1e5), Imax: d(1e-3, 1e6), frac: d(0.001, 1), modulation: fc.constantFrom('sinusoidal', 'svpwm', 'six-step'), voltageUtilization: d(0.01, 1) }),
        fc.record({ windingTemp_C: d(-60, 250), magnetTemp_C: d(-60, 250), coldTemp_C: d(-60, 250), magnetTempCoeff: d(-0.003, 0.001) }),
        (motor, inv, conditions) => {
          const { frac, ...rest } = inv;
          const file = parseProject({ format: 'torquewise-project', version: 1, motor, inverter: { ...rest, Icont: rest.Imax * frac }, conditions });
          const rp = resolveProject(file);
          for (const m of [rp.machine20, rp.hot, rp.cold]) for (const v of Object.values(m)) expect(Number.isFinite(v)).toBe(true);
          expect(rp.hot.psiM).toBeGreaterThan(0);
          expect(rp.cold.Rs).toBeGreaterThan(0);
          for (const l of [rp.peak, rp.continuous]) {
            expect(Number.isFinite(l.Vmax) && l.Vmax > 0).toBe(true);
            expect(Number.isFinite(l.Imax) && l.Imax > 0).toBe(true);
          }
        },
      ),
    );
  });
});
