/**
 * What a duty cycle's last repeat amounts to: energies, RMS and peak current, temperature peaks, the
 * instants outside the envelope and the limits exceeded, and the verdict.
 *
 * Energies and the RMS current use the trapezoid rule on the per-instant values (the rule the thermal
 * network is fed by, cycle-pass.ts); the RMS torque is the exact integral of the cycle's
 * piecewise-linear samples (duty-cycle-spec.ts). The RMS current is that of |i_dq| (A peak, the terms
 * of the drive's continuous current Icont). The heat stored over the repeat is
 * C_w (T_w,end - T_w,start) + C_s (T_s,end - T_s,start).
 */
import type { ThermalNetworkSpec } from '../machine/thermal-network-spec';
import { junctionTemperature, magnetTemperature } from '../machine/thermal-network';
import type { CycleArrays } from './cycle-pass';
import type { CycleInstants } from './duty-cycle-spec';
import { OUTSIDE, type OutsideKind } from './instant-losses';

const RPM = Math.PI / 30;

export interface Peak { value: number; t_s: number }

export interface CycleEnergies {
  /** from the DC link (negative: returned to it), J */
  dcLink_J: number;
  /** to the shaft (negative: taken from it), J */
  shaft_J: number;
  copper_J: number;
  iron_J: number;
  mechanical_J: number;
  inverter_J: number;
  /** removed from the network to the coolant, J */
  heatRemoved_J: number;
  /** stored in the network's heat capacities over the repeat, J */
  heatStored_J: number;
  /** (dcLink - shaft - losses) / max(|dcLink|, |shaft| + losses) */
  balanceResidual: number;
  /** (stored - (copper + iron - removed)) / (copper + iron) */
  heatResidual: number;
}

export interface OutsideInterval { from_s: number; to_s: number; limitedBy: Exclude<OutsideKind, 'inside'>; peakCurrent_A: number }

export type ThermalLimit = 'winding' | 'magnet' | 'junction';
export interface Exceedance { limit: ThermalLimit; max_C: number; first_s: number; peak: Peak }

export interface Verdict {
  status: 'within-limits' | 'limit-exceeded' | 'outside-envelope';
  text: string;
}

export interface CycleSummary {
  rmsCurrent_A: number;
  peakCurrent: Peak;
  energies: CycleEnergies;
  magnet_C: Float64Array;
  junction_C: Float64Array;
  peaks: { winding: Peak; stator: Peak; magnet: Peak; junction: Peak };
  outside: OutsideInterval[];
  exceeded: Exceedance[];
  verdict: Verdict;
}

function peakOf(t: Float64Array, v: Float64Array): Peak {
  let k = 0;
  for (let j = 1; j < v.length; j++) if (v[j]! > v[k]!) k = j;
  return { value: v[k]!, t_s: t[k]! };
}

function exceedance(limit: ThermalLimit, max: number | undefined, t: Float64Array, v: Float64Array): Exceedance | null {
  if (max === undefined) return null;
  for (let k = 0; k < v.length; k++) if (v[k]! > max) return { limit, max_C: max, first_s: t[k]!, peak: peakOf(t, v) };
  return null;
}

const fmt = (x: number, d: number): string => x.toFixed(d);

/** The summary of the repeat whose start temperatures were start (winding, stator, °C) and heat removed `removed_J`. */
export function summarizeCycle(x: CycleInstants, a: CycleArrays, th: ThermalNetworkSpec, start: Float64Array, removed_J: number): CycleSummary {
  const t = x.t_s, N = t.length;
  let dc = 0, sh = 0, cu = 0, fe = 0, me = 0, iv = 0, i2 = 0;
  let ps0 = x.torque_Nm[0]! * x.speed_rpm[0]! * RPM;
  for (let k = 0; k < N - 1; k++) {
    const h = 0.5 * (t[k + 1]! - t[k]!);
    const ps1 = x.torque_Nm[k + 1]! * x.speed_rpm[k + 1]! * RPM;
    dc += h * (a.dcPower_W[k]! + a.dcPower_W[k + 1]!);
    sh += h * (ps0 + ps1);
    cu += h * (a.copper_W[k]! + a.copper_W[k + 1]!);
    fe += h * (a.iron_W[k]! + a.iron_W[k + 1]!);
    me += h * (a.mechanical_W[k]! + a.mechanical_W[k + 1]!);
    iv += h * (a.inverter_W[k]! + a.inverter_W[k + 1]!);
    i2 += h * (a.current_A[k]! * a.current_A[k]! + a.current_A[k + 1]! * a.current_A[k + 1]!);
    ps0 = ps1;
  }
  const loss = cu + fe + me + iv;
  const stored = th.windingCapacity_J_per_K * (a.winding_C[N - 1]! - start[0]!) + th.statorCapacity_J_per_K * (a.stator_C[N - 1]! - start[1]!);
  const energies: CycleEnergies = {
    dcLink_J: dc, shaft_J: sh, copper_J: cu, iron_J: fe, mechanical_J: me, inverter_J: iv,
    heatRemoved_J: removed_J, heatStored_J: stored,
    balanceResidual: (dc - sh - loss) / Math.max(Math.abs(dc), Math.abs(sh) + loss, Number.MIN_VALUE),
    heatResidual: (stored - (cu + fe - removed_J)) / Math.max(cu + fe, Number.MIN_VALUE),
  };
  const magnet = new Float64Array(N), junction = new Float64Array(N);
  for (let k = 0; k < N; k++) {
    magnet[k] = magnetTemperature(th, a.stator_C[k]!);
    junction[k] = junctionTemperature(th, a.inverter_W[k]!);
  }
  const outside: OutsideInterval[] = [];
  for (let k = 0; k < N; k++) {
    if (a.outside[k] === 0) continue;
    const from = k, why = a.outside[k]!;
    let pk = a.current_A[k]!;
    while (k + 1 < N && a.outside[k + 1] !== 0) { k++; pk = Math.max(pk, a.current_A[k]!); }
    outside.push({ from_s: t[from]!, to_s: t[k]!, limitedBy: OUTSIDE[why] as Exclude<OutsideKind, 'inside'>, peakCurrent_A: pk });
  }
  const exceeded = [
    exceedance('winding', th.windingMax_C, t, a.winding_C),
    exceedance('magnet', th.magnetMax_C, t, magnet),
    exceedance('junction', th.junctionToCoolant_K_per_W === undefined ? undefined : th.junctionMax_C, t, junction),
  ].filter((e): e is Exceedance => e !== null);
  const peaks = { winding: peakOf(t, a.winding_C), stator: peakOf(t, a.stator_C), magnet: peakOf(t, magnet), junction: peakOf(t, junction) };
  return {
    rmsCurrent_A: Math.sqrt(i2 / (t[N - 1]! - t[0]!)), peakCurrent: peakOf(t, a.current_A), energies,
    magnet_C: magnet, junction_C: junction, peaks, outside, exceeded, verdict: verdictOf(outside, exceeded),
  };
}

/** The verdict: outside the envelope first (the cycle cannot be driven), then the limits exceeded. */
export function verdictOf(outside: readonly OutsideInterval[], exceeded: readonly Exceedance[]): Verdict {
  const parts: string[] = [];
  if (outside.length > 0) {
    const o = outside[0]!;
    parts.push(`outside the envelope in ${outside.length} interval${outside.length > 1 ? 's' : ''}, first ${fmt(o.from_s, 2)}..${fmt(o.to_s, 2)} s (${o.limitedBy} limit)`);
  }
  for (const e of exceeded) {
    parts.push(`${e.limit} above its ${fmt(e.max_C, 1)} °C limit from ${fmt(e.first_s, 2)} s (peak ${fmt(e.peak.value, 1)} °C at ${fmt(e.peak.t_s, 2)} s)`);
  }
  if (parts.length === 0) return { status: 'within-limits', text: 'within limits' };
  return { status: outside.length > 0 ? 'outside-envelope' : 'limit-exceeded', text: parts.join('; ') };
}
