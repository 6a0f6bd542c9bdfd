// Bounded resources: absurd point counts and durations are refused with the limit named, and the
// simulator's traces stay decimated. (Memory and cancel latency are measured by `npm run trust`.)
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { resolveProject } from '../src/core/project/project';
import { parseProject } from '../src/core/project/schema';
import { computeEnvelope } from '../src/core/steady-state/envelope';
import { runSimulation, MAX_CONTROL_PERIODS } from '../src/core/simulation/simulate';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { DEFAULT_MAX_POINTS, MAX_TRACE_POINTS } from '../src/core/simulation/decimate';
import { simulateCommand } from '../src/cli/commands/simulate';
import { envelopeCommand } from '../src/cli/commands/envelope';
import { parseArgs } from '../src/cli/args';
import { DEMOS } from '../trust/fuzz-cases';
import { refusal } from './helpers';

type Json = Record<string, any>;
const demo = (n: string): Json => structuredClone(DEMOS[n]) as Json;
const resolved = (j: Json) => resolveProject(parseProject(j));

describe('absurd requests are refused with the limit named', () => {
  it('envelope --points 1e9: the command names --points and its limit', () => {
    const e = refusal(() => envelopeCommand.run(resolved(demo('demo-spm-48v')), parseArgs(['envelope', 'f.json', '--points', '1e9'])));
    expect(e.field).toBe('--points');
    expect(e.message).toBe('--points must be <= 100000 (got 1000000000)');
  });

  it(`simulate --max-points above ${MAX_TRACE_POINTS}: refused by name before any work; the engine names its own limit`, () => {
    const p = resolved(demo('demo-servo-axis'));
    const e = refusal(() => simulateCommand.run(p, parseArgs(['simulate', 'f.json', '--max-points', '10000000'])));
    expect(e.field).toBe('--max-points');
    expect(e.message).toBe('--max-points must be <= 200000 (got 10000000)');
    expect(refusal(() => simulateCommand.run(p, parseArgs(['simulate', 'f.json', '--max-points', '200001']))).field).toBe('--max-points');
    const setup = simulationFromProject(p);
    expect(refusal(() => runSimulation(setup, { maxPoints: 1e7 })).message).toBe('maxPoints must be a whole number in 2..200000 (got 10000000)');
  });

  it('computeEnvelope with 1e9 points: the engine names its own limit', () => {
    const p = resolved(demo('demo-spm-48v'));
    const e = refusal(() => computeEnvelope(p.hot, p.peak, { points: 1e9 }));
    expect(e.message).toMatch(/^envelope\.points must be an integer in 2\.\.1000000/);
  });

  it('scenario.duration_s 1e6: the schema names the field and its limit', () => {
    const j = demo('demo-spm-48v');
    j.scenario.duration_s = 1e6;
    const e = refusal(() => resolved(j));
    expect(e.message).toBe('scenario.duration_s must be <= 3600 s');
  });

  it(`duration_s x fCtrl_Hz above ${MAX_CONTROL_PERIODS} control periods is refused before any work, naming the limit and the longest duration`, () => {
    const j = demo('demo-spm-48v'); // 20 kHz
    j.scenario.duration_s = 3600;
    const e = refusal(() => simulationFromProject(resolved(j)));
    expect(e.field).toBe('scenario.duration_s');
    expect(e.message).toBe('scenario.duration_s asks for 72000000 control periods (duration_s x control.fCtrl_Hz); the limit is 2000000 periods, at most 100 s at 20000 Hz');
    // exactly at the cap is accepted (set up, not run here)
    j.scenario.duration_s = 100;
    expect(simulationFromProject(resolved(j)).duration_s).toBe(100);
  });

  it('the CLI prints the refusal as one line and exits 2', () => {
    const dir = mkdtempSync(join(tmpdir(), 'tw-limits-'));
    try {
      const j = demo('demo-servo-axis');
      j.scenario.duration_s = 3000;
      const f = join(dir, 'long.json');
      writeFileSync(f, JSON.stringify(j));
      const root = resolve(__dirname, '..');
      const r = spawnSync(process.execPath, [join(root, 'node_modules', 'tsx', 'dist', 'cli.mjs'), join(root, 'src', 'cli', 'index.ts'), 'simulate', f], { encoding: 'utf8', timeout: 60_000 });
      expect(r.status).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(/^torquewise: scenario\.duration_s asks for 48000000 control periods .* the limit is 2000000 periods/);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('traces stay decimated', () => {
  it(`a run longer than maxPoints periods returns at most maxPoints samples per trace (default ${DEFAULT_MAX_POINTS}), min and max kept`, () => {
    const j = demo('demo-servo-axis'); // 16 kHz
    j.scenario.duration_s = 0.5; // 8000 periods
    const setup = simulationFromProject(resolved(j));
    const full = runSimulation(setup, { maxPoints: MAX_TRACE_POINTS });
    expect(full.traces.t_s.length).toBe(8001);
    const dflt = runSimulation(setup);
    const small = runSimulation(setup, { maxPoints: 300 });
    for (const [r, cap] of [[dflt, DEFAULT_MAX_POINTS], [small, 300]] as const) {
      for (const a of Object.values(r.traces)) {
        expect(a.length).toBeLessThanOrEqual(cap);
        expect(a.length).toBeGreaterThan(cap / 2);
      }
      // min/max preserving: the extremes of the decimated traces are those of the full run
      for (const k of ['iq_A', 'speed_rpm', 'torque_Nm'] as const) {
        expect(Math.max(...r.traces[k])).toBe(Math.max(...full.traces[k]));
        expect(Math.min(...r.traces[k])).toBe(Math.min(...full.traces[k]));
      }
      expect(r.traces.t_s[0]).toBe(0);
      expect(r.traces.t_s[r.traces.t_s.length - 1]).toBeCloseTo(0.5, 9);
    }
  });
});
