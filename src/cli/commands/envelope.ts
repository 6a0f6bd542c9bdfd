import type { Command } from '../command';
import { envelopeCsv as envelopeCsvDocument, envelopeRegionAt } from '../../core/reports/envelope-csv';
import { computeEnvelope, type Envelope } from '../../core/steady-state/envelope';
import { PLOT_SPEED_MAX_RPM, projectSpeedRange } from '../../core/reports/speed-range';
import { numberFlag } from '../args';
import { table, fmt } from '../table';
import { peakToRms, radSToRpm, rpmToRadS } from '../../core/base/units';
import { describeLimit } from '../../core/drive/current-limits';
import type { CurrentLimits } from '../../core/drive/current-limit-types';

/** The envelope as the CLI's JSON document (motoring under Imax at the file's temperatures). */
export function envelopeJson(env: Envelope) {
  const points = [];
  for (let k = 0; k < env.speed.length; k++) {
    points.push({
      speed_rpm: radSToRpm(env.speed[k]!),
      torque_Nm: env.torque[k]!,
      power_W: env.power[k]!,
      id_A: env.id[k]!,
      iq_A: env.iq[k]!,
      current_A: env.current[k]!,
      voltage_V: env.voltage[k]!,
      // past the maximum speed no current gives motoring torque within the bus: no region then
      feasible: env.feasible[k] === 1,
      region: envelopeRegionAt(env, k),
    });
  }
  return {
    points,
    baseSpeed_rpm: radSToRpm(env.baseSpeed),
    maxSpeed_rpm: env.maxSpeed === null ? null : radSToRpm(env.maxSpeed),
    characteristicCurrent_A: env.characteristicCurrent,
    accuracy: env.accuracy,
  };
}

/**
 * The envelope as CSV (src/core/reports/envelope-csv.ts, the command line's columns). With `about`,
 * '#' comment rows first: the project, the voltage limit and the effective current limit the curve
 * is drawn at, and which rating binds it.
 */
export function envelopeCsv(env: Envelope, about?: { name: string; Vmax: number; limits: CurrentLimits }): string {
  const comments = about
    ? [
        `# torquewise envelope; project: ${about.name || 'unnamed'}; motoring, hot corner`,
        `# drawn at ${describeLimit('peak', about.limits.peak)}; Vmax ${fmt(about.Vmax)} V peak phase; ${describeLimit('continuous', about.limits.continuous)}`,
      ]
    : [];
  return envelopeCsvDocument([{ key: 'motoring', env }], { comments, naming: 'cli' });
}

export const envelopeCommand: Command = {
  name: 'envelope',
  summary: 'maximum motoring torque vs speed under Imax, hot corner',
  usage: 'envelope <project.json> [--speed-max RPM] [--points N] [--csv FILE] [--json]',
  flags: { 'speed-max': 'number', points: 'number', csv: 'output' },
  run(p, args) {
    const speedMax = numberFlag(args, 'speed-max', { min: 1, max: PLOT_SPEED_MAX_RPM, unit: 'rpm' });
    const points = numberFlag(args, 'points', { min: 2, max: 100000, integer: true });
    // Without --speed-max: the project's range (requirements, the motor's maximum speed).
    const env = computeEnvelope(p.models.hot, p.peak, {
      ...(points !== undefined ? { points } : {}),
      speedMax: speedMax !== undefined ? rpmToRadS(speedMax) : projectSpeedRange(p).speedMax,
    });
    // the effective current limits and which rating binds each (added beside the envelope's own keys)
    const json = { ...envelopeJson(env), currentLimits: p.currentLimits };
    const step = Math.max(1, Math.floor(env.speed.length / 25));
    const rows = json.points.filter((_, k) => k % step === 0 || k === json.points.length - 1)
      .map((q) => [q.speed_rpm, q.torque_Nm, q.power_W / 1e3, q.id_A, q.iq_A, q.current_A, peakToRms(q.current_A), q.voltage_V, q.region]);
    const lines = [
      `${p.name}: motoring envelope at the ${describeLimit('peak', p.currentLimits.peak)}, Vmax ${fmt(p.peak.Vmax)} V peak phase, hot corner`,
      '',
      ...table(['speed rpm', 'torque N·m', 'power kW', 'id A pk', 'iq A pk', '|i| A pk', '|i| A rms', '|v| V pk', 'region'], rows),
      '',
      `base speed ${fmt(json.baseSpeed_rpm)} rpm, maximum speed ${json.maxSpeed_rpm === null ? 'unbounded (psiM/Ld inside the current limit)' : fmt(json.maxSpeed_rpm) + ' rpm'}, ` +
        `characteristic current ${fmt(json.characteristicCurrent_A)} A peak (${fmt(peakToRms(json.characteristicCurrent_A))} A rms), torque accuracy ${fmt(env.accuracy, 2)} relative`,
    ];
    return { json, lines, ...(args.flags.has('csv') ? { files: [{ flag: 'csv', contents: envelopeCsv(env, { name: p.name, Vmax: p.peak.Vmax, limits: p.currentLimits }) }] } : {}) };
  },
};
