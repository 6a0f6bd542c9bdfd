import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { loadProjectText } from '../src/core/project/project';
import type { ResolvedProject } from '../src/core/project/project';
import { simulationFindings, rampedReference, runSimulation, TRACE_NAMES } from '../src/core/simulation/simulate';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import type { SimulationResult } from '../src/core/simulation/simulate';
import { stepResponse, loadStepResponse, steadyStateError } from '../src/core/simulation/metrics';
import { MAX_TRACE_POINTS } from '../src/core/simulation/decimate';

// the demos with the true rotor angle (control.angle ideal): these checks are about the plant and the loops, not the angle source
const demo = (f: string): any => {
  const o = JSON.parse(readFileSync(resolve(__dirname, '..', 'resources', `${f}.json`), 'utf8'));
  if (o.control) o.control.angle = { source: 'ideal' };
  return o;
};
const proj = (o: unknown): ResolvedProject => loadProjectText(JSON.stringify(o));
/** untouched traces: every run here is shorter than the largest trace length a run may ask for */
const FULL = { maxPoints: MAX_TRACE_POINTS };

function noNaN(r: SimulationResult): void {
  for (const v of Object.values(r.metrics)) expect(v === null || Number.isFinite(v)).toBe(true);
  for (const n of TRACE_NAMES) for (const x of r.traces[n]) expect(Number.isFinite(x)).toBe(true);
}

/** a surface-magnet variant of the servo demo (Ld = Lq), no friction unless asked */
function spmServo(control: object, scenario: object, motor: object = {}): ResolvedProject {
  const o = demo('demo-servo-axis');
  o.motor = { ...o.motor, Ld: 0.005, Lq: 0.005, viscousFriction: 0, coulombFriction: 0, ...motor };
  o.control = control;
  o.scenario = scenario;
  return proj(o);
}

describe('cascade simulator against outside references', () => {
  it('IMC current loop answers a step like a first-order lag 1/omega_c, within the sample delay', () => {
    // Harnefors and Nee, 1998, Model-based current control of AC machines using the internal model control method:
    // the IMC-tuned loop is omega_c/s, closed loop a first-order lag with time constant 1/omega_c.
    for (const [fCtrl, delay] of [[10000, 1], [50000, 0]] as const) {
      const p = spmServo(
        { mode: 'current-step', fCtrl_Hz: fCtrl, delaySamples: delay, currentBandwidth_Hz: 300 },
        { duration_s: 0.006, currentStep: { id_A: 0, iq_A: 4, t_s: 0.001 } },
      );
      const r = runSimulation(simulationFromProject(p), FULL);
      const tau = 1 / (2 * Math.PI * 300);
      const Td = delay / fCtrl + 0.5 / fCtrl;
      const t = r.traces.t_s, iq = r.traces.iq_A;
      let worst = 0;
      let t63 = NaN;
      for (let i = 0; i < t.length; i++) {
        const x = t[i]! - 0.001;
        if (x < 0) continue;
        worst = Math.max(worst, Math.abs(iq[i]! - 4 * (1 - Math.exp(-x / tau))));
        if (Number.isNaN(t63) && iq[i]! >= 4 * (1 - Math.exp(-1))) t63 = x;
      }
      // deviation from the ideal lag bounded by the delay's share of the time constant
      expect(worst).toBeLessThan(4 * (2 * Math.PI * 300) * Td);
      expect(Math.abs(t63 - tau)).toBeLessThan(Td + 1 / fCtrl);
      expect(iq[iq.length - 1]!).toBeCloseTo(4, 2);
      expect(Math.max(...r.traces.id_A.map(Math.abs))).toBeLessThan(1e-9); // locked rotor, no coupling
    }
  });

  it('constant torque, no load, no friction: omega = T t / J', () => {
    // Newton's second law for rotation, J domega/dt = T
    const p = spmServo(
      { mode: 'torque', fCtrl_Hz: 10000, currentBandwidth_Hz: 1000 },
      { duration_s: 0.05, torqueSteps: [{ t_s: 0, torque_Nm: 0.5 }], loadInertia: 0.0001 },
    );
    const setup = simulationFromProject(p);
    const J = setup.plant.inertia;
    expect(J).toBeCloseTo(0.00022, 12);
    const r = runSimulation(setup, FULL);
    const n = r.traces.t_s.length;
    const tEnd = r.traces.t_s[n - 1]!;
    const w = (r.traces.speed_rpm[n - 1]! * 2 * Math.PI) / 60;
    // the current loop lags by about 1/omega_c + Td: the speed is short by T (1/omega_c + Td)/J at most
    const lag = 1 / (2 * Math.PI * 1000) + 1.5e-4;
    expect(w).toBeLessThanOrEqual((0.5 * tEnd) / J);
    expect(w).toBeGreaterThan((0.5 * (tEnd - 1.5 * lag)) / J);
    expect(r.traces.torque_Nm[n - 1]!).toBeCloseTo(0.5, 3);
  });

  it('symmetric optimum a = 2: about 43 % overshoot without a prefilter, under 10 % with it', () => {
    // from memory: Kessler's symmetric optimum (1958) with a = 2 overshoots 40-45 % on a reference step;
    // the first-order prefilter with the integral time brings it under about 10 %.
    const make = (): ResolvedProject =>
      spmServo(
        { mode: 'speed', fCtrl_Hz: 10000, currentBandwidth_Hz: 800, speedTuning: { method: 'symmetric-optimum', a: 2 } },
        { duration_s: 0.05, initialSpeed_rpm: 1000, speedSteps: [{ t_s: 0.005, speed_rpm: 1010 }], loadInertia: 0.0001 },
      );
    const raw = runSimulation(simulationFromProject(make()), FULL);
    const pre = runSimulation(simulationFromProject(make(), { speedRefPrefilter: true }), FULL);
    expect(raw.metrics.speedOvershoot_pct!).toBeGreaterThan(38);
    expect(raw.metrics.speedOvershoot_pct!).toBeLessThan(48);
    expect(pre.metrics.speedOvershoot_pct!).toBeLessThan(10);
    expect(raw.events.filter((e) => e.kind !== 'overspeed')).toEqual([]); // linear: no limit touched
    // the same prefilter from the project file's control.speedPrefilter
    const fromFile = spmServo(
      { mode: 'speed', fCtrl_Hz: 10000, currentBandwidth_Hz: 800, speedTuning: { method: 'symmetric-optimum', a: 2 }, speedPrefilter: true },
      { duration_s: 0.05, initialSpeed_rpm: 1000, speedSteps: [{ t_s: 0.005, speed_rpm: 1010 }], loadInertia: 0.0001 },
    );
    expect(runSimulation(simulationFromProject(fromFile), FULL).metrics.speedOvershoot_pct!).toBeCloseTo(pre.metrics.speedOvershoot_pct!, 9);
  });

  it('after a load step on a surface-PM motor iq settles at (T_load + B omega + T_c)/(1.5 p psiM)', () => {
    // torque balance at steady speed with T_e = 1.5 p psiM iq (conventions page; Newton's second law)
    const p = spmServo(
      { mode: 'speed', fCtrl_Hz: 10000, currentBandwidth_Hz: 800, speedBandwidth_Hz: 60 },
      { duration_s: 0.25, initialSpeed_rpm: 1500, speedSteps: [], loadSteps: [{ t_s: 0.02, torque_Nm: 1.2 }], loadInertia: 0.0001 },
      { viscousFriction: 2e-4, coulombFriction: 0.03 },
    );
    const setup = simulationFromProject(p);
    const r = runSimulation(setup, FULL);
    const n = r.traces.t_s.length;
    const w = (1500 * 2 * Math.PI) / 60;
    const m = setup.plant.machine;
    const expected = (1.2 + 2e-4 * w + 0.03) / (1.5 * m.polePairs * m.psiM);
    expect(Math.abs(r.traces.iq_A[n - 1]! / expected - 1)).toBeLessThan(1e-3);
    expect(r.metrics.finalSpeed_rpm!).toBeCloseTo(1500, 2);
    expect(r.metrics.loadStepDip_rpm!).toBeGreaterThan(1);
    expect(r.metrics.loadStepRecovery_s!).toBeGreaterThan(0);
    expect(r.metrics.loadStepRecovery_s!).toBeLessThan(0.2);
  });

  it('balanced phase currents: amplitude sqrt(id² + iq²), electrical frequency p n / 60', () => {
    // amplitude-invariant Clarke/Park (conventions page): |i_abc| peak = |i_dq|; f_e = p n / 60
    const o = demo('demo-servo-axis');
    o.scenario = { duration_s: 0.06, initialSpeed_rpm: 1200, speedSteps: [], loadSteps: [{ t_s: 0, torque_Nm: 1 }], loadInertia: 0.0001 };
    const setup = simulationFromProject(proj(o));
    const r = runSimulation(setup, FULL);
    const t = r.traces.t_s;
    const i0 = t.findIndex((x) => x >= 0.03);
    const n = t.length;
    const amp = Math.hypot(r.traces.id_A[n - 1]!, r.traces.iq_A[n - 1]!);
    for (const ph of [r.traces.ia_A, r.traces.ib_A, r.traces.ic_A]) {
      let mx = -Infinity;
      let mn = Infinity;
      const ups: number[] = [];
      for (let i = i0; i < n; i++) {
        mx = Math.max(mx, ph[i]!);
        mn = Math.min(mn, ph[i]!);
        if (i > i0 && ph[i - 1]! < 0 && ph[i]! >= 0) ups.push(t[i - 1]! + (-ph[i - 1]! / (ph[i]! - ph[i - 1]!)) * (t[i]! - t[i - 1]!));
      }
      expect(mx).toBeCloseTo(amp, 1);
      expect(-mn).toBeCloseTo(amp, 1);
      const f = (ups.length - 1) / (ups[ups.length - 1]! - ups[0]!);
      expect(f).toBeCloseTo((setup.plant.machine.polePairs * 1200) / 60, 0);
    }
    // the three phases sum to zero
    for (let i = 0; i < n; i += 97) expect(r.traces.ia_A[i]! + r.traces.ib_A[i]! + r.traces.ic_A[i]!).toBeCloseTo(0, 9);
  });
});

describe('cascade simulator behaviour', () => {
  it('runs every demo with at most 10 derivative evaluations per period and no NaN', () => {
    for (const f of ['demo-spm-48v', 'demo-ipm-traction', 'demo-servo-axis']) {
      const r = runSimulation(simulationFromProject(proj(demo(f))));
      expect(r.diagnostic).toBeUndefined();
      expect(r.stats.evaluationsPerPeriod).toBeLessThanOrEqual(10);
      expect(r.stats.rhsEvaluations / r.stats.controlSteps).toBeLessThanOrEqual(10);
      expect(r.traces.t_s.length).toBeLessThanOrEqual(5000);
      noNaN(r);
      const ref = demo(f).scenario.speedSteps[0].speed_rpm;
      expect(r.metrics.finalSpeed_rpm!).toBeCloseTo(ref, -1);
      for (const x of r.traces.vNorm) expect(x).toBeLessThanOrEqual(1 + 1e-9);
    }
  });

  it('a speed step too large for the bus saturates the voltage and reports it', () => {
    const o = demo('demo-spm-48v');
    o.inverter.voltageUtilization = 1; // the steady state may use the whole modulation range
    o.scenario = { ...o.scenario, speedSteps: [{ t_s: 0.01, speed_rpm: 20000 }], loadSteps: [] };
    const r = runSimulation(simulationFromProject(proj(o)));
    expect(r.metrics.voltageSaturation_s!).toBeGreaterThan(0.01);
    expect(r.events.some((e) => e.kind === 'voltage-saturation' && e.tEnd_s! > e.t_s)).toBe(true);
    expect(r.diagnostic).toBeUndefined(); // saturation is not an instability
    expect(r.metrics.peakCurrent_A!).toBeLessThan(1.1 * 200);
    noNaN(r);
  });

  it('unstable gains end the run with a diagnostic naming the time and the state, never NaN', () => {
    const p = spmServo(
      { mode: 'current-step', fCtrl_Hz: 10000, currentKp: 200, currentKi: 1000 },
      { duration_s: 0.05, currentStep: { id_A: 0, iq_A: 2, t_s: 0.001 } },
    );
    const r = runSimulation(simulationFromProject(p));
    expect(r.diagnostic).toMatch(/diverged at t = [0-9.e-]+ s/);
    expect(r.diagnostic).toMatch(/iq = /);
    expect(r.diagnostic).toMatch(/oscillates/);
    expect(r.events.some((e) => e.kind === 'divergence')).toBe(true);
    expect(r.stats.controlSteps).toBeLessThan(500);
    noNaN(r);
  });

  it('an unstable speed loop ends the run with a diagnostic; the tuned demos do not trip the watch', () => {
    const servo = demo('demo-servo-axis');
    // speed gains far too high for the inertia: the tuning's own margin says unstable
    const { speedBandwidth_Hz: _b, speedTuning: _t, ...control } = servo.control;
    const bad = proj({ ...servo, control: { ...control, speedKp: 50, speedKi: 1e6 } });
    const setup = simulationFromProject(bad);
    expect(setup.tuning!.speed.continuous.phaseMargin_deg!).toBeLessThan(0); // common practice (no source): PM < 0 is unstable
    // the sampled loop's gain is still above one at its Nyquist frequency: flagged as a danger
    expect(setup.tuning!.speed.gainAtNyquist_dB).toBeGreaterThan(0);
    expect(setup.tuning!.warnings.some((w) => w.code === 'crossover-above-nyquist' && w.field === 'control.speedTuning')).toBe(true);
    const r = runSimulation(setup);
    expect(r.diagnostic).toMatch(/speed loop oscillates/);
    expect(r.diagnostic).toMatch(/swung between the motoring and the generating limit 8 times/);
    expect(r.events.filter((e) => e.kind === 'divergence')).toHaveLength(1);
    expect(r.stats.controlSteps * setup.controller.Ts).toBeLessThan(servo.scenario.duration_s);
    noNaN(r);
    for (const f of ['demo-spm-48v', 'demo-ipm-traction', 'demo-servo-axis']) {
      const ok = runSimulation(simulationFromProject(proj(demo(f))));
      expect(ok.diagnostic).toBeUndefined();
    }
  });

  it('names what the scenario asks beyond the motor or the drive, before and after the run', () => {
    const servo = demo('demo-servo-axis');
    expect(simulationFromProject(proj(servo)).findings).toEqual([]);
    // 50 000 rpm on a motor rated 6000 rpm, on a 320 V bus, with a 50 N·m load on a drive of about 9 N·m
    const far = proj({
      ...servo,
      scenario: { ...servo.scenario, speedSteps: [{ t_s: 0.005, speed_rpm: 50000 }], loadSteps: [{ t_s: 0.05, torque_Nm: 50 }] },
    });
    const setup = simulationFromProject(far);
    const f = setup.findings!;
    const by = (code: string) => f.filter((x) => x.code === code);
    expect(by('speed-above-motor-max').map((x) => x.field)).toEqual(['scenario.speedSteps[0].speed_rpm']);
    expect(by('load-above-drive').map((x) => x.field)).toEqual(['scenario.loadSteps[0].torque_Nm']);
    // back-EMF sqrt(3) p omega psiM, cold magnet, against the bus (common practice (no source))
    const emf = by('back-emf-above-bus');
    expect(emf).toHaveLength(1);
    expect(emf[0]!.severity).toBe('danger');
    expect(emf[0]!.message).toMatch(/IEC 61800-5-1/);
    const wMax = 50000 * (Math.PI / 30);
    expect(emf[0]!.message).toContain(`${(Math.sqrt(3) * far.cold.polePairs * wMax * far.cold.psiM).toFixed(0)} V line-to-line peak`);
    // overspeed is the motor's maximum speed when the file gives one
    expect(setup.overspeed_rad_s).toBeCloseTo(6000 * (Math.PI / 30), 9);
    const r = runSimulation(setup);
    expect(r.events.some((e) => e.kind === 'overspeed')).toBe(true);
    // the reference is out of reach: said after the run, with the tuning warnings and the setup's findings
    const after = simulationFindings(r, setup).map((x) => x.code);
    expect(after).toEqual(expect.arrayContaining(['speed-above-motor-max', 'load-above-drive', 'back-emf-above-bus']));
    // a load the drive holds gives no load finding; a reachable reference gives no speed-not-reached
    const fine = proj({ ...servo, scenario: { ...servo.scenario, loadSteps: [{ t_s: 0.05, torque_Nm: 2 }] } });
    const sf = simulationFromProject(fine);
    expect(sf.findings!.some((x) => x.code === 'load-above-drive')).toBe(false);
    expect(simulationFindings(runSimulation(sf), sf).some((x) => x.code === 'speed-not-reached')).toBe(false);
  });

  it('the ramped speed reference the load check uses: linear at the ramp rate, a later step retargets', () => {
    // common practice (no source): a rate limiter moves the reference toward its target at a fixed rate
    const steps = [{ t: 0.1, v: 100 }, { t: 0.5, v: 20 }];
    expect(rampedReference(0, steps, Infinity, 0.2)).toBe(100);
    expect(rampedReference(0, steps, 200, 0.05)).toBe(0);
    expect(rampedReference(0, steps, 200, 0.3)).toBeCloseTo(40, 12);
    expect(rampedReference(0, steps, 200, 0.55)).toBeCloseTo(70, 12); // 80 at 0.5 s, then down toward 20
    expect(rampedReference(0, steps, 200, 2)).toBeCloseTo(20, 12);
  });

  it('measures each load step, and leaves one met before the speed settled unmeasured, saying why', () => {
    const servo = demo('demo-servo-axis');
    // two load steps after the speed step has settled: both measured, the first gives the keys
    const two = proj({ ...servo, scenario: { ...servo.scenario, duration_s: 0.15, loadSteps: [{ t_s: 0.05, torque_Nm: 2 }, { t_s: 0.1, torque_Nm: 4 }] } });
    const s2 = simulationFromProject(two);
    const r2 = runSimulation(s2, FULL);
    expect(r2.loadSteps.map((l) => l.t_s)).toEqual([0.05, 0.1]);
    for (const l of r2.loadSteps) {
      expect(l.settled).toBe(true);
      expect(l.dip_rpm!).toBeGreaterThan(0);
    }
    expect(r2.metrics.loadStepDip_rpm).toBe(r2.loadSteps[0]!.dip_rpm);
    // each equals the array form on the full-rate traces, over its own window (common practice (no source))
    const tr = r2.traces;
    const n = tr.t_s.length;
    expect(r2.loadSteps[1]!.dip_rpm!).toBeCloseTo(loadStepResponse(tr.t_s, tr.speedRef_rpm, tr.speed_rpm, n, 0.1, Infinity, undefined, 1).dip!, 9);
    // a load step 1 ms after the speed step: the speed is far from its reference, nothing is measured
    const early = proj({ ...servo, scenario: { ...servo.scenario, loadSteps: [{ t_s: 0.006, torque_Nm: 2 }] } });
    const se = simulationFromProject(early);
    const re = runSimulation(se);
    expect(re.loadSteps[0]!.settled).toBe(false);
    expect(re.loadSteps[0]!.errorAtStep_rpm!).toBeGreaterThan(100);
    expect(re.metrics.loadStepDip_rpm).toBeNull();
    expect(simulationFindings(re, se).some((f) => f.code === 'load-step-unsettled')).toBe(true);
  });

  it('says the speed reference was not reached when the run ends short of it', () => {
    const servo = demo('demo-servo-axis');
    // a thousand times the inertia: the step cannot complete within the run
    const heavy = proj({ ...servo, scenario: { ...servo.scenario, loadInertia: 0.5 } });
    const setup = simulationFromProject(heavy);
    const r = runSimulation(setup);
    const nr = simulationFindings(r, setup).filter((x) => x.code === 'speed-not-reached');
    expect(nr).toHaveLength(1);
    expect(nr[0]!.message).toMatch(/reference of 2000 rpm/);
  });

  it('an overcurrent trip stops a run whose current runs away', () => {
    const p = spmServo(
      { mode: 'current-step', fCtrl_Hz: 10000, currentBandwidth_Hz: 300 },
      { duration_s: 0.05, currentStep: { id_A: 0, iq_A: 14, t_s: 0.001 } },
    );
    const setup = simulationFromProject(p);
    setup.tripCurrent_A = 10; // below the asked current
    const r = runSimulation(setup);
    expect(r.diagnostic).toMatch(/overcurrent trip 10\.00 A/);
    // the peak current counts the state that tripped
    expect(r.metrics.peakCurrent_A!).toBeGreaterThan(10);
    noNaN(r);
  });

  it('stops on the abort signal and on the step budget', () => {
    const p = proj(demo('demo-servo-axis'));
    let calls = 0;
    const signal = { get aborted() { return ++calls > 2; } };
    const a = runSimulation(simulationFromProject(p), { signal });
    expect(a.events.some((e) => e.kind === 'aborted')).toBe(true);
    expect(a.stats.controlSteps).toBe(3 * 256);
    const b = runSimulation(simulationFromProject(p), { maxSteps: 100 });
    expect(b.events.some((e) => e.kind === 'budget')).toBe(true);
    expect(b.stats.controlSteps).toBe(100);
    let t = 0;
    const c = runSimulation(simulationFromProject(p), { wallBudget_s: 1, clock: () => (t += 0.4) });
    expect(c.events.some((e) => e.kind === 'budget')).toBe(true);
    noNaN(c);
  });

  it('reports progress up to 1 and the delay-angle compensation changes the result', () => {
    const p = proj(demo('demo-servo-axis'));
    const seen: number[] = [];
    const r1 = runSimulation(simulationFromProject(p), { onProgress: (x) => seen.push(x) });
    expect(seen[seen.length - 1]).toBe(1);
    expect(seen.every((x, i) => i === 0 || x >= seen[i - 1]!)).toBe(true);
    const r0 = runSimulation(simulationFromProject(p, { delayAngleCompensation: false }));
    expect(r0.metrics.rmsCurrent_A).not.toBe(r1.metrics.rmsCurrent_A);
  });

  it('bad scenarios throw InputError naming the field', () => {
    const o = demo('demo-servo-axis');
    o.control.mode = 'torque';
    expect(() => simulationFromProject(proj(o))).toThrow(/scenario.torqueSteps/);
    const q = demo('demo-servo-axis');
    delete q.scenario;
    expect(() => simulationFromProject(proj(q))).toThrow(/scenario/);
  });
});

describe('a phase current above the peak limit', () => {
  it('the servo demo overshoots 15 A in the speed step: a finding on inverter.Imax with the peak, the limit and why', () => {
    const p = proj(demo('demo-servo-axis'));
    const setup = simulationFromProject(p);
    const r = runSimulation(setup, FULL);
    // the largest sampled |i_dq| of the run, read again from the full-rate traces
    let most = 0;
    for (let k = 0; k < r.traces.t_s.length; k++) most = Math.max(most, Math.hypot(r.traces.id_A[k]!, r.traces.iq_A[k]!));
    expect(r.metrics.peakCurrent_A!).toBeCloseTo(most, 9);
    expect(most).toBeCloseTo(15.753, 3); // 5 % above the inverter's 15 A
    // the controller asked for the limit, no more: the overshoot is the current loop's own
    expect(r.peakCurrentAt!.reference_A).toBeCloseTo(15, 6);
    expect(r.peakCurrentAt!.t_s).toBeCloseTo(0.0055625, 9); // 9 periods after the speed step at 5 ms
    const f = simulationFindings(r, setup).find((x) => x.code === 'current-above-limit');
    expect(f?.field).toBe('inverter.Imax');
    expect(f?.severity).toBe('warning');
    expect(f?.message).toMatch(/reached 15\.75 A peak \(11\.14 A rms\) at 5\.563 ms, 5\.0 % above the peak limit 15\.00 A peak/);
    expect(f?.message).toMatch(/asked for 15\.00 A peak .*overshot that reference .*1 period late \(computation delay\)/);
  });

  it('without the computation delay the same step stays within the limit: no finding', () => {
    const o = demo('demo-servo-axis');
    o.control.delaySamples = 0;
    const setup = simulationFromProject(proj(o));
    const r = runSimulation(setup, FULL);
    expect(r.metrics.peakCurrent_A!).toBeLessThan(15);
    expect(simulationFindings(r, setup).map((f) => f.code)).not.toContain('current-above-limit');
  });

  it('names motor.peakCurrent when the motor binds, against its (lower) limit', () => {
    const o = demo('demo-servo-axis');
    o.motor.peakCurrent = 14; // invented: below the inverter's 15 A
    const p = proj(o);
    const setup = simulationFromProject(p);
    expect(setup.Imax).toBe(14);
    expect(setup.currentLimitField).toBe('motor.peakCurrent');
    const r = runSimulation(setup, FULL);
    expect(r.peakCurrentAt!.reference_A).toBeCloseTo(14, 6);
    const f = simulationFindings(r, setup).find((x) => x.code === 'current-above-limit');
    expect(f?.field).toBe('motor.peakCurrent');
    expect(f?.message).toMatch(/above the peak limit 14\.00 A peak \(9\.899 A rms\) \(motor\.peakCurrent\)/);
    expect(r.metrics.peakCurrent_A!).toBeGreaterThan(14 * 1.001);
  });
});

describe('streamed metrics and traces', () => {
  it('metrics do not depend on the decimation and equal the array forms on the full-rate traces', () => {
    const p = proj(demo('demo-servo-axis')); // its speed step then load step
    const setup = simulationFromProject(p);
    const full = runSimulation(setup, FULL);
    const dec = runSimulation(setup, { maxPoints: 200 });
    expect(dec.traces.t_s.length).toBeLessThanOrEqual(200);
    expect(full.traces.t_s.length).toBe(full.stats.controlSteps + 1);
    expect(dec.metrics).toEqual(full.metrics);
    // the array forms over the full-rate traces (as the simulator computed them before streaming)
    const tr = full.traces;
    const n = tr.t_s.length;
    const s0 = setup.marks.speedSteps[0]!;
    const l0 = setup.marks.loadEvents[0]!;
    const evs = [...setup.marks.speedSteps.map((s) => s.t), ...setup.marks.loadEvents].sort((a, b) => a - b);
    const after = (t: number): number => evs.find((x) => x > t + 1e-12) ?? Infinity;
    const rpm = 60 / (2 * Math.PI);
    const before = setup.marks.speedSteps.filter((s) => s.t < s0.t).reduce((_, s) => s.v, setup.initialSpeed_rad_s) * rpm;
    const st = stepResponse(tr.t_s, tr.speed_rpm, n, s0.t, after(s0.t), before, s0.v * rpm);
    const ld = loadStepResponse(tr.t_s, tr.speedRef_rpm, tr.speed_rpm, n, l0, after(l0));
    const tLast = tr.t_s[n - 1]!;
    const sse = steadyStateError(tr.t_s, tr.speedRef_rpm, tr.speed_rpm, n, Math.max(0.05 * tLast, 2 * setup.controller.Ts));
    expect(full.metrics.riseTime_s).toBe(st.riseTime_s);
    expect(full.metrics.speedOvershoot_pct).toBe(st.overshoot_pct);
    expect(full.metrics.settlingTime_s).toBe(st.settlingTime_s);
    expect(full.metrics.loadStepDip_rpm).toBe(ld.dip);
    expect(full.metrics.loadStepRecovery_s).toBe(ld.recovery_s);
    expect(full.metrics.steadyStateError_rpm).toBe(sse);
    expect(full.metrics.finalSpeed_rpm).toBe(tr.speed_rpm[n - 1]);
    // the demo's figures are defined (not all null), so the comparison means something
    expect(full.metrics.riseTime_s).toBeGreaterThan(0);
    expect(full.metrics.loadStepDip_rpm).toBeGreaterThan(0);
    expect(full.metrics.loadStepRecovery_s).toBeGreaterThan(0);
  });
});
