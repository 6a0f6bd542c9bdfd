/**
 * The one-page description (Markdown) that goes with an exported current-reference table: what the
 * axes are, how the firmware reads it (normalise by the measured bus, clamp, bilinear), what nodes
 * beyond the envelope hold, the stated bound and how it was found, and what a bus away from the
 * table's does with Rs. Common practice (no source).
 */
import type { CurrentTable } from '../control/current-table';
import type { CurrentTableAbout } from './current-table-header';
import { cIdent } from './current-table-header';

const g = (x: number): string => String(Number(x.toPrecision(4)));

/** Markdown text (LF line ends). */
export function currentTableNotes(t: CurrentTable, about: CurrentTableAbout): string {
  const b = about.bound;
  const c0 = cIdent(t.corners[0]?.name ?? 'hot');
  const dT = (2 * t.torquePeak) / (t.nT - 1), dx = t.xMax / (t.nS - 1);
  const name = (about.project || 'unnamed').replace(/[\r\n\u2028\u2029]/g, ' ');
  return [
    `# Current-reference table: ${name}`,
    '',
    `${about.tool}, ${about.date}. Control: ${t.control === 'min-loss' ? 'least copper + iron + inverter loss at each electromagnetic torque' : 'least current (MTPA, field weakening, MTPV)'}; corners ${t.corners.map((c) => c.name).join(', ')}.`,
    '',
    '## Axes',
    `- Speed measure x = omega_e / V_bus in rad/s per V, with omega_e = p omega_m the electrical speed (p = ${about.polePairs}) and V_bus = Vdc - 2 x device drop (${g(about.deviceDrop)} V) the effective bus. ${t.nS} rows, uniform from 0 to ${g(t.xMax)} (step ${g(dx)}); at the nominal ${g(about.Vdc)} V bus the top row is ${g((t.xMax * t.bus_V * 30) / (Math.PI * about.polePairs))} rpm.`,
    `- Torque demand T, electromagnetic, N·m (what the current makes; friction and iron-loss torque are the speed loop's to cover). ${t.nT} columns, uniform from -${g(t.torquePeak)} to +${g(t.torquePeak)} (step ${g(dT)}), zero on a column.`,
    '- Per corner: `tmot[x]`, `tgen[x]` the largest motoring and generating torque (magnitudes) of each row within Imax and the voltage limit; `id[x][T]`, `iq[x][T]` in A peak (amplitude-invariant dq).',
    '',
    '## Why one table serves a varying bus',
    'In steady state v = Rs i + omega_e J psi(i) and the modulator gives |v| <= g V_bus. With Rs = 0 the voltage limit is |psi(i)| <= g / x: the allowed currents, and so the chosen current for each torque, depend on x only, for any flux linkage (flux maps included). Rs adds a drop Rs |i| that does not scale with the bus, so the table is exact at the bus it was built for and, at another bus V\', asks a voltage off by at most Rs |i| |1 - V\'/V_bus| volts (' +
      `Rs ${about.Rs.map(g).join(', ')} ohm, V_bus ${g(t.bus_V)} V). Keep voltage headroom for that, or build the table at the lowest bus.` +
      (t.control === 'min-loss' ? ' Loss-minimising currents are optimal at the bus they were built for only (inverter and iron losses do not scale with x).' : ''),
    '',
    '## Reading it (every control period)',
    '1. x = |omega_e| / (Vdc_measured - 2 TWCT_DEVICE_DROP_V); if omega_e < 0, negate the demand T (and later i_q): the point at (-x, -T) has the same i_d and the opposite i_q.',
    '2. Clamp x to [0, TWCT_X_MAX]. Above the top row the table does not apply (the currents of the top row need more voltage there): a bus below the nominal raises x at the same speed, so to cover the top speed at a bus V_min build the table up to that speed times V_bus / V_min (the command\'s --speed-max).',
    '3. Row: s = x / TWCT_X_MAX * (TWCT_SPEED_POINTS - 1), r = min(floor(s), TWCT_SPEED_POINTS - 2), f = s - r.',
    '4. Clamp the demand: Tmax = tmot[r] + f (tmot[r+1] - tmot[r]), Tmin = -(tgen[r] + f (tgen[r+1] - tgen[r])), T = min(max(T, Tmin), Tmax).',
    '5. Column: u = (T + TWCT_TORQUE_PEAK) / (2 TWCT_TORQUE_PEAK) * (TWCT_TORQUE_POINTS - 1), c = min(floor(u), TWCT_TORQUE_POINTS - 2), h = u - c.',
    '6. i_d = (1-f)(1-h) id[r][c] + f(1-h) id[r+1][c] + (1-f)h id[r][c+1] + f h id[r+1][c+1]; the same for i_q (then negate i_q if the speed was negative).',
    '',
    '```c',
    `float T_hi = twct_tmot_${c0}[r] + f * (twct_tmot_${c0}[r + 1] - twct_tmot_${c0}[r]);`,
    `float T_lo = -(twct_tgen_${c0}[r] + f * (twct_tgen_${c0}[r + 1] - twct_tgen_${c0}[r]));`,
    'T = T > T_hi ? T_hi : (T < T_lo ? T_lo : T);',
    `id_ref = (1 - f) * (1 - h) * twct_id_${c0}[r][c] + f * (1 - h) * twct_id_${c0}[r + 1][c]`,
    `       + (1 - f) * h * twct_id_${c0}[r][c + 1] + f * h * twct_id_${c0}[r + 1][c + 1];`,
    '```',
    '',
    '## Beyond the envelope',
    "A node whose torque is beyond its row's largest torque holds that row's maximum-torque point of the same sign (beyond the maximum speed, where a row makes no torque of that sign, the zero-torque point). The clamp keeps the demand within the interpolated row maximum; cells that straddle the edge blend the last solved node with the maximum-torque point, which the bound includes.",
    '',
    '## Stated bound',
    `Reading the table this way (float32 values, clamp, bilinear) gives a current whose torque is within ${g(b.torque_Nm)} N·m of the solver's torque for the clamped demand (the demand itself inside the envelope, else the true largest torque at that x), whose |i| exceeds Imax = ${g(t.limits.Imax)} A by at most ${g(b.current_A)} A and whose |v| exceeds Vmax = ${g(t.limits.Vmax)} V by at most ${g(b.voltage_V)} V at the bus it was built for: relative ${g(b.relative)} of the peak torque, Imax and Vmax.`,
    `Method: every cell sampled on a finer lattice, ${b.refine} steps per cell along each axis (nodes, quarter points, edge and cell midpoints), ${b.samples} samples over all corners; each compared with the machine model (torque, steady voltage at omega_e = x V_bus) and the largest torque at that x. A sampled maximum; a finer table lowers it (inside the envelope with the square of the step, in the cells at its edge with the step).`,
    '',
    '## Corners',
    'Each corner is a table of its own (hot: the file\'s winding and magnet temperatures; cold: the cold temperature, the highest back-EMF). The bound holds for each corner read on its own; pick the corner matching the machine, or blend them at your own risk.',
    '',
  ].join('\n');
}
