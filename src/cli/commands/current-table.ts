import type { Command } from '../command';
import { numberFlag, stringFlag } from '../args';
import { InputError } from '../../core/base/errors';
import { fmt } from '../table';
import { radSToRpm, rpmToRadS } from '../../core/base/units';
import { PLOT_SPEED_MAX_RPM } from '../../core/reports/speed-range';
import { buildCurrentTable, rowSpeed } from '../../core/control/current-table';
import { currentTableBound } from '../../core/control/current-table-bound';
import { currentTableAbout, currentTableInputs, currentTableJson, type CurrentTableCorners } from '../../core/reports/current-table-export';
import { currentTableHeader } from '../../core/reports/current-table-header';
import { currentTableCsv } from '../../core/reports/current-table-csv';
import { currentTableNotes } from '../../core/reports/current-table-notes';
import { datasheetDate } from './datasheet';

const required = (args: Parameters<Command['run']>[1], name: string): number => {
  const n = numberFlag(args, name, { min: 2, max: 500, integer: true });
  if (n === undefined) throw new InputError(`--${name}`, 'is required: a whole number of grid nodes from 2 to 500');
  return n;
};

export const currentTableCommand: Command = {
  name: 'current-table',
  summary: 'id/iq reference table for firmware against torque and speed per bus volt, hot and cold, with its error bound; C header, CSV, notes',
  usage: 'current-table <project.json> --speed-points N --torque-points N [--corner hot|cold|both] [--min-loss] [--speed-max RPM] [--header OUT.h] [--csv OUT.csv] [--notes OUT.md] [--json]',
  flags: { 'speed-points': 'number', 'torque-points': 'number', corner: 'string', 'min-loss': 'switch', 'speed-max': 'number', header: 'output', csv: 'output', notes: 'output' },
  run(p, args) {
    const speedPoints = required(args, 'speed-points');
    const torquePoints = required(args, 'torque-points');
    const cornerText = stringFlag(args, 'corner') ?? 'both';
    if (cornerText !== 'hot' && cornerText !== 'cold' && cornerText !== 'both') throw new InputError('--corner', `must be hot, cold or both (got '${cornerText}')`);
    const speedMax = numberFlag(args, 'speed-max', { min: 1, max: PLOT_SPEED_MAX_RPM, unit: 'rpm' });
    const minLoss = args.flags.has('min-loss');
    const inputs = currentTableInputs(p, {
      speedPoints, torquePoints, corners: cornerText as CurrentTableCorners, minLoss,
      ...(speedMax !== undefined ? { speedMax_rad_s: rpmToRadS(speedMax) } : {}),
    });
    const t0 = performance.now();
    const table = buildCurrentTable(inputs.corners, inputs.spec);
    const build_s = (performance.now() - t0) / 1e3;
    const t1 = performance.now();
    const bound = currentTableBound(table, inputs.corners.map((c) => c.model));
    const bound_s = (performance.now() - t1) / 1e3;
    const about = currentTableAbout(p, inputs, bound, datasheetDate());
    const json = { ...currentTableJson(table, about), build_s, bound_s };
    const pp = about.polePairs;
    const topRpm = radSToRpm(rowSpeed(table.xMax, table.bus_V, pp));
    const noLosses = minLoss && Object.keys(p.losses).length === 0;
    const lines = [
      `${p.name}: current-reference table, ${table.control === 'min-loss' ? 'loss-minimising' : 'least'} current, corners ${table.corners.map((c) => c.name).join(' and ')}, torque electromagnetic`,
      `  speed measure x = electrical speed / effective bus (${fmt(table.bus_V)} V = Vdc ${fmt(about.Vdc)} V - 2 x ${fmt(about.deviceDrop)} V): ${table.nS} rows 0 to ${fmt(table.xMax)} rad/s per V (${fmt(topRpm)} rpm at this bus)`,
      `  torque: ${table.nT} columns ${fmt(-table.torquePeak)} to ${fmt(table.torquePeak)} N·m; Imax ${fmt(table.limits.Imax)} A peak, Vmax ${fmt(table.limits.Vmax)} V peak phase`,
      ...table.corners.map((c) => `  ${c.name}: largest torque ${fmt(c.tMot[0]!)} N·m motoring at standstill, ${fmt(c.tMot[table.nS - 1]!)} motoring / ${fmt(c.tGen[table.nS - 1]!)} generating at the top row`),
      `  bound (bilinear read, demand clamped, ${bound.refine} steps per cell, ${bound.samples} samples): torque ${fmt(bound.torque_Nm)} N·m, |i| over Imax ${fmt(bound.current_A)} A, |v| over Vmax ${fmt(bound.voltage_V)} V (relative ${fmt(bound.relative, 3)})`,
      ...(noLosses ? ['  the file has no losses section: the loss-minimising current is the least current'] : []),
      `  built in ${fmt(build_s * 1e3)} ms, bound checked in ${fmt(bound_s * 1e3)} ms`,
    ];
    const files: Array<{ flag: string; contents: string }> = [];
    if (args.flags.has('header')) files.push({ flag: 'header', contents: currentTableHeader(table, about) });
    if (args.flags.has('csv')) files.push({ flag: 'csv', contents: currentTableCsv(table, about) });
    if (args.flags.has('notes')) files.push({ flag: 'notes', contents: currentTableNotes(table, about) });
    return { json, lines, ...(files.length > 0 ? { files } : {}) };
  },
};
