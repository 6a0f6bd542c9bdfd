// Everything the views show, computed by src/core from one valid resolved project.
// No physics here: this module calls the engine and arranges its answers for plotting.
import type { ResolvedProject } from '../../../core/project/project';
import type { Envelope } from '../../../core/steady-state/envelope';
import { constantTorqueIq, mtpaCurrents, mtpvPoint, currentOnVoltageBoundary } from '../../../core/steady-state/mtpa';
import { currentOnVoltageBoundaryNumeric } from '../../../core/steady-state/voltage-boundary';
import { numericScratch } from '../../../core/machine/model-numeric';
import { isMachineModel } from '../../../core/machine/machine-model';
import type { SizingResult } from '../../../core/steady-state/sizing';
import type { SafetyReport } from '../../../core/steady-state/safety';
import type { DerivedConstants } from '../../../core/machine/nameplate';
import { datasheetCurves, datasheetVerdicts } from '../../../core/reports/datasheet-parts';
import { RPM_TO_RAD_S } from '../../../core/base/units';
import type { MachineInput } from '../../../core/machine/machine-model';

export type Corner = 'hot' | 'cold';
export type CurrentKind = 'peak' | 'continuous';
export type Direction = 'motoring' | 'generating';

export interface Curve {
  key: string;
  corner: Corner;
  current: CurrentKind;
  direction: Direction;
  env: Envelope;
}

export interface EnvelopeOptions {
  points: number;
  /** rad/s; null = the engine's default range (to just past the maximum speed) of the hot, peak, motoring envelope */
  speedMax: number | null;
}

export const DEFAULT_ENVELOPE_OPTIONS: EnvelopeOptions = { points: 200, speedMax: null };

/** The curves: recomputed on every edit. */
export interface EnvelopeResults {
  project: ResolvedProject;
  speedMax: number;
  points: number;
  curves: Curve[];
  /** the reference curve: hot magnet, peak current, motoring */
  main: Envelope;
  constantsHot: DerivedConstants;
  constantsCold: DerivedConstants;
  compute_ms: number;
}

export const curveKey = (c: Corner, i: CurrentKind, d: Direction): string => `${i}-${c}-${d}`;

/** The verdicts (sizing searches are slower): computed right after the curves are drawn. */
export interface Verdicts {
  /** the project these verdicts belong to (may lag the curves by one redraw) */
  verdictsFor: ResolvedProject;
  /** hot corner (least torque per ampere) */
  sizing: SizingResult;
  /** cold corner (most back-EMF: voltage-limited points fail here first) */
  sizingCold: SizingResult;
  safety: SafetyReport;
  /** the speed the safety figures are for: the motor's rated maximum speed, else the plotted top speed, rad/s */
  safetySpeed: number;
  verdict_ms: number;
}

export type Results = EnvelopeResults & Verdicts;

/** A requirement point met in both corners (hot and cold), and which corner fails it otherwise. */
export function pointVerdict(v: Pick<Verdicts, 'sizing' | 'sizingCold'>, i: number): { met: boolean; fails: 'hot' | 'cold' | 'both' | null } {
  const hot = v.sizing.points[i]?.met ?? false;
  const cold = v.sizingCold.points[i]?.met ?? false;
  return { met: hot && cold, fails: hot && cold ? null : !hot && !cold ? 'both' : hot ? 'cold' : 'hot' };
}

/** The sizing verdicts and the safety figures, by the core's own rule (the CLI's datasheet computes them the same way). */
export function computeVerdicts(p: ResolvedProject, speedMax: number): Verdicts {
  const t0 = performance.now();
  // safety at the motor's maximum speed when the file gives one, else at the plotted top speed
  const v = datasheetVerdicts(p, speedMax);
  return { verdictsFor: p, ...v, verdict_ms: performance.now() - t0 };
}

export function computeResults(p: ResolvedProject, opts: EnvelopeOptions): Results {
  const e = computeEnvelopes(p, opts);
  return { ...e, ...computeVerdicts(p, e.speedMax) };
}

export function computeEnvelopes(p: ResolvedProject, opts: EnvelopeOptions): EnvelopeResults {
  const t0 = performance.now();
  // the core's curves (the CLI's datasheet computes the same): the project's range (one rule with
  // the CLI) unless the user typed a top speed
  const d = datasheetCurves(p, { points: opts.points, speedMax: opts.speedMax ?? undefined });
  const curves: Curve[] = d.curves.map((c) => ({ key: curveKey(c.corner, c.current, c.direction), ...c }));
  const main = curves.find((c) => c.key === curveKey('hot', 'peak', 'motoring'))!.env;
  return {
    project: p,
    speedMax: d.speedMax,
    points: opts.points,
    curves,
    main,
    constantsHot: d.constantsHot,
    constantsCold: d.constantsCold,
    compute_ms: performance.now() - t0,
  };
}

export interface PlaneCurves {
  mtpa: { id: number[]; iq: number[] };
  mtpv: { id: number[]; iq: number[] };
  /** |v| = Vmax at each speed; NaN (a gap) where the boundary current was not found */
  ellipses: Array<{ speed_rpm: number; id: number[]; iq: number[] }>;
  /** constant-torque lines over the id range asked for; null where no motoring point lies within the span */
  torque: Array<{ T: number; id: Array<number | null>; iq: Array<number | null> }>;
}

/** The constant-torque lines of the current plane: torques (N·m), over id in [lo, hi], kept where |iq| <= span (A peak). */
export interface TorqueLines {
  torques: number[];
  lo: number;
  hi: number;
  span: number;
}

/**
 * Geometry of the current plane for one machine model and voltage limit (engine functions only):
 * the model's MTPA, MTPV, voltage-limit and constant-torque curves, so a flux-map machine is drawn
 * saturated (its constant-parameter closed forms otherwise).
 */
export function planeCurves(m: MachineInput, Vmax: number, Imax: number, speeds_rpm: number[], mtpvSpeeds: number[], lines: TorqueLines | null = null): PlaneCurves {
  const n = 60;
  const mtpa = { id: [] as number[], iq: [] as number[] };
  for (let k = -n; k <= n; k++) {
    const I = (Math.abs(k) / n) * Imax * 1.25;
    const c = mtpaCurrents(m, I);
    mtpa.id.push(c.id);
    mtpa.iq.push(k < 0 ? -Math.abs(c.iq) : Math.abs(c.iq));
  }
  const mtpv = { id: [] as number[], iq: [] as number[] };
  const upper: Array<{ id: number; iq: number }> = [];
  for (const w of mtpvSpeeds) {
    const pt = mtpvPoint(m, Vmax, w, 1);
    if (pt && pt.current <= 1.6 * Imax) upper.push({ id: pt.id, iq: pt.iq });
  }
  for (let i = upper.length - 1; i >= 0; i--) {
    mtpv.id.push(upper[i]!.id);
    mtpv.iq.push(-upper[i]!.iq);
  }
  for (const u of upper) {
    mtpv.id.push(u.id);
    mtpv.iq.push(u.iq);
  }
  const buf = new Float64Array(2);
  // a model without constant terms: Newton along the boundary from the point before (a gap where it fails)
  const numeric = isMachineModel(m) && m.linear === null ? m : null;
  const ns = numericScratch();
  const ellipses = speeds_rpm
    .filter((s) => Number.isFinite(s) && s > 0)
    .map((speed_rpm) => {
      const we = m.polePairs * speed_rpm * RPM_TO_RAD_S;
      const id: number[] = [];
      const iq: number[] = [];
      buf[0] = 0;
      buf[1] = 0;
      for (let k = 0; k <= 180; k++) {
        const phi = (k / 180) * 2 * Math.PI;
        if (numeric === null) currentOnVoltageBoundary(m, Vmax, we, phi, buf);
        else if (currentOnVoltageBoundaryNumeric(numeric, Vmax, we, phi, buf, ns) < 0) {
          id.push(NaN);
          iq.push(NaN);
          buf[0] = 0;
          buf[1] = 0;
          continue;
        }
        id.push(buf[0]!);
        iq.push(buf[1]!);
      }
      return { speed_rpm, id, iq };
    });
  const torque = (lines?.torques ?? []).map((T) => {
    const x: Array<number | null> = [];
    const y: Array<number | null> = [];
    for (let k = 0; k <= 120; k++) {
      const id = lines!.lo + (k / 120) * (lines!.hi - lines!.lo);
      const iq = constantTorqueIq(m, T, id);
      const ok = Number.isFinite(iq) && Math.abs(iq) <= lines!.span;
      x.push(ok ? id : null);
      y.push(ok ? iq : null);
    }
    return { T, id: x, iq: y };
  });
  return { mtpa, mtpv, ellipses, torque };
}
