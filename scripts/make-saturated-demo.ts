/**
 * Writes the fourth demo project: an invented interior-magnet traction motor whose flux map is sampled
 * from the algebraic saturation model (src/core/machine/saturation-model.ts; Hinkkanen et al. (2017),
 * IEEE Trans. Ind. Appl. 53(3), with the magnet as a d-axis current). The rest of the project follows
 * the interior-magnet traction demo: the same bus, inverter, conditions, control, scenario, losses,
 * thermal network and duty cycle.
 *
 *   npx tsx scripts/make-saturated-demo.ts OUT.json
 *
 * A 41 x 41 map of iq >= 0 (mirrored by the engine), |i| up to 1.2 x the 450 A peak limit.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { INVENTED_IPM_SATURATION, SaturationModel } from '../src/core/machine/saturation-model';
import { evenGrid, sampleFluxMap } from '../src/core/machine/sample-flux-map';
import { FluxMapModel, fluxMapAt } from '../src/core/machine/flux-map';
import { solveOperatingPoint } from '../src/core/steady-state/operating-point';
import { maxTorquePoint } from '../src/core/steady-state/envelope';

const out = process.argv[2];
if (!out) {
  console.error('usage: npx tsx scripts/make-saturated-demo.ts OUT.json');
  process.exit(2);
}

const POLE_PAIRS = 4;
const RS = 0.018; // ohm per phase at 25 °C (0.036 ohm line to line, as the traction demo)
const IMAX = 450;
const MAP_MAGNET_C = 20;
const sat = new SaturationModel(INVENTED_IPM_SATURATION, POLE_PAIRS, RS);
const round = (x: number, digits: number): number => Number(x.toPrecision(digits));
const map = sampleFluxMap(sat, evenGrid(-1.2 * IMAX, 1.2 * IMAX, 41), evenGrid(0, 1.2 * IMAX, 41), MAP_MAGNET_C);
const fluxMap = {
  magnetTemp_C: MAP_MAGNET_C,
  id_A: map.id_A.map((x) => round(x, 12)),
  iq_A: map.iq_A.map((x) => round(x, 12)),
  psid_Wb: map.psid_Wb.map((r) => r.map((x) => round(x, 9))),
  psiq_Wb: map.psiq_Wb.map((r) => r.map((x) => round(x, 9))),
};

const base = JSON.parse(readFileSync(fileURLToPath(new URL('../resources/demo-ipm-traction.json', import.meta.url)), 'utf8')) as Record<string, unknown>;
const requirements = [
  { label: 'hill start (MTPA)', speed_rpm: 500, torque_Nm: 250 },
  { label: 'rated', speed_rpm: 3000, torque_Nm: 90, duty: 'continuous' },
  { label: 'full torque in field weakening', speed_rpm: 3500, torque_Nm: 160 },
  { label: 'regenerative braking', speed_rpm: 6000, torque_Nm: -60 },
  { label: 'overtake at top speed (envelope on MTPV)', speed_rpm: 12000, torque_Nm: 41 },
];
const project = {
  format: base.format,
  version: base.version,
  name: 'Invented demo: saturating interior-magnet traction motor (flux map from an algebraic saturation model)',
  note: 'Invented numbers for demonstration only; not a real product. The flux map (41 x 41, iq >= 0, mirrored) is sampled from the algebraic saturation model of Hinkkanen, Pescetto, Mölsä, Saarakkala, Pellegrino and Bojoi (2017), IEEE Trans. Ind. Appl. 53(3), with the magnet as a constant d-axis current, so it is reciprocal; at 450 A on the q axis the apparent Lq is about 35 % below its zero-current value and psi_d about 12 % lower. A 350 V bus is dangerous: follow local codes, licensed practice and IEC 61800-5-1. The loss coefficients (losses) are those of the interior-magnet traction demo, invented too, and so are its thermal network (thermal) and its duty cycle (dutyCycle, labelled invented).',
  motor: {
    polePairs: POLE_PAIRS,
    Rs: RS,
    fluxMap,
    inertia: 0.045,
    viscousFriction: 0.002,
    coulombFriction: 0.3,
    maxSpeed_rpm: 12000,
    ratedCurrent: 226,
    peakCurrent: IMAX,
  },
  inverter: base.inverter,
  conditions: base.conditions,
  requirements,
  control: base.control,
  scenario: base.scenario,
  losses: base.losses,
  thermal: base.thermal,
  dutyCycle: base.dutyCycle,
};
// arrays of numbers on one line each (a map row per line)
const text = JSON.stringify(project, null, 2).replace(/\[\s*(-?[\d.e+-]+(?:,\s*-?[\d.e+-]+)*)\s*\]/g, (_, xs: string) => `[${xs.split(/,\s*/).join(', ')}]`);
writeFileSync(out, `${text}\n`);

// what the requirements exercise, at the map's magnet temperature and at the hot corner
const c = base.conditions as { magnetTemp_C: number; magnetTempCoeff: number };
const inv = base.inverter as { Vdc: number; voltageUtilization: number; deviceDrop: number };
const Vmax = (inv.Vdc / Math.sqrt(3)) * inv.voltageUtilization - inv.deviceDrop; // about the engine's svpwm limit
for (const [label, m] of [[`${MAP_MAGNET_C} °C magnet`, new FluxMapModel(fluxMap, POLE_PAIRS, RS)], [`${c.magnetTemp_C} °C magnet`, fluxMapAt(fluxMap, POLE_PAIRS, RS, c.magnetTemp_C, c.magnetTempCoeff)]] as const) {
  const rows = requirements.map((r) => {
    const p = solveOperatingPoint(m, { Vmax, Imax: IMAX }, (r.speed_rpm * Math.PI) / 30, r.torque_Nm);
    return `${r.label}: ${p.feasible ? p.region : `not held (${p.limitedBy})`}, ${p.current.toFixed(0)} A`;
  });
  const top = maxTorquePoint(m, { Vmax, Imax: IMAX }, (12000 * Math.PI) / 30, 'motoring');
  console.log(`${label}, Vmax ~${Vmax.toFixed(0)} V: ${rows.join('; ')}; envelope at 12000 rpm ${top.torque.toFixed(1)} N·m (${top.region}, ${top.current.toFixed(0)} A)`);
}
console.log(`wrote ${out}`);
