import { basename } from 'node:path';
import type { Command } from '../command';
import { stringFlag } from '../args';
import { InputError } from '../../core/base/errors';
import { dutyCycleFromCsv, type DutyCycleColumns } from '../../core/reports/duty-cycle-csv';
import { loadProject, parseProjectJson } from '../../core/project/project';
import { fmt } from '../table';

const COLUMNS: readonly (keyof DutyCycleColumns)[] = ['t', 'speed', 'torque'];
const WHAT: Record<keyof DutyCycleColumns, string> = { t: 'time column (s)', speed: 'speed column (rpm)', torque: 'torque column (N·m)' };

/** The project's text with `dutyCycle` last and each of its columns on one line (a long cycle stays a few lines). */
export function projectTextWithCycle(json: Record<string, unknown>, cycle: { label: string; t_s: number[]; speed_rpm: number[]; torque_Nm: number[] }): string {
  const rest = { ...json };
  delete rest['dutyCycle'];
  const head = Object.keys(rest).length === 0 ? '{' : `${JSON.stringify(rest, null, 2).replace(/\n\}$/, '')},`;
  const col = (xs: readonly number[]): string => `[${xs.map((x) => JSON.stringify(x)).join(', ')}]`;
  const section = [
    '  "dutyCycle": {',
    `    "label": ${JSON.stringify(cycle.label)},`,
    `    "t_s": ${col(cycle.t_s)},`,
    `    "speed_rpm": ${col(cycle.speed_rpm)},`,
    `    "torque_Nm": ${col(cycle.torque_Nm)}`,
    '  }',
  ].join('\n');
  return `${head}\n${section}\n}\n`;
}

/**
 * Reads a duty cycle from a CSV (one row per sample) into the project's `dutyCycle` section (an
 * existing cycle is replaced) and writes the project to --out through the atomic write, after loading
 * the new text as the app would (so a cycle the project file cannot hold is refused, not written).
 */
export const importDutyCycleCommand: Command = {
  name: 'import-duty-cycle',
  summary: 'a duty cycle from a CSV (one row per sample: time, speed, torque) into the dutyCycle section, written to a new project file',
  usage: 'import-duty-cycle <project.json> --from CYCLE.csv --t COL --speed COL --torque COL [--label TEXT] --out NEW.json',
  flags: { from: 'string', t: 'string', speed: 'string', torque: 'string', label: 'string', out: 'output' },
  async run(_p, args, input) {
    if (!input) throw new InputError('--from', 'cannot be read here (the command runs from the command line only)');
    if (!args.flags.has('from')) throw new InputError('--from', 'is required: the CSV file of the cycle, one row per sample');
    if (!args.flags.has('out')) throw new InputError('--out', 'is required: the project file to write (never the project itself)');
    const columns = {} as DutyCycleColumns;
    for (const k of COLUMNS) {
      const v = stringFlag(args, k);
      if (v === undefined) throw new InputError(`--${k}`, `is required: the CSV header's name of the ${WHAT[k]}`);
      columns[k] = v;
    }
    const label = stringFlag(args, 'label') ?? `from ${basename(stringFlag(args, 'from') ?? 'the CSV')}`;
    if (label.length > 200) throw new InputError('--label', `must be at most 200 characters (it has ${label.length})`);
    const parsed = parseProjectJson(input.projectText);
    if (parsed === null || typeof parsed !== 'object' || Array.isArray(parsed)) throw new InputError('file', 'must be a JSON object { ... }');
    const json = parsed as Record<string, unknown>;
    const replaced = json['dutyCycle'] !== undefined;
    const { section, shift_s } = dutyCycleFromCsv(await input.readFile('from'), columns, label);
    const text = projectTextWithCycle(json, section);
    // the new project as the app loads it: refused here, before any file is written
    const loaded = loadProject(text).resolved;
    const n = section.t_s.length;
    const range = (xs: readonly number[]): { min: number; max: number } => {
      let min = Infinity, max = -Infinity;
      for (const x of xs) { if (x < min) min = x; if (x > max) max = x; }
      return { min, max };
    };
    const speed = range(section.speed_rpm), torque = range(section.torque_Nm);
    const duration_s = section.t_s[n - 1]!;
    const lines = [
      `${loaded.name}`,
      '',
      `duty cycle '${label}': ${n} samples over ${fmt(duration_s)} s, speed ${fmt(speed.min)} to ${fmt(speed.max)} rpm, torque ${fmt(torque.min)} to ${fmt(torque.max)} N·m` +
        (shift_s !== 0 ? ` (times moved by ${fmt(-shift_s)} s to start at 0)` : ''),
      `written to the project given by --out (dutyCycle ${replaced ? 'replaced' : 'added'})`,
    ];
    return {
      json: { name: loaded.name, label, samples: n, duration_s, shift_s, speed_rpm: speed, torque_Nm: torque, replaced },
      lines,
      files: [{ flag: 'out', contents: text }],
    };
  },
};
