/**
 * The `control.angle` section of a project file: where the controller's rotor angle and speed come
 * from (see ../control/angle-spec.ts). Absent: the true values ("ideal", today's behaviour).
 * { "source": "ideal" | "encoder" | "resolver" | "sensorless", the options of that source }:
 *  - encoder: linesPerRev (2048), speedWindowPeriods (4), speedFilter_Hz (0: none), offset_deg (0),
 *    timerFrequency_Hz (absent: speed by the difference of counts over the window);
 *  - resolver: bandwidth_Hz (300, the tracking loop's closed-loop -3 dB bandwidth), damping (0.707),
 *    amplitudeImbalance (0), quadratureError_deg (0), polePairs (1);
 *  - sensorless: bandwidth_Hz (100, the PLL's), handoverSpeed_rpm (required), fluxError_pct,
 *    resistanceError_pct, inductanceError_pct (0).
 * The defaults are those above, filled here; an option of another source is refused naming the key.
 * The section parses to an AngleSpec.
 */
import { z } from 'zod';
import type { AngleSpec } from '../control/angle-spec';
import { keyDoc as doc } from './schema-keys';

function num(path: string, min: number, max: number, opts: { gtMin?: boolean; int?: boolean } = {}) {
  let s = z.number();
  if (opts.int) s = s.int();
  s = opts.gtMin ? s.gt(min) : s.gte(min);
  return s.lte(max).optional().describe(doc(path));
}

export const ANGLE_SOURCES = ['ideal', 'encoder', 'resolver', 'sensorless'] as const;
export type AngleSource = (typeof ANGLE_SOURCES)[number];

/** the options each source takes (every other option is refused) */
export const ANGLE_OPTIONS: Readonly<Record<AngleSource, readonly string[]>> = {
  ideal: [],
  encoder: ['linesPerRev', 'speedWindowPeriods', 'speedFilter_Hz', 'offset_deg', 'timerFrequency_Hz'],
  resolver: ['bandwidth_Hz', 'damping', 'amplitudeImbalance', 'quadratureError_deg', 'polePairs'],
  sensorless: ['bandwidth_Hz', 'handoverSpeed_rpm', 'fluxError_pct', 'resistanceError_pct', 'inductanceError_pct'],
};

export const ENCODER_DEFAULTS = { linesPerRev: 2048, speedWindowPeriods: 4, speedFilter_Hz: 0, offset_deg: 0 } as const;
export const RESOLVER_DEFAULTS = { bandwidth_Hz: 300, damping: 0.707, amplitudeImbalance: 0, quadratureError_deg: 0, polePairs: 1 } as const;
export const SENSORLESS_DEFAULTS = { bandwidth_Hz: 100, fluxError_pct: 0, resistanceError_pct: 0, inductanceError_pct: 0 } as const;

const fields = z.strictObject({
  source: z.enum(ANGLE_SOURCES).describe(doc('control.angle.source')),
  linesPerRev: num('control.angle.linesPerRev', 1, 1e7, { int: true }),
  speedWindowPeriods: num('control.angle.speedWindowPeriods', 1, 10000, { int: true }),
  speedFilter_Hz: num('control.angle.speedFilter_Hz', 0, 1e6),
  offset_deg: num('control.angle.offset_deg', -360, 360),
  timerFrequency_Hz: num('control.angle.timerFrequency_Hz', 0, 1e10, { gtMin: true }),
  bandwidth_Hz: num('control.angle.bandwidth_Hz', 0, 1e5, { gtMin: true }),
  damping: num('control.angle.damping', 0.05, 10),
  amplitudeImbalance: num('control.angle.amplitudeImbalance', -0.5, 0.5),
  quadratureError_deg: num('control.angle.quadratureError_deg', -30, 30),
  polePairs: num('control.angle.polePairs', 1, 64, { int: true }),
  handoverSpeed_rpm: num('control.angle.handoverSpeed_rpm', 0, 1e6),
  fluxError_pct: num('control.angle.fluxError_pct', -90, 100),
  resistanceError_pct: num('control.angle.resistanceError_pct', -90, 100),
  inductanceError_pct: num('control.angle.inductanceError_pct', -90, 100),
});

type AngleFields = z.output<typeof fields>;

/** The section with its source's defaults, as an AngleSpec. */
function toSpec(a: AngleFields): AngleSpec {
  switch (a.source) {
    case 'ideal':
      return { source: 'ideal' };
    case 'encoder': {
      const d = ENCODER_DEFAULTS;
      const spec: AngleSpec = { source: 'encoder', linesPerRev: a.linesPerRev ?? d.linesPerRev, speedWindowPeriods: a.speedWindowPeriods ?? d.speedWindowPeriods, speedFilter_Hz: a.speedFilter_Hz ?? d.speedFilter_Hz, offset_deg: a.offset_deg ?? d.offset_deg };
      if (a.timerFrequency_Hz !== undefined) spec.timerFrequency_Hz = a.timerFrequency_Hz;
      return spec;
    }
    case 'resolver': {
      const d = RESOLVER_DEFAULTS;
      return { source: 'resolver', bandwidth_Hz: a.bandwidth_Hz ?? d.bandwidth_Hz, damping: a.damping ?? d.damping, amplitudeImbalance: a.amplitudeImbalance ?? d.amplitudeImbalance, quadratureError_deg: a.quadratureError_deg ?? d.quadratureError_deg, polePairs: a.polePairs ?? d.polePairs };
    }
    case 'sensorless': {
      const d = SENSORLESS_DEFAULTS;
      return { source: 'sensorless', bandwidth_Hz: a.bandwidth_Hz ?? d.bandwidth_Hz, handoverSpeed_rpm: a.handoverSpeed_rpm ?? 0, fluxError_pct: a.fluxError_pct ?? d.fluxError_pct, resistanceError_pct: a.resistanceError_pct ?? d.resistanceError_pct, inductanceError_pct: a.inductanceError_pct ?? d.inductanceError_pct };
    }
  }
}

export const angleSchema = fields
  .superRefine((a, ctx) => {
    const allowed = ANGLE_OPTIONS[a.source];
    for (const k of Object.keys(a)) {
      if (k === 'source' || allowed.includes(k) || (a as Record<string, unknown>)[k] === undefined) continue;
      const takes = allowed.length ? `its options: ${allowed.join(', ')}` : 'it takes no options';
      ctx.addIssue({ code: 'custom', path: [k], message: `is not an option of source "${a.source}" (${takes})` });
    }
    if (a.source === 'sensorless' && a.handoverSpeed_rpm === undefined) {
      ctx.addIssue({ code: 'custom', path: ['handoverSpeed_rpm'], message: 'is required by source "sensorless": the speed, rpm, where the observer takes over from the open-loop start' });
    }
  })
  .transform(toSpec)
  .describe(doc('control.angle'));
