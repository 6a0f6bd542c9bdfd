import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadProjectText, type ResolvedProject } from '../src/core/project/project';
import { Plant, loadSchedule } from '../src/core/simulation/plant';
import { Rk4Stepper } from '../src/core/simulation/stepper';
import { LinearDqModel } from '../src/core/machine/linear-dq';
import type { DqMachine } from '../src/core/machine/dq-machine';
import { SensorlessEstimator, type SensorlessOptions } from '../src/core/control/sensorless-estimator';
import { correctionGains, correctionWeight } from '../src/core/control/sensorless-active-flux';
import { wrapToPi as wrapAngle } from '../src/core/control/angle-estimator';
import type { SensorlessAngle } from '../src/core/control/angle-spec';
import { messageOf } from './helpers';

const demo = (name: string): ResolvedProject => loadProjectText(readFileSync(join(__dirname, '..', 'resources', `${name}.json`), 'utf8'));
const sensorless = (over: Partial<SensorlessAngle> = {}): SensorlessAngle => ({ source: 'sensorless', bandwidth_Hz: 100, handoverSpeed_rpm: 300, fluxError_pct: 0, resistanceError_pct: 0, inductanceError_pct: 0, ...over });

interface Run { errPeakAfterStep: number; errSteadyMean: number; errSteadyMax: number; id: number; iq: number; speedErrSteady: number; lost: string | null }

/**
 * A closed current loop of our own: the constant-parameter dq plant (the simulator's Plant,
 * voltage held in alpha-beta over a period, fixed-step RK4 with 20 substeps), the speed held by the
 * load machine (mechanics locked), a discrete PI per axis in the ESTIMATED rotor frame (internal
 * model control: Kp = L wc, Ki = Rs wc; Harnefors and Nee (1998), Model-based current control of AC
 * machines using the internal model control method, IEEE Trans. Industry Applications 34(1)) with
 * decoupling and back-EMF feed-forward at the estimated speed, one period of computation delay
 * (the voltage computed at t_k is held over (t_k+1, t_k+2], rotated by 1.5 we Ts ahead). A torque
 * (load) step of the current reference from zero to (id, iq) at tStep.
 */
function closedLoop(m: DqMachine, spec: SensorlessAngle, Ts: number, bw_Hz: number, wm: number, idRef: number, iqRef: number, tStep: number, tEnd: number): Run {
  const plant = new Plant({ machine: new LinearDqModel(m), inertia: 1, viscousFriction: 0, coulombFriction: 0, load: loadSchedule(), mechanics: 'locked', inputFrame: 'alpha-beta', coulombWidth_rad_s: 1e-3 });
  const stepper = new Rk4Stepper(plant, Ts, 20);
  const p = m.polePairs, we = p * wm, th0 = 0.3;
  const y = new Float64Array([0, 0, wm, th0, 0]);
  const est = new SensorlessEstimator(spec, m, { startupCurrent_A: 0 });
  est.reset(th0, we);
  const wc = 2 * Math.PI * bw_Hz;
  let xd = 0, xq = 0;
  // the period's held voltage and the command waiting for the next period: the back-EMF at rest currents
  const bemf = (th: number): [number, number] => [-we * m.psiM * Math.sin(th), we * m.psiM * Math.cos(th)];
  let lastApplied = bemf(th0 - 0.5 * we * Ts); // held over the period before t = 0
  let applied = bemf(th0 + 0.5 * we * Ts);
  let next = bemf(th0 + 1.5 * we * Ts);
  const n = Math.round(tEnd / Ts);
  let errPeakAfterStep = 0, sum = 0, count = 0, errSteadyMax = 0, wSum = 0;
  for (let k = 0; k < n; k++) {
    const t = k * Ts;
    plant.setAngleOrigin(y[3]!);
    const th = y[3]!, c = Math.cos(th), s = Math.sin(th);
    const ia = c * y[0]! - s * y[1]!, ib = s * y[0]! + c * y[1]!;
    est.sample(th, y[2]!, ia, ib, lastApplied[0], lastApplied[1], Ts);
    const the = est.thetaE, wh = est.omegaE;
    const err = Math.abs(wrapAngle(the - th));
    if (t >= tStep) errPeakAfterStep = Math.max(errPeakAfterStep, err);
    if (t >= tEnd - 0.02) { sum += wrapAngle(the - th); count++; errSteadyMax = Math.max(errSteadyMax, err); wSum += wh - we; }
    const ce = Math.cos(the), se = Math.sin(the);
    const id = ce * ia + se * ib, iq = -se * ia + ce * ib;
    const idr = t >= tStep ? idRef : 0, iqr = t >= tStep ? iqRef : 0;
    const ed = idr - id, eq = iqr - iq;
    const vd = m.Ld * wc * ed + xd - wh * m.Lq * iq;
    const vq = m.Lq * wc * eq + xq + wh * (m.Ld * id + m.psiM);
    xd += m.Rs * wc * Ts * ed;
    xq += m.Rs * wc * Ts * eq;
    const ta = the + 1.5 * wh * Ts, ca = Math.cos(ta), sa = Math.sin(ta);
    const cmd: [number, number] = [ca * vd - sa * vq, sa * vd + ca * vq];
    // one period of delay: this period holds the command of the previous sample
    applied = next;
    next = cmd;
    plant.input[0] = applied[0];
    plant.input[1] = applied[1];
    stepper.period(y, t, t + Ts);
    lastApplied = applied;
  }
  return { errPeakAfterStep, errSteadyMean: sum / count, errSteadyMax, id: y[0]!, iq: y[1]!, speedErrSteady: wSum / count, lost: est.lossOfLock() };
}

const traction = demo('demo-ipm-traction');
const spm = demo('demo-spm-48v');
/** the demo's hot machine (the plant), control rate, current bandwidth, half rated speed (rad/s) and rated current (A peak) */
function caseOf(p: ResolvedProject, ratedSpeed_rpm: number) {
  const c = p.file.control!;
  return { m: p.models.hot as DqMachine, Ts: 1 / c.fCtrl_Hz, bw: c.currentBandwidth_Hz!, wm: (0.5 * ratedSpeed_rpm * 2 * Math.PI) / 60, I: p.rated.current_A! };
}
// the traction demo's nameplate rated speed; the 48 V demo's "rated" requirement (3000 rpm)
const ipmCase = caseOf(traction, (traction.rated.speed_rad_s! * 60) / (2 * Math.PI));
const spmCase = caseOf(spm, spm.file.requirements!.find((r) => r.label === 'rated')!.speed_rpm);

describe('sensorless estimator on a closed current loop, matched parameters, half rated speed', () => {
  it('traction IPM: after a step to rated current at 30° lead the angle error peaks below 0.005 rad and settles below 0.001 rad (0.06°)', () => {
    const { m, Ts, bw, wm, I } = ipmCase;
    const r = closedLoop(m, sensorless(), Ts, bw, wm, -I * Math.sin(Math.PI / 6), I * Math.cos(Math.PI / 6), 0.02, 0.12);
    expect(r.iq).toBeCloseTo(I * Math.cos(Math.PI / 6), -1);
    expect(r.errSteadyMax).toBeLessThan(0.001);
    expect(r.errPeakAfterStep).toBeLessThan(0.005);
    expect(r.lost).toBeNull();
  });
  it('48 V SPM: after a step to rated q current the angle error peaks below 0.005 rad and settles below 0.001 rad', () => {
    const { m, Ts, bw, wm, I } = spmCase;
    const r = closedLoop(m, sensorless(), Ts, bw, wm, 0, I, 0.02, 0.12);
    expect(r.iq).toBeCloseTo(I, -1);
    expect(r.errSteadyMax).toBeLessThan(0.001);
    expect(r.errPeakAfterStep).toBeLessThan(0.005);
    expect(r.lost).toBeNull();
  });
});

/*
 * First-order sensitivity of the active-flux observer to a flux-linkage error dpsiM (the observer's
 * psiM minus the plant's), in steady state at electrical speed we, derived here (complex notation,
 * true rotor frame, delta = thetaHat - theta the steady angle error):
 *
 * 1. The observer's flux error is x = W (psi_i - psi_s) (see sensorless-active-flux.ts: the voltage
 *    model is exact with matched Rs and the voltage held per period; W = W(we) the discrete weight).
 * 2. The current model is evaluated in the estimated frame: psi_i = e^{j delta} (Ld Re(e^{-j delta} i)
 *    + psiM + dpsiM + j Lq Im(e^{-j delta} i)). To first order in delta and dpsiM,
 *      psi_i - psi_s = dpsiM + delta (j psi_a + (Ld - Lq) iq),   psi_a = psiM + (Ld - Lq) id
 *    (d/d delta at 0: j psi_s + Ld iq - j Lq id, with psi_s = Ld id + psiM + j Lq iq).
 * 3. The active flux estimate is psi_s + x - Lq i = psi_a + x; the PLL locks (zero steady error of
 *    a type II loop at constant speed) onto its angle, so delta = Im(x) / psi_a:
 *      delta psi_a = Im(W) dpsiM + delta Im(W (j psi_a + (Ld - Lq) iq))
 *    => delta = Im(W) dpsiM / (psi_a (1 - Re W) - (Ld - Lq) iq Im W).
 * For the continuous loop with ki = 0, W = kp / (kp + j we), this is delta = -kp dpsiM / (we psi_a + (Ld - Lq) iq kp):
 * a flux error shows as an angle error shrinking with speed (a larger psiM in the model: the estimate lags).
 */
function predictedDelta(m: DqMachine, dpsi: number, we: number, Ts: number, id: number, iq: number, correction_Hz: number): number {
  const { kp, ki } = correctionGains(correction_Hz);
  const W = new Float64Array(2);
  correctionWeight(kp, ki, we, Ts, W);
  const psiA = m.psiM + (m.Ld - m.Lq) * id;
  return (W[1]! * dpsi) / (psiA * (1 - W[0]!) - (m.Ld - m.Lq) * iq * W[1]!);
}

describe('sensorless estimator: 20 % flux-linkage error against the first-order sensitivity (derived above)', () => {
  for (const [name, cs, lead] of [['traction IPM', ipmCase, Math.PI / 6], ['48 V SPM', spmCase, 0]] as const) {
    for (const pct of [20, -20]) {
      it(`${name}, fluxError ${pct} %: the steady angle error is within 20 % of the prediction`, () => {
        const { m, Ts, bw, wm, I } = cs;
        const r = closedLoop(m, sensorless({ fluxError_pct: pct }), Ts, bw, wm, -I * Math.sin(lead), I * Math.cos(lead), 0.02, 0.6);
        const pred = predictedDelta(m, (pct / 100) * m.psiM, m.polePairs * wm, Ts, r.id, r.iq, 10);
        expect(Math.abs(r.errSteadyMean / pred - 1)).toBeLessThan(0.2);
      });
    }
  }
});

/**
 * Start from rest on the 48 V demo (free mechanics, its inertia plus load inertia and friction, a
 * constant load): open-loop current vector on the q axis of the start-up frame with the ramp, then
 * a speed PI on the ESTIMATED speed holding the hand-over speed (integrator from `handoverIq_A`;
 * gains for a 10 Hz crossover, Kp = J ws / Kt, Ki = Kp ws / 4: common practice, no source),
 * the current PIs as above in the estimator's (blended) frame.
 */
function startFromRest(p: ResolvedProject, spec: SensorlessAngle, opts: SensorlessOptions, load_Nm: number, tEnd: number, at?: { w0: number; tLoad: number; TLoad: number }) {
  const m = p.models.hot as DqMachine;
  const c = p.file.control!;
  const Ts = 1 / c.fCtrl_Hz, wc = 2 * Math.PI * c.currentBandwidth_Hz!;
  const J = p.mechanics.inertia + (p.file.scenario?.loadInertia ?? 0);
  const plant = new Plant({ machine: new LinearDqModel(m), inertia: J, viscousFriction: p.mechanics.viscousFriction, coulombFriction: p.mechanics.coulombFriction, load: loadSchedule([{ t_s: 0, torque_Nm: load_Nm }, ...(at ? [{ t_s: at.tLoad, torque_Nm: at.TLoad }] : [])]), mechanics: 'free', inputFrame: 'alpha-beta', coulombWidth_rad_s: 0.05 });
  const stepper = new Rk4Stepper(plant, Ts, 20);
  const w0 = at?.w0 ?? 0, we0 = m.polePairs * w0;
  const y = new Float64Array([0, 0, w0, 0.7, 0]);
  const est = new SensorlessEstimator(spec, m, opts);
  // from rest the start-up does not know the rotor angle (0.7 rad): the vector pulls the rotor in; at speed it starts locked
  est.reset(at ? 0.7 : 0, we0);
  const Kt = 1.5 * m.polePairs * m.psiM, ws = 2 * Math.PI * 10, Kpw = (J * ws) / Kt, Kiw = (Kpw * ws) / 4;
  const wRef = at ? w0 : (spec.handoverSpeed_rpm * 2 * Math.PI) / 60;
  let xd = 0, xq = 0, xw = 0, wasOpen = est.openLoop, handover = wasOpen ? NaN : -1;
  const bemf = (th: number): [number, number] => [-we0 * m.psiM * Math.sin(th), we0 * m.psiM * Math.cos(th)];
  let next = bemf(0.7 + 1.5 * we0 * Ts), applied = bemf(0.7 + 0.5 * we0 * Ts), lastApplied = bemf(0.7 - 0.5 * we0 * Ts);
  let errAfter = 0, speedErrAfter = 0, errPeakLoad = 0, errFinal = 0, speedDip = 0;
  const n = Math.round(tEnd / Ts);
  for (let k = 0; k < n; k++) {
    const t = k * Ts;
    plant.setAngleOrigin(y[3]!);
    const th = y[3]!, cth = Math.cos(th), sth = Math.sin(th);
    const ia = cth * y[0]! - sth * y[1]!, ib = sth * y[0]! + cth * y[1]!;
    est.sample(th, y[2]!, ia, ib, lastApplied[0], lastApplied[1], Ts);
    const the = est.thetaE, wh = est.omegaE;
    if (wasOpen && !est.openLoop) { wasOpen = false; handover = t; xw = est.startup.handoverIq_A; }
    if (at && t >= at.tLoad) {
      errPeakLoad = Math.max(errPeakLoad, Math.abs(wrapAngle(the - th)));
      speedDip = Math.max(speedDip, (wRef - y[2]!) / wRef);
      if (t >= tEnd - 0.05) errFinal = Math.max(errFinal, Math.abs(wrapAngle(the - th)));
    }
    if (!wasOpen && t > handover + 0.2) {
      errAfter = Math.max(errAfter, Math.abs(wrapAngle(the - th)));
      speedErrAfter = Math.max(speedErrAfter, Math.abs(y[2]! - wRef) / wRef);
    }
    const ce = Math.cos(the), se = Math.sin(the);
    const id = ce * ia + se * ib, iq = -se * ia + ce * ib;
    let iqr: number;
    if (est.openLoop) iqr = est.startupCurrent_A;
    else { const ew = wRef - wh / m.polePairs; iqr = Kpw * ew + xw; xw += Kiw * Ts * ew; }
    const ed = -id, eq = iqr - iq;
    const vd = m.Ld * wc * ed + xd - wh * m.Lq * iq;
    const vq = m.Lq * wc * eq + xq + wh * (m.Ld * id + m.psiM);
    xd += m.Rs * wc * Ts * ed;
    xq += m.Rs * wc * Ts * eq;
    const ta = the + 1.5 * wh * Ts, ca = Math.cos(ta), sa = Math.sin(ta);
    applied = next;
    next = [ca * vd - sa * vq, sa * vd + ca * vq];
    plant.input[0] = applied[0];
    plant.input[1] = applied[1];
    stepper.period(y, t, t + Ts);
    lastApplied = applied;
  }
  return { handover, errAfter, speedErrAfter, errPeakLoad, errFinal, speedDip, offset: est.startup.handoverOffset_rad, lost: est.lossOfLock() };
}

describe('sensorless start-up from rest (48 V demo)', () => {
  it('open loop at 40 A up to 600 rpm, hand-over with a 20 ms blend: 0.2 s later the angle error stays below 0.01 rad and the speed within 2 % of 600 rpm', () => {
    const spec = sensorless({ handoverSpeed_rpm: 600 });
    const r = startFromRest(spm, spec, { startupCurrent_A: 40 }, 1, 0.7);
    // the ramp reaches 600 rpm after 0.2 s (the default ramp)
    expect(r.handover).toBeCloseTo(0.2, 2);
    expect(r.errAfter).toBeLessThan(0.01);
    expect(r.speedErrAfter).toBeLessThan(0.02);
    expect(r.lost).toBeNull();
  });
});

describe('sensorless estimator: start state, loss of lock, bad input', () => {
  const m = spmCase.m;
  it('a run that starts at or above the hand-over speed starts locked; below it starts open loop (common practice, no source)', () => {
    const est = new SensorlessEstimator(sensorless({ handoverSpeed_rpm: 300 }), m, { startupCurrent_A: 30 });
    est.reset(1, (300 * 2 * Math.PI / 60) * m.polePairs);
    expect(est.openLoop).toBe(false);
    expect(est.thetaE).toBe(1);
    est.reset(1, 0);
    expect(est.openLoop).toBe(true);
    expect(est.startupCurrent_A).toBe(30);
  });
  it('the watchdog\'s call names the loss of lock once the error stays above pi/4 for 10 ms (100 periods at 10 kHz), not before', () => {
    const est = new SensorlessEstimator(sensorless(), m, { startupCurrent_A: 0 });
    const we = 400;
    est.reset(0, we);
    // no current, no voltage: the observer holds its flux and the PLL coasts at we; the "true" angle is 1 rad ahead of it
    for (let k = 0; k < 99; k++) est.sample(est.thetaE + 1 + we * 1e-4, 0, 0, 0, 0, 0, 1e-4);
    expect(est.lossOfLock()).toBeNull();
    est.sample(est.thetaE + 1 + we * 1e-4, 0, 0, 0, 0, 0, 1e-4);
    expect(est.lossOfLock()).toMatch(/loss of lock: .*45\.0° electrical .*10\.0 ms/);
  });
  it('bad specification values are refused naming the field', () => {
    expect(messageOf(() => new SensorlessEstimator(sensorless({ bandwidth_Hz: 0 }), m, { startupCurrent_A: 1 }))).toMatch(/^control\.angle\.bandwidth_Hz must be > 0 Hz/);
    expect(messageOf(() => new SensorlessEstimator(sensorless({ fluxError_pct: -100 }), m, { startupCurrent_A: 1 }))).toMatch(/^control\.angle\.fluxError_pct must be between/);
    expect(messageOf(() => new SensorlessEstimator(sensorless({ handoverSpeed_rpm: -5 }), m, { startupCurrent_A: 1 }))).toMatch(/^control\.angle\.handoverSpeed_rpm/);
  });
  it('the observer\'s terms carry the stated errors', () => {
    const est = new SensorlessEstimator(sensorless({ fluxError_pct: 20, resistanceError_pct: -10, inductanceError_pct: 5 }), m, { startupCurrent_A: 1 });
    expect(est.terms.psiM).toBeCloseTo(1.2 * m.psiM, 15);
    expect(est.terms.Rs).toBeCloseTo(0.9 * m.Rs, 15);
    expect(est.terms.Lq).toBeCloseTo(1.05 * m.Lq, 15);
  });
});

describe('sensorless speed loop at half rated speed: a load-torque step (traction demo, free mechanics)', () => {
  it('started locked at 2000 rpm, a 60 N·m load step at 0.05 s: the angle error peaks below 0.03 rad and settles below 0.001 rad', () => {
    const r = startFromRest(traction, sensorless({ handoverSpeed_rpm: 300 }), { startupCurrent_A: 0 }, 0, 0.45, { w0: ipmCase.wm, tLoad: 0.05, TLoad: 60 });
    expect(r.errPeakLoad).toBeLessThan(0.03);
    expect(r.errFinal).toBeLessThan(0.001);
    expect(r.speedErrAfter).toBeLessThan(0.05);
    expect(r.lost).toBeNull();
  });
});
