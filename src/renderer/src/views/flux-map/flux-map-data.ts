// Whether a project carries a measured flux map (motor.fluxMap), read from the validated file with a
// type guard: a project without one (constant Ld, Lq, psiM, or a nameplate) has no flux-map view.
import type { FluxMapData } from '../../../../core/machine/flux-map';
import type { ResolvedProject } from '../../../../core/project/project';

const isNumberArray = (x: unknown): x is number[] => Array.isArray(x) && x.every((v) => typeof v === 'number' && Number.isFinite(v));
const isTable = (x: unknown, rows: number, cols: number): x is number[][] =>
  Array.isArray(x) && x.length === rows && x.every((r) => isNumberArray(r) && r.length === cols);

/** A flux map of the project file's shape: two ascending grids of at least 2 points and two tables of their size. */
export function isFluxMapData(x: unknown): x is FluxMapData {
  if (typeof x !== 'object' || x === null) return false;
  const m = x as Record<string, unknown>;
  const id = m['id_A'], iq = m['iq_A'];
  if (!isNumberArray(id) || !isNumberArray(iq) || id.length < 2 || iq.length < 2) return false;
  if (typeof m['magnetTemp_C'] !== 'number') return false;
  return isTable(m['psid_Wb'], id.length, iq.length) && isTable(m['psiq_Wb'], id.length, iq.length);
}

/** The project's flux map (motor.fluxMap), or null when it has none. */
export function fluxMapOf(p: ResolvedProject | null | undefined): FluxMapData | null {
  const motor: unknown = p?.file.motor;
  if (typeof motor !== 'object' || motor === null) return null;
  const map = (motor as Record<string, unknown>)['fluxMap'];
  return isFluxMapData(map) ? map : null;
}
