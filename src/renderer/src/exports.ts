// Text exports: the envelope and the simulated traces as CSV (numbers straight from the engine).
import { describeLimits } from '../../core/current-limits';
import { RAD_S_TO_RPM, SQRT2 } from '../../core/units';
import type { Results } from './compute';

const g = (x: number): string => (Number.isFinite(x) ? String(Number(x.toPrecision(10))) : '');

/**
 * Every envelope curve in long form, one row per speed point. Header lines starting with '#'
 * state the options the curves were computed with, so the numbers can be reproduced.
 */
export function envelopeCsv(r: Results): string {
  const lines: string[] = [];
  lines.push(`# torquewise envelope; project: ${r.project.name || 'unnamed'}`);
  lines.push(`# points=${r.points} speedMax_rad_s=${g(r.speedMax)} curves=${r.curves.map((c) => c.key).join(',')}`);
  lines.push(`# ${describeLimits(r.project.currentLimits)}; Vmax ${g(r.project.peak.Vmax)} V peak phase`);
  lines.push('# currents in A peak (and rms), voltage in V peak phase, speed mechanical');
  lines.push('curve,speed_rpm,torque_Nm,power_W,id_A,iq_A,current_A_peak,current_A_rms,voltage_V,region');
  for (const c of r.curves) {
    const e = c.env;
    for (let k = 0; k < e.speed.length; k++) {
      lines.push(
        [
          c.key,
          g(e.speed[k]! * RAD_S_TO_RPM),
          g(e.torque[k]!),
          g(e.power[k]!),
          g(e.id[k]!),
          g(e.iq[k]!),
          g(e.current[k]!),
          g(e.current[k]! / SQRT2),
          g(e.voltage[k]!),
          e.feasible[k] ? e.region[k] : 'beyond-max-speed',
        ].join(','),
      );
    }
  }
  return lines.join('\n') + '\n';
}

/** Simulated traces, one column per channel. */
export function tracesCsv(traces: Record<string, ArrayLike<number>>): string {
  const keys = Object.keys(traces).filter((k) => traces[k] && typeof traces[k]!.length === 'number');
  const t = keys.includes('t_s') ? ['t_s', ...keys.filter((k) => k !== 't_s')] : keys;
  const n = Math.min(...t.map((k) => traces[k]!.length));
  const lines = [t.join(',')];
  for (let i = 0; i < n; i++) lines.push(t.map((k) => g(traces[k]![i]!)).join(','));
  return lines.join('\n') + '\n';
}
