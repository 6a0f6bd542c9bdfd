import type { Command } from '../command';
import { numberFlag, stringFlag } from '../args';
import { InputError } from '../../core/base/errors';
import { fmt } from '../table';
import { rpmToRadS } from '../../core/base/units';
import { mapAxis } from '../../core/steady-state/efficiency-map';
import { maxTorquePoint } from '../../core/steady-state/envelope';
import { PLOT_SPEED_MAX_RPM, projectSpeedRange } from '../../core/reports/speed-range';
import { efficiencyMapCsv, efficiencyMapJson, efficiencyMapSummary } from '../../core/reports/efficiency-map-report';
import { efficiencyMapThreaded, mapGridFlags } from '../efficiency-workers';
import type { Corner } from '../efficiency-grid';

export const efficiencyCommand: Command = {
  name: 'efficiency',
  summary: 'efficiency map over speed and shaft torque (motor, inverter, system; losses), across threads',
  usage: 'efficiency <project.json> [--speed-points N] [--torque-points N] [--speed-max RPM] [--corner hot|cold] [--min-loss] [--threads N] [--csv FILE] [--json]',
  flags: { 'speed-points': 'number', 'torque-points': 'number', 'speed-max': 'number', corner: 'string', 'min-loss': 'switch', threads: 'number', csv: 'output' },
  async run(p, args, input) {
    // grid and threads (their defaults: src/cli/efficiency-workers.ts)
    const { nS, nT, threads } = mapGridFlags(args);
    const speedMax = numberFlag(args, 'speed-max', { min: 1, max: PLOT_SPEED_MAX_RPM, unit: 'rpm' });
    const cornerText = stringFlag(args, 'corner') ?? 'hot';
    if (cornerText !== 'hot' && cornerText !== 'cold') throw new InputError('--corner', `must be hot or cold (got '${cornerText}')`);
    const corner: Corner = cornerText;
    const minLoss = args.flags.has('min-loss');
    const model = corner === 'hot' ? p.models.hot : p.models.cold;
    // speed 0 .. the envelope's plotted range; shaft torque from the generating to the motoring maximum (at standstill)
    const wMax = speedMax !== undefined ? rpmToRadS(speedMax) : projectSpeedRange(p).speedMax;
    const tMot = Math.abs(maxTorquePoint(model, p.peak, 0, 'motoring').torque);
    const tGen = Math.abs(maxTorquePoint(model, p.peak, 0, 'generating').torque);
    if (!(tMot > 0 && tGen > 0)) throw new InputError('motor', 'gives no torque at standstill within the limits: there is no map to draw');
    const speeds = mapAxis(0, wMax, nS), torques = mapAxis(-tGen, tMot, nT);
    const t0 = performance.now();
    // the workers load the project's text (without it, as when run from a library call, this thread computes it all)
    const map = await efficiencyMapThreaded(input?.projectText ?? '', p, corner, minLoss, speeds, torques, input === undefined ? 1 : threads);
    const wall_s = (performance.now() - t0) / 1e3;
    const summary = { ...efficiencyMapSummary(map), corner, control: minLoss ? 'min-loss' : 'least-current', threads, wall_s };
    const json = { ...efficiencyMapJson(map), summary };
    const peak = summary.peakSystem;
    const lines = [
      `${p.name}: efficiency map, ${corner} corner, ${minLoss ? 'loss-minimising' : 'least'} current, shaft torque ${fmt(-tGen)} to ${fmt(tMot)} N·m, speed 0 to ${fmt(json.speeds_rpm[nS - 1]!)} rpm`,
      `  grid ${nS} speeds x ${nT} torques = ${nS * nT} points, ${summary.pointsInside} inside the envelope`,
      peak === null
        ? '  no point inside the envelope'
        : `  peak system efficiency ${fmt(100 * peak.efficiency)} % at ${fmt(peak.speed_rpm)} rpm, ${fmt(peak.torque_Nm)} N·m`,
      `  computed in ${fmt(wall_s * 1e3)} ms on ${Math.min(threads, nS)} thread${Math.min(threads, nS) === 1 ? '' : 's'}`,
    ];
    const comments = [`# torquewise efficiency map; project: ${p.name || 'unnamed'}; ${corner} corner; ${minLoss ? 'loss-minimising' : 'least'} current; shaft torque; efficiencies as fractions`];
    return { json, lines, ...(args.flags.has('csv') ? { files: [{ flag: 'csv', contents: efficiencyMapCsv(map, comments) }] } : {}) };
  },
};
