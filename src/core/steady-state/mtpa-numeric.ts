/**
 * Generic numeric paths of the MTPA current and the constant-torque locus: they use only the machine
 * model's torque, so they hold for any flux map; on a linear model they agree with the closed forms
 * of mtpa.ts (checked in test/mtpa-numeric.test.ts).
 */
import type { MachineModel } from '../machine/machine-model';
import { goldenSectionMax, polishMax } from '../mathematics/root-finding';

const SAMPLES = 32;
const GOLDEN_STEPS = 60;

/**
 * MTPA current at magnitude I >= 0 (positive torque, iq >= 0): the current angle theta in [0, pi]
 * that maximises model.torque(I cos theta, I sin theta), bracketed by 33 samples, refined by golden
 * section and polished by Newton on central differences. Writes out[0] = id, out[1] = iq.
 * Morimoto, Takeda, Hirasa, Taniguchi (1990), Expansion of operating limits for permanent magnet
 * motor by current vector control considering inverter capacity, IEEE Trans. Ind. Appl. 26(5):
 * MTPA is the torque maximum along the current circle.
 */
export function mtpaCurrentsNumeric(m: MachineModel, I: number, out: Float64Array): void {
  const Ia = Math.abs(I);
  if (Ia === 0) { out[0] = 0; out[1] = 0; return; }
  const f = (t: number): number => m.torque(Ia * Math.cos(t), Ia * Math.sin(t));
  const step = Math.PI / SAMPLES;
  let kBest = 0, fBest = -Infinity;
  for (let k = 0; k <= SAMPLES; k++) {
    const v = f(k * step);
    if (v > fBest) { fBest = v; kBest = k; }
  }
  const lo = Math.max(0, (kBest - 1) * step), hi = Math.min(Math.PI, (kBest + 1) * step);
  const g = new Float64Array(2);
  goldenSectionMax(f, lo, hi, GOLDEN_STEPS, g);
  const t = polishMax(f, g[0]!, lo, hi, 1e-3);
  out[0] = Ia * Math.cos(t);
  out[1] = Ia * Math.sin(t);
}

/**
 * The q current that gives torque T at d current id: Newton on model.torque(id, iq) - T in iq from
 * iq = 0 with the slope by central differences; NaN where the torque does not rise with iq at
 * iq = 0 (no motoring point on that side of the locus) or Newton does not converge. Common practice (no source).
 */
export function constantTorqueIqNumeric(m: MachineModel, T: number, id: number): number {
  const slope = (iq: number): number => {
    const h = 1e-3 * (1 + Math.abs(iq));
    return (m.torque(id, iq + h) - m.torque(id, iq - h)) / (2 * h);
  };
  if (!(slope(0) > 0)) return NaN;
  let iq = 0;
  for (let k = 0; k < 60; k++) {
    const s = slope(iq);
    if (!(s > 0)) return NaN;
    const d = (m.torque(id, iq) - T) / s;
    iq -= d;
    if (Math.abs(d) <= 1e-15 * (1 + Math.abs(iq))) return iq;
  }
  return NaN;
}
