/**
 * Load a project, the one pipeline of the app, its worker and the CLI (loadProject): JSON with the
 * duplicate-key check (project-json.ts), the format migration (migrate.ts), the schema (schema.ts),
 * then the resolution: the dq machine at 20 °C, hot and cold, the inverter's limits (peak and
 * continuous current), the conditions, the requirements, what each nameplate input was taken to
 * mean, and consistency findings.
 */
import type { Conditions, DqMachine, Mechanics } from '../machine/dq-machine';
import type { CurrentLimits } from '../drive/current-limit-types';
import type { DriveLimits, InverterSpec } from '../drive/inverter-spec';
import type { Finding } from '../base/finding';
import type { Requirement } from '../steady-state/operating-point-types';
import { effectiveCurrentLimits } from '../drive/current-limits';
import { defaultedInputFindings } from './defaulted-inputs';
import { InputError } from '../base/errors';
import { machineAt } from '../machine/thermal';
import { driveLimits } from '../drive/inverter';
import { nameplateToModel, type Interpretation, type RatedData } from '../machine/nameplate';
import { DEFAULT_COLD_TEMP_C, DEFAULT_DUTY, DEFAULT_MODULATION, DEFAULT_TEMP_C, defaultConditions, parseProject, type FluxMapSection, type LossesSection, type ProjectFile } from './schema';
import { resolveFluxMap } from './flux-map-resolve';
import { dutyCycleOf, thermalNetworkOf, type ResolvedDutyCycle } from './thermal-resolve';
import type { ThermalNetworkSpec } from '../machine/thermal-network-spec';
import { migrateProject } from './migrate';
import { oddMachineFindings, ratedFindings } from './resolve-findings';
import { parseProjectJson } from './project-json';
import { RPM_TO_RAD_S } from '../base/units';
import type { MachineModel } from '../machine/machine-model';
import { LinearDqModel } from '../machine/linear-dq';
import { toleranceChoiceProblems } from './tolerance-schema';

export { parseProjectJson };
export type { ResolvedDutyCycle } from './thermal-resolve';
export { DEFAULT_COLD_TEMP_C, DEFAULT_MODULATION, DEFAULT_TEMP_C } from './schema';

/**
 * A machine model the solvers are given, carrying its apparent constant terms at zero current
 * (Ld, Lq, psiM: its own for a constant machine, a flux map's incremental inductances and psi_d
 * there) so that a setup built from it still shows them. Solvers ask the model, never these terms.
 */
export type ProjectModel = MachineModel & DqMachine;

export interface ResolvedProject {
  /** the validated file with its defaults filled in */
  file: ProjectFile;
  name: string;
  /** dq model at 20 °C */
  machine20: DqMachine;
  /** Rs at the winding temperature, psiM at the magnet temperature */
  hot: DqMachine;
  /** Rs and psiM at the cold temperature (highest back-EMF) */
  cold: DqMachine;
  /**
   * The machine models the solvers are given (hot and cold corners, and at 20 °C): the constant dq
   * machine's, or a flux map's. `machine20`, `hot` and `cold` above are then the apparent constant
   * terms at zero current, for display.
   */
  models: { at20: ProjectModel; hot: ProjectModel; cold: ProjectModel };
  mechanics: Mechanics;
  inverter: InverterSpec;
  /** voltage limit and the effective peak current (the weaker of inverter Imax and motor peak current) */
  peak: DriveLimits;
  /** voltage limit and the effective continuous current (the weaker of inverter Icont and motor rated current) */
  continuous: DriveLimits;
  /** the effective current limits and which rating binds each */
  currentLimits: CurrentLimits;
  conditions: Conditions;
  requirements: Requirement[];
  /** rated data from a nameplate section (SI, A peak), empty for a motor section */
  rated: RatedData;
  interpretation: Interpretation[];
  findings: Finding[];
  /**
   * The loss coefficients of the file's `losses` section with the schema's defaults filled in
   * (iron, windage, inverter; each absent part, and each absent coefficient, is a zero loss):
   * {} for a file without the section.
   */
  losses: LossesSection;
  /** the lumped thermal network of the file's `thermal` section; absent: no thermal rating */
  thermal?: ThermalNetworkSpec;
  /** the file's `dutyCycle` section, its columns as Float64Arrays; absent when the file gives none */
  dutyCycle?: ResolvedDutyCycle;
  /** true for a file of a newer format version: show it, never save it over itself */
  readOnly?: boolean;
}


/** A project as the app and the CLI load it: the file as written, at the current format version, and what it resolves to. */
export interface LoadedProject {
  /** the parsed file brought to the current format version (before the schema fills its defaults): what the app's form shows */
  file: Record<string, unknown>;
  /** the validated file resolved: machine hot and cold, limits, findings (readOnly for a file of a newer version) */
  resolved: ResolvedProject;
}

/**
 * A parsed project file -> migrated file and resolved project: migrate, validate, resolve. Throws
 * InputError carrying every problem of the file (up to MAX_PROBLEMS), each naming its path.
 */
export function loadProjectJson(json: unknown): LoadedProject {
  const m = migrateProject(json);
  if (!m.readOnly && m.fromVersion === m.json['version']) {
    const current = resolveProject(parseProject(json));
    // inputs left to the schema's defaults, said as the app says them
    current.findings.push(...defaultedInputFindings(json));
    return { file: m.json, resolved: current };
  }
  let rp: ResolvedProject;
  try {
    rp = resolveProject(parseProject(m.json));
  } catch (e) {
    if (!m.readOnly || !(e instanceof InputError)) throw e;
    throw new InputError('version', `is ${m.fromVersion}: the file was written by a newer Torquewise; this one reads version ${m.json['version']} and cannot read it (${e.message})`);
  }
  rp.findings.unshift(...m.findings);
  rp.findings.push(...defaultedInputFindings(m.json));
  return { file: m.json, resolved: m.readOnly ? { ...rp, readOnly: true } : rp };
}

/** The one way a project text is loaded (app, worker, CLI): parseProjectJson, then loadProjectJson. */
export function loadProject(text: string): LoadedProject {
  return loadProjectJson(parseProjectJson(text));
}

/** Project text -> resolved project (loadProject's resolved project). */
export function loadProjectText(source: string): ResolvedProject {
  return loadProject(source).resolved;
}

/**
 * A validated project file -> machine hot and cold, limits, findings. `findings: false` leaves out
 * the rated and odd-machine findings (each solves operating points), for a study that resolves many
 * perturbed copies of one file and reads none of them.
 */
export function resolveProject(file: ProjectFile, opts: { findings?: boolean } = {}): ResolvedProject {
  // a minimal file may leave out the conditions (every temperature 20 °C) or the winding temperature
  const c = file.conditions ?? defaultConditions();
  const conditions: Conditions = {
    windingTemp_C: c.windingTemp_C ?? DEFAULT_TEMP_C,
    magnetTemp_C: c.magnetTemp_C,
    coldTemp_C: c.coldTemp_C ?? DEFAULT_COLD_TEMP_C,
    magnetTempCoeff: c.magnetTempCoeff,
  };
  let machine20: DqMachine;
  let mechanics: Mechanics;
  let interpretation: Interpretation[] = [];
  const findings: Finding[] = [];
  let rated: RatedData = {};
  let fluxMap: FluxMapSection | undefined;
  if (file.motor) {
    const m = file.motor;
    if (m.fluxMap !== undefined) {
      // the map's apparent terms at zero current for now; the models and findings follow the conditions below
      fluxMap = m.fluxMap;
      machine20 = { polePairs: m.polePairs, Rs: m.Rs, Ld: 1, Lq: 1, psiM: 0 };
    } else {
      // the schema has refused a motor section with neither the constant terms nor a flux map
      if (m.Ld === undefined || m.Lq === undefined || m.psiM === undefined) throw new InputError('motor.Ld', 'is required (or motor.fluxMap)');
      machine20 = { polePairs: m.polePairs, Rs: m.Rs, Ld: m.Ld, Lq: m.Lq, psiM: m.psiM };
      if (m.psiM === 0 && m.Ld === m.Lq) throw new InputError('motor.psiM', 'must be > 0 Wb when Ld = Lq (with neither magnet nor saliency the machine makes no torque)');
    }
    mechanics = { inertia: m.inertia, viscousFriction: m.viscousFriction, coulombFriction: m.coulombFriction };
    if (m.maxSpeed_rpm !== undefined) rated.maxSpeed_rad_s = m.maxSpeed_rpm * RPM_TO_RAD_S;
    if (m.ratedCurrent !== undefined) rated.current_A = m.ratedCurrent;
    if (m.peakCurrent !== undefined) rated.peakCurrent_A = m.peakCurrent;
  } else if (file.nameplate) {
    const r = nameplateToModel(file.nameplate, { magnetTempCoeff: c.magnetTempCoeff, path: 'nameplate' });
    machine20 = r.model;
    mechanics = r.mechanics;
    interpretation = r.interpretation;
    findings.push(...r.findings);
    rated = r.rated;
  } else {
    throw new InputError('motor', 'is required (or a nameplate section)');
  }

  const inverter: InverterSpec = { ...file.inverter, modulation: file.inverter.modulation ?? DEFAULT_MODULATION };
  if (file.inverter.modulation === undefined) {
    findings.push({
      code: 'modulation-assumed', severity: 'info', field: 'inverter.modulation',
      message: `No modulation given: space-vector PWM ("${DEFAULT_MODULATION}") is assumed, voltage limit Vdc/√3 per phase peak. Give "sinusoidal" (Vdc/2) if the drive uses plain sine-triangle PWM.`,
    });
  }
  const currentLimits = effectiveCurrentLimits(inverter, rated.current_A, rated.peakCurrent_A);
  const peak: DriveLimits = { ...driveLimits(inverter, 'peak'), Imax: currentLimits.peak.A };
  const continuous: DriveLimits = { ...driveLimits(inverter, 'continuous'), Imax: currentLimits.continuous.A };
  let hot = machineAt(machine20, conditions.windingTemp_C, conditions.magnetTemp_C, conditions.magnetTempCoeff);
  let cold = machineAt(machine20, conditions.coldTemp_C, conditions.coldTemp_C, conditions.magnetTempCoeff);
  let models: ResolvedProject['models'] = { at20: new LinearDqModel(machine20), hot: new LinearDqModel(hot), cold: new LinearDqModel(cold) };
  if (fluxMap !== undefined) {
    const r = resolveFluxMap(fluxMap, machine20.polePairs, machine20.Rs, conditions);
    ({ machine20, hot, cold, models } = r);
    findings.push(...r.findings);
  }
  if (file.conditions === undefined) {
    findings.push({
      code: 'conditions-assumed', severity: 'info', field: 'conditions',
      message: `No conditions given: every temperature (winding, magnet, cold corner) is taken at ${DEFAULT_TEMP_C} °C, so the hot corner is not hot: ` +
        'a warm winding has more resistance and a warm magnet less flux. Give conditions.windingTemp_C and conditions.magnetTemp_C for the hot corner and conditions.coldTemp_C for the coldest start.',
    });
  } else if (c.windingTemp_C === undefined) {
    findings.push({
      code: 'winding-temp-assumed', severity: 'info', field: 'conditions.windingTemp_C',
      message: `No winding temperature given: the hot corner's winding is taken at ${DEFAULT_TEMP_C} °C (resistance at 20 °C). Give the winding temperature the drive must work at.`,
    });
  }
  if (file.conditions !== undefined && c.coldTemp_C === undefined) {
    findings.push({
      code: 'cold-corner-assumed', severity: 'info', field: 'conditions.coldTemp_C',
      message: `No cold-corner temperature given: the cold corner (strongest magnet, highest back-EMF) is taken at ${DEFAULT_COLD_TEMP_C} °C. A colder start raises the back-EMF further; give the coldest ambient the drive must start in.`,
    });
  }

  if (opts.findings !== false) {
    for (const t of toleranceChoiceProblems(file)) findings.push({ code: 'tolerance-band-unused', severity: 'warning', field: `tolerances.${t.key}`, message: `tolerances.${t.key} ${t.message}.` });
    findings.push(...ratedFindings(rated, hot, inverter, peak, file.motor ? 'motor' : 'nameplate'));
    findings.push(...oddMachineFindings(file.motor ? 'motor' : 'nameplate', machine20, hot, mechanics, peak, file.requirements));
  }

  const rp: ResolvedProject = {
    file,
    name: file.name,
    machine20,
    hot,
    cold,
    models,
    mechanics,
    inverter,
    peak,
    continuous,
    currentLimits,
    conditions,
    requirements: file.requirements.map((r) => ({ label: r.label, speed_rpm: r.speed_rpm, torque_Nm: r.torque_Nm, duty: r.duty ?? DEFAULT_DUTY })),
    rated,
    interpretation,
    findings,
    losses: lossesOf(file.losses),
  };
  if (file.thermal !== undefined) rp.thermal = thermalNetworkOf(file.thermal);
  if (file.dutyCycle !== undefined) rp.dutyCycle = dutyCycleOf(file.dutyCycle);
  return rp;
}

/** The losses section as its own plain object (the file's parts copied, absent parts left out). */
function lossesOf(l: LossesSection | undefined): LossesSection {
  const out: LossesSection = {};
  if (l?.iron) out.iron = { ...l.iron };
  if (l?.windage) out.windage = { ...l.windage };
  if (l?.inverter) out.inverter = { ...l.inverter };
  return out;
}
