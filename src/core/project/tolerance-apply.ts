/**
 * A project's toleranced parameters (the bands of its `tolerances` section with their nominal values
 * and ends) and a set of their values applied to the validated file: a pure function giving a
 * perturbed copy (the file itself is never written), which the normal resolution then takes
 * (project.ts resolveProject). What each path changes is said in tolerance-schema.ts; besides,
 * an inverter.Imax below inverter.Icont takes the continuous limit down with it (the peak limit
 * caps every current).
 */
import { InputError } from '../base/errors';
import { fluxMapAt } from '../machine/flux-map';
import { parseProject, type ProjectFile } from './schema';
import { allowedTolerancePaths, TOLERANCE_PATHS, type ToleranceBand, type TolerancePath, type TolerancesSection } from './tolerance-schema';
import { KEYS } from './schema-keys';

export interface ToleranceParameter {
  path: TolerancePath;
  /** the file's value (a flux map's magnet flux: psi_d(0, 0) of the map as given; its scale: 1) */
  nominal: number;
  /** the band's ends in the parameter's unit */
  min: number;
  max: number;
  unit: string;
  /** a flux map's psi_d(0, 0) as given, Wb (the magnet flux and the scale of a map are taken about it) */
  mapFlux0?: number;
}

/** The file's tolerances section as its type (the schema has checked it). */
export function tolerancesOf(file: ProjectFile): TolerancesSection | undefined {
  return file.tolerances as TolerancesSection | undefined;
}

/** The nominal value of a parameter of the file. */
export function nominalValue(file: ProjectFile, path: TolerancePath): number {
  const m = file.motor, np = file.nameplate;
  const need = <T>(x: T | undefined): T => {
    if (x === undefined) throw new InputError(`tolerances.${path}`, 'names a parameter this file does not have');
    return x;
  };
  switch (path) {
    case 'motor.Rs': return need(m).Rs;
    case 'motor.psiM': return need(need(m).psiM);
    case 'motor.Ld': return need(need(m).Ld);
    case 'motor.Lq': return need(need(m).Lq);
    case 'motor.fluxMap.magnetFlux': {
      const map = need(need(m).fluxMap);
      const f = new Float64Array(2);
      fluxMapAt(map, need(m).polePairs, need(m).Rs, map.magnetTemp_C, -0.0012).flux(0, 0, f);
      return f[0]!;
    }
    case 'motor.fluxMap.scale': need(need(m).fluxMap); return 1;
    case 'nameplate.R': return need(np).R.value;
    case 'nameplate.Ke': return need(need(np).Ke).value;
    case 'nameplate.Kt': return need(need(np).Kt).value;
    case 'nameplate.L': return need(need(np).L).value;
    case 'nameplate.Ld': return need(need(np).Ld).value;
    case 'nameplate.Lq': return need(need(np).Lq).value;
    case 'inverter.Vdc': return file.inverter.Vdc;
    case 'inverter.Imax': return file.inverter.Imax;
    case 'thermal.coolantTemp_C': return need(file.thermal).coolantTemp_C;
  }
}

/** A band's ends about a nominal value. */
export function bandEnds(nominal: number, b: ToleranceBand): { min: number; max: number } {
  if ('min' in b) return { min: b.min, max: b.max };
  const lo = nominal * (1 - b.minus_pct / 100), hi = nominal * (1 + b.plus_pct / 100);
  return { min: Math.min(lo, hi), max: Math.max(lo, hi) };
}

/**
 * The toleranced parameters of a file, in the order of TOLERANCE_PATHS (the same order whatever the
 * file's key order, so a sample's draws do not depend on how the file is written); [] without bands.
 */
export function toleranceParameters(file: ProjectFile): ToleranceParameter[] {
  const t = tolerancesOf(file);
  if (t === undefined) return [];
  const out: ToleranceParameter[] = [];
  const allowed = allowedTolerancePaths(file);
  for (const path of TOLERANCE_PATHS) {
    const b = t[path];
    if (b === undefined || !allowed.includes(path)) continue; // a band on a parameter the file lacks: a warning at resolution
    const nominal = nominalValue(file, path);
    const mapFlux0 = path.startsWith('motor.fluxMap.') ? nominalValue(file, 'motor.fluxMap.magnetFlux') : undefined;
    out.push({ path, nominal, ...bandEnds(nominal, b), unit: KEYS[`tolerances.${path}`]?.unit ?? '', ...(mapFlux0 !== undefined ? { mapFlux0 } : {}) });
  }
  return out;
}

/**
 * The file with the parameters set to `values` (one per parameter, in the order of `params`): a new
 * object sharing every part it does not change. Pure: `file` is left as it was.
 */
export function applyParameterValues(file: ProjectFile, params: readonly ToleranceParameter[], values: ArrayLike<number>): ProjectFile {
  const out: ProjectFile = { ...file, inverter: { ...file.inverter } };
  if (file.motor) out.motor = { ...file.motor };
  if (file.nameplate) out.nameplate = { ...file.nameplate };
  if (file.thermal) out.thermal = { ...file.thermal };
  let shift = 0, scale = 1, psi0 = 0, mapTouched = false;
  params.forEach((p, k) => {
    const v = values[k]!;
    const np = out.nameplate!;
    switch (p.path) {
      case 'motor.Rs': out.motor!.Rs = v; break;
      case 'motor.psiM': out.motor!.psiM = v; break;
      case 'motor.Ld': out.motor!.Ld = v; break;
      case 'motor.Lq': out.motor!.Lq = v; break;
      case 'motor.fluxMap.magnetFlux': shift = v - p.nominal; psi0 = p.mapFlux0 ?? p.nominal; mapTouched = true; break;
      case 'motor.fluxMap.scale': scale = v; psi0 = p.mapFlux0 ?? 0; mapTouched = true; break;
      case 'nameplate.R': np.R = { ...np.R, value: v }; break;
      case 'nameplate.Ke': np.Ke = { ...np.Ke!, value: v }; break;
      case 'nameplate.Kt': np.Kt = { ...np.Kt!, value: v }; break;
      case 'nameplate.L': np.L = { ...np.L!, value: v }; break;
      case 'nameplate.Ld': np.Ld = { ...np.Ld!, value: v }; break;
      case 'nameplate.Lq': np.Lq = { ...np.Lq!, value: v }; break;
      case 'inverter.Vdc': out.inverter.Vdc = v; break;
      case 'inverter.Imax': out.inverter.Imax = v; if (out.inverter.Icont > v) out.inverter.Icont = v; break;
      case 'thermal.coolantTemp_C': out.thermal!.coolantTemp_C = v; break;
    }
  });
  if (mapTouched) {
    const map = out.motor!.fluxMap!;
    // psi_d = psi0 + shift + scale (psi_d - psi0); psi_q = scale psi_q (rows of the map as given)
    const psid = map.psid_Wb.map((row) => row.map((x) => psi0 + shift + scale * (x - psi0)));
    const psiq = scale === 1 ? map.psiq_Wb : map.psiq_Wb.map((row) => row.map((x) => scale * x));
    out.motor!.fluxMap = { ...map, psid_Wb: psid, psiq_Wb: psiq };
  }
  return out;
}

/**
 * Each band end applied alone must give a valid file: an InputError at tolerances.<path> otherwise,
 * saying which end and what the file would then break (e.g. a bus below twice the device drop).
 */
export function checkBandEnds(file: ProjectFile, params: readonly ToleranceParameter[]): void {
  params.forEach((p, k) => {
    for (const [end, v] of [['lower', p.min], ['upper', p.max]] as const) {
      const values = params.map((q) => q.nominal);
      values[k] = v;
      try {
        parseProject(applyParameterValues(file, params, values));
      } catch (e) {
        if (!(e instanceof InputError)) throw e;
        throw new InputError(`tolerances.${p.path}`, `has its ${end} end at ${Number(v.toPrecision(6))}${p.unit ? ` ${p.unit}` : ''}, which the file cannot take: ${e.message}`);
      }
    }
  });
}
