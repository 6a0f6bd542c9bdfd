import type { Command } from '../command';
import { sizeDrive, type SizingPoint } from '../../core/steady-state/sizing';
import { table, fmt } from '../table';
import { peakToRms } from '../../core/base/units';
import { describeLimit } from '../../core/drive/current-limits';
import { limitPhrase } from '../../core/reports/phrases';

/** A headroom within round-off of zero (the limit binds) printed as 0. */
const snap = (x: number, scale: number): number => (Math.abs(x) < 1e-9 * scale ? 0 : x);

/** What binds a point, for the table: nothing (MTPA), field weakening (met on the voltage limit by design), or the limit that stops it. */
function bindsText(q: SizingPoint): string {
  if (q.met) return q.limitedBy === 'none' ? '-' : 'field weakening';
  return limitPhrase(q.limitedBy);
}

export const sizeCommand: Command = {
  name: 'size',
  summary: 'least Imax for the bus and least Vdc for Imax that meet every requirement, hot and cold',
  usage: 'size <project.json> [--json]',
  flags: {},
  run(p) {
    const hot = sizeDrive(p.models.hot, p.inverter, p.requirements, p.currentLimits);
    const cold = sizeDrive(p.models.cold, p.inverter, p.requirements, p.currentLimits);
    const worst = (a: number | null, b: number | null) => (a === null || b === null ? null : Math.max(a, b));
    // The file's temperatures (hot corner) give the headline figures; the cold corner is reported beside.
    const json = {
      minImax_A: hot.minImax,
      minVdc_V: hot.minVdc,
      // least continuous current for the continuous-duty points (only when there are some)
      ...(hot.minIcont !== undefined ? { minIcont_A: hot.minIcont } : {}),
      // the same keys in both corners: label, speed_rpm, torque_Nm, duty, current limit, met, torqueAvailable_Nm,
      // current_A, voltage_V, headrooms (null when not met), torque shortfall (null when met), note, limitedBy
      points: hot.points,
      cold: { minImax_A: cold.minImax, minVdc_V: cold.minVdc, ...(cold.minIcont !== undefined ? { minIcont_A: cold.minIcont } : {}), points: cold.points },
      bothCorners: { minImax_A: worst(hot.minImax, cold.minImax), minVdc_V: worst(hot.minVdc, cold.minVdc) },
      currentLimits: p.currentLimits,
    };
    const rows = hot.points.map((q, k) => {
      const c = cold.points[k]!;
      // a point out of reach has no operating voltage or headroom: the figures would be what it needs
      // (a point not met has a torque shortfall instead of headrooms)
      return [q.label, q.speed_rpm, q.torque_Nm, q.duty, q.met ? 'yes' : 'NO', q.torqueAvailable_Nm, q.current_A,
        q.currentHeadroom_A === null ? '-' : snap(q.currentHeadroom_A, q.currentLimit_A), q.met ? q.voltage_V : '-',
        q.voltageHeadroom_V === null ? '-' : snap(q.voltageHeadroom_V, p.peak.Vmax), q.torqueShortfall_Nm === null ? '-' : q.torqueShortfall_Nm, bindsText(q), c.met ? 'yes' : 'NO'];
    });
    const notes = hot.points.map((q, k) => {
      const c = cold.points[k]!;
      return `  ${q.label} (${q.duty} duty): ${q.met ? 'met' : 'NOT met'}, ${q.headroomNote}${c.met === q.met ? '' : `; cold corner: ${c.met ? 'met' : 'NOT met'}, ${c.headroomNote}`}`;
    });
    const imax = (x: number | null) => (x === null ? 'none (a point lies beyond MTPV)' : `${fmt(x)} A pk = ${fmt(peakToRms(x))} A rms`);
    const lines = [
      `${p.name}: sizing at Vdc ${fmt(p.inverter.Vdc)} V (hot corner figures)`,
      `current limits: ${describeLimit('peak', p.currentLimits.peak)}; ${describeLimit('continuous', p.currentLimits.continuous)}`,
      '',
      ...table(['point', 'speed rpm', 'torque N·m', 'duty', 'met hot', 'avail. N·m', '|i| A pk', 'i room A', '|v| V pk', 'v room V', 'short N·m', 'binds (hot)', 'met cold'], rows),
      '',
      'per point (hot corner):',
      ...notes,
      '',
      `least Imax at this bus: hot ${imax(hot.minImax)}; cold ${imax(cold.minImax)}`,
      ...(hot.minIcont !== undefined ? [`least continuous current for the continuous points: hot ${imax(hot.minIcont)}; cold ${imax(cold.minIcont ?? null)}`] : []),
      `least Vdc at these current limits: hot ${hot.minVdc === null ? 'none' : fmt(hot.minVdc) + ' V'}; cold ${cold.minVdc === null ? 'none' : fmt(cold.minVdc) + ' V'}`,
    ];
    return { json, lines };
  },
};
