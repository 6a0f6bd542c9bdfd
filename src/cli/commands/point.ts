import type { Command } from '../command';
import { solveOperatingPoint } from '../../core/steady-state/operating-point';
import { numberFlag } from '../args';
import { InputError } from '../../core/base/errors';
import { fmt } from '../table';
import { peakToRms, rpmToRadS } from '../../core/base/units';
import { describeLimit } from '../../core/drive/current-limits';
import { notReachablePhrase, regionPhrase } from '../../core/reports/phrases';

export const pointCommand: Command = {
  name: 'point',
  summary: 'least-current (id, iq) for one speed and torque, or which limit forbids it',
  usage: 'point <project.json> --speed RPM --torque NM [--json]',
  flags: { speed: 'number', torque: 'number' },
  run(p, args) {
    const speed = numberFlag(args, 'speed', { min: -1e6, max: 1e6, unit: 'rpm' });
    const torque = numberFlag(args, 'torque', { min: -1e7, max: 1e7, unit: 'N·m' });
    if (speed === undefined) throw new InputError('--speed', 'is required (rpm)');
    if (torque === undefined) throw new InputError('--torque', 'is required (N·m)');
    const op = solveOperatingPoint(p.models.hot, p.peak, rpmToRadS(speed), torque);
    const json = { feasible: op.feasible, id_A: op.id, iq_A: op.iq, current_A: op.current, voltage_V: op.voltage, limitedBy: op.limitedBy, region: op.region, currentLimits: p.currentLimits };
    const verdict = op.feasible ? 'feasible' : `NOT feasible: ${notReachablePhrase(op.limitedBy)}`;
    const lines = [
      `${p.name}: ${fmt(torque)} N·m at ${fmt(speed)} rpm (hot corner): ${verdict}`,
      `  id ${fmt(op.id)} A pk, iq ${fmt(op.iq)} A pk, |i| ${fmt(op.current)} A pk = ${fmt(peakToRms(op.current))} A rms (limit: ${describeLimit('peak', p.currentLimits.peak)})`,
      `  |v| ${fmt(op.voltage)} V peak phase (limit ${fmt(p.peak.Vmax)} V), region: ${regionPhrase(op.region)}`,
    ];
    return { json, lines };
  },
};
