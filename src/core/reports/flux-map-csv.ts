/**
 * A flux map read from a CSV in long format: one row per point, a header naming the columns, the
 * user saying which column holds id, iq, psi_d and psi_q and whether the currents are rms or peak
 * (fluxes per phase, Wb peak). The points must make a full rectangular grid (every id with every
 * iq, once); the result is the project file's `motor.fluxMap` (A peak, Wb peak).
 */
import { InputError } from '../base/errors';
import { SQRT2 } from '../base/units';
import type { FluxMapData } from '../machine/flux-map';
import { MAX_FLUX_MAP_POINTS } from '../project/schema';
import { parseCsv } from './csv';

/** The columns of the CSV, by their header names, and the flags that named them (for messages). */
export interface FluxMapColumns {
  id: string;
  iq: string;
  psid: string;
  psiq: string;
}

export interface FluxMapCsvOptions {
  columns: FluxMapColumns;
  /** the currents of the CSV: rms (multiplied by √2 to A peak) or peak */
  current: 'rms' | 'peak';
  magnetTemp_C: number;
}

const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const FLAG: Record<keyof FluxMapColumns, string> = { id: '--id', iq: '--iq', psid: '--psid', psiq: '--psiq' };

/** The CSV text -> a flux map on the full rectangular grid of its points, or an InputError naming the row, column or missing point. */
export function fluxMapFromCsv(text: string, o: FluxMapCsvOptions): FluxMapData {
  const rows = parseCsv(text.replace(/^\uFEFF/, '')).filter((r) => !(r.length === 1 && r[0]!.trim() === ''));
  if (rows.length < 2) throw new InputError('CSV', 'needs a header row naming the columns and at least one row of points');
  const header = rows[0]!.map((h) => h.trim());
  const col = {} as Record<keyof FluxMapColumns, number>;
  for (const k of Object.keys(FLAG) as (keyof FluxMapColumns)[]) {
    const name = o.columns[k].trim();
    const at = header.indexOf(name);
    if (at < 0) throw new InputError(FLAG[k], `'${name}' is not a column of the CSV header (columns: ${header.map((h) => `'${h}'`).join(', ')})`);
    if (header.indexOf(name, at + 1) >= 0) throw new InputError(FLAG[k], `'${name}' names more than one column of the CSV header`);
    col[k] = at;
  }
  const scale = o.current === 'rms' ? SQRT2 : 1;
  const points: Array<{ id: number; iq: number; psid: number; psiq: number; row: number }> = [];
  for (let r = 1; r < rows.length; r++) {
    const cells = rows[r]!;
    const value = (k: keyof FluxMapColumns): number => {
      const s = (cells[col[k]] ?? '').trim();
      if (!DECIMAL.test(s)) throw new InputError(`CSV row ${r + 1}`, `column '${header[col[k]]}' (${FLAG[k]}) must be a number (got '${s.length > 40 ? s.slice(0, 40) + '…' : s}')`);
      return Number(s);
    };
    points.push({ id: value('id'), iq: value('iq'), psid: value('psid'), psiq: value('psiq'), row: r + 1 });
  }
  const ids = [...new Set(points.map((p) => p.id))].sort((a, b) => a - b);
  const iqs = [...new Set(points.map((p) => p.iq))].sort((a, b) => a - b);
  for (const [g, k] of [[ids, 'id'], [iqs, 'iq']] as const) {
    if (g.length < 2) throw new InputError(FLAG[k], `column has ${g.length} distinct value; a map needs at least 2`);
    if (g.length > MAX_FLUX_MAP_POINTS) throw new InputError(FLAG[k], `column has ${g.length} distinct values; a map has at most ${MAX_FLUX_MAP_POINTS}`);
  }
  const iOf = new Map(ids.map((x, i) => [x, i]));
  const jOf = new Map(iqs.map((x, j) => [x, j]));
  const psid: number[][] = ids.map(() => new Array<number>(iqs.length).fill(NaN));
  const psiq: number[][] = ids.map(() => new Array<number>(iqs.length).fill(NaN));
  const rowOf: number[][] = ids.map(() => new Array<number>(iqs.length).fill(0));
  for (const p of points) {
    const i = iOf.get(p.id)!, j = jOf.get(p.iq)!;
    if (rowOf[i]![j]! > 0) throw new InputError(`CSV row ${p.row}`, `repeats the point id ${p.id}, iq ${p.iq} of row ${rowOf[i]![j]} (each point once)`);
    rowOf[i]![j] = p.row;
    psid[i]![j] = p.psid;
    psiq[i]![j] = p.psiq;
  }
  for (let i = 0; i < ids.length; i++) {
    for (let j = 0; j < iqs.length; j++) {
      if (rowOf[i]![j]! === 0) {
        throw new InputError('CSV', `has no point at id ${ids[i]}, iq ${iqs[j]} (${o.current}): the map must be a full rectangular grid, every id value with every iq value (${ids.length} x ${iqs.length} points, ${points.length} given)`);
      }
    }
  }
  return { magnetTemp_C: o.magnetTemp_C, id_A: ids.map((x) => x * scale), iq_A: iqs.map((x) => x * scale), psid_Wb: psid, psiq_Wb: psiq };
}
