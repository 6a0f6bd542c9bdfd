import type { Command } from '../command';
import { numberFlag, stringFlag } from '../args';
import { InputError } from '../../core/base/errors';
import { fmt } from '../table';
import { rpmToRadS } from '../../core/base/units';
import { mapAxis } from '../../core/steady-state/efficiency-map';
import { maxTorquePoint } from '../../core/steady-state/envelope';
import { PLOT_SPEED_MAX_RPM, projectSpeedRange } from '../../core/reports/speed-range';
import { EFFICIENCY_GAIN_CSV_COLUMNS, EFFICIENCY_MAP_CSV_HEADER, efficiencyMapCsv, efficiencyMapJson, efficiencyMapSummary } from '../../core/reports/efficiency-map-report';
import { minLossGainMap, type MinLossGainMap } from '../../core/steady-state/min-loss-gain-map';
import { lossConditionsFromProject } from '../../core/project/loss-conditions-from-project';
import { radSToRpm } from '../../core/base/units';
import { efficiencyMapThreaded, mapGridFlags } from '../efficiency-workers';
import type { Corner } from '../efficiency-grid';

export const efficiencyCommand: Command = {
  name: 'efficiency',
  summary: 'efficiency map over speed and shaft torque (motor, inverter, system; losses), across threads',
  usage: 'efficiency <project.json> [--speed-points N] [--torque-points N] [--speed-max RPM] [--corner hot|cold] [--min-loss | --gain] [--threads N] [--csv FILE] [--json]',
  flags: { 'speed-points': 'number', 'torque-points': 'number', 'speed-max': 'number', corner: 'string', 'min-loss': 'switch', gain: 'switch', threads: 'number', csv: 'output' },
  async run(p, args, input) {
    // grid and threads (their defaults: src/cli/efficiency-workers.ts)
    const { nS, nT, threads } = mapGridFlags(args);
    const speedMax = numberFlag(args, 'speed-max', { min: 1, max: PLOT_SPEED_MAX_RPM, unit: 'rpm' });
    const cornerText = stringFlag(args, 'corner') ?? 'hot';
    if (cornerText !== 'hot' && cornerText !== 'cold') throw new InputError('--corner', `must be hot or cold (got '${cornerText}')`);
    const corner: Corner = cornerText;
    const gainAsked = args.flags.has('gain');
    if (gainAsked && args.flags.has('min-loss')) throw new InputError('--gain', 'already maps the loss-minimising current (beside the least current): leave out --min-loss');
    const minLoss = args.flags.has('min-loss') || gainAsked;
    const model = corner === 'hot' ? p.models.hot : p.models.cold;
    // speed 0 .. the envelope's plotted range; shaft torque from the generating to the motoring maximum (at standstill)
    const wMax = speedMax !== undefined ? rpmToRadS(speedMax) : projectSpeedRange(p).speedMax;
    const tMot = Math.abs(maxTorquePoint(model, p.peak, 0, 'motoring').torque);
    const tGen = Math.abs(maxTorquePoint(model, p.peak, 0, 'generating').torque);
    if (!(tMot > 0 && tGen > 0)) throw new InputError('motor', 'gives no torque at standstill within the limits: there is no map to draw');
    const speeds = mapAxis(0, wMax, nS), torques = mapAxis(-tGen, tMot, nT);
    const t0 = performance.now();
    // the workers load the project's text (without it, as when run from a library call, this thread computes it all)
    // --gain: both maps from the same fixed points, in this thread (the min-loss map keeps its least-current starts)
    let gain: MinLossGainMap | undefined;
    let map;
    if (gainAsked) ({ minLoss: map, gain } = minLossGainMap(model, p.peak, lossConditionsFromProject(p), speeds, torques));
    else map = await efficiencyMapThreaded(input?.projectText ?? '', p, corner, minLoss, speeds, torques, input === undefined ? 1 : threads);
    const threadsUsed = gain !== undefined ? 1 : threads;
    const wall_s = (performance.now() - t0) / 1e3;
    const summary = { ...efficiencyMapSummary(map), corner, control: minLoss ? 'min-loss' : 'least-current', threads: threadsUsed, wall_s, ...(gain !== undefined ? { mostLossSaved: mostSaved(gain) } : {}) };
    const json = { ...efficiencyMapJson(map), ...(gain !== undefined ? { gain: gainJson(gain) } : {}), summary };
    const peak = summary.peakSystem;
    const lines = [
      `${p.name}: efficiency map, ${corner} corner, ${minLoss ? 'loss-minimising' : 'least'} current, shaft torque ${fmt(-tGen)} to ${fmt(tMot)} N·m, speed 0 to ${fmt(json.speeds_rpm[nS - 1]!)} rpm`,
      `  grid ${nS} speeds x ${nT} torques = ${nS * nT} points, ${summary.pointsInside} inside the envelope`,
      peak === null
        ? '  no point inside the envelope'
        : `  peak system efficiency ${fmt(100 * peak.efficiency)} % at ${fmt(peak.speed_rpm)} rpm, ${fmt(peak.torque_Nm)} N·m`,
      ...(summary.mostLossSaved === undefined ? [] : summary.mostLossSaved === null
        ? ['  loss-minimising control saves nothing over the least current anywhere on the grid']
        : [`  loss-minimising control saves at most ${fmt(summary.mostLossSaved.lossSaved_W)} W (${fmt(summary.mostLossSaved.systemGain_pts)} points of system efficiency) at ${fmt(summary.mostLossSaved.speed_rpm)} rpm, ${fmt(summary.mostLossSaved.torque_Nm)} N·m`]),
      `  computed in ${fmt(wall_s * 1e3)} ms on ${Math.min(threadsUsed, nS)} thread${Math.min(threadsUsed, nS) === 1 ? '' : 's'}`,
    ];
    const comments = [`# torquewise efficiency map; project: ${p.name || 'unnamed'}; ${corner} corner; ${minLoss ? 'loss-minimising' : 'least'} current; shaft torque; efficiencies as fractions`];
    return { json, lines, ...(args.flags.has('csv') ? { files: [{ flag: 'csv', contents: efficiencyMapCsv(map, comments, gain !== undefined ? [...EFFICIENCY_MAP_CSV_HEADER, ...EFFICIENCY_GAIN_CSV_COLUMNS] : EFFICIENCY_MAP_CSV_HEADER, gain) }] } : {}) };
  },
};

const gainArray = (g: MinLossGainMap, a: Float64Array): Array<number | null> => Array.from(a, (x, k) => (g.feasible[k] === 1 && Number.isFinite(x) ? x : null));

/** The gain's JSON arrays (index speed x torques + torque, null outside the envelope). */
const gainJson = (g: MinLossGainMap) => ({
  lossLeastCurrent_W: gainArray(g, g.lossLeastCurrent), lossMinLoss_W: gainArray(g, g.lossMinLoss),
  lossSaved_W: gainArray(g, g.lossSaved), systemGain_pts: gainArray(g, g.systemGain_pts),
});

/** Where loss-minimising control saves the most, or null where it saves nothing. */
function mostSaved(g: MinLossGainMap): { lossSaved_W: number; systemGain_pts: number; speed_rpm: number; torque_Nm: number } | null {
  let best = -1;
  for (let k = 0; k < g.feasible.length; k++) if (g.feasible[k] === 1 && g.lossSaved[k]! > 0 && (best < 0 || g.lossSaved[k]! > g.lossSaved[best]!)) best = k;
  if (best < 0) return null;
  const nT = g.torques.length;
  return { lossSaved_W: g.lossSaved[best]!, systemGain_pts: g.systemGain_pts[best]!, speed_rpm: radSToRpm(g.speeds[Math.floor(best / nT)]!), torque_Nm: g.torques[best % nT]! };
}
