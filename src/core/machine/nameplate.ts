/**
 * Datasheet terms -> dq model. The one place where line-to-line, rms, poles and V/krpm are
 * converted into the engine's SI, per-phase (star-equivalent), peak quantities at 20 °C.
 * Every input is echoed in `interpretation` with what it was taken to mean.
 */
import type { DqMachine, Mechanics } from './dq-machine';
import type { Finding } from '../base/finding';
import { InputError } from '../base/errors';
import { NDFEB_ALPHA_BR, fluxAt, resistanceAt } from './thermal';
import { RPM_TO_RAD_S, SQRT2, SQRT3 } from '../base/units';

/** R or L as measured: per phase (star equivalent) or between two terminals. */
export type Basis = 'phase' | 'line-to-line';
/** Back-EMF constant units: line-to-line rms or peak volts per 1000 rpm (mechanical), or
 * phase-peak volts per electrical rad/s (= V·s/rad = Wb, which is psiM itself). */
export type KeUnit = 'V_LL_rms/krpm' | 'V_LL_peak/krpm' | 'V_ph_peak*s/rad';
/** Torque constant per rms or per peak phase ampere. */
export type KtUnit = 'Nm/A_rms' | 'Nm/A_peak';
export type CurrentBasis = 'rms' | 'peak';

export interface Nameplate {
  /** number of magnet poles (even); give this or polePairs */
  poles?: number;
  polePairs?: number;
  /** winding resistance, ohm, at temp_C (default 20 °C) */
  R: { value: number; basis: Basis; temp_C?: number };
  /** synchronous inductance of a surface-magnet motor (Ld = Lq), H; give this or Ld */
  L?: { value: number; basis: Basis };
  /** d-axis inductance, H */
  Ld?: { value: number; basis: Basis };
  /** q-axis inductance, H; missing = surface magnet, Lq = Ld */
  Lq?: { value: number; basis: Basis };
  /** back-EMF constant at temp_C (default 20 °C); give Ke or Kt or both */
  Ke?: { value: number; unit: KeUnit; temp_C?: number };
  /** torque constant (at id = 0) at temp_C (default: Ke's temperature, else 20 °C) */
  Kt?: { value: number; unit: KtUnit; temp_C?: number };
  /** rated (continuous) phase current, A */
  ratedCurrent?: { value: number; basis: CurrentBasis };
  /** peak phase current of the motor, A */
  peakCurrent?: { value: number; basis: CurrentBasis };
  ratedSpeed_rpm?: number;
  ratedTorque_Nm?: number;
  maxSpeed_rpm?: number;
  /** rotor inertia, kg·m² */
  inertia: number;
  /** N·m·s/rad, default 0 */
  viscousFriction?: number;
  /** N·m, default 0 */
  coulombFriction?: number;
}

export interface Interpretation {
  field: string;
  given: string;
  takenAs: string;
}

/** Rated data in SI (peak A, rad/s), when the nameplate gives them. */
export interface RatedData {
  current_A?: number;
  peakCurrent_A?: number;
  speed_rad_s?: number;
  torque_Nm?: number;
  maxSpeed_rad_s?: number;
}

export interface NameplateModel {
  /** dq model at 20 °C */
  model: DqMachine;
  mechanics: Mechanics;
  rated: RatedData;
  interpretation: Interpretation[];
  findings: Finding[];
}

export interface NameplateOptions {
  /** magnet remanence coefficient, 1/K, used to bring Ke (and Kt) to 20 °C */
  magnetTempCoeff: number;
  /** project path of the nameplate section, for messages */
  path: string;
  /** relative Kt vs Ke disagreement above which a finding is raised */
  ktKeTolerance: number;
}

export const DEFAULT_NAMEPLATE_OPTIONS: Readonly<NameplateOptions> = {
  magnetTempCoeff: NDFEB_ALPHA_BR,
  path: 'nameplate',
  ktKeTolerance: 0.05,
};

/** 1000 rpm in rad/s (mechanical). */
const KRPM = 1000 * RPM_TO_RAD_S;

/** A short number for messages: 4 significant digits, no exponent for ordinary magnitudes. */
export function fmt(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  const r = Number(x.toPrecision(4));
  return Math.abs(r) >= 1e-4 || r === 0 ? String(r) : r.toExponential(3);
}

/** psiM (Wb, phase peak per electrical rad/s) from a back-EMF constant. */
export function psiMFromKe(value: number, unit: KeUnit, polePairs: number): number {
  switch (unit) {
    case 'V_LL_rms/krpm':
      // E_ph,peak = E_LL,rms·sqrt(2)/sqrt(3) at omega_e = p·1000 rpm
      return (value * SQRT2) / SQRT3 / (polePairs * KRPM);
    case 'V_LL_peak/krpm':
      return value / SQRT3 / (polePairs * KRPM);
    case 'V_ph_peak*s/rad':
      return value;
  }
}

/** Torque constant in N·m per peak ampere from a datasheet value. */
export const ktToPeak = (value: number, unit: KtUnit): number => (unit === 'Nm/A_rms' ? value / SQRT2 : value);

export interface DerivedConstants {
  /** torque per peak phase ampere at id = 0: 1.5 p psiM, N·m/A */
  Kt_Nm_per_Apeak: number;
  /** torque per rms phase ampere at id = 0, N·m/A */
  Kt_Nm_per_Arms: number;
  /** line-to-line rms back-EMF per 1000 rpm, V */
  Ke_VLLrms_per_krpm: number;
  /** line-to-line peak back-EMF per 1000 rpm, V */
  Ke_VLLpeak_per_krpm: number;
  /** phase peak back-EMF per electrical rad/s, V·s/rad (= psiM) */
  Ke_Vs_per_rad: number;
  /** psiM/Ld, A peak: the short-circuit current, and the centre of the voltage ellipses */
  characteristicCurrent_A: number;
  /** Lq/Ld */
  saliency: number;
  /** Ld/Rs, s */
  tauD_s: number;
  /** Lq/Rs, s */
  tauQ_s: number;
}

/** Datasheet constants of a dq model (at whatever temperature `m` is). */
export function deriveConstants(m: DqMachine): DerivedConstants {
  const p = m.polePairs;
  const ktPeak = 1.5 * p * m.psiM;
  const ePhPeakPerKrpm = m.psiM * p * KRPM;
  return {
    Kt_Nm_per_Apeak: ktPeak,
    Kt_Nm_per_Arms: ktPeak * SQRT2,
    Ke_VLLrms_per_krpm: (ePhPeakPerKrpm * SQRT3) / SQRT2,
    Ke_VLLpeak_per_krpm: ePhPeakPerKrpm * SQRT3,
    Ke_Vs_per_rad: m.psiM,
    characteristicCurrent_A: m.psiM / m.Ld,
    saliency: m.Lq / m.Ld,
    tauD_s: m.Ld / m.Rs,
    tauQ_s: m.Lq / m.Rs,
  };
}

const KE_LABEL: Record<KeUnit, string> = {
  'V_LL_rms/krpm': 'V (line-to-line rms) per 1000 rpm',
  'V_LL_peak/krpm': 'V (line-to-line peak) per 1000 rpm',
  'V_ph_peak*s/rad': 'V·s/rad (phase peak per electrical rad/s)',
};

function positive(path: string, x: number | undefined, unit: string): void {
  if (x !== undefined && !(Number.isFinite(x) && x > 0)) throw new InputError(path, `must be > 0 ${unit}`.trim());
}

/**
 * Convert a nameplate to the dq model at 20 °C.
 * Throws InputError for contradictions (both poles and pole pairs disagreeing, odd poles, no Ke
 * and no Kt, both L and Ld). Consistency problems that still allow a model are `findings`.
 */
export function nameplateToModel(np: Nameplate, options: Partial<NameplateOptions> = {}): NameplateModel {
  const o: NameplateOptions = { ...DEFAULT_NAMEPLATE_OPTIONS, ...options };
  const P = o.path;
  const interpretation: Interpretation[] = [];
  const findings: Finding[] = [];
  const say = (field: string, given: string, takenAs: string): void => {
    interpretation.push({ field: `${P}.${field}`, given, takenAs });
  };

  // --- poles
  let p: number;
  if (np.poles !== undefined) {
    if (!Number.isInteger(np.poles) || np.poles < 2 || np.poles % 2 !== 0) {
      throw new InputError(`${P}.poles`, 'must be an even whole number >= 2 (poles, not pole pairs)');
    }
    p = np.poles / 2;
    if (np.polePairs !== undefined && np.polePairs !== p) {
      throw new InputError(`${P}.polePairs`, `disagrees with ${P}.poles (${np.poles} poles = ${p} pole pairs)`);
    }
    say('poles', `${np.poles} poles`, `p = ${p} pole pairs`);
  } else if (np.polePairs !== undefined) {
    if (!Number.isInteger(np.polePairs) || np.polePairs < 1) throw new InputError(`${P}.polePairs`, 'must be a whole number >= 1');
    p = np.polePairs;
    say('polePairs', `${p} pole pairs`, `p = ${p} pole pairs (${2 * p} poles)`);
  } else {
    throw new InputError(`${P}.poles`, 'is required (or polePairs)');
  }

  const alphaBr = o.magnetTempCoeff;
  for (const t of [np.Ke?.temp_C, np.Kt?.temp_C]) {
    if (t !== undefined && !(fluxAt(1, t, alphaBr) > 0)) {
      throw new InputError('conditions.magnetTempCoeff', `makes the magnet flux vanish at ${fmt(t)} °C; use a coefficient between -0.003 and 0.001 /K`);
    }
  }
  const toPhase = (x: number, basis: Basis): number => (basis === 'line-to-line' ? x / 2 : x);
  const basisText = (b: Basis): string => (b === 'line-to-line' ? 'line-to-line' : 'per phase');

  // --- resistance
  positive(`${P}.R.value`, np.R.value, 'ohm');
  const tR = np.R.temp_C ?? 20;
  const RsAtT = toPhase(np.R.value, np.R.basis);
  const Rs20 = RsAtT / resistanceAt(1, tR);
  say(
    'R',
    `${fmt(np.R.value)} ohm ${basisText(np.R.basis)} at ${fmt(tR)} °C`,
    (np.R.basis === 'line-to-line' ? `Rs = ${fmt(RsAtT)} ohm/phase (star equivalent, half the line-to-line value)` : `Rs = ${fmt(RsAtT)} ohm/phase`) +
      (tR !== 20 ? ` at ${fmt(tR)} °C -> ${fmt(Rs20)} ohm/phase at 20 °C (copper 0.00393 /K)` : ' at 20 °C'),
  );

  // --- inductances
  let Ld: number;
  let Lq: number;
  if (np.L !== undefined) {
    if (np.Ld !== undefined || np.Lq !== undefined) throw new InputError(`${P}.L`, 'give either L (surface magnet) or Ld/Lq, not both');
    positive(`${P}.L.value`, np.L.value, 'H');
    Ld = Lq = toPhase(np.L.value, np.L.basis);
    say('L', `${fmt(np.L.value)} H ${basisText(np.L.basis)}`, `Ld = Lq = ${fmt(Ld)} H per phase (surface magnet)`);
  } else if (np.Ld !== undefined) {
    positive(`${P}.Ld.value`, np.Ld.value, 'H');
    Ld = toPhase(np.Ld.value, np.Ld.basis);
    say('Ld', `${fmt(np.Ld.value)} H ${basisText(np.Ld.basis)}`, `Ld = ${fmt(Ld)} H per phase`);
    if (np.Lq !== undefined) {
      positive(`${P}.Lq.value`, np.Lq.value, 'H');
      Lq = toPhase(np.Lq.value, np.Lq.basis);
      say('Lq', `${fmt(np.Lq.value)} H ${basisText(np.Lq.basis)}`, `Lq = ${fmt(Lq)} H per phase`);
    } else {
      Lq = Ld;
      say('Lq', 'not given', `Lq = Ld = ${fmt(Ld)} H (surface magnet assumed)`);
      findings.push({
        code: 'spm-assumed',
        severity: 'info',
        field: `${P}.Lq`,
        message: 'Lq is not given, so a surface-magnet motor (Lq = Ld, no reluctance torque) is assumed.',
      });
    }
  } else {
    throw new InputError(`${P}.Ld`, 'is required (or L for a surface-magnet motor), H');
  }

  // --- back-EMF and torque constants
  let psiM20: number;
  const tKe = np.Ke?.temp_C ?? 20;
  const tKt = np.Kt?.temp_C ?? np.Ke?.temp_C ?? 20;
  if (np.Ke !== undefined) {
    positive(`${P}.Ke.value`, np.Ke.value, 'V');
    const psiT = psiMFromKe(np.Ke.value, np.Ke.unit, p);
    psiM20 = psiT / fluxAt(1, tKe, alphaBr);
    say(
      'Ke',
      `${fmt(np.Ke.value)} ${KE_LABEL[np.Ke.unit]} at ${fmt(tKe)} °C`,
      `psiM = ${fmt(psiT)} Wb (phase peak back-EMF / electrical rad/s, p = ${p})` +
        (tKe !== 20 ? ` at ${fmt(tKe)} °C -> ${fmt(psiM20)} Wb at 20 °C (magnet ${alphaBr} /K)` : ' at 20 °C'),
    );
  } else if (np.Kt !== undefined) {
    positive(`${P}.Kt.value`, np.Kt.value, 'N·m/A');
    const ktPk = ktToPeak(np.Kt.value, np.Kt.unit);
    const psiT = ktPk / (1.5 * p);
    psiM20 = psiT / fluxAt(1, tKt, alphaBr);
    findings.push({
      code: 'psim-from-kt',
      severity: 'info',
      field: `${P}.Kt`,
      message:
        'psiM is taken from Kt (no Ke given). A datasheet Kt measured under load includes saturation and, on an interior-magnet motor, reluctance torque; a measured Ke is the better source.',
    });
  } else {
    throw new InputError(`${P}.Ke`, 'is required (or Kt), a back-EMF constant');
  }
  if (np.Kt !== undefined) {
    positive(`${P}.Kt.value`, np.Kt.value, 'N·m/A');
    const ktPk = ktToPeak(np.Kt.value, np.Kt.unit);
    say(
      'Kt',
      `${fmt(np.Kt.value)} N·m per ${np.Kt.unit === 'Nm/A_rms' ? 'rms' : 'peak'} phase ampere at ${fmt(tKt)} °C`,
      `Kt = ${fmt(ktPk)} N·m/A peak = ${fmt(ktPk * SQRT2)} N·m/A rms` + (np.Ke !== undefined ? ' (checked against Ke; psiM taken from Ke)' : ` -> psiM = ${fmt(psiM20)} Wb at 20 °C`),
    );
    if (np.Ke !== undefined) {
      // Kt_peak = 1.5 p psiM, i.e. Kt[N·m/A_rms] = sqrt(3)·Ke[V_LL,rms per mechanical rad/s]
      const ktFromKe = 1.5 * p * fluxAt(psiM20, tKt, alphaBr);
      const rel = ktPk / ktFromKe - 1;
      if (Math.abs(rel) > o.ktKeTolerance) {
        findings.push({
          code: 'kt-ke-mismatch',
          severity: 'warning',
          field: `${P}.Kt`,
          message:
            `Kt (${fmt(ktPk * SQRT2)} N·m/A rms) and Ke (which implies ${fmt(ktFromKe * SQRT2)} N·m/A rms) disagree by ${(rel * 100).toFixed(1)} %, ` +
            `more than ${fmt(o.ktKeTolerance * 100)} %. psiM is taken from Ke. Check the units (rms or peak, line-to-line or phase, poles or pole pairs); ` +
            (rel < 0
              ? 'a Kt measured at high current is lower through saturation.'
              : Lq > Ld
                ? 'on an interior-magnet motor a Kt measured along MTPA includes reluctance torque and is higher than 1.5 p psiM.'
                : 'a Kt above the one Ke implies is unusual for a surface-magnet motor.'),
        });
      }
    }
  }

  // --- rated data
  const rated: RatedData = {};
  const curr = (name: 'ratedCurrent' | 'peakCurrent'): number | undefined => {
    const c = np[name];
    if (c === undefined) return undefined;
    positive(`${P}.${name}.value`, c.value, 'A');
    const pk = c.basis === 'rms' ? c.value * SQRT2 : c.value;
    say(name, `${fmt(c.value)} A ${c.basis}`, `${fmt(pk)} A peak phase (${fmt(pk / SQRT2)} A rms)`);
    return pk;
  };
  const ic = curr('ratedCurrent');
  if (ic !== undefined) rated.current_A = ic;
  const ip = curr('peakCurrent');
  if (ip !== undefined) rated.peakCurrent_A = ip;
  if (np.ratedSpeed_rpm !== undefined) {
    rated.speed_rad_s = np.ratedSpeed_rpm * RPM_TO_RAD_S;
    say('ratedSpeed_rpm', `${fmt(np.ratedSpeed_rpm)} rpm`, `${fmt(rated.speed_rad_s)} rad/s mechanical`);
  }
  if (np.ratedTorque_Nm !== undefined) rated.torque_Nm = np.ratedTorque_Nm;
  if (np.maxSpeed_rpm !== undefined) rated.maxSpeed_rad_s = np.maxSpeed_rpm * RPM_TO_RAD_S;
  if (ic !== undefined && ip !== undefined && ip < ic) {
    findings.push({
      code: 'peak-below-rated',
      severity: 'warning',
      field: `${P}.peakCurrent`,
      message: `The peak current (${fmt(ip)} A peak) is below the rated current (${fmt(ic)} A peak); check rms versus peak.`,
    });
  }

  positive(`${P}.inertia`, np.inertia, 'kg·m²');
  const mechanics: Mechanics = {
    inertia: np.inertia,
    viscousFriction: np.viscousFriction ?? 0,
    coulombFriction: np.coulombFriction ?? 0,
  };
  return { model: { polePairs: p, Rs: Rs20, Ld, Lq, psiM: psiM20 }, mechanics, rated, interpretation, findings };
}
