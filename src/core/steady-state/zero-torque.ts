/**
 * The least-current operating point of zero torque at a speed within the voltage limit.
 * Linear model (closed form): T = 0 on iq = 0, or on id = -psiM/(Ld-Lq) (any iq); on each line |v|² is a
 * quadratic and the least current is the root nearest zero. Any model (numeric path): the line iq = 0
 * (zero torque for a machine symmetric in q), |v(id, 0)| = Vmax bisected from id = 0 towards the side
 * where the voltage falls, between 0 and the lowest voltage on that side (golden section) within the
 * voltage region's bound.
 */
import type { LinearTerms, MachineModel } from '../machine/machine-model';
import type { OperatingPoint } from './operating-point-types';
import { bisectPredicate, goldenSectionMax } from '../mathematics/root-finding';
import { point } from './point-of-current';

/** Smallest |x| with a x² + b x + c <= 0 (a > 0), or NaN when there is none. */
function nearestToZero(a: number, b: number, c: number): number {
  if (c <= 0) return 0;
  const disc = b * b - 4 * a * c;
  if (disc < 0) return Number.NaN;
  const q = -0.5 * (b + (b >= 0 ? 1 : -1) * Math.sqrt(disc));
  const r1 = q / a;
  const r2 = q !== 0 ? c / q : r1;
  return Math.abs(r1) < Math.abs(r2) ? r1 : r2;
}

/**
 * Zero torque in closed form: T = 0 on iq = 0, or on id = -psiM/(Ld-Lq) (any iq). On each line |v|² is
 * a quadratic; the least current is the root nearest zero. Null when neither line meets |v| <= Vmax.
 */
export function zeroTorqueLinear(mm: MachineModel, m: LinearTerms, Vmax: number, speed: number): OperatingPoint | null {
  const we = mm.polePairs * speed;
  const Rs = mm.Rs;
  let best: OperatingPoint | null = null;
  // iq = 0: |v|² = Rs² id² + we² (Ld id + psiM)²
  const id1 = nearestToZero(Rs * Rs + we * we * m.Ld * m.Ld, 2 * we * we * m.Ld * m.psiM, we * we * m.psiM * m.psiM - Vmax * Vmax);
  if (!Number.isNaN(id1)) best = point(mm, speed, id1, 0, id1 === 0 ? 'mtpa' : 'field-weakening');
  const dl = m.Ld - m.Lq;
  if (dl !== 0 && m.psiM > 0) {
    // id = id0: vd = Rs id0 - we Lq iq, vq = Rs iq + we Ld id0 + we psiM
    const id0 = -m.psiM / dl;
    const e = we * (m.Ld * id0 + m.psiM);
    const a = Rs * Rs + we * we * m.Lq * m.Lq;
    const iq = a > 0 ? nearestToZero(a, 2 * (-Rs * id0 * we * m.Lq + Rs * e), Rs * Rs * id0 * id0 + e * e - Vmax * Vmax) : (e * e <= Vmax * Vmax ? 0 : Number.NaN);
    if (!Number.isNaN(iq)) {
      const q = point(mm, speed, id0, iq, 'field-weakening');
      if (!best || q.current < best.current) best = q;
    }
  }
  if (best) best.torque = 0;
  return best;
}


/** Numeric path on the line iq = 0 (see the file comment); null when |v| <= Vmax is not reached within Ib. */
export function zeroTorqueNumeric(m: MachineModel, Vmax: number, speed: number, Ib: number | null): OperatingPoint | null {
  const we = m.polePairs * speed;
  const v = new Float64Array(2);
  const g = (id: number): number => { m.steadyVoltage(id, 0, we, v); return Math.hypot(v[0]!, v[1]!) - Vmax; };
  let id = 0;
  if (g(0) > 0) {
    if (Ib === null) return null;
    const h = 1e-6 * Ib;
    const dir = g(-h) <= g(h) ? -1 : 1;
    // the lowest voltage on that side (golden section over the distance), then the crossing nearest 0
    const b = new Float64Array(2);
    goldenSectionMax((x) => -g(dir * x), 0, Ib, 100, b);
    const xm = b[0]!;
    if (!(g(dir * xm) <= 0)) return null;
    // predicate over the distance x from 0: feasible at x (true at xm, false at 0)
    bisectPredicate((x) => g(dir * x) <= 0, 0, xm, 1e-15, b);
    id = dir * b[1]!;
  }
  const p = point(m, speed, id, 0, id === 0 ? 'mtpa' : 'field-weakening');
  p.torque = 0;
  return p;
}

/** Zero torque: the closed form for a linear model, else the numeric path. */
export function zeroTorque(m: MachineModel, Vmax: number, speed: number, Ib: number | null): OperatingPoint | null {
  return m.linear !== null ? zeroTorqueLinear(m, m.linear, Vmax, speed) : zeroTorqueNumeric(m, Vmax, speed, Ib);
}
