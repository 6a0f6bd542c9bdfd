import type { Command } from '../command';
import { solveLossPoint } from '../../core/steady-state/loss-point';
import { lossConditionsFromProject } from '../../core/project/loss-conditions-from-project';
import { numberFlag } from '../args';
import { InputError } from '../../core/base/errors';
import { fmt } from '../table';
import { peakToRms, rpmToRadS } from '../../core/base/units';
import { describeLimit } from '../../core/drive/current-limits';
import { notReachablePhrase, regionPhrase } from '../../core/reports/phrases';

const pct = (x: number): string => (Number.isFinite(x) ? `${fmt(100 * x)} %` : 'n/a');

export const pointCommand: Command = {
  name: 'point',
  summary: 'current, losses and efficiencies for one speed and shaft torque, or which limit forbids it',
  usage: 'point <project.json> --speed RPM --torque NM [--min-loss] [--json]',
  flags: { speed: 'number', torque: 'number', 'min-loss': 'switch' },
  run(p, args) {
    const speed = numberFlag(args, 'speed', { min: -1e6, max: 1e6, unit: 'rpm' });
    const torque = numberFlag(args, 'torque', { min: -1e7, max: 1e7, unit: 'N·m' });
    if (speed === undefined) throw new InputError('--speed', 'is required (rpm)');
    if (torque === undefined) throw new InputError('--torque', 'is required (N·m, shaft torque)');
    const minLoss = args.flags.has('min-loss');
    // --torque is the shaft torque: the electromagnetic torque also covers the iron and mechanical losses
    const op = solveLossPoint(p.models.hot, p.peak, lossConditionsFromProject(p), rpmToRadS(speed), torque, { minLoss });
    const json = {
      feasible: op.feasible, id_A: op.id, iq_A: op.iq, current_A: op.current, voltage_V: op.voltage, limitedBy: op.limitedBy, region: op.region, currentLimits: p.currentLimits,
      torqueEm_Nm: op.torqueEm_Nm,
      losses: { ...op.losses },
      efficiency: { ...op.efficiency },
      dcPower_W: op.dcPower_W,
      dcCurrent_A: op.dcCurrent_A,
      // 0 at zero current (as the solver says); its quotient can underflow to 0/0 at currents near the smallest double
      powerFactor: Number.isFinite(op.powerFactor) ? op.powerFactor : 0,
      control: op.control,
    };
    const verdict = op.feasible ? 'feasible' : `NOT feasible: ${notReachablePhrase(op.limitedBy)}`;
    const l = op.losses;
    const total = l.copper_W + l.iron_W + l.mechanical_W + l.inverter_W;
    const lines = [
      `${p.name}: shaft torque ${fmt(torque)} N·m at ${fmt(speed)} rpm (hot corner, ${minLoss ? 'loss-minimising' : 'least'} current): ${verdict}`,
      `  electromagnetic torque ${fmt(op.torqueEm_Nm)} N·m (shaft torque plus the iron and mechanical loss torques)`,
      `  id ${fmt(op.id)} A pk, iq ${fmt(op.iq)} A pk, |i| ${fmt(op.current)} A pk = ${fmt(peakToRms(op.current))} A rms (limit: ${describeLimit('peak', p.currentLimits.peak)})`,
      `  |v| ${fmt(op.voltage)} V peak phase (limit ${fmt(p.peak.Vmax)} V), region: ${regionPhrase(op.region)}`,
      `  losses: copper ${fmt(l.copper_W)} W, iron ${fmt(l.iron_W)} W, mechanical ${fmt(l.mechanical_W)} W, inverter ${fmt(l.inverter_W)} W, total ${fmt(total)} W`,
      `  efficiency: motor ${pct(op.efficiency.motor)}, inverter ${pct(op.efficiency.inverter)}, system ${pct(op.efficiency.system)}`,
      `  DC link ${fmt(op.dcPower_W)} W, ${fmt(op.dcCurrent_A)} A at ${fmt(p.inverter.Vdc)} V; power factor ${fmt(json.powerFactor, 3)}`,
    ];
    return { json, lines };
  },
};
