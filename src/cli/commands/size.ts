import type { Command } from '../command';
import { sizeDrive, type SizingPoint } from '../../core/steady-state/sizing';
import { table, fmt } from '../table';
import { peakToRms } from '../../core/base/units';
import { describeLimit } from '../../core/drive/current-limits';
import { limitPhrase } from '../../core/reports/phrases';
import { lossConditionsFromProject } from '../../core/project/loss-conditions-from-project';
import { temperatureModelFromProject } from '../../core/project/temperature-model-from-project';
import { continuousRequirementChecks } from '../../core/steady-state/continuous-requirements';
import { evaluateDutyCycle, type DutyCycleResult } from '../../core/simulation/duty-cycle';
import type { ResolvedProject } from '../../core/project/project';

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
    const th = thermalSizing(p);
    if (th !== null) Object.assign(json, th.json);
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
      ...(th === null ? [] : ['', ...th.lines]),
    ];
    return { json, lines };
  },
};

/**
 * With a thermal network: each continuous-duty point against the S1 curve (its own coupled steady
 * temperatures beside), and with a duty cycle the least continuous current it needs (its RMS
 * current) beside the least peak current (its peak), from the cycle's periodic state.
 */
function thermalSizing(p: ResolvedProject): { json: Record<string, unknown>; lines: string[] } | null {
  const net = p.thermal;
  if (net === undefined) return null;
  const c = lossConditionsFromProject(p);
  const checks = continuousRequirementChecks(temperatureModelFromProject(p), net, p.continuous, c, p.requirements);
  const json: Record<string, unknown> = { continuousPoints: checks };
  const lines = [`thermal rating (coolant ${fmt(net.coolantTemp_C)} °C; winding limit ${fmt(net.windingMax_C)} °C, magnet ${fmt(net.magnetMax_C)} °C):`];
  if (checks.length === 0) lines.push('  no requirement point is marked continuous');
  for (const q of checks) {
    lines.push(`  ${q.label} (continuous): ${q.underS1 ? 'under' : 'ABOVE'} the S1 torque at ${fmt(q.speed_rpm)} rpm, ${fmt(q.s1Torque_Nm)} N·m (${q.s1LimitedBy} limit); ` +
      (q.status === 'converged' ? `held, it settles at winding ${fmt(q.windingTemp_C)} °C, magnet ${fmt(q.magnetTemp_C)} °C` : `held, it does not settle (${q.status})`));
  }
  if (p.dutyCycle !== undefined) {
    const r = evaluateDutyCycle(p.dutyCycle, net, temperatureModelFromProject(p), c, p.peak) as DutyCycleResult; // never cancelled
    json.dutyCycle = { label: r.label, minIcont_A: r.rmsCurrent_A, minImax_A: r.peakCurrent.value, rmsCurrent_A: r.rmsCurrent_A, peakCurrent_A: r.peakCurrent.value, verdict: r.verdict };
    lines.push(`duty cycle "${r.label}": least continuous current ${fmt(r.rmsCurrent_A)} A pk = ${fmt(peakToRms(r.rmsCurrent_A))} A rms (its RMS current; Icont ${fmt(p.continuous.Imax)} A pk), ` +
      `least peak current ${fmt(r.peakCurrent.value)} A pk (Imax ${fmt(p.peak.Imax)} A pk); ${r.verdict.text}`);
  }
  return { json, lines };
}
