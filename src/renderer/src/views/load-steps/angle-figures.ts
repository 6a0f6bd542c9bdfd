// What a run with a measured or estimated rotor angle adds to the Load steps view, pure (testable in
// node): the angle source of the run named in one line (encoder lines, resolver tracking loop,
// sensorless observer with its PLL), the angle error in electrical degrees (the engine keeps radians),
// the rms and peak rows of the metrics table, and the sensorless observer's validity finding.
import type { Finding } from '../../../../core/base/finding';
import { num } from '../../components/format';

export const RAD_TO_DEG = 180 / Math.PI;

type Json = Record<string, unknown>;
const obj = (v: unknown): Json | null => (v !== null && typeof v === 'object' && !Array.isArray(v) ? (v as Json) : null);
const numOf = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);

/** control.angle of a project file (parsed or as saved), or null when absent or ideal. */
export function angleOf(file: unknown): Json | null {
  const a = obj(obj(obj(file)?.control)?.angle);
  return a && typeof a.source === 'string' && a.source !== 'ideal' ? a : null;
}

/** The project file a finished run was made from: its inputs key (the file less control.pwm), else the current project's. */
export function runFile(inputsKey: string | undefined, current: unknown): unknown {
  if (inputsKey) {
    try {
      return JSON.parse(inputsKey) as unknown;
    } catch {
      /* not JSON: the current project */
    }
  }
  return current;
}

/**
 * The angle source in one line, as an engineer names it: "encoder, 2048 lines (8192 counts per
 * revolution, 0.176 ° electrical per count), speed over 8 control periods, filter 1 kHz"; "resolver,
 * tracking loop 300 Hz, damping 0.707"; "sensorless observer, PLL 4000 Hz, open-loop start-up handing
 * over at 700 rpm". Null for the true angle (ideal or absent). `polePairs` when the file has no motor
 * section.
 */
export function angleSourceText(file: unknown, polePairs: number | null = null): string | null {
  const a = angleOf(file);
  if (!a) return null;
  // the motor section's pole pairs, else the caller's (a nameplate gives poles in its own terms)
  const pp = numOf(obj(obj(file)?.motor)?.polePairs) ?? polePairs;
  const hz = (v: number): string => (v >= 1000 ? `${num(v / 1e3)} kHz` : `${num(v)} Hz`);
  const parts: string[] = [];
  if (a.source === 'encoder') {
    const lines = numOf(a.linesPerRev);
    const counts = lines === null ? null : 4 * lines;
    // quadrature decoding: four edges per line; one count is 360/(4 N) mechanical degrees, pp times that electrical
    const perCount = counts !== null && pp !== null ? `, ${num((360 * pp) / counts, 3)} ° electrical per count` : '';
    parts.push(lines === null ? 'encoder' : `encoder, ${num(lines)} lines (${num(counts!)} counts per revolution${perCount})`);
    const ts = numOf(a.timerFrequency_Hz);
    const w = numOf(a.speedWindowPeriods);
    if (ts !== null) parts.push(`speed by edge timing (timer ${hz(ts)})`);
    else if (w !== null) parts.push(`speed over ${num(w)} control period${w === 1 ? '' : 's'}`);
    const f = numOf(a.speedFilter_Hz);
    if (f !== null && f > 0) parts.push(`speed filter ${hz(f)}`);
    const off = numOf(a.offset_deg);
    if (off !== null && off !== 0) parts.push(`mounting offset ${num(off, 3)} ° mechanical`);
  } else if (a.source === 'resolver') {
    const bw = numOf(a.bandwidth_Hz);
    parts.push(bw === null ? 'resolver' : `resolver, tracking loop ${hz(bw)}`);
    const z = numOf(a.damping);
    if (z !== null) parts.push(`damping ${num(z, 3)}`);
    const im = numOf(a.amplitudeImbalance);
    if (im !== null && im !== 0) parts.push(`amplitude imbalance ${num(im * 100, 3)} %`);
    const q = numOf(a.quadratureError_deg);
    if (q !== null && q !== 0) parts.push(`quadrature error ${num(q, 3)} °`);
  } else if (a.source === 'sensorless') {
    const bw = numOf(a.bandwidth_Hz);
    parts.push(bw === null ? 'sensorless observer' : `sensorless observer, PLL ${hz(bw)}`);
    const h = numOf(a.handoverSpeed_rpm);
    if (h !== null) parts.push(`open-loop start-up handing over at ${num(h)} rpm`);
    const mism = ([['fluxError_pct', 'flux linkage'], ['resistanceError_pct', 'resistance'], ['inductanceError_pct', 'inductance']] as const)
      .map(([k, name]) => [numOf(a[k]), name] as const)
      .filter(([v]) => v !== null && v !== 0)
      .map(([v, name]) => `${name} ${v! > 0 ? '+' : ''}${num(v!, 3)} %`);
    if (mism.length) parts.push(`observer's parameters off the motor's: ${mism.join(', ')}`);
  } else {
    parts.push(String(a.source));
  }
  return parts.join(', ');
}

/** The sensorless hand-over speed of a project file, rpm, or null. */
export function handoverSpeed(file: unknown): number | null {
  const a = angleOf(file);
  return a && a.source === 'sensorless' ? numOf(a.handoverSpeed_rpm) : null;
}

/** A trace of angles in radians as electrical degrees, in a new array. */
export function degrees(rad: ArrayLike<number>): Float64Array {
  const out = new Float64Array(rad.length);
  for (let i = 0; i < rad.length; i++) out[i] = rad[i]! * RAD_TO_DEG;
  return out;
}

/** An angle in radians as "0.101 ° electrical (1.75 mrad)". */
export function angleText(rad: number): string {
  return `${num(rad * RAD_TO_DEG, 3)} ° electrical (${num(rad * 1e3, 3)} mrad)`;
}

/** The metrics table's rows for the angle error (rms, peak) and the speed estimate's ripple, present only when the run reports them. */
export function angleMetricRows(m: { angleErrorRms_rad?: number | null; angleErrorPeak_rad?: number | null; speedEstimateRipple_rpm?: number | null }): Array<{ key: string; label: string; text: string; value: number }> {
  const rows: Array<{ key: string; label: string; text: string; value: number }> = [];
  const add = (key: 'angleErrorRms_rad' | 'angleErrorPeak_rad', label: string) => {
    const v = m[key];
    if (typeof v === 'number' && Number.isFinite(v)) rows.push({ key, label, text: angleText(v), value: v });
  };
  add('angleErrorRms_rad', 'angle error, rms (estimated − true)');
  add('angleErrorPeak_rad', 'angle error, peak (estimated − true)');
  const w = m.speedEstimateRipple_rpm;
  if (typeof w === 'number' && Number.isFinite(w)) rows.push({ key: 'speedEstimateRipple_rpm', label: 'speed estimate ripple, rms (estimated − true)', text: `${num(w, 3)} rpm`, value: w });
  return rows;
}

/** The findings about where the angle comes from (the sensorless observer's validity and hand-over, the estimator's loop against the speed loop). */
export function angleFindings(findings: readonly Finding[]): Finding[] {
  return findings.filter((f) => f.code === 'sensorless-low-speed' || f.code === 'speed-loop-near-estimator' || (f.field ?? '').startsWith('control.angle'));
}

/**
 * A symmetric range of the angle-error axis, ° electrical: the largest |error| with a margin, at least
 * ±0.05 ° (a perfect estimate would otherwise draw on a range of nothing).
 */
export function angleErrorRange(deg: ArrayLike<number>): [number, number] {
  let m = 0;
  for (let i = 0; i < deg.length; i++) {
    const a = Math.abs(deg[i]!);
    if (Number.isFinite(a) && a > m) m = a;
  }
  const r = Math.max(0.05, 1.15 * m);
  return [-r, r];
}
