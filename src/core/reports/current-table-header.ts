/**
 * The current-reference table (control/current-table.ts) as a C header for firmware: include
 * guards, the sizes and the axis ends as #defines, `static const float` arrays (speed axis, torque
 * axis, and per corner the largest motoring and generating torque per row and i_d, i_q as
 * [speed][torque]), the units, the project's name, the date, the control rule, the bus it was built
 * at and the stated error bound in a comment. Every number is the float32 value the table holds,
 * written with 9 significant digits (enough to read back the same float32); a bound rounded up. Names are prefixed TWCT_
 * (macros) and twct_ (arrays). Common practice (no source).
 */
import type { CurrentTable } from '../control/current-table';
import type { CurrentTableBound } from '../control/current-table-bound';

/** What the exports say about a table besides its numbers. */
export interface CurrentTableAbout {
  project: string;
  /** YYYY-MM-DD */
  date: string;
  /** e.g. "Torquewise 0.1.0" */
  tool: string;
  /** the bus named in the file, V, and the drop of one conducting device, V */
  Vdc: number;
  deviceDrop: number;
  polePairs: number;
  /** stator resistance of each corner (same order as the table's corners), ohm */
  Rs: readonly number[];
  bound: CurrentTableBound;
}

/** Text safe inside a C block comment and on one line: printable ASCII, no comment end. */
export function commentText(s: string): string {
  return s.replace(/[^\x20-\x7e]/g, '?').replace(/\*\//g, '*?/').replace(/\/\*/g, '/?*');
}

/** A C identifier part from a corner name (letters, digits, underscores). */
export const cIdent = (s: string): string => s.replace(/[^A-Za-z0-9_]/g, '_');

/** A float literal of the float32 value of x: 9 significant digits, then `f`. */
export function cFloat(x: number): string {
  const f = Math.fround(x);
  if (!Number.isFinite(f)) throw new RangeError(`not a finite float: ${x}`);
  const s = f === 0 ? '0' : f.toPrecision(9);
  return `${s.includes('.') || s.includes('e') ? s : `${s}.0`}f`;
}

/** The next float32 above the float32 f. */
function nextFloatUp(f: number): number {
  if (f === 0) return 1.401298464324817e-45;
  const b = new Float32Array([f]);
  const u = new Uint32Array(b.buffer);
  if (f > 0) u[0]! += 1; else u[0]! -= 1;
  return b[0]!;
}

/**
 * A float literal for a bound: both its decimal text and the float32 a compiler makes of it are >= x
 * (a bound stays a bound once written and rounded to float).
 */
export function cFloatUp(x: number): string {
  let f = Math.fround(x);
  if (f < x) f = nextFloatUp(f);
  let s = cFloat(f);
  for (let k = 0; k < 4 && Number(s.slice(0, -1)) < x; k++) { f = nextFloatUp(f); s = cFloat(f); }
  return s;
}

const list = (a: ArrayLike<number>, from: number, to: number): string => {
  const parts: string[] = [];
  for (let k = from; k < to; k++) parts.push(cFloat(a[k]!));
  return parts.join(', ');
};

function vector(name: string, size: string, a: ArrayLike<number>, unit: string): string[] {
  return [`/* ${unit} */`, `static const float ${name}[${size}] = { ${list(a, 0, a.length)} };`];
}

function matrix(name: string, t: CurrentTable, a: ArrayLike<number>, unit: string): string[] {
  const rows: string[] = [];
  for (let r = 0; r < t.nS; r++) rows.push(`  { ${list(a, r * t.nT, (r + 1) * t.nT)} }${r + 1 < t.nS ? ',' : ''}`);
  return [`/* ${unit}, [speed row][torque column] */`, `static const float ${name}[TWCT_SPEED_POINTS][TWCT_TORQUE_POINTS] = {`, ...rows, '};'];
}

/** Numbers for a comment: 6 significant digits. */
const n6 = (x: number): string => String(Number(x.toPrecision(6)));

/** The C header text (LF line ends). */
export function currentTableHeader(t: CurrentTable, about: CurrentTableAbout): string {
  const b = about.bound;
  const corners = t.corners.map((c) => cIdent(c.name));
  const lines = [
    '/*',
    ` * Current-reference table for field-oriented control (${commentText(about.tool)}).`,
    ` * Project: ${commentText(about.project || 'unnamed')}`,
    ` * Date: ${commentText(about.date)}`,
    ` * Control: ${t.control === 'min-loss' ? 'least copper + iron + inverter loss at each torque (exact at the bus it was built for only)' : 'least current (MTPA, field weakening, MTPV)'}; corners: ${corners.join(', ')}.`,
    ' * Units: currents A peak (amplitude-invariant dq), torque N*m electromagnetic, speed measure',
    ' *   x = electrical speed / effective bus = p * omega_m / (Vdc - 2 * device drop), rad/s per V.',
    ` * Built at Vdc ${n6(about.Vdc)} V (effective ${n6(t.bus_V)} V), Vmax ${n6(t.limits.Vmax)} V peak phase, Imax ${n6(t.limits.Imax)} A peak, ${about.polePairs} pole pairs.`,
    ` * Stated error bound (bilinear read, demand clamped to the row maximum, sampled ${b.refine} steps per cell):`,
    ` *   torque within ${n6(b.torque_Nm)} N*m of the solver, |i| at most ${n6(b.current_A)} A over Imax, |v| at most ${n6(b.voltage_V)} V over Vmax;`,
    ` *   relative ${n6(b.relative)} (of the peak torque, Imax, Vmax).`,
    ` * Another bus V': the resistive drop does not scale with the bus; the voltage asked moves by at most Rs*|i|*|1 - V'/${n6(t.bus_V)}| V (Rs ${about.Rs.map(n6).join(', ')} ohm).`,
    ' * Read it: x = |omega_e| / (Vdc_measured - 2 * TWCT_DEVICE_DROP_V), clamped to TWCT_X_MAX; a negative speed negates the torque demand',
    ' *   and the i_q read; demand clamped to [-tgen(x), tmot(x)] (each linear in x between rows); i_d, i_q bilinear in (x, T).',
    ' *   Nodes beyond a row\'s largest torque hold that row\'s maximum-torque point.',
    ' */',
    '#ifndef TWCT_CURRENT_TABLE_H',
    '#define TWCT_CURRENT_TABLE_H',
    '',
    `#define TWCT_SPEED_POINTS ${t.nS}`,
    `#define TWCT_TORQUE_POINTS ${t.nT}`,
    `#define TWCT_X_MAX ${cFloat(t.xMax)} /* rad/s per V, the speed axis runs uniformly from 0 */`,
    `#define TWCT_TORQUE_PEAK ${cFloat(t.torquePeak)} /* N*m, the torque axis runs uniformly from -peak to +peak */`,
    `#define TWCT_DEVICE_DROP_V ${cFloat(about.deviceDrop)} /* V, one conducting device */`,
    `#define TWCT_BOUND_TORQUE_NM ${cFloatUp(b.torque_Nm)}`,
    `#define TWCT_BOUND_CURRENT_A ${cFloatUp(b.current_A)}`,
    `#define TWCT_BOUND_VOLTAGE_V ${cFloatUp(b.voltage_V)}`,
    '',
    ...vector('twct_speed_axis', 'TWCT_SPEED_POINTS', t.x, 'speed measure x, electrical rad/s per V of effective bus'),
    ...vector('twct_torque_axis', 'TWCT_TORQUE_POINTS', t.torque, 'electromagnetic torque, N*m'),
  ];
  t.corners.forEach((c, k) => {
    const id = corners[k]!;
    lines.push('', `/* corner ${id} */`);
    lines.push(...vector(`twct_tmot_${id}`, 'TWCT_SPEED_POINTS', c.tMot, 'largest motoring torque per row, N*m'));
    lines.push(...vector(`twct_tgen_${id}`, 'TWCT_SPEED_POINTS', c.tGen, 'largest generating torque magnitude per row, N*m'));
    lines.push(...matrix(`twct_id_${id}`, t, c.id, 'i_d, A peak'));
    lines.push(...matrix(`twct_iq_${id}`, t, c.iq, 'i_q, A peak'));
  });
  lines.push('', '#endif /* TWCT_CURRENT_TABLE_H */', '');
  return lines.join('\n');
}
