/**
 * Plain words for the engine's codes and project paths, for screens and text reports (the JSON
 * documents keep the codes): which limit decides a point, the control region, a finding's severity,
 * and the input a project path names.
 */
import type { LimitedBy, Region } from '../steady-state/operating-point-types';
import type { Severity } from '../base/finding';

const LIMIT: Record<LimitedBy, string> = {
  none: 'within both limits',
  current: 'the current limit',
  voltage: 'the voltage limit',
  'current-and-voltage': 'both the current and the voltage limit',
  'beyond-mtpv': 'beyond the maximum-torque-per-volt limit',
};

/** Which limit decides a point, in words ("the voltage limit", "beyond the maximum-torque-per-volt limit"). */
export function limitPhrase(code: LimitedBy | string): string {
  return (LIMIT as Record<string, string>)[code] ?? code.replace(/-/g, ' ');
}

/** Why a point is out of reach, in words: "not reachable: beyond the maximum-torque-per-volt limit". */
export function notReachablePhrase(code: LimitedBy | string): string {
  if (code === 'none') return 'not reachable';
  const p = limitPhrase(code);
  return `not reachable: ${p.startsWith('beyond') ? p : `held by ${p}`}`;
}

const REGION: Record<Region | 'beyond-max-speed', string> = {
  mtpa: 'maximum torque per ampere (MTPA)',
  'field-weakening': 'field weakening',
  mtpv: 'maximum torque per volt (MTPV)',
  'beyond-max-speed': 'beyond the maximum speed',
};

/** The control region of an operating point, in words. */
export function regionPhrase(code: Region | string): string {
  return (REGION as Record<string, string>)[code] ?? code.replace(/-/g, ' ');
}

const SEVERITY: Record<Severity, string> = { info: 'note', warning: 'caution', danger: 'danger' };

/** A finding's severity as a word: note, caution, danger. */
export function severityPhrase(s: Severity | string): string {
  return (SEVERITY as Record<string, string>)[s] ?? s;
}

/** Inputs by project path (array indices written as []). */
const FIELD: Record<string, string> = {
  'motor': 'motor model',
  'motor.polePairs': 'motor pole pairs',
  'motor.Rs': 'motor resistance',
  'motor.Ld': 'motor d-axis inductance',
  'motor.Lq': 'motor q-axis inductance',
  'motor.psiM': 'motor magnet flux linkage',
  'motor.inertia': 'rotor inertia',
  'motor.viscousFriction': 'viscous friction',
  'motor.coulombFriction': 'Coulomb friction',
  'motor.maxSpeed_rpm': 'motor maximum speed',
  'motor.ratedCurrent': 'motor rated current',
  'motor.peakCurrent': 'motor peak current',
  'motor.fluxMap': 'motor flux map',
  'motor.fluxMap.magnetTemp_C': 'flux map magnet temperature',
  'motor.fluxMap.id_A': 'flux map d currents',
  'motor.fluxMap.iq_A': 'flux map q currents',
  'motor.fluxMap.psid_Wb': 'flux map d flux linkages',
  'motor.fluxMap.psiq_Wb': 'flux map q flux linkages',
  'nameplate': 'motor datasheet',
  'nameplate.poles': 'motor poles',
  'nameplate.polePairs': 'motor pole pairs',
  'nameplate.R': 'winding resistance',
  'nameplate.L': 'winding inductance',
  'nameplate.Ld': 'd-axis inductance',
  'nameplate.Lq': 'q-axis inductance',
  'nameplate.Ke': 'back-EMF constant Ke',
  'nameplate.Kt': 'torque constant Kt',
  'nameplate.ratedCurrent': 'motor rated current',
  'nameplate.peakCurrent': 'motor peak current',
  'nameplate.ratedSpeed_rpm': 'motor rated speed',
  'nameplate.ratedTorque_Nm': 'motor rated torque',
  'nameplate.maxSpeed_rpm': 'motor maximum speed',
  'nameplate.inertia': 'rotor inertia',
  'nameplate.viscousFriction': 'viscous friction',
  'nameplate.coulombFriction': 'Coulomb friction',
  'inverter': 'inverter',
  'inverter.Vdc': 'DC bus voltage',
  'inverter.Imax': 'inverter peak current',
  'inverter.Icont': 'inverter continuous current',
  'inverter.modulation': 'modulation',
  'inverter.voltageUtilization': 'voltage utilisation',
  'inverter.deviceDrop': 'device voltage drop',
  'conditions': 'temperatures',
  'conditions.windingTemp_C': 'hot winding temperature',
  'conditions.magnetTemp_C': 'hot magnet temperature',
  'conditions.coldTemp_C': 'cold-corner temperature',
  'conditions.magnetTempCoeff': 'magnet remanence coefficient',
  'control': 'controller',
  'control.mode': 'control mode',
  'control.fCtrl_Hz': 'control rate',
  'control.delaySamples': 'control delay',
  'control.currentBandwidth_Hz': 'current-loop bandwidth',
  'control.currentKp': 'current-loop Kp',
  'control.currentKi': 'current-loop Ki',
  'control.speedBandwidth_Hz': 'speed-loop bandwidth',
  'control.speedKp': 'speed-loop Kp',
  'control.speedKi': 'speed-loop Ki',
  'control.speedTuning': 'speed-loop tuning',
  'control.speedTuning.method': 'speed-loop tuning rule',
  'control.speedTuning.a': 'symmetric-optimum spacing',
  'control.antiWindup': 'anti-windup',
  'control.decoupling': 'decoupling',
  'control.speedLoopDivider': 'speed-loop rate divider',
  'control.speedRamp_rpm_per_s': 'speed ramp',
  'control.speedPrefilter': 'speed reference prefilter',
  'control.angle': 'angle source',
  'control.angle.source': 'angle source',
  'control.angle.linesPerRev': 'encoder lines per revolution',
  'control.angle.speedWindowPeriods': 'encoder speed window',
  'control.angle.speedFilter_Hz': 'encoder speed filter',
  'control.angle.offset_deg': 'encoder mounting offset',
  'control.angle.timerFrequency_Hz': 'encoder edge timer frequency',
  'control.angle.bandwidth_Hz': 'angle tracking-loop bandwidth',
  'control.angle.damping': 'resolver tracking-loop damping',
  'control.angle.amplitudeImbalance': 'resolver amplitude imbalance',
  'control.angle.quadratureError_deg': 'resolver quadrature error',
  'control.angle.polePairs': 'resolver pole pairs',
  'control.angle.handoverSpeed_rpm': 'sensorless hand-over speed',
  'control.angle.fluxError_pct': 'observer flux-linkage error',
  'control.angle.resistanceError_pct': 'observer resistance error',
  'control.angle.inductanceError_pct': 'observer inductance error',
  'scenario': 'load-step scenario',
  'scenario.duration_s': 'scenario duration',
  'scenario.initialSpeed_rpm': 'initial speed',
  'scenario.loadInertia': 'load inertia',
  'scenario.speedSteps': 'speed reference steps',
  'scenario.loadSteps': 'load torque steps',
  'scenario.torqueSteps': 'torque reference steps',
  'losses': 'loss coefficients',
  'losses.iron': 'motor iron loss',
  'losses.iron.kh': 'iron hysteresis loss coefficient',
  'losses.iron.beta': 'iron hysteresis flux exponent',
  'losses.iron.ke': 'iron eddy-current loss coefficient',
  'losses.windage': 'motor windage',
  'losses.windage.kw': 'windage coefficient',
  'losses.inverter': 'inverter losses',
  'losses.inverter.Vce0': 'switch threshold voltage',
  'losses.inverter.rce': 'switch on-state resistance',
  'losses.inverter.Vf0': 'diode threshold voltage',
  'losses.inverter.rd': 'diode on-state resistance',
  'losses.inverter.EonEoff_J': 'switch turn-on and turn-off energy',
  'losses.inverter.Err_J': 'diode reverse-recovery energy',
  'losses.inverter.Vref_V': 'switching-energy test voltage',
  'losses.inverter.Iref_A': 'switching-energy test current',
  'losses.inverter.fsw_Hz': 'switching frequency',
  'thermal': 'thermal network',
  'thermal.coolantTemp_C': 'coolant temperature',
  'thermal.windingCapacity_J_per_K': 'winding heat capacity',
  'thermal.windingToStator_K_per_W': 'winding-to-stator thermal resistance',
  'thermal.statorCapacity_J_per_K': 'stator heat capacity',
  'thermal.statorToCoolant_K_per_W': 'stator-to-coolant thermal resistance',
  'thermal.statorToCoolantBySpeed': 'stator-to-coolant resistance by speed',
  'thermal.statorToCoolantBySpeed.speed_rpm': 'stator-to-coolant table speeds',
  'thermal.statorToCoolantBySpeed.K_per_W': 'stator-to-coolant table resistances',
  'thermal.magnetAboveStator_K': 'magnet temperature above the stator',
  'thermal.windingMax_C': 'winding temperature limit',
  'thermal.magnetMax_C': 'magnet temperature limit',
  'thermal.junctionToCoolant_K_per_W': 'junction-to-coolant thermal resistance',
  'thermal.junctionMax_C': 'junction temperature limit',
  'dutyCycle': 'duty cycle',
  'dutyCycle.label': 'duty cycle name',
  'dutyCycle.t_s': 'duty cycle times',
  'dutyCycle.speed_rpm': 'duty cycle speeds',
  'dutyCycle.torque_Nm': 'duty cycle torques',
  'tolerances': 'tolerance bands',
  'tolerances.motor.Rs': 'motor resistance tolerance',
  'tolerances.motor.psiM': 'motor magnet flux linkage tolerance',
  'tolerances.motor.Ld': 'motor d-axis inductance tolerance',
  'tolerances.motor.Lq': 'motor q-axis inductance tolerance',
  'tolerances.motor.fluxMap.magnetFlux': 'flux map magnet flux tolerance',
  'tolerances.motor.fluxMap.scale': 'flux map scale tolerance',
  'tolerances.nameplate.R': 'winding resistance tolerance',
  'tolerances.nameplate.Ke': 'back-EMF constant Ke tolerance',
  'tolerances.nameplate.Kt': 'torque constant Kt tolerance',
  'tolerances.nameplate.L': 'winding inductance tolerance',
  'tolerances.nameplate.Ld': 'd-axis inductance tolerance',
  'tolerances.nameplate.Lq': 'q-axis inductance tolerance',
  'tolerances.inverter.Vdc': 'DC bus voltage tolerance',
  'tolerances.inverter.Imax': 'inverter peak current tolerance',
  'tolerances.thermal.coolantTemp_C': 'coolant temperature tolerance',
  'tolerances.monteCarlo': 'Monte Carlo settings',
  'tolerances.monteCarlo.samples': 'Monte Carlo samples',
  'tolerances.monteCarlo.seed': 'Monte Carlo seed',
  'tolerances.monteCarlo.distribution': 'Monte Carlo distribution',
  'tolerances.monteCarlo.sigmaOfBand': 'Monte Carlo standard deviation',
  'variants': 'design variants',
  'requirements': 'requirement points',
  'version': 'file format version',
  'file': 'project file',
};

const SUB: Record<string, string> = { value: '', basis: 'basis', unit: 'unit', temp_C: 'temperature', t_s: 'time', speed_rpm: 'speed', torque_Nm: 'torque', label: 'label' };

/**
 * The input a project path names, in words: "inverter.Imax" -> "inverter peak current",
 * "nameplate.Ke.temp_C" -> "back-EMF constant Ke temperature", "requirements.2.speed_rpm" ->
 * "requirement point 3 speed". An unknown path is returned as given.
 */
export function fieldPhrase(path: string): string {
  const direct = FIELD[path];
  if (direct !== undefined) return direct;
  const parts = path.split('.');
  // a row of a list: "<list> <n> <column>"
  for (let i = parts.length - 1; i > 0; i--) {
    const idx = parts[i]!;
    if (/^\d+$/.test(idx)) {
      const list = parts.slice(0, i).join('.');
      const listName = FIELD[list];
      if (listName === undefined) break;
      const row = list === 'requirements' ? `requirement point ${Number(idx) + 1}` : `${listName.replace(/s$/, '')} ${Number(idx) + 1}`;
      const rest = parts.slice(i + 1).map((p) => SUB[p] ?? p).filter((p) => p !== '');
      return [row, ...rest].join(' ');
    }
  }
  // a sub-key of a known input: "<input> <sub>"
  for (let i = parts.length - 1; i > 0; i--) {
    const head = FIELD[parts.slice(0, i).join('.')];
    if (head !== undefined) {
      const rest = parts.slice(i).map((p) => SUB[p] ?? p).filter((p) => p !== '');
      return rest.length ? `${head} ${rest.join(' ')}` : head;
    }
  }
  return path;
}

/** A finding for a screen or a text report: "caution, inverter peak current: message". */
export function findingLine(f: { severity: Severity | string; field?: string; message: string }): string {
  return `${severityPhrase(f.severity)}${f.field ? `, ${fieldPhrase(f.field)}` : ''}: ${plainMessage(f.message)}`;
}

const PATHS = Object.keys(FIELD)
  .filter((k) => k.includes('.'))
  .sort((a, b) => b.length - a.length);
const PATH_RE = new RegExp(`(?<![\\w.])(${PATHS.map((p) => p.replace(/\./g, '\\.')).join('|')})(?![\\w])`, 'g');

/** A message with every project path in it written as words ("raise control.fCtrl_Hz" -> "raise the control rate"). */
export function plainMessage(message: string): string {
  return message.replace(PATH_RE, (p) => `the ${fieldPhrase(p)}`).replace(/\bthe the\b/g, 'the');
}
