import type { Command } from '../command';
import { numberFlag, stringFlag } from '../args';
import { InputError } from '../../core/base/errors';
import { fluxMapFromCsv, type FluxMapColumns } from '../../core/reports/flux-map-csv';
import { DEFAULT_TEMP_C, loadProject, parseProjectJson } from '../../core/project/project';
import { fmt } from '../table';
import { findingLine } from '../../core/reports/phrases';

const COLUMNS: readonly (keyof FluxMapColumns)[] = ['id', 'iq', 'psid', 'psiq'];

/**
 * Reads a flux map from a CSV in long format into the project's motor section (the map replaces
 * Ld, Lq and psiM) and writes the project to --out through the atomic write, after loading the
 * new text as the app would (so a map that does not cover the peak limit is refused, not written).
 */
export const importFluxMapCommand: Command = {
  name: 'import-flux-map',
  summary: 'a flux map from a CSV (one row per point) into the motor section, written to a new project file',
  usage: 'import-flux-map <project.json> --from MAP.csv --id COL --iq COL --psid COL --psiq COL --current rms|peak [--magnet-temp C] --out NEW.json',
  flags: { from: 'string', id: 'string', iq: 'string', psid: 'string', psiq: 'string', current: 'string', 'magnet-temp': 'number', out: 'output' },
  async run(_p, args, input) {
    if (!input) throw new InputError('--from', 'cannot be read here (the command runs from the command line only)');
    if (!args.flags.has('from')) throw new InputError('--from', 'is required: the CSV file of the map, one row per point');
    if (!args.flags.has('out')) throw new InputError('--out', 'is required: the project file to write (never the project itself)');
    const columns = {} as FluxMapColumns;
    for (const k of COLUMNS) {
      const v = stringFlag(args, k);
      if (v === undefined) throw new InputError(`--${k}`, `is required: the CSV header's name of the ${k === 'id' || k === 'iq' ? `${k} current column` : `${k === 'psid' ? 'd' : 'q'}-axis flux linkage column (Wb peak per phase)`}`);
      columns[k] = v;
    }
    const current = stringFlag(args, 'current');
    if (current !== 'rms' && current !== 'peak') throw new InputError('--current', `must be "rms" or "peak": how the CSV's currents are given${current === undefined ? '' : ` (got '${current}')`}`);
    const json = parseProjectJson(input.projectText);
    const motor = (json as Record<string, unknown>)['motor'];
    if (motor === null || typeof motor !== 'object' || Array.isArray(motor)) {
      throw new InputError('motor', 'is required: a flux map goes into a motor section (polePairs, Rs, inertia); a project with a nameplate section needs one first');
    }
    const magnetTemp_C = numberFlag(args, 'magnet-temp', { min: -60, max: 250, unit: '°C' }) ?? DEFAULT_TEMP_C;
    const map = fluxMapFromCsv(await input.readFile('from'), { columns, current, magnetTemp_C });
    const m = { ...(motor as Record<string, unknown>) };
    delete m['Ld'];
    delete m['Lq'];
    delete m['psiM'];
    m['fluxMap'] = map;
    const text = JSON.stringify({ ...(json as Record<string, unknown>), motor: m }, null, 2) + '\n';
    // the new project as the app loads it: a map that does not cover the limits is refused here, before any file is written
    const loaded = loadProject(text).resolved;
    const mapFindings = loaded.findings.filter((f) => f.code.startsWith('flux-map'));
    const lines = [
      `${loaded.name}`,
      '',
      `flux map: ${map.id_A.length} x ${map.iq_A.length} points, id ${fmt(map.id_A[0]!)} to ${fmt(map.id_A[map.id_A.length - 1]!)} A peak, ` +
        `iq ${fmt(map.iq_A[0]!)} to ${fmt(map.iq_A[map.iq_A.length - 1]!)} A peak${current === 'rms' ? ' (from A rms, x √2)' : ''}, magnet at ${fmt(magnetTemp_C)} °C${args.flags.has('magnet-temp') ? '' : ' (--magnet-temp not given: 20 °C taken)'}`,
      `written to the project given by --out (motor.Ld, motor.Lq and motor.psiM replaced by motor.fluxMap)`,
      '',
      'findings:',
      ...mapFindings.map((f) => `  ${findingLine(f)}`),
    ];
    return {
      json: { name: loaded.name, points: { id: map.id_A.length, iq: map.iq_A.length }, current, magnetTemp_C, findings: mapFindings },
      lines,
      files: [{ flag: 'out', contents: text }],
    };
  },
};
