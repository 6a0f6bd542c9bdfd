/**
 * The simulation setup of a project: the hot machine, the effective peak limits, the mechanics, the
 * file's control section (schema defaults; `defaultControl()` when absent) and scenario, tuned by
 * the tuning rules, with the findings of what the scenario asks that the motor or drive cannot give.
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { Finding } from '../base/finding';
import { limitField } from '../drive/current-limits';
import { InputError } from '../base/errors';
import { modulationLimit } from '../drive/inverter';
import { loadSchedule, loadLevel, coulombWidth } from '../simulation/plant';
import type { PlantParams } from '../simulation/plant';
import { stepSchedule } from '../control/controller';
import type { ControllerConfig, ControlMode } from '../control/controller';
import type { AngleSpec } from '../control/angle-spec';
import { buildReferenceTable, torqueLimitsAt } from '../control/reference-table';
import type { ReferenceTable } from '../control/reference-table';
import { safetyReport } from '../steady-state/safety';
import { tuneLoops } from '../control/tuning';
import { DEFAULT_SOLVER_OPTIONS, DEFAULT_TRIP_FACTOR, MAX_CONTROL_PERIODS } from '../simulation/simulation-setup';
import type { SimulationSetup, SolverOptions } from '../simulation/simulation-setup';
import { rampedReference } from '../simulation/ramped-reference';
import { RAD_S_TO_RPM, RPM_TO_RAD_S } from '../base/units';
import type { ProjectModel, ResolvedProject } from './project';
import { defaultControl, type ControlSection, type ScenarioSection } from './schema';
import { tuningInputFor } from './tuning-from-project';
import type { MachineInput } from '../machine/machine-model';
import { machineModel } from '../machine/linear-dq';
import { zeroCurrentTerms } from '../machine/model-numeric';
import { pwmFromProject } from './pwm-from-project';
import { angleFromProject } from './angle-from-project';

export interface SimulationOverrides {
  control?: Partial<ControlSection>;
  scenario?: Partial<ScenarioSection>;
  solver?: Partial<SolverOptions>;
  /** first-order speed-reference prefilter with the speed PI's integral time (default false) */
  speedRefPrefilter?: boolean;
  /** see ControllerConfig.delayAngleCompensation (default true) */
  delayAngleCompensation?: boolean;
  /** back-EMF feed-forward; default follows control.decoupling */
  backEmfFeedForward?: boolean;
  /** reference-table grid (default 33 x 25) */
  tableNodes?: { speed: number; torque: number };
}


/** Speed at which the open-circuit back-EMF reaches Vmax, rad/s (mechanical); a magnetless machine: where Ld Imax does. */
function noLoadSpeed(m: MachineInput, lim: DriveLimits): number {
  const { psi0, Ld0 } = zeroCurrentTerms(machineModel(m));
  return psi0 > 0 ? lim.Vmax / (m.polePairs * psi0) : lim.Vmax / (m.polePairs * Ld0 * lim.Imax);
}

export function simulationFromProject(p: ResolvedProject, overrides: SimulationOverrides = {}): SimulationSetup<ProjectModel> {
  const baseScenario = p.file.scenario;
  if (!baseScenario && !overrides.scenario) throw new InputError('scenario', 'is required to simulate (duration_s, speedSteps, loadSteps, ...)');
  const control: ControlSection = { ...(p.file.control ?? defaultControl()), ...(overrides.control ?? {}) };
  const scenario = { ...(baseScenario ?? {}), ...(overrides.scenario ?? {}) } as NonNullable<ResolvedProject['file']['scenario']>;
  if (!(scenario.duration_s > 0)) throw new InputError('scenario.duration_s', 'must be > 0 s');
  const mode: ControlMode = control.mode;
  const fCtrl = control.fCtrl_Hz;
  const wanted = scenario.duration_s * fCtrl;
  if (wanted > MAX_CONTROL_PERIODS) {
    throw new InputError('scenario.duration_s', `asks for ${Math.round(wanted)} control periods (duration_s x control.fCtrl_Hz); the limit is ${MAX_CONTROL_PERIODS} periods, at most ${MAX_CONTROL_PERIODS / fCtrl} s at ${fCtrl} Hz`);
  }
  const Ts = 1 / fCtrl;
  const delaySamples = control.delaySamples;
  const divider = control.speedLoopDivider;
  const machine = p.models.hot;
  const lim = p.peak;
  const J = p.mechanics.inertia + (scenario.loadInertia ?? 0);
  const tuning = tuneLoops(tuningInputFor(p, control, scenario.loadInertia ?? 0));
  const cd = tuning.current;
  const cq = tuning.currentQ ?? tuning.current;
  const sp = tuning.speed;
  const speedSteps = (scenario.speedSteps ?? []).map((s) => ({ t: s.t_s, v: s.speed_rpm * RPM_TO_RAD_S }));
  const w0 = mode === 'current-step' ? 0 : (scenario.initialSpeed_rpm ?? 0) * RPM_TO_RAD_S;
  const wMaxRef = Math.max(Math.abs(w0), ...speedSteps.map((s) => Math.abs(s.v)));
  const w0NoLoad = noLoadSpeed(machine, lim);
  const speedMax = Math.max(1.5 * wMaxRef, 1.2 * w0NoLoad, 1);
  let table: ReferenceTable | null = null;
  if (mode !== 'current-step') {
    table = buildReferenceTable(machine, lim, {
      speedMax_rad_s: speedMax,
      ...(overrides.tableNodes ? { speedNodes: overrides.tableNodes.speed, torqueNodes: overrides.tableNodes.torque } : {}),
    });
  }
  const loadSteps = mode === 'current-step' ? [] : scenario.loadSteps ?? [];
  const loadRamps = mode === 'current-step' ? [] : scenario.loadRamps ?? [];
  const k2 = mode === 'current-step' ? 0 : scenario.loadModel?.k ?? 0;
  const load = loadSchedule(loadSteps, loadRamps, k2);
  const TL0 = loadLevel(load, 0);
  const plant: PlantParams<ProjectModel> = {
    machine,
    inertia: J,
    viscousFriction: p.mechanics.viscousFriction,
    coulombFriction: p.mechanics.coulombFriction,
    load,
    mechanics: mode === 'current-step' ? 'locked' : 'free',
    inputFrame: 'alpha-beta',
    coulombWidth_rad_s: coulombWidth(p.mechanics.coulombFriction, J, Ts),
  };
  const decoupling = control.decoupling;
  const cs = scenario.currentStep;
  const Ti = sp.Ki > 0 ? sp.Kp / sp.Ki : 0;
  const cfg: ControllerConfig = {
    mode,
    Ts,
    delaySamples,
    machine,
    currentD: { Kp: cd.Kp, Ki: cd.Ki },
    currentQ: { Kp: cq.Kp, Ki: cq.Ki },
    speed: { Kp: sp.Kp, Ki: sp.Ki },
    speedLoopDivider: divider,
    antiWindup: control.antiWindup,
    decoupling,
    backEmfFeedForward: overrides.backEmfFeedForward ?? decoupling,
    delayAngleCompensation: overrides.delayAngleCompensation ?? true,
    speedRamp_rad_s2: control.speedRamp_rpm_per_s !== undefined ? control.speedRamp_rpm_per_s * RPM_TO_RAD_S : Infinity,
    speedRefPrefilter_s: (overrides.speedRefPrefilter ?? control.speedPrefilter) ? Ti : 0,
    Imax: lim.Imax,
    voltage: modulationLimit(p.inverter),
    table,
    speedRef: stepSchedule(w0, speedSteps),
    torqueRef: stepSchedule(0, (scenario.torqueSteps ?? []).map((s) => ({ t: s.t_s, v: s.torque_Nm }))),
    idRef: stepSchedule(0, cs ? [{ t: cs.t_s, v: cs.id_A }] : []),
    iqRef: stepSchedule(0, cs ? [{ t: cs.t_s, v: cs.iq_A }] : []),
    initialTorque: mode === 'speed' ? TL0 + p.mechanics.viscousFriction * w0 + k2 * w0 * Math.abs(w0) + (w0 !== 0 ? Math.sign(w0) * p.mechanics.coulombFriction : 0) : 0,
  };
  if (mode === 'current-step' && !cs) throw new InputError('scenario.currentStep', 'is required in current-step mode ({id_A, iq_A, t_s})');
  if (mode === 'torque' && (scenario.torqueSteps ?? []).length === 0) throw new InputError('scenario.torqueSteps', 'needs at least one step in torque mode');
  // overspeed: above the motor's maximum speed when the datasheet gives one, else well above what the run asks
  const wRatedMax = p.rated.maxSpeed_rad_s;
  const overspeed = wRatedMax !== undefined && wRatedMax > 0 ? wRatedMax : mode === 'speed' ? Math.max(1.2 * wMaxRef, 0.1 * speedMax) : speedMax;
  const findings = scenarioFindings(p, {
    ramp: cfg.speedRamp_rad_s2, mode, w0, speedSteps, loadSteps, load, table, wRatedMax, wMaxRef,
    B: p.mechanics.viscousFriction, Tc: p.mechanics.coulombFriction, k2,
  });
  return {
    plant,
    controller: cfg,
    duration_s: scenario.duration_s,
    initialSpeed_rad_s: w0,
    initialTheta_rad: 0,
    solver: { ...DEFAULT_SOLVER_OPTIONS, ...(overrides.solver ?? {}) },
    Imax: lim.Imax,
    currentLimitField: limitField('peak', p.currentLimits.peak, p.file.motor ? 'motor' : 'nameplate'),
    tripCurrent_A: DEFAULT_TRIP_FACTOR * lim.Imax,
    divergenceSpeed_rad_s: mode === 'current-step' ? Infinity : 3 * speedMax,
    overspeed_rad_s: mode === 'current-step' ? Infinity : overspeed,
    marks: {
      speedSteps: mode === 'speed' ? speedSteps : [],
      loadEvents: [...loadSteps.map((s) => s.t_s), ...loadRamps.map((r) => r.t_s)].sort((a, b) => a - b),
    },
    tuning,
    findings,
    pwm: pwmFromProject(p, control, scenario),
    ...angleOf(control, machine.polePairs, p.rated.speed_rad_s ?? noLoadSpeed(machine, lim)),
  };
}

/**
 * the setup's angle source; none (the true angle and speed) when ideal, so that ideal setups stay as
 * they were; a sensorless source with the rated speed (nameplate, else the no-load speed at Vmax)
 */
function angleOf(control: ControlSection, polePairs: number, rated_rad_s: number): { angle?: AngleSpec; ratedSpeed_rad_s?: number } {
  const angle = angleFromProject(control, polePairs);
  if (angle.source === 'ideal') return {};
  return angle.source === 'sensorless' ? { angle, ratedSpeed_rad_s: rated_rad_s } : { angle };
}

interface ScenarioFacts {
  ramp: number;
  mode: ControlMode;
  w0: number;
  speedSteps: ReadonlyArray<{ t: number; v: number }>;
  loadSteps: ReadonlyArray<{ t_s: number; torque_Nm: number }>;
  load: ReturnType<typeof loadSchedule>;
  table: ReferenceTable | null;
  wRatedMax: number | undefined;
  wMaxRef: number;
  B: number;
  Tc: number;
  k2: number;
}

const rpmText = (w: number): string => `${(w * RAD_S_TO_RPM).toFixed(0)} rpm`;

/**
 * What the scenario asks that the motor or the drive cannot give, before the run: speed steps above
 * the motor's maximum speed; load steps (plus friction and the fan load) above the largest torque
 * the drive makes at the speed reference in force then (hot magnet, peak current); back-EMF above
 * the bus at the highest speed asked. Each finding names the field.
 */
function scenarioFindings(p: ResolvedProject, f: ScenarioFacts): Finding[] {
  const out: Finding[] = [];
  if (f.mode === 'current-step') return out;
  const wr = f.wRatedMax;
  if (f.mode === 'speed' && wr !== undefined && wr > 0) {
    if (Math.abs(f.w0) > wr) out.push({ code: 'speed-above-motor-max', severity: 'warning', field: 'scenario.initialSpeed_rpm', message: `starts at ${rpmText(Math.abs(f.w0))}, above the motor's maximum speed ${rpmText(wr)}` });
    f.speedSteps.forEach((st, i) => {
      if (Math.abs(st.v) > wr) out.push({ code: 'speed-above-motor-max', severity: 'warning', field: `scenario.speedSteps[${i}].speed_rpm`, message: `asks for ${rpmText(Math.abs(st.v))}, above the motor's maximum speed ${rpmText(wr)}` });
    });
  }
  if (f.mode === 'speed' && f.table) {
    const lim = new Float64Array(2);
    f.loadSteps.forEach((ls, i) => {
      const w = rampedReference(f.w0, f.speedSteps, f.ramp, ls.t_s);
      const need = loadLevel(f.load, ls.t_s) + f.B * w + (w !== 0 ? Math.sign(w) * f.Tc : 0) + f.k2 * w * Math.abs(w);
      torqueLimitsAt(f.table!, w, lim);
      const tooMuch = need > lim[0]! * (1 + 1e-9) || need < lim[1]! * (1 + 1e-9);
      if (tooMuch) {
        const most = need > 0 ? lim[0]! : lim[1]!;
        out.push({
          code: 'load-above-drive', severity: 'warning', field: `scenario.loadSteps[${i}].torque_Nm`,
          message: `at ${rpmText(w)} the load and friction need ${need.toPrecision(4)} N·m; the drive makes at most ${most.toPrecision(4)} N·m there (hot magnet, peak current): the speed will not hold`,
        });
      }
    });
  }
  if (f.wMaxRef > 0) {
    const s = safetyReport(p.models.cold, p.inverter, f.wMaxRef);
    for (const x of s.findings) if (x.code === 'back-emf-above-bus') out.push({ ...x, field: f.mode === 'speed' ? 'scenario.speedSteps' : 'scenario.initialSpeed_rpm', message: `${x.message} Follow local codes, licensed practice and IEC 61800-5-1.` });
  }
  return out;
}
