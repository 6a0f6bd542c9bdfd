/**
 * The losses of one steady operating point of motor and inverter: copper 1.5 Rs |i|^2, iron from the
 * model's flux (machine/motor-losses.ts), the bridge's semiconductor losses (drive/inverter-losses.ts)
 * at the point's modulation index m = |v_dq| / (Vdc/2) and fundamental power factor, and the AC power
 * 1.5 (vd id + vq iq) the motor takes at its terminals (amplitude-invariant dq, so the factor 1.5).
 */
import type { MachineModel } from '../machine/machine-model';
import type { FrictionSpec, IronLossSpec, WindageSpec } from '../machine/motor-losses';
import type { InverterLossSpec } from '../drive/inverter-losses';
import { ironLossAt } from '../machine/motor-losses';
import { inverterBridgeLoss } from '../drive/inverter-losses';

/** The loss data (the project file's `losses` section, same keys); an absent part is a zero loss. */
export interface LossSpec {
  iron?: IronLossSpec;
  windage?: WindageSpec;
  inverter?: InverterLossSpec;
}

/** What the loss solvers need besides the machine model and the limits. */
export interface LossConditions {
  /** DC-bus voltage, V (modulation index, switching-loss scaling, DC current) */
  Vdc: number;
  /** the machine's friction */
  friction: FrictionSpec;
  losses: LossSpec;
}

/** Indices into PointLossScratch.r. */
export const PL = { copper: 0, iron: 1, inverter: 2, acPower: 3, modulation: 4, powerFactor: 5, vd: 6, vq: 7 } as const;

/** A caller-owned scratch for pointLosses: `r` the results (indices PL), `v` two doubles for the model. */
export interface PointLossScratch { r: Float64Array; v: Float64Array }
export const newPointLossScratch = (): PointLossScratch => ({ r: new Float64Array(8), v: new Float64Array(2) });

/**
 * Losses at current (id, iq), A peak, and mechanical speed w (rad/s) into sc (indices PL); returns
 * copper + iron + inverter, W (results in sc.r). The power factor is signed (negative when the motor returns power)
 * and 0 at zero current or voltage. Allocates nothing.
 */
export function pointLosses(m: MachineModel, c: LossConditions, w: number, id: number, iq: number, sc: PointLossScratch): number {
  const we = m.polePairs * w;
  const v = sc.v, r = sc.r;
  m.steadyVoltage(id, iq, we, v);
  const vd = v[0]!, vq = v[1]!;
  const I = Math.hypot(id, iq), V = Math.hypot(vd, vq);
  const pac = 1.5 * (vd * id + vq * iq);
  const IV = I * V; // may underflow to 0 for tiny currents and voltages: the power factor is then 0
  const pf = IV > 0 ? (vd * id + vq * iq) / IV : 0;
  const mi = V / (0.5 * c.Vdc);
  const cu = 1.5 * m.Rs * I * I;
  const fe = ironLossAt(m, c.losses.iron, id, iq, we, v);
  const inv = c.losses.inverter === undefined ? 0 : inverterBridgeLoss(c.losses.inverter, I, mi, pf, c.Vdc);
  r[PL.copper] = cu; r[PL.iron] = fe; r[PL.inverter] = inv; r[PL.acPower] = pac;
  r[PL.modulation] = mi; r[PL.powerFactor] = pf; r[PL.vd] = vd; r[PL.vq] = vq;
  return cu + fe + inv;
}

const ratio = (out: number, inp: number): number => (inp > 0 && out > 0 ? out / inp : 0);

/**
 * Motor, inverter and system efficiency (fractions) into out[0..2] from the shaft power ps, the motor's
 * AC power pac and the DC power pdc (W, motor reference direction): output over input, motoring
 * shaft/AC, AC/DC, shaft/DC; generating (ps < 0) electrical out over mechanical in, -AC/-shaft,
 * -DC/-AC, -DC/-shaft; 0 where the output is not positive, and all 0 at zero shaft power.
 */
export function efficiencies(ps: number, pac: number, pdc: number, out: Float64Array): void {
  if (ps > 0) { out[0] = ratio(ps, pac); out[1] = ratio(pac, pdc); out[2] = ratio(ps, pdc); }
  else if (ps < 0) { out[0] = ratio(-pac, -ps); out[1] = ratio(-pdc, -pac); out[2] = ratio(-pdc, -ps); }
  else { out[0] = 0; out[1] = 0; out[2] = 0; }
}

