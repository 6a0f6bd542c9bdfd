// Shared by test/controller-identity.test.ts (not a test file itself): controller configurations
// covering every branch of the sampled step, a deterministic sequence of samples to drive them, and
// a hash of the bits of everything the step writes (the applied voltage and every output field).
import type { ControllerConfig } from '../src/core/control/controller-config';
import type { ReferenceTable } from '../src/core/control/reference-table';
import type { MachineModel } from '../src/core/machine/machine-model';
import type { StepSchedule } from '../src/core/control/step-schedule';

const ipm = { polePairs: 4, Rs: 0.02, Ld: 0.3e-3, Lq: 0.75e-3, psiM: 0.07 };

/** A saturating model (cubic flux), so that the flux feed-forward and gain scheduling take their generic path. */
function cubic(): MachineModel {
  const c = 2e-9;
  return {
    polePairs: ipm.polePairs, Rs: ipm.Rs, linear: null,
    flux: (id, iq, o) => { o[0] = ipm.psiM + ipm.Ld * id - c * id * id * id; o[1] = ipm.Lq * iq - c * iq * iq * iq; },
    torque: (id, iq) => 1.5 * ipm.polePairs * ((ipm.psiM + ipm.Ld * id - c * id ** 3) * iq - (ipm.Lq * iq - c * iq ** 3) * id),
    steadyVoltage: (id, iq, we, o) => { o[0] = ipm.Rs * id - we * (ipm.Lq * iq - c * iq ** 3); o[1] = ipm.Rs * iq + we * (ipm.psiM + ipm.Ld * id - c * id ** 3); },
    incrementalInductance: (id, iq, o) => { o[0] = ipm.Ld - 3 * c * id * id; o[1] = 0; o[2] = 0; o[3] = ipm.Lq - 3 * c * iq * iq; },
    current: (psid, psiq, o) => { o[0] = (psid - ipm.psiM) / ipm.Ld; o[1] = psiq / ipm.Lq; },
  };
}

/** A synthetic table over 0..1000 rad/s (9 x 7 nodes): limits falling with speed, currents a smooth function of the node. */
function table(): ReferenceTable {
  const nS = 9, nU = 7;
  const tMot = Float64Array.from({ length: nS }, (_, r) => 200 / (1 + 0.3 * r));
  const tGen = Float64Array.from({ length: nS }, (_, r) => 180 / (1 + 0.25 * r));
  const id = new Float64Array(nS * nU), iq = new Float64Array(nS * nU);
  for (let r = 0; r < nS; r++) for (let c = 0; c < nU; c++) {
    const u = -1 + (2 * c) / (nU - 1);
    id[r * nU + c] = -40 * Math.abs(u) - 15 * r * Math.abs(u);
    iq[r * nU + c] = 300 * u / (1 + 0.2 * r);
  }
  return { speedMax: 1000, nS, nU, tMot, tGen, id, iq };
}

const sched = (initial: number, steps: Array<[number, number]>): StepSchedule =>
  ({ initial, times: Float64Array.from(steps.map((s) => s[0])), values: Float64Array.from(steps.map((s) => s[1])) });

const base: ControllerConfig = {
  mode: 'speed', Ts: 1e-4, delaySamples: 1, machine: ipm,
  currentD: { Kp: 0.3, Ki: 200 }, currentQ: { Kp: 0.75, Ki: 200 }, speed: { Kp: 2, Ki: 40 },
  speedLoopDivider: 1, antiWindup: 'clamping', decoupling: true, backEmfFeedForward: true, delayAngleCompensation: true,
  speedRamp_rad_s2: Infinity, speedRefPrefilter_s: 0, Imax: 400,
  voltage: { shape: 'circle', radius: 120, Vdc: 207.8 },
  table: null, speedRef: sched(0, [[0.002, 600], [0.02, -300]]), torqueRef: sched(10, [[0.005, 250], [0.02, -250]]),
  idRef: sched(0, [[0.003, -50]]), iqRef: sched(5, [[0.001, 420], [0.03, -100]]), initialTorque: 3,
};

export interface Variant { name: string; cfg: () => ControllerConfig }

export const variants: Variant[] = [
  { name: 'speed, clamping, circle', cfg: () => ({ ...base, table: table() }) },
  { name: 'speed, back-calculation, hexagon, divider 4, ramp, prefilter, delay 2', cfg: () => ({ ...base, table: table(), antiWindup: 'back-calculation', voltage: { shape: 'hexagon', radius: 120, Vdc: 207.8 }, speedLoopDivider: 4, speedRamp_rad_s2: 2e5, speedRefPrefilter_s: 0.004, delaySamples: 2 }) },
  { name: 'torque, clamping, no feed-forward, delay 0', cfg: () => ({ ...base, mode: 'torque', table: table(), decoupling: false, backEmfFeedForward: false, delaySamples: 0, delayAngleCompensation: false }) },
  { name: 'torque, back-calculation, hexagon', cfg: () => ({ ...base, mode: 'torque', table: table(), antiWindup: 'back-calculation', voltage: { shape: 'hexagon', radius: 100, Vdc: 173.2 } }) },
  { name: 'current-step, clamping, circle, delay 3', cfg: () => ({ ...base, mode: 'current-step', delaySamples: 3 }) },
  { name: 'current-step, back-calculation, decoupling only', cfg: () => ({ ...base, mode: 'current-step', antiWindup: 'back-calculation', backEmfFeedForward: false }) },
  { name: 'speed, saturating model, gain scheduling', cfg: () => ({ ...base, machine: cubic(), table: table(), gainScheduling: true }) },
  { name: 'current-step, saturating model, back-calculation', cfg: () => ({ ...base, mode: 'current-step', machine: cubic(), antiWindup: 'back-calculation', gainScheduling: true }) },
];

/** FNV-1a over the bytes of the doubles. */
function hashInto(h: number, bytes: Uint8Array): number {
  for (let i = 0; i < bytes.length; i++) { h ^= bytes[i]!; h = Math.imul(h, 16777619) >>> 0; }
  return h;
}

type Ctor = new (cfg: ControllerConfig) => {
  sample: Float64Array; reset(w: number, th: number): void; stepSampled(out: Float64Array): void;
  xd: number; xq: number; xw: number; speedRefOut: number; torqueRef: number; idRef: number; iqRef: number;
  vdCmd: number; vqCmd: number; currentLimited: boolean; voltageSaturated: boolean; torqueClamped: boolean;
};

/** 600 periods of a sequence that swings the speed through zero and the currents through the limits; the hash of every output. */
export function runVariant(Ctl: Ctor, v: Variant, seen?: { sat: number; lim: number; clamp: number }): string {
  const cfg = v.cfg();
  const c = new Ctl(cfg);
  c.reset(20, 0.3);
  const out = new Float64Array(2);
  const rec = new Float64Array(16);
  const bytes = new Uint8Array(rec.buffer);
  let h = 2166136261;
  let th = 0.3;
  for (let k = 0; k < 600; k++) {
    const t = k * cfg.Ts;
    const w = 20 + 700 * Math.sin(k / 90) - 0.5 * k;
    const id = -60 + 80 * Math.sin(k / 13);
    const iq = 350 * Math.sin(k / 40) + 40 * Math.cos(k / 3);
    const s = c.sample;
    s[0] = t; s[1] = id; s[2] = iq; s[3] = w; s[4] = th; s[5] = Math.cos(th); s[6] = Math.sin(th);
    c.stepSampled(out);
    rec[0] = out[0]!; rec[1] = out[1]!; rec[2] = c.xd; rec[3] = c.xq; rec[4] = c.xw; rec[5] = c.speedRefOut;
    rec[6] = c.torqueRef; rec[7] = c.idRef; rec[8] = c.iqRef; rec[9] = c.vdCmd; rec[10] = c.vqCmd;
    rec[11] = c.currentLimited ? 1 : 0; rec[12] = c.voltageSaturated ? 1 : 0; rec[13] = c.torqueClamped ? 1 : 0;
    h = hashInto(h, bytes);
    if (seen) { seen.sat += rec[12]!; seen.lim += rec[11]!; seen.clamp += rec[13]!; }
    th = (th + 4 * w * cfg.Ts) % (2 * Math.PI);
    if (th < 0) th += 2 * Math.PI;
  }
  return h.toString(16).padStart(8, '0');
}
