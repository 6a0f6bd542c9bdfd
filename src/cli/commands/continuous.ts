import type { Command } from '../command';
import type { ResolvedProject } from '../../core/project/project';
import type { ThermalNetworkSpec } from '../../core/machine/thermal-network-spec';
import { InputError } from '../../core/base/errors';
import { csvDocument } from '../../core/reports/csv';
import { PLOT_SPEED_MAX_RPM, projectSpeedRange } from '../../core/reports/speed-range';
import { lossConditionsFromProject } from '../../core/project/loss-conditions-from-project';
import { temperatureModelFromProject } from '../../core/project/temperature-model-from-project';
import { continuousTorqueCurve, type ContinuousPoint } from '../../core/steady-state/continuous-torque';
import { DEFAULT_ENVELOPE_OPTIONS } from '../../core/steady-state/envelope';
import { rpmToRadS } from '../../core/base/units';
import { numberFlag } from '../args';
import { fmt, table } from '../table';

/** The project's thermal network, or a clear refusal naming the section. */
export function thermalOf(p: ResolvedProject): ThermalNetworkSpec {
  if (p.thermal === undefined) throw new InputError('thermal', 'is needed for this command: give the thermal network (coolant temperature, capacities, resistances, limits)');
  return p.thermal;
}

/** A number for JSON: null where it is not finite (no temperatures beyond the maximum speed). */
export const jsonNumber = (x: number): number | null => (Number.isFinite(x) ? x : null);

/** The S1 points as the CLI's JSON (the core's keys, NaN as null). */
export const continuousJson = (points: readonly ContinuousPoint[]) => points.map((q) => ({
  speed_rpm: q.speed_rpm, torque_Nm: q.torque_Nm, limitedBy: q.limitedBy,
  windingTemp_C: jsonNumber(q.windingTemp_C), magnetTemp_C: jsonNumber(q.magnetTemp_C), junctionTemp_C: jsonNumber(q.junctionTemp_C),
}));

export const continuousCommand: Command = {
  name: 'continuous',
  summary: 'continuous (S1) motoring torque vs speed from the thermal network, the binding limit named',
  usage: 'continuous <project.json> [--speed-max RPM] [--points N] [--csv FILE] [--json]',
  flags: { 'speed-max': 'number', points: 'number', csv: 'output' },
  run(p, args) {
    const net = thermalOf(p);
    const speedMax = numberFlag(args, 'speed-max', { min: 1, max: PLOT_SPEED_MAX_RPM, unit: 'rpm' });
    const n = numberFlag(args, 'points', { min: 2, max: 100000, integer: true }) ?? DEFAULT_ENVELOPE_OPTIONS.points;
    // without --speed-max: the project's range, as the envelope
    const wMax = speedMax !== undefined ? rpmToRadS(speedMax) : projectSpeedRange(p).speedMax;
    const speeds = Float64Array.from({ length: n }, (_, k) => (wMax * k) / (n - 1));
    const curve = continuousTorqueCurve(temperatureModelFromProject(p), net, p.continuous, lossConditionsFromProject(p), speeds);
    const json = { points: continuousJson(curve), coolantTemp_C: net.coolantTemp_C, windingMax_C: net.windingMax_C, magnetMax_C: net.magnetMax_C, junctionMax_C: net.junctionMax_C ?? null, currentLimits: p.currentLimits };
    const step = Math.max(1, Math.floor(curve.length / 25));
    const rows = curve.filter((_, k) => k % step === 0 || k === curve.length - 1)
      .map((q) => [q.speed_rpm, q.torque_Nm, (q.torque_Nm * rpmToRadS(q.speed_rpm)) / 1e3, q.limitedBy, q.windingTemp_C, q.magnetTemp_C, q.junctionTemp_C]);
    const lines = [
      `${p.name}: continuous (S1) motoring torque, coolant ${fmt(net.coolantTemp_C)} °C; limits winding ${fmt(net.windingMax_C)} °C, magnet ${fmt(net.magnetMax_C)} °C` +
        `${net.junctionMax_C !== undefined && net.junctionToCoolant_K_per_W !== undefined ? `, junction ${fmt(net.junctionMax_C)} °C` : ''}, continuous current ${fmt(p.continuous.Imax)} A peak`,
      '',
      ...table(['speed rpm', 'torque N·m', 'power kW', 'limited by', 'winding °C', 'magnet °C', 'junction °C'], rows),
    ];
    const csv = () => csvDocument([
      ['speed_rpm', 'torque_Nm', 'limitedBy', 'windingTemp_C', 'magnetTemp_C', 'junctionTemp_C'],
      ...curve.map((q) => [q.speed_rpm, q.torque_Nm, q.limitedBy, q.windingTemp_C, q.magnetTemp_C, q.junctionTemp_C]),
    ]);
    return { json, lines, ...(args.flags.has('csv') ? { files: [{ flag: 'csv', contents: csv() }] } : {}) };
  },
};
