/**
 * The conditions every exported figure and datasheet carries, so that a figure reads on its own:
 * project name, bus voltage and modulation, hot and cold temperatures, the effective current
 * limits and which rating binds each, the date and the tool's version. Plain text lines.
 */
import type { ResolvedProject } from '../project/project';
import type { EffectiveCurrent } from '../drive/current-limit-types';
import type { Modulation } from '../drive/inverter-spec';
import { TOOL_NAME, TOOL_VERSION } from '../base/version';

export interface FigureConditionsOptions {
  /** the date printed, e.g. "2026-12-03" (the caller's clock; this module reads none) */
  date: string;
  /** the tool's version, default TOOL_VERSION */
  version?: string;
}

/** Modulation in words. */
export const MODULATION_WORDS: Record<Modulation, string> = {
  sinusoidal: 'sinusoidal PWM',
  svpwm: 'SVPWM',
  'six-step': 'six-step',
};

/** 4 significant digits, plain for ordinary magnitudes. */
const g = (x: number): string => (Number.isFinite(x) ? String(Number(x.toPrecision(4))) : '–');

/** "300 A peak (212.1 A rms), motor binds (inverter 400 A peak)" */
export function limitWords(c: EffectiveCurrent): string {
  const other = c.binds === 'motor' ? `inverter ${g(c.inverter_A)} A peak` : c.motor_A !== undefined ? `motor ${g(c.motor_A)} A peak` : 'no motor rating given';
  return `${g(c.A)} A peak (${g(c.A / Math.SQRT2)} A rms), ${c.binds} binds (${other})`;
}

/** The conditions as lines: who/when, the bus, the temperatures, the current limits. */
export function figureConditions(p: ResolvedProject, o: FigureConditionsOptions): string[] {
  const c = p.conditions;
  const name = p.name.trim() || 'Unnamed project';
  return [
    `${name} · ${TOOL_NAME} ${o.version ?? TOOL_VERSION} · ${o.date}`,
    `Vdc ${g(p.inverter.Vdc)} V, ${MODULATION_WORDS[p.inverter.modulation]} (Vmax ${g(p.peak.Vmax)} V peak phase) · ` +
      `hot: winding ${g(c.windingTemp_C)} °C, magnet ${g(c.magnetTemp_C)} °C · cold: ${g(c.coldTemp_C)} °C`,
    `peak current ${limitWords(p.currentLimits.peak)} · continuous ${limitWords(p.currentLimits.continuous)}`,
  ];
}

/** The date of a Date as YYYY-MM-DD (UTC). */
export const isoDate = (d: Date): string => d.toISOString().slice(0, 10);
