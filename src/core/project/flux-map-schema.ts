/**
 * The flux map of a project file, `motor.fluxMap`: the zod section and its checks, each problem
 * naming the exact entry (e.g. `motor.fluxMap.psid_Wb[3][7]`): a rectangular table (rows = id_A,
 * columns = iq_A), strictly ascending grids, finite numbers, psi_d increasing in id and psi_q
 * increasing in iq (positive incremental inductances), and a grid that covers the peak current
 * limit. A map whose iq_A starts at 0 or above covers iq >= 0 only and is mirrored.
 */
import { z } from 'zod';
import { keyDoc as doc } from './schema-keys';

/** Most grid points along either axis of a flux map. */
export const MAX_FLUX_MAP_POINTS = 101;
/** Most problems of one kind (ascending, increasing) listed for one map: a broken table says the first few. */
const MAX_LISTED = 5;
/** Relative slack of the coverage check (a grid written with rounded currents still covers its limit). */
const COVER_SLACK = 1e-9;

const T_MIN = -60;
const T_MAX = 250;
const grid = (path: string) => z.array(z.number().gte(-1e6).lte(1e6)).min(2).max(MAX_FLUX_MAP_POINTS).describe(doc(path));
const table = (path: string) => z.array(z.array(z.number().gte(-100).lte(100))).min(2).max(MAX_FLUX_MAP_POINTS).describe(doc(path));

type Ctx = z.RefinementCtx;
type Map = { id_A: number[]; iq_A: number[]; psid_Wb: number[][]; psiq_Wb: number[][] };

function ascending(ctx: Ctx, key: 'id_A' | 'iq_A', g: readonly number[]): boolean {
  for (let k = 1; k < g.length; k++) {
    if (!(g[k]! > g[k - 1]!)) {
      ctx.addIssue({ code: 'custom', path: [key, k], message: `must be > ${key}[${k - 1}] (${g[k - 1]} A): the grid must be strictly ascending` });
      return false;
    }
  }
  return true;
}

function rectangular(ctx: Ctx, key: 'psid_Wb' | 'psiq_Wb', t: readonly (readonly number[])[], nd: number, nq: number): boolean {
  if (t.length !== nd) {
    ctx.addIssue({ code: 'custom', path: [key], message: `has ${t.length} rows; it must have one per id_A entry (${nd})` });
    return false;
  }
  for (let i = 0; i < nd; i++) {
    if (t[i]!.length !== nq) {
      ctx.addIssue({ code: 'custom', path: [key, i], message: `has ${t[i]!.length} entries; it must have one per iq_A entry (${nq})` });
      return false;
    }
  }
  return true;
}

/** psi_d rising with id along every column, psi_q rising with iq along every row; the first few failures named. */
function increasing(ctx: Ctx, m: Map): void {
  const nd = m.id_A.length, nq = m.iq_A.length;
  let n = 0, more = 0;
  for (let i = 1; i < nd; i++) {
    for (let j = 0; j < nq; j++) {
      if (m.psid_Wb[i]![j]! > m.psid_Wb[i - 1]![j]!) continue;
      if (n++ >= MAX_LISTED) { more++; continue; }
      ctx.addIssue({
        code: 'custom', path: ['psid_Wb', i, j],
        message: `must be > psid_Wb[${i - 1}][${j}] (${m.psid_Wb[i - 1]![j]} Wb): psi_d must increase with id (a positive incremental d inductance); it does not from id ${m.id_A[i - 1]} to ${m.id_A[i]} A at iq ${m.iq_A[j]} A`,
      });
    }
  }
  let nq2 = 0;
  for (let i = 0; i < nd; i++) {
    for (let j = 1; j < nq; j++) {
      if (m.psiq_Wb[i]![j]! > m.psiq_Wb[i]![j - 1]!) continue;
      if (nq2++ >= MAX_LISTED) { more++; continue; }
      ctx.addIssue({
        code: 'custom', path: ['psiq_Wb', i, j],
        message: `must be > psiq_Wb[${i}][${j - 1}] (${m.psiq_Wb[i]![j - 1]} Wb): psi_q must increase with iq (a positive incremental q inductance); it does not from iq ${m.iq_A[j - 1]} to ${m.iq_A[j]} A at id ${m.id_A[i]} A`,
      });
    }
  }
  if (more > 0) ctx.addIssue({ code: 'custom', path: [], message: `has ${more} more points where a flux does not increase with its current (the first ${MAX_LISTED} of each table are listed)` });
}

export const fluxMapSchema = z
  .strictObject({
    magnetTemp_C: z.number().gte(T_MIN).lte(T_MAX).describe(doc('motor.fluxMap.magnetTemp_C')),
    id_A: grid('motor.fluxMap.id_A'),
    iq_A: grid('motor.fluxMap.iq_A'),
    psid_Wb: table('motor.fluxMap.psid_Wb'),
    psiq_Wb: table('motor.fluxMap.psiq_Wb'),
  })
  .superRefine((m, ctx) => {
    const okD = ascending(ctx, 'id_A', m.id_A);
    const okQ = ascending(ctx, 'iq_A', m.iq_A);
    const rd = rectangular(ctx, 'psid_Wb', m.psid_Wb, m.id_A.length, m.iq_A.length);
    const rq = rectangular(ctx, 'psiq_Wb', m.psiq_Wb, m.id_A.length, m.iq_A.length);
    if (okD && okQ && rd && rq) increasing(ctx, m);
  })
  .describe(doc('motor.fluxMap'));

export type FluxMapSection = z.output<typeof fluxMapSchema>;

/**
 * Whether the map's grid covers |i| <= Ipk (A peak) on both axes (iq mirrored when the map starts
 * at iq >= 0): a problem per axis that falls short, saying by how much, else none.
 */
export function fluxMapCoverageProblems(m: FluxMapSection, Ipk: number, limitWords: string): Array<{ key: 'id_A' | 'iq_A'; message: string }> {
  const out: Array<{ key: 'id_A' | 'iq_A'; message: string }> = [];
  const need = Ipk * (1 - COVER_SLACK);
  const fmtA = (x: number): string => String(Number(x.toPrecision(6)));
  for (const key of ['id_A', 'iq_A'] as const) {
    const g = m[key];
    const lo = g[0]!, hi = g[g.length - 1]!;
    const mirrored = key === 'iq_A' && lo >= 0;
    const short: string[] = [];
    if (hi < need) short.push(`${fmtA(Ipk - hi)} A short at the top`);
    if (!mirrored && lo > -need) short.push(`${fmtA(Ipk + lo)} A short at the bottom`);
    if (short.length === 0) continue;
    const range = mirrored ? `0 to ${fmtA(hi)} A (mirrored to -${fmtA(hi)} A)` : `${fmtA(lo)} to ${fmtA(hi)} A`;
    out.push({
      key,
      message: `covers ${range}; the map must cover the peak current limit, ${fmtA(Ipk)} A (${limitWords}), from -${fmtA(Ipk)} to ${fmtA(Ipk)} A${key === 'iq_A' ? ' (or 0 to ' + fmtA(Ipk) + ' A, mirrored)' : ''}: ${short.join(', ')}`,
    });
  }
  return out;
}

/**
 * A flux map whose lists are longer than MAX_FLUX_MAP_POINTS, found by their lengths alone (no
 * entry is read), so a huge table is answered at once.
 */
export function fluxMapCapProblem(json: unknown): { path: string; message: string } | null {
  const o = (x: unknown, k: string): unknown => (x !== null && typeof x === 'object' && !Array.isArray(x) ? (x as Record<string, unknown>)[k] : undefined);
  const map = o(o(json, 'motor'), 'fluxMap');
  const over = (path: string, n: number) => ({ path, message: `must have at most ${MAX_FLUX_MAP_POINTS} entries (it has ${n})` });
  for (const key of ['id_A', 'iq_A', 'psid_Wb', 'psiq_Wb']) {
    const x = o(map, key);
    if (!Array.isArray(x)) continue;
    if (x.length > MAX_FLUX_MAP_POINTS) return over(`motor.fluxMap.${key}`, x.length);
    if (key.startsWith('psi')) {
      for (let i = 0; i < x.length; i++) {
        const row: unknown = x[i];
        if (Array.isArray(row) && row.length > MAX_FLUX_MAP_POINTS) return over(`motor.fluxMap.${key}[${i}]`, row.length);
      }
    }
  }
  return null;
}
