import type { Command } from '../command';
import { sizeDrive } from '../../core/sizing';
import { table, fmt } from '../table';
import { peakToRms } from '../../core/units';

export const sizeCommand: Command = {
  name: 'size',
  summary: 'least Imax for the bus and least Vdc for Imax that meet every requirement, hot and cold',
  usage: 'size <project.json> [--json]',
  flags: {},
  run(p) {
    const hot = sizeDrive(p.hot, p.inverter, p.requirements);
    const cold = sizeDrive(p.cold, p.inverter, p.requirements);
    const worst = (a: number | null, b: number | null) => (a === null || b === null ? null : Math.max(a, b));
    // The file's temperatures (hot corner) give the headline figures; the cold corner is reported beside.
    const json = {
      minImax_A: hot.minImax,
      minVdc_V: hot.minVdc,
      points: hot.points.map((q) => ({ label: q.label, met: q.met, torqueAvailable_Nm: q.torqueAvailable_Nm, current_A: q.current_A, voltage_V: q.voltage_V, limitedBy: q.limitedBy })),
      cold: { minImax_A: cold.minImax, minVdc_V: cold.minVdc, points: cold.points },
      bothCorners: { minImax_A: worst(hot.minImax, cold.minImax), minVdc_V: worst(hot.minVdc, cold.minVdc) },
    };
    const rows = hot.points.map((q, k) => {
      const c = cold.points[k]!;
      return [q.label, q.speed_rpm, q.torque_Nm, q.met ? 'yes' : 'NO', q.torqueAvailable_Nm, q.current_A, q.voltage_V, q.limitedBy, c.met ? 'yes' : 'NO'];
    });
    const imax = (x: number | null) => (x === null ? 'none (a point lies beyond MTPV)' : `${fmt(x)} A pk = ${fmt(peakToRms(x))} A rms`);
    const text = [
      `${p.name}: sizing at Vdc ${fmt(p.inverter.Vdc)} V, Imax ${fmt(p.peak.Imax)} A pk`,
      '',
      table(['point', 'speed rpm', 'torque N·m', 'met hot', 'avail. N·m', '|i| A pk', '|v| V pk', 'limited by', 'met cold'], rows),
      '',
      `least Imax at this bus: hot ${imax(hot.minImax)}; cold ${imax(cold.minImax)}`,
      `least Vdc at this Imax: hot ${hot.minVdc === null ? 'none' : fmt(hot.minVdc) + ' V'}; cold ${cold.minVdc === null ? 'none' : fmt(cold.minVdc) + ' V'}`,
    ].join('\n');
    return { json, text };
  },
};
