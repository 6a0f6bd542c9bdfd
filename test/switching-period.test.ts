// The switching model over carrier periods (src/core/simulation/switching-period.ts) on an R-L-EMF
// load (a machine locked at a constant speed): the checks of the switching model against closed forms.
import { describe, expect, it } from 'vitest';
import { Plant, STATE_SIZE, loadSchedule } from '../src/core/simulation/plant';
import { CashKarpStepper } from '../src/core/simulation/stepper';
import { SwitchingPeriod } from '../src/core/simulation/switching-period';
import { legDuties } from '../src/core/drive/pwm-modulator';
import type { PwmModulation } from '../src/core/drive/pwm-spec';
import { periodRipple } from '../src/core/simulation/current-ripple';
import { deadTimeVoltageError } from '../src/core/simulation/dead-time-error';
import { dcLinkCurrent } from '../src/core/simulation/dc-link-current';
import { harmonicAmplitude, harmonicCoefficients, thd } from '../src/core/mathematics/harmonics';

interface Load { Rs: number; L: number; psiM: number; we: number }
interface Bridge { Vdc: number; td?: number; drop?: number; modulation: PwmModulation; Tc: number }

/** a locked machine (Ld = Lq = L, one pole pair) at electrical speed we, Cash-Karp at a tight tolerance */
function rig(load: Load, b: Bridge, tol = 1e-10, compensation?: { band_A: number }) {
  const plant = new Plant({
    machine: { polePairs: 1, Rs: load.Rs, Ld: load.L, Lq: load.L, psiM: load.psiM }, inertia: 1, viscousFriction: 0, coulombFriction: 0,
    load: loadSchedule(), mechanics: 'locked', inputFrame: 'alpha-beta', coulombWidth_rad_s: 1e-3,
  });
  const y = new Float64Array(STATE_SIZE);
  y[2] = load.we;
  const inner = new CashKarpStepper(plant, b.Tc, y, tol, new Float64Array([1e-6, 1e-6, 1e-3, 1e-6, Infinity]));
  const sw = new SwitchingPeriod(plant, inner, { Vdc: b.Vdc, deadTime_s: b.td ?? 0, deviceDrop_V: b.drop ?? 0, zeroCurrent_A: 1e-3, fsw_Hz: 1 / b.Tc, ...(compensation ? { compensation } : {}) });
  return { plant, y, inner, sw };
}

/** the steady dq currents of an R-L-EMF load under a constant dq voltage (vd, vq) at electrical speed we */
function steadyCurrents(l: Load, vd: number, vq: number): [number, number] {
  // vd = R id - we L iq ; vq = R iq + we L id + we psiM
  const a = l.Rs, b = -l.we * l.L, c = l.we * l.L, dd = l.Rs;
  const r1 = vd, r2 = vq - l.we * l.psiM;
  const det = a * dd - b * c;
  return [(r1 * dd - b * r2) / det, (a * r2 - c * r1) / det];
}

/** the dq command held in alpha-beta over a carrier period: rotated by the angle at the period's centre */
function held(vd: number, vq: number, th: number, out: Float64Array): void {
  out[0] = vd * Math.cos(th) - vq * Math.sin(th);
  out[1] = vd * Math.sin(th) + vq * Math.cos(th);
}

/** the period mean of phase a's current from the probe's boundary samples (trapezoid) */
function meanA(sw: SwitchingPeriod): number {
  let s = 0;
  for (let j = 1; j < sw.nb; j++) s += 0.5 * (sw.ib[3 * j]! + sw.ib[3 * (j - 1)]!) * (sw.tb[j]! - sw.tb[j - 1]!);
  return s / (sw.tb[sw.nb - 1]! - sw.tb[0]!);
}

describe('switching model: checks against closed forms', () => {
  it('centred SVPWM peak-to-peak ripple of phase a at its peak, m = 0.2 .. 1.0, within 2 % of (Vdc Tc / L)(m/(2 sqrt 3) - m²/4) (derived from the volt-seconds, Holmes and Lipo 2003, Pulse Width Modulation for Power Converters, ch. 5)', () => {
    // Derivation: at theta = 0 (v_a = V, v_b = v_c = -V/2) min-max injection gives d_a = 1/2 + 3V/(4Vdc),
    // d_b = d_c = 1/2 - 3V/(4Vdc). The half period runs 000 for (1 - d_a)Tc/2, 100 for
    // (d_a - d_b)Tc/2 = 3V Tc/(4Vdc), 111 for d_b Tc/2. Phase a sees 2Vdc/3 in 100 and 0 in the zero
    // states, so with R = 0 and no EMF its ripple rises by (2Vdc/3 - V)(3V Tc/(4 Vdc))/L in each
    // active state and falls as much in each zero state (000 around the period's ends, 111 in its
    // middle, equal here): peak-to-peak = (Vdc Tc/L)(2/3 - m/sqrt 3)(sqrt 3 m/4), m = sqrt 3 V/Vdc.
    const Vdc = 400, Tc = 1e-4, L = 1e-3;
    for (const m of [0.2, 0.5, 0.8, 1.0]) {
      const { y, sw } = rig({ Rs: 0, L, psiM: 0, we: 0 }, { Vdc, modulation: 'svpwm', Tc });
      const d = new Float64Array(3);
      legDuties((m * Vdc) / Math.sqrt(3), 0, Vdc, 'svpwm', d);
      sw.resetProbe();
      sw.half(y, 0, Tc / 2, d, true);
      sw.half(y, Tc / 2, Tc, d, false);
      const p2p = periodRipple(sw.tb, sw.ib, sw.nb, 3, 0);
      const closed = ((Vdc * Tc) / L) * (m / (2 * Math.sqrt(3)) - (m * m) / 4);
      expect(Math.abs(p2p / closed - 1)).toBeLessThan(0.02);
      expect(sw.nb).toBe(7); // six edges: seven segments, eight boundaries less the shared one at the half
    }
  });

  it('averaged and switching runs agree on the fundamental: the period-mean phase current within 1 % of its peak at steady state, dead time 0 (PWM averaging: the period mean of the switched voltage is the command; Holmes and Lipo 2003, ch. 3)', () => {
    const l: Load = { Rs: 0.05, L: 1e-3, psiM: 0.05, we: 2 * Math.PI * 50 };
    const Tc = 1e-4, Vdc = 100;
    const vd = -l.we * l.L * 20, vq = l.Rs * 20 + l.we * l.psiM;
    for (const modulation of ['sinusoidal', 'svpwm', 'dpwm1'] as const) {
      const s = rig(l, { Vdc, modulation, Tc });
      const a = rig(l, { Vdc, modulation, Tc });
      const [id0, iq0] = steadyCurrents(l, vd, vq);
      for (const r of [s, a]) { r.y[0] = id0; r.y[1] = iq0; }
      const v = new Float64Array(2), d = new Float64Array(3);
      let worst = 0;
      const Ipk = Math.hypot(id0, iq0);
      for (let k = 0; k < 600; k++) {
        const t0 = k * Tc, tm = t0 + Tc / 2, t1 = t0 + Tc;
        held(vd, vq, s.y[3]! + (l.we * Tc) / 2, v);
        legDuties(v[0]!, v[1]!, Vdc, modulation, d);
        s.sw.resetProbe();
        s.sw.half(s.y, t0, tm, d, true);
        s.sw.half(s.y, tm, t1, d, false);
        const mSw = meanA(s.sw);
        // the averaged model: the command itself held over the period; Simpson's rule for its mean
        a.plant.input[0] = v[0]!; a.plant.input[1] = v[1]!;
        a.plant.setAngleOrigin(a.y[3]!);
        a.sw.currents(a.y); const i0 = a.sw.iph[0]!;
        a.inner.period(a.y, t0, tm);
        a.sw.currents(a.y); const i1 = a.sw.iph[0]!;
        a.inner.period(a.y, tm, t1);
        a.sw.currents(a.y); const i2 = a.sw.iph[0]!;
        const mAvg = (i0 + 4 * i1 + i2) / 6;
        if (k >= 400) worst = Math.max(worst, Math.abs(mSw - mAvg) / Ipk);
      }
      expect(worst).toBeLessThan(0.01);
    }
  });

  it('dead time: the fundamental voltage loss is (4/pi) Vdc td fsw within 3 %, against the current, at a current far above the ripple (Murai, Watanabe and Iwasaki 1987, IEEE Trans. Industry Applications IA-23(5))', () => {
    const l: Load = { Rs: 0.05, L: 1e-3, psiM: 0.05, we: 2 * Math.PI * 50 };
    const Tc = 1e-4, Vdc = 100, td = 2e-6;
    const vd = -l.we * l.L * 20, vq = l.Rs * 20 + l.we * l.psiM;
    const { y, sw } = rig(l, { Vdc, modulation: 'svpwm', Tc, td });
    [y[0], y[1]] = steadyCurrents(l, vd, vq);
    const n = 200; // one fundamental period of 20 ms
    const ea = new Float64Array(n), eb = new Float64Array(n), ec = new Float64Array(n), ia = new Float64Array(n);
    const v = new Float64Array(2), d = new Float64Array(3);
    for (let k = 0; k < 3 * n; k++) {
      const t0 = k * Tc;
      held(vd, vq, y[3]! + (l.we * Tc) / 2, v);
      legDuties(v[0]!, v[1]!, Vdc, 'svpwm', d);
      sw.resetProbe();
      sw.half(y, t0, t0 + Tc / 2, d, true);
      sw.half(y, t0 + Tc / 2, t0 + Tc, d, false);
      if (k >= 2 * n) {
        const j = k - 2 * n;
        ea[j] = (sw.legVs[0]! - sw.cmdVs[0]!) / Tc; eb[j] = (sw.legVs[1]! - sw.cmdVs[1]!) / Tc; ec[j] = (sw.legVs[2]! - sw.cmdVs[2]!) / Tc;
        ia[j] = meanA(sw);
      }
    }
    const err = deadTimeVoltageError(ea, eb, ec, n, 1);
    const closed = (4 / Math.PI) * Vdc * td / Tc;
    expect(Math.abs(err.fundamental_V / closed - 1)).toBeLessThan(0.03);
    // against the current: the error's fundamental is opposite to phase a's current fundamental
    const c = new Float64Array(2);
    harmonicCoefficients(ia, n, 1, 1, c);
    const cosAngle = (err.a * c[0]! + err.b * c[1]!) / (err.fundamental_V * Math.hypot(c[0]!, c[1]!));
    expect(cosAngle).toBeLessThan(-0.99);
    // the error is a square wave against each current: its 5th harmonic a fifth of its fundamental,
    // the 3rd (common mode) absent from the phase (Murai, Watanabe and Iwasaki 1987)
    const e5 = deadTimeVoltageError(ea, eb, ec, n, 5).fundamental_V; // 5 "cycles" in the window: the 5th harmonic
    const e3 = deadTimeVoltageError(ea, eb, ec, n, 3).fundamental_V;
    expect(e5 / err.fundamental_V).toBeGreaterThan(0.2 * 0.9);
    expect(e5 / err.fundamental_V).toBeLessThan(0.2 * 1.1);
    expect(e3 / err.fundamental_V).toBeLessThan(0.01);
    // that 5th harmonic voltage, (4/pi) Vdc td fsw / 5, drives a 5th harmonic current through the
    // load's impedance at 5 f, |Rs + j 5 w L| (the EMF is at the fundamental only): within 5 %
    const I5 = harmonicAmplitude(ia, n, 1, 5);
    expect(I5 / (closed / 5 / Math.hypot(l.Rs, 5 * l.we * l.L))).toBeGreaterThan(0.95);
    expect(I5 / (closed / 5 / Math.hypot(l.Rs, 5 * l.we * l.L))).toBeLessThan(1.05);
    // the THD of the current to harmonic 25 holds that 5th (and the 7th, ...)
    expect(thd(ia, n, 1, 25)).toBeGreaterThan(I5 / harmonicAmplitude(ia, n, 1, 1));
  });

  it('dead-time and device-drop compensation (control.pwm.deadTimeCompensation): the legs apply the commanded volt-seconds, per half period where the current keeps its sign, and the fundamental loss falls below 2 % of (4/pi)(Vdc td fsw + drop) (the correction by the current sign: Murai, Watanabe and Iwasaki 1987, IEEE Trans. Industry Applications IA-23(5))', () => {
    const l: Load = { Rs: 0.05, L: 1e-3, psiM: 0.05, we: 2 * Math.PI * 50 };
    const Tc = 1e-4, Vdc = 100, td = 2e-6, drop = 1;
    const vd = -l.we * l.L * 20, vq = l.Rs * 20 + l.we * l.psiM;
    const { y, sw } = rig(l, { Vdc, modulation: 'svpwm', Tc, td, drop }, 1e-10, { band_A: 1 });
    [y[0], y[1]] = steadyCurrents(l, vd, vq);
    const n = 200;
    const ea = new Float64Array(n), eb = new Float64Array(n), ec = new Float64Array(n);
    const v = new Float64Array(2), d = new Float64Array(3);
    let worst = 0, halves = 0;
    for (let k = 0; k < 3 * n; k++) {
      const t0 = k * Tc;
      held(vd, vq, y[3]! + (l.we * Tc) / 2, v);
      legDuties(v[0]!, v[1]!, Vdc, 'svpwm', d);
      sw.resetProbe();
      sw.half(y, t0, t0 + Tc / 2, d, true);
      // the rising half alone: legs whose current stays far from zero (20 A amplitude, ripple about 1 A) apply the command exactly
      for (let x = 0; x < 3; x++) {
        if (Math.abs(sw.iph[x]!) > 3) { worst = Math.max(worst, Math.abs(sw.legVs[x]! - sw.cmdVs[x]!) / (Vdc * Tc / 2)); halves++; }
      }
      sw.resetProbe();
      sw.half(y, t0 + Tc / 2, t0 + Tc, d, false);
      if (k >= 2 * n) {
        const j = k - 2 * n;
        // the falling half's error (the rising half's is checked above): the period's sum
        ea[j] = (sw.legVs[0]! - sw.cmdVs[0]!) / (Tc / 2); eb[j] = (sw.legVs[1]! - sw.cmdVs[1]!) / (Tc / 2); ec[j] = (sw.legVs[2]! - sw.cmdVs[2]!) / (Tc / 2);
      }
    }
    expect(halves).toBeGreaterThan(1000);
    expect(worst).toBeLessThan(1e-9); // duty units: the volt-seconds of the half period
    const err = deadTimeVoltageError(ea, eb, ec, n, 1);
    const uncompensated = (4 / Math.PI) * (Vdc * td / Tc + drop);
    expect(err.fundamental_V / uncompensated).toBeLessThan(0.02);
  });

  it('DC-link capacitor rms current of sinusoidal PWM within 3 % of I sqrt(2M (sqrt 3/(4 pi) + cos² phi (sqrt 3/pi - 9M/16))) (Kolar and Round 2006, IEE Proc. Electric Power Applications 153(4))', () => {
    const l: Load = { Rs: 1, L: 5e-3, psiM: 0, we: 2 * Math.PI * 50 };
    const Tc = 1e-4, Vdc = 100;
    for (const M of [0.5, 0.9]) {
      const vd = (M * Vdc) / 2, vq = 0;
      const { y, sw } = rig(l, { Vdc, modulation: 'sinusoidal', Tc });
      [y[0], y[1]] = steadyCurrents(l, vd, vq);
      const n = 200;
      const v = new Float64Array(2), d = new Float64Array(3);
      const ia = new Float64Array(n), va = new Float64Array(n);
      let I1 = 0, I2 = 0, span = 0;
      for (let k = 0; k < 2 * n; k++) {
        const t0 = k * Tc;
        held(vd, vq, y[3]! + (l.we * Tc) / 2, v);
        legDuties(v[0]!, v[1]!, Vdc, 'sinusoidal', d);
        sw.resetProbe();
        sw.half(y, t0, t0 + Tc / 2, d, true);
        sw.half(y, t0 + Tc / 2, t0 + Tc, d, false);
        if (k >= n) {
          I1 += sw.idcInt; I2 += sw.idcSqInt; span += sw.span;
          ia[k - n] = meanA(sw);
          va[k - n] = v[0]!;
        }
      }
      const dc = dcLinkCurrent(I1, I2, span);
      const ci = new Float64Array(2), cv = new Float64Array(2);
      harmonicCoefficients(ia, n, 1, 1, ci);
      harmonicCoefficients(va, n, 1, 1, cv);
      const Irms = Math.hypot(ci[0]!, ci[1]!) / Math.SQRT2;
      const cosPhi = (ci[0]! * cv[0]! + ci[1]! * cv[1]!) / (Math.hypot(ci[0]!, ci[1]!) * Math.hypot(cv[0]!, cv[1]!));
      const closed = Irms * Math.sqrt(2 * M * (Math.sqrt(3) / (4 * Math.PI) + cosPhi * cosPhi * (Math.sqrt(3) / Math.PI - (9 * M) / 16)));
      expect(Math.abs(dc.rippleRms_A / closed - 1)).toBeLessThan(0.03);
      // the mean is the power balance: 1.5 V I cos phi / Vdc (a lossless bridge)
      expect(dc.mean_A).toBeCloseTo((1.5 * (M * Vdc / 2) * Irms * Math.SQRT2 * cosPhi) / Vdc, 1);
    }
  });

  describe('dead-time rule (Murai, Watanabe and Iwasaki 1987: the diode that conducts sets the leg in the dead time)', () => {
    const Vdc = 100, Tc = 1e-4, td = 2e-6;
    const period = (id0: number, d: number[]) => {
      const { y, sw } = rig({ Rs: 0, L: 1e3, psiM: 0, we: 0 }, { Vdc, modulation: 'svpwm', Tc, td });
      y[0] = id0; // theta = 0: i_a = id, i_b = i_c = -id/2 (held by the large inductance)
      const dd = Float64Array.from(d);
      sw.resetProbe();
      sw.half(y, 0, Tc / 2, dd, true);
      sw.half(y, Tc / 2, Tc, dd, false);
      return sw;
    };
    it('a current out of the leg loses Vdc td per period, into it gains as much', () => {
      const sw = period(10, [0.3, 0.5, 0.7]);
      expect((sw.legVs[0]! - sw.cmdVs[0]!) / (Vdc * td)).toBeCloseTo(-1, 9);
      expect((sw.legVs[1]! - sw.cmdVs[1]!) / (Vdc * td)).toBeCloseTo(1, 9);
      expect((sw.legVs[2]! - sw.cmdVs[2]!) / (Vdc * td)).toBeCloseTo(1, 9);
    });
    it('at zero current the pulse is delayed by td, its width kept: no volt-second error (the rule of switching-period.ts)', () => {
      const sw = period(0, [0.3, 0.5, 0.7]);
      for (let x = 0; x < 3; x++) expect(sw.legVs[x]! - sw.cmdVs[x]!).toBeCloseTo(0, 12);
      // leg a rises at (1 - 0.3) Tc/2 + td
      expect([...sw.tb.subarray(0, sw.nb)].some((t) => Math.abs(t - (0.35 * Tc + td)) < 1e-15)).toBe(true);
    });
    it('a pulse shorter than the dead time vanishes when the current waits for it in the lower diode', () => {
      const sw = period(10, [0.01, 0.5, 0.5]);
      expect(sw.legVs[0]).toBe(0);
      expect(sw.on[0]).toBe(0);
    });
  });
});
