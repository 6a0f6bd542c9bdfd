/**
 * The modulator of a two-level three-phase bridge with a symmetric (triangular) carrier: from the
 * phase voltage references and the bus, each leg's duty (the fraction of the carrier period its upper
 * device is commanded on), and the commanded switching instants of the legs within a period
 * (centred pulses).
 *
 * A leg's average voltage against the bus minus is d·Vdc; the phase voltage is that minus the mean
 * of the three legs, so adding the same zero-sequence voltage v0 to the three references changes no
 * phase voltage: d_x = 1/2 + (v_x + v0)/Vdc. The modulations (see PwmModulation) differ in v0:
 * sinusoidal 0; min-max (svpwm) -(max + min)/2, which centres the active vectors in the period as
 * space-vector PWM does; DPWM1 the v0 that puts the leg of the largest |v| on its rail.
 * Holmes and Lipo (2003), Pulse Width Modulation for Power Converters, ch. 5 and 6; Hava, Kerkman
 * and Lipo (1998), "Simple analytical and graphical methods for carrier-based PWM-VSI drives",
 * IEEE Trans. Power Electronics 14(1).
 *
 * Overmodulation is clipped as a compare-register modulator does: each duty saturates at 0 or 1
 * after the injection (a reference outside the linear range loses the excess of the legs that
 * saturate; the middle leg keeps its value).
 */
import type { PwmModulation } from './pwm-spec';

const SQRT3_2 = Math.sqrt(3) / 2;
const INV_SQRT3 = 1 / Math.sqrt(3);

/**
 * The duties of the three legs into `d` (length >= 3) for the stationary-frame reference
 * (v_alpha, v_beta) (amplitude-invariant, peak phase V) on the bus `Vdc`, V. Allocation-free.
 */
export function legDuties(valpha: number, vbeta: number, Vdc: number, modulation: PwmModulation, d: Float64Array): void {
  d[0] = valpha;
  d[1] = vbeta;
  dutiesOfAlphaBeta(Vdc, modulation, d);
}

/** `legDuties(vab[0], vab[1], ...)`: the reference read from an array (no double crosses a call). */
export function legDutiesOf(vab: Float64Array, Vdc: number, modulation: PwmModulation, d: Float64Array): void {
  d[0] = vab[0]!;
  d[1] = vab[1]!;
  dutiesOfAlphaBeta(Vdc, modulation, d);
}

/** The duties, in place, from the stationary-frame reference (alpha, beta) in d[0], d[1]. */
function dutiesOfAlphaBeta(Vdc: number, modulation: PwmModulation, d: Float64Array): void {
  const valpha = d[0]!, vbeta = d[1]!;
  d[1] = -0.5 * valpha + SQRT3_2 * vbeta;
  d[2] = -0.5 * valpha - SQRT3_2 * vbeta;
  dutiesOfPhases(Vdc, modulation, d);
}

/** The duties of the three legs into `d` for the phase references va, vb, vc (V, phase to neutral). */
export function phaseDuties(va: number, vb: number, vc: number, Vdc: number, modulation: PwmModulation, d: Float64Array): void {
  d[0] = va;
  d[1] = vb;
  d[2] = vc;
  dutiesOfPhases(Vdc, modulation, d);
}

/** The duties of the three legs, in place, from the phase references d[0..2]. */
function dutiesOfPhases(Vdc: number, modulation: PwmModulation, d: Float64Array): void {
  const va = d[0]!, vb = d[1]!, vc = d[2]!;
  let v0 = 0;
  if (modulation !== 'sinusoidal') {
    const mx = va > vb ? (va > vc ? va : vc) : vb > vc ? vb : vc;
    const mn = va < vb ? (va < vc ? va : vc) : vb < vc ? vb : vc;
    if (modulation === 'svpwm') v0 = -0.5 * (mx + mn);
    else v0 = mx + mn >= 0 ? 0.5 * Vdc - mx : -0.5 * Vdc - mn; // dpwm1: the larger |v| on its rail
  }
  const inv = 1 / Vdc;
  d[0] = clip01(0.5 + (va + v0) * inv);
  d[1] = clip01(0.5 + (vb + v0) * inv);
  d[2] = clip01(0.5 + (vc + v0) * inv);
}

function clip01(x: number): number {
  return x < 0 ? 0 : x > 1 ? 1 : x;
}

/**
 * Dead-time and device-drop compensation of one leg's duty d over a half carrier period Th, for the
 * phase current's sign s in [-1, 1] (taken linear across a band about zero current): the dead time
 * delays the rising edge of a leg whose current flows out of it (s = 1) and the falling edge of one
 * whose current flows in (s = -1), each by td (see switching-period.ts), so the rising half gains
 * td/Th (1 + s)/2 and the falling half loses td/Th (1 - s)/2 (each half exact for a current of one
 * sign, the carrier period's sum td s / Th); the device drop lowers the leg by drop s, made up by
 * s drop/Vdc. Clipped to [0, 1]. Murai, Watanabe and Iwasaki (1987), "Waveform distortion and
 * correction circuit for PWM inverters with switching lag-times", IEEE Trans. Industry
 * Applications IA-23(5) (the correction by the current's sign); the per-edge split and the linear
 * band are common practice (no source).
 */
export function compensatedDuty(d: number, s: number, rising: boolean, tdOverTh: number, dropOverVdc: number): number {
  const dd = rising ? d + 0.5 * tdOverTh * (1 + s) : d - 0.5 * tdOverTh * (1 - s);
  return clip01(dd + s * dropOverVdc);
}

/**
 * The commanded edges of a leg with duty d in a carrier period [0, Tc] of a symmetric carrier whose
 * valley (all legs off) is at the period's ends: the upper device is on over
 * [(1 - d) Tc/2, (1 + d) Tc/2]. With two updates per period the rising edge takes the first half's
 * duty and the falling edge the second's. Returns the rising edge time; the falling one is Tc - it
 * for one update.
 */
export function risingEdge(d: number, Tc: number): number {
  return 0.5 * (1 - d) * Tc;
}

/** The falling edge of a leg with duty d (the second half's duty with two updates per period). */
export function fallingEdge(d: number, Tc: number): number {
  return 0.5 * (1 + d) * Tc;
}

/**
 * The phase voltages (alpha, beta; amplitude-invariant) of leg voltages ua, ub, uc against the bus
 * minus, into out[0], out[1]: v_alpha = (2 ua - ub - uc)/3, v_beta = (ub - uc)/sqrt 3.
 */
export function legsToAlphaBeta(ua: number, ub: number, uc: number, out: Float64Array): void {
  out[0] = (2 * ua - ub - uc) / 3;
  out[1] = (ub - uc) / (2 * SQRT3_2);
}

/**
 * Each switching state's voltages with the device drop, for each pattern of the phase currents'
 * signs (every |i| above the drop's linear band; with no drop, the states themselves for any pattern): out[5 k .. 5 k + 4] = v_alpha, v_beta, ua, ub, uc
 * for k = st + 8 sg, st = a + 2 b + 4 c the legs on the plus rail, sg = a + 2 b + 4 c the phases
 * whose current is positive (out of the leg). A leg sits at its rail minus drop sgn(i), a switch or a
 * diode conducting (common practice, no source). The arithmetic is the switching model's per segment
 * (switching-period.ts): a table entry equals what it computes for that state and those signs.
 */
export function switchingStateTable(Vdc: number, drop: number, out: Float64Array): void {
  for (let k = 0; k < 64; k++) {
    let ua = (k & 1) * Vdc, ub = ((k >> 1) & 1) * Vdc, uc = ((k >> 2) & 1) * Vdc;
    ua -= drop * ((k & 8) !== 0 ? 1 : -1);
    ub -= drop * ((k & 16) !== 0 ? 1 : -1);
    uc -= drop * ((k & 32) !== 0 ? 1 : -1);
    out[5 * k] = (2 * ua - ub - uc) / 3;
    out[5 * k + 1] = (ub - uc) * INV_SQRT3;
    out[5 * k + 2] = ua;
    out[5 * k + 3] = ub;
    out[5 * k + 4] = uc;
  }
}
