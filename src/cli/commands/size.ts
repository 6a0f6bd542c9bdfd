import type { Command } from '../command';
import { sizeDrive } from '../../core/sizing';
import { table, fmt } from '../table';
import { peakToRms } from '../../core/units';

/** A headroom within round-off of zero (the limit binds) printed as 0. */
const snap = (x: number, scale: number): number => (Math.abs(x) < 1e-9 * scale ? 0 : x);

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
      // the same keys in both corners: label, speed_rpm, torque_Nm, met, torqueAvailable_Nm, current_A, voltage_V, headrooms, limitedBy
      points: hot.points,
      cold: { minImax_A: cold.minImax, minVdc_V: cold.minVdc, points: cold.points },
      bothCorners: { minImax_A: worst(hot.minImax, cold.minImax), minVdc_V: worst(hot.minVdc, cold.minVdc) },
    };
    const rows = hot.points.map((q, k) => {
      const c = cold.points[k]!;
      // a point out of reach has no operating voltage or headroom: the figures would be what it needs
      return [q.label, q.speed_rpm, q.torque_Nm, q.met ? 'yes' : 'NO', q.torqueAvailable_Nm, q.current_A, snap(q.currentHeadroom_A, p.peak.Imax), q.met ? q.voltage_V : '-', q.met ? snap(q.voltageHeadroom_V, p.peak.Vmax) : '-', q.limitedBy, c.met ? 'yes' : 'NO'];
    });
    const imax = (x: number | null) => (x === null ? 'none (a point lies beyond MTPV)' : `${fmt(x)} A pk = ${fmt(peakToRms(x))} A rms`);
    const lines = [
      `${p.name}: sizing at Vdc ${fmt(p.inverter.Vdc)} V, Imax ${fmt(p.peak.Imax)} A pk`,
      '',
      ...table(['point', 'speed rpm', 'torque N·m', 'met hot', 'avail. N·m', '|i| A pk', 'i room A', '|v| V pk', 'v room V', 'limited by', 'met cold'], rows),
      '',
      `least Imax at this bus: hot ${imax(hot.minImax)}; cold ${imax(cold.minImax)}`,
      `least Vdc at this Imax: hot ${hot.minVdc === null ? 'none' : fmt(hot.minVdc) + ' V'}; cold ${cold.minVdc === null ? 'none' : fmt(cold.minVdc) + ' V'}`,
    ];
    return { json, lines };
  },
};
