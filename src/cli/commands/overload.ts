import type { Command } from '../command';
import { InputError } from '../../core/base/errors';
import { csvDocument } from '../../core/reports/csv';
import { PLOT_SPEED_MAX_RPM } from '../../core/reports/speed-range';
import { lossConditionsFromProject } from '../../core/project/loss-conditions-from-project';
import { temperatureModelFromProject } from '../../core/project/temperature-model-from-project';
import { continuousTorqueCurve } from '../../core/steady-state/continuous-torque';
import { peakDuration, peakDurationCurve, type PeakLimit, type Temperatures } from '../../core/steady-state/peak-duration';
import { rpmToRadS } from '../../core/base/units';
import { numberFlag } from '../args';
import { fmt, table } from '../table';
import { thermalOf } from './continuous';

const TORQUE_MAX = 1e6;

/** A duration for JSON: seconds, null when never reached (limitedBy 'none') or outside the envelope (outsideEnvelope). */
const jsonDuration = (s: number): number | null => (Number.isFinite(s) ? s : null);
const saidDuration = (s: number, l: PeakLimit): string => (Number.isNaN(s) ? `outside the envelope (${l})` : s === Infinity ? 'unlimited' : `${fmt(s)} s (${l})`);
const tempsJson = (t: Temperatures) => ({ windingTemp_C: t.windingTemp_C, statorTemp_C: t.statorTemp_C, magnetTemp_C: t.magnetTemp_C, junctionTemp_C: t.junctionTemp_C });

export const overloadCommand: Command = {
  name: 'overload',
  summary: 'how long an overload torque can be held from a continuous point\'s hot steady state (default start: half the S1 torque at the overload speed; one point, or a curve against torque)',
  usage: 'overload <project.json> --speed RPM (--torque NM | --torques N) [--from-speed RPM] [--from-torque NM] [--csv FILE] [--json]',
  flags: { speed: 'number', torque: 'number', torques: 'number', 'from-speed': 'number', 'from-torque': 'number', csv: 'output' },
  run(p, args) {
    const net = thermalOf(p);
    const speed = numberFlag(args, 'speed', { min: 0, max: PLOT_SPEED_MAX_RPM, unit: 'rpm' });
    if (speed === undefined) throw new InputError('--speed', 'is needed: the overload speed, rpm');
    const torque = numberFlag(args, 'torque', { min: 0, max: TORQUE_MAX, unit: 'N·m' });
    const N = numberFlag(args, 'torques', { min: 1, max: 1000, integer: true });
    if ((torque === undefined) === (N === undefined)) throw new InputError('--torque', 'or --torques (not both) is needed: one overload torque, N·m, or how many torques up to the peak envelope');
    const fromSpeed = numberFlag(args, 'from-speed', { min: 0, max: PLOT_SPEED_MAX_RPM, unit: 'rpm' }) ?? speed;
    const c = lossConditionsFromProject(p);
    const tm = temperatureModelFromProject(p);
    let fromTorque = numberFlag(args, 'from-torque', { min: 0, max: TORQUE_MAX, unit: 'N·m' });
    const byDefault = fromTorque === undefined;
    fromTorque ??= 0.5 * continuousTorqueCurve(tm, net, p.continuous, c, [rpmToRadS(fromSpeed)])[0]!.torque_Nm;
    const from = { speed_rad_s: rpmToRadS(fromSpeed), torque_Nm: fromTorque };
    const fromJson = { speed_rpm: fromSpeed, torque_Nm: fromTorque };
    const head = `${p.name}: overload at ${fmt(speed)} rpm from the steady state of ${fmt(fromTorque)} N·m at ${fmt(fromSpeed)} rpm${byDefault ? ' (half the S1 torque there, the default)' : ''}`;
    if (torque !== undefined) {
      const d = peakDuration(tm, net, p.peak, p.continuous, c, from, { speed_rad_s: rpmToRadS(speed), torque_Nm: torque });
      const json = { speed_rpm: speed, torque_Nm: torque, duration_s: jsonDuration(d.duration_s), limitedBy: d.limitedBy, outsideEnvelope: d.outsideEnvelope, from: fromJson, start: tempsJson(d.start), end: tempsJson(d.end) };
      const lines = [
        head, '',
        `${fmt(torque)} N·m: ${saidDuration(d.duration_s, d.limitedBy)}`,
        `start: winding ${fmt(d.start.windingTemp_C)} °C, magnet ${fmt(d.start.magnetTemp_C)} °C, junction ${fmt(d.start.junctionTemp_C)} °C`,
        `${d.duration_s === Infinity ? 'steady' : 'end'}: winding ${fmt(d.end.windingTemp_C)} °C, magnet ${fmt(d.end.magnetTemp_C)} °C, junction ${fmt(d.end.junctionTemp_C)} °C`,
      ];
      const csv = () => csvDocument([['torque_Nm', 'duration_s', 'limitedBy'], [torque, d.duration_s, d.limitedBy]]);
      return { json, lines, ...(args.flags.has('csv') ? { files: [{ flag: 'csv', contents: csv() }] } : {}) };
    }
    const cv = peakDurationCurve(tm, net, p.peak, p.continuous, c, from, rpmToRadS(speed), N!);
    const points = Array.from(cv.torque_Nm, (t, k) => ({ torque_Nm: t, duration_s: jsonDuration(cv.duration_s[k]!), limitedBy: cv.limitedBy[k]! }));
    const json = { speed_rpm: speed, from: fromJson, start: tempsJson(cv.start), points };
    const lines = [head, '', ...table(['torque N·m', 'duration', 'limited by'], points.map((q, k) => [q.torque_Nm, saidDuration(cv.duration_s[k]!, q.limitedBy), q.limitedBy]))];
    const csv = () => csvDocument([['torque_Nm', 'duration_s', 'limitedBy'], ...points.map((q, k) => [q.torque_Nm, cv.duration_s[k]!, q.limitedBy])]);
    return { json, lines, ...(args.flags.has('csv') ? { files: [{ flag: 'csv', contents: csv() }] } : {}) };
  },
};
