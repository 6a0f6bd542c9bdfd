// The tuning view's current-table export (the card's data path, kept apart from React): the
// firmware's current-reference table of the project (core/control/current-table.ts), its stated
// bound, the C header text and a one-line summary, as the command line's `current-table --header`.
// Built in a Web Worker (workers/current-table-worker.ts runs currentTableJob), with progress as the
// fraction of speed rows solved.
import { loadProjectText, type ResolvedProject } from '../../../core/project/project';
import { buildCurrentTable } from '../../../core/control/current-table';
import { currentTableBound } from '../../../core/control/current-table-bound';
import { currentTableAbout, currentTableInputs, type CurrentTableCorners } from '../../../core/reports/current-table-export';
import { currentTableHeader } from '../../../core/reports/current-table-header';

export interface CurrentTableChoice {
  speedPoints: number;
  torquePoints: number;
  corners: CurrentTableCorners;
  minLoss: boolean;
}

export const CURRENT_TABLE_DEFAULTS: Readonly<CurrentTableChoice> = { speedPoints: 17, torquePoints: 11, corners: 'both', minLoss: false };
export const CURRENT_TABLE_POINTS_MAX = 200;

/** The suggested file name, from the project's name. */
export function currentTableFileName(p: ResolvedProject): string {
  const base = (p.name.trim() || 'project').replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'project';
  return `${base}-current-table.h`;
}

export interface CurrentTableExport {
  header: string;
  fileName: string;
  summary: string;
}

/**
 * The header text, a file name from the project's name, and a summary line with the stated bound;
 * `onProgress(fraction)` after each speed row of each corner (the bound's check after the last is short).
 */
export function currentTableExport(p: ResolvedProject, choice: CurrentTableChoice, date: string, onProgress?: (fraction: number) => void): CurrentTableExport {
  const inputs = currentTableInputs(p, choice);
  const t = buildCurrentTable(inputs.corners, inputs.spec, onProgress ? { onRow: (done, total) => onProgress(done / total) } : {});
  const bound = currentTableBound(t, inputs.corners.map((c) => c.model));
  const header = currentTableHeader(t, currentTableAbout(p, inputs, bound, date));
  const r = (x: number) => String(Number(x.toPrecision(3)));
  const summary = `${t.nS} x ${t.nT} nodes, ${t.corners.map((c) => c.name).join(' and ')}; bound: torque ${r(bound.torque_Nm)} N·m, |i| over Imax ${r(bound.current_A)} A, |v| over Vmax ${r(bound.voltage_V)} V`;
  return { header, fileName: currentTableFileName(p), summary };
}

/** The worker's job: the project from its text (as every reader loads it), then its export. */
export function currentTableJob(projectText: string, choice: CurrentTableChoice, date: string, onProgress?: (fraction: number) => void): CurrentTableExport {
  return currentTableExport(loadProjectText(projectText), choice, date, onProgress);
}
