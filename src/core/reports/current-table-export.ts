/**
 * From a loaded project to the inputs of a current-reference table (control/current-table.ts) and
 * to what its exports say about it: the corners' machine models (hot, cold or both, on common
 * axes), the effective bus the speed measure is normalised by, the peak limits, the speed axis up to
 * the project's speed range at the file's bus (or a speed given), and the loss data for
 * loss-minimising control. Shared by the command line and the app.
 */
import type { ResolvedProject } from '../project/project';
import type { CurrentTable, CurrentTableSpec } from '../control/current-table';
import type { CurrentTableBound } from '../control/current-table-bound';
import type { MachineInput } from '../machine/machine-model';
import type { CurrentTableAbout } from './current-table-header';
import { effectiveBus } from '../drive/inverter';
import { InputError } from '../base/errors';
import { projectSpeedRange } from './speed-range';
import { lossConditionsFromProject } from '../project/loss-conditions-from-project';
import { TOOL_NAME, TOOL_VERSION } from '../base/version';

export type CurrentTableCorners = 'hot' | 'cold' | 'both';

export interface CurrentTableRequest {
  speedPoints: number;
  torquePoints: number;
  corners: CurrentTableCorners;
  minLoss: boolean;
  /** top of the speed axis as a mechanical speed at the file's bus, rad/s; default the project's speed range */
  speedMax_rad_s?: number;
}

export interface CurrentTableInputs {
  corners: Array<{ name: string; model: MachineInput }>;
  spec: CurrentTableSpec;
  /** Rs of each corner, ohm */
  Rs: number[];
}

/** The corners, the spec and each corner's Rs for a table of project p. */
export function currentTableInputs(p: ResolvedProject, q: CurrentTableRequest): CurrentTableInputs {
  const bus = effectiveBus(p.inverter);
  if (!(bus > 0)) throw new InputError('inverter.deviceDrop', 'leaves no bus voltage (Vdc - 2 x drop <= 0): there is no table to make');
  const names: Array<'hot' | 'cold'> = q.corners === 'both' ? ['hot', 'cold'] : [q.corners];
  const wMax = q.speedMax_rad_s ?? projectSpeedRange(p).speedMax;
  const spec: CurrentTableSpec = {
    bus_V: bus, limits: p.peak, xMax: (p.machine20.polePairs * wMax) / bus,
    speedPoints: q.speedPoints, torquePoints: q.torquePoints,
    ...(q.minLoss ? { minLoss: lossConditionsFromProject(p) } : {}),
  };
  return { corners: names.map((n) => ({ name: n, model: p.models[n] })), spec, Rs: names.map((n) => p.models[n].Rs) };
}

/** What the exports say about a table of project p. */
export function currentTableAbout(p: ResolvedProject, inputs: CurrentTableInputs, bound: CurrentTableBound, date: string): CurrentTableAbout {
  return { project: p.name, date, tool: `${TOOL_NAME} ${TOOL_VERSION}`, Vdc: p.inverter.Vdc, deviceDrop: p.inverter.deviceDrop, polePairs: p.machine20.polePairs, Rs: inputs.Rs, bound };
}

/** The table's JSON document (arrays as plain numbers; id and iq as rows of the speed axis). */
export function currentTableJson(t: CurrentTable, about: CurrentTableAbout) {
  const rows = (a: Float32Array) => Array.from({ length: t.nS }, (_, r) => Array.from(a.subarray(r * t.nT, (r + 1) * t.nT)));
  return {
    project: about.project, date: about.date, control: t.control, torque: 'electromagnetic',
    bus: { Vdc_V: about.Vdc, deviceDrop_V: about.deviceDrop, effective_V: t.bus_V }, limits: { Vmax_V: t.limits.Vmax, Imax_A: t.limits.Imax },
    polePairs: about.polePairs,
    speedAxis_rad_s_per_V: Array.from(t.x), torqueAxis_Nm: Array.from(t.torque),
    corners: t.corners.map((c, k) => ({ corner: c.name, Rs_ohm: about.Rs[k], tMot_Nm: Array.from(c.tMot), tGen_Nm: Array.from(c.tGen), id_A: rows(c.id), iq_A: rows(c.iq) })),
    bound: about.bound,
  };
}
