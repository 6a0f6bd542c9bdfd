// `efficiency`: the map over speed and shaft torque, its rows split across worker threads
// (src/cli/commands/efficiency.ts, src/cli/efficiency-workers.ts), from the sources and from the built CLI.
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { runCli } from './cli-run';
import { CLI_BUNDLE, ensureBundle, mapWorkerBundle } from '../scripts/cli-bundle.mjs';
import { parseCsv } from '../src/core/reports/csv';
import { Worker } from 'node:worker_threads';
import { pathToFileURL } from 'node:url';
import { loadProjectText } from '../src/core/project/project';
import { mapAxis } from '../src/core/steady-state/efficiency-map';
import { efficiencyMapThreaded, MAP_WORKER_TASK, prestartMapWorkers, type MapWorkerJob } from '../src/cli/efficiency-workers';
import { efficiencyRows, MAP_ARRAYS, ownMap, sharedMap } from '../src/cli/efficiency-grid';
import { rowCounter } from '../src/node/worker-pool';
import type { EfficiencyMap } from '../src/core/steady-state/efficiency-map';

const demo = (name: string) => join(resolve(__dirname, '..'), 'resources', `demo-${name}.json`);
const dir = mkdtempSync(join(tmpdir(), 'tw-eff-'));
/** the document without what depends on the run (wall time, thread count) */
const results = (out: string) => {
  const d = JSON.parse(out);
  delete d.summary.wall_s;
  delete d.summary.threads;
  return d;
};
const grid = ['--speed-points', '24', '--torque-points', '21'];

describe('efficiency --json', () => {
  it('1 and 2 threads give identical documents (each speed row is computed on its own)', async () => {
    const one = await runCli('efficiency', demo('ipm-traction'), ...grid, '--threads', '1', '--json');
    const two = await runCli('efficiency', demo('ipm-traction'), ...grid, '--threads', '2', '--json');
    expect(one.err).toBe('');
    expect(two.err).toBe('');
    expect(two.code).toBe(0);
    expect(JSON.parse(two.out).summary.threads).toBe(2);
    expect(results(two.out)).toEqual(results(one.out));
  }, 60_000);

  it('arrays are row-major speed-major, null outside; energy balance at every motoring point to 1e-9', async () => {
    const d = JSON.parse((await runCli('efficiency', demo('ipm-traction'), ...grid, '--threads', '1', '--json')).out);
    const nS = d.speeds_rpm.length, nT = d.torques_Nm.length;
    expect([nS, nT]).toEqual([24, 21]);
    expect(d.speeds_rpm[0]).toBe(0);
    expect(d.torques_Nm[0]).toBeLessThan(0);
    expect(d.torques_Nm[nT - 1]).toBeGreaterThan(0);
    for (const k of ['feasible', 'motor', 'inverter', 'system', 'copper_W', 'iron_W', 'mechanical_W', 'inverter_W', 'dcPower_W']) expect(d[k]).toHaveLength(nS * nT);
    let inside = 0, checked = 0;
    for (let i = 0; i < nS; i++) {
      for (let j = 0; j < nT; j++) {
        const k = i * nT + j;
        if (!d.feasible[k]) {
          expect(d.system[k]).toBeNull();
          continue;
        }
        inside++;
        const shaft = (d.torques_Nm[j] * d.speeds_rpm[i] * Math.PI) / 30;
        if (shaft <= 0) continue;
        const losses = d.copper_W[k] + d.iron_W[k] + d.mechanical_W[k] + d.inverter_W[k];
        // energy conservation (common practice (no source))
        expect(Math.abs(d.dcPower_W[k] - (shaft + losses)) / d.dcPower_W[k]).toBeLessThan(1e-9);
        checked++;
      }
    }
    expect(d.summary.pointsInside).toBe(inside);
    expect(checked).toBeGreaterThan(50);
    expect(d.summary.peakSystem.efficiency).toBe(Math.max(...d.system.filter((x: number | null) => x !== null)));
  });

  it('--min-loss: no point with more total loss than least current', async () => {
    const g = ['--speed-points', '6', '--torque-points', '7', '--threads', '1', '--json'];
    const a = JSON.parse((await runCli('efficiency', demo('ipm-traction'), ...g)).out);
    const b = JSON.parse((await runCli('efficiency', demo('ipm-traction'), ...g, '--min-loss')).out);
    expect(b.summary.control).toBe('min-loss');
    const total = (d: any, k: number) => d.copper_W[k] + d.iron_W[k] + d.mechanical_W[k] + d.inverter_W[k];
    let both = 0;
    for (let k = 0; k < a.feasible.length; k++) {
      if (!a.feasible[k] || !b.feasible[k]) continue;
      both++;
      // the loss-minimising current is chosen over a set holding the least-current one (common practice (no source))
      expect(total(b, k)).toBeLessThanOrEqual(total(a, k) * (1 + 1e-9));
    }
    expect(both).toBeGreaterThan(10);
  }, 60_000);

  it('--gain: the loss saved is least-current loss less min-loss loss, never negative, and the map is the min-loss one', async () => {
    const g = ['--speed-points', '6', '--torque-points', '7', '--threads', '1', '--json'];
    const a = JSON.parse((await runCli('efficiency', demo('ipm-traction'), ...g)).out);
    const b = JSON.parse((await runCli('efficiency', demo('ipm-traction'), ...g, '--min-loss')).out);
    const r = await runCli('efficiency', demo('ipm-traction'), ...g, '--gain');
    expect(r.code).toBe(0);
    const d = JSON.parse(r.out);
    expect(d.summary.control).toBe('min-loss');
    expect(d.system).toEqual(b.system);
    const total = (x: any, k: number) => x.copper_W[k] + x.iron_W[k] + x.mechanical_W[k] + x.inverter_W[k];
    let inside = 0;
    for (let k = 0; k < d.feasible.length; k++) {
      if (!d.feasible[k]) { expect(d.gain.lossSaved_W[k]).toBeNull(); continue; }
      inside++;
      // the loss saved by the better current over the same output (common practice (no source))
      expect(d.gain.lossSaved_W[k]).toBeGreaterThanOrEqual(0);
      expect(d.gain.lossSaved_W[k]).toBeCloseTo(d.gain.lossLeastCurrent_W[k] - d.gain.lossMinLoss_W[k], 9);
      expect(d.gain.lossMinLoss_W[k] / total(d, k)).toBeCloseTo(1, 12);
      expect(d.gain.lossLeastCurrent_W[k] / total(a, k)).toBeCloseTo(1, 8);
    }
    expect(inside).toBeGreaterThan(10);
    const best = d.summary.mostLossSaved;
    expect(best.lossSaved_W).toBe(Math.max(...d.gain.lossSaved_W.filter((x: number | null) => x !== null)));
    const text = (await runCli('efficiency', demo('ipm-traction'), '--speed-points', '6', '--torque-points', '7', '--gain')).out;
    expect(text).toMatch(/loss-minimising control saves at most [0-9.]+ W/);
  }, 60_000);
});

describe('efficiency text and --csv', () => {
  it('the summary names the grid, the points inside and the peak system efficiency', async () => {
    const r = await runCli('efficiency', demo('spm-48v'), '--speed-points', '10', '--torque-points', '11', '--threads', '1', '--corner', 'cold');
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/efficiency map, cold corner, least current/);
    expect(r.out).toMatch(/grid 10 speeds x 11 torques = 110 points, \d+ inside the envelope/);
    expect(r.out).toMatch(/peak system efficiency \d+\.?\d* % at \d+\.?\d* rpm/);
  });

  it('--csv: a comment row, the header, one row per point that reads back as the JSON', async () => {
    const csv = join(dir, 'map.csv');
    const r = await runCli('efficiency', demo('spm-48v'), '--speed-points', '5', '--torque-points', '4', '--threads', '1', '--csv', csv, '--json');
    expect(r.code).toBe(0);
    const d = JSON.parse(r.out);
    const rows = parseCsv(readFileSync(csv, 'utf8'));
    expect(rows[0]![0]).toMatch(/^# torquewise efficiency map/);
    expect(rows[1]).toEqual(['speed_rpm', 'torque_Nm', 'feasible', 'motor', 'inverter', 'system', 'copper_W', 'iron_W', 'mechanical_W', 'inverter_W', 'dcPower_W', 'torqueEm_Nm']);
    expect(rows).toHaveLength(2 + 20);
    const k = d.feasible.findIndex((f: boolean, i: number) => f && d.speeds_rpm[Math.floor(i / 4)] > 0);
    const row = rows[2 + k]!;
    // 10 significant digits (src/core/reports/csv.ts)
    expect(Number(row[0])).toBeCloseTo(d.speeds_rpm[Math.floor(k / 4)], 5);
    expect(Number(row[1])).toBeCloseTo(d.torques_Nm[k % 4], 8);
    expect(row[2]).toBe('1');
    expect(Number(row[5])).toBeCloseTo(d.system[k], 9);
    expect(Number(row[10])).toBeCloseTo(d.dcPower_W[k], 4);
  });
});

describe('efficiency: bad options are refused naming them, exit 2, no stack trace', () => {
  const cases: Array<[string[], RegExp]> = [
    [['--corner', 'warm'], /^torquewise: --corner must be hot or cold \(got 'warm'\)$/m],
    [['--threads', '0'], /^torquewise: --threads must be >= 1/m],
    [['--threads', '1.5'], /^torquewise: --threads must be a whole number/m],
    [['--speed-points', '1'], /^torquewise: --speed-points must be >= 2/m],
    [['--torque-points', 'many'], /^torquewise: --torque-points must be a number/m],
    [['--speed-max', '-5'], /^torquewise: --speed-max must be >= 1 rpm/m],
    [['--min-loss', 'yes'], /^torquewise: --min-loss takes no value/m],
    [['--gain', '--min-loss'], /^torquewise: --gain already maps the loss-minimising current/m],
  ];
  for (const [argv, re] of cases) {
    it(argv.join(' '), async () => {
      const r = await runCli('efficiency', demo('spm-48v'), ...argv);
      expect(r.code).toBe(2);
      expect(r.err).toMatch(re);
      expect(r.err.trim().split('\n')).toHaveLength(1);
      expect(r.err).not.toMatch(/\n\s+at /);
      expect(r.out).toBe('');
    });
  }
});

describe('the built CLI (out/cli/torquewise.mjs)', () => {
  it('finds its workers: --threads 2 gives the document of --threads 1 and of the sources', async () => {
    expect(ensureBundle()).toBe('');
    const argv = ['efficiency', demo('ipm-traction'), ...grid, '--json'];
    const two = spawnSync(process.execPath, [CLI_BUNDLE, ...argv, '--threads', '2'], { encoding: 'utf8', timeout: 60_000 });
    const one = spawnSync(process.execPath, [CLI_BUNDLE, ...argv, '--threads', '1'], { encoding: 'utf8', timeout: 60_000 });
    expect({ code: two.status, err: two.stderr }).toEqual({ code: 0, err: '' });
    expect(one.status).toBe(0);
    expect(results(two.stdout)).toEqual(results(one.stdout));
    const src = await runCli(...argv, '--threads', '1');
    expect(results(two.stdout)).toEqual(results(src.out));
  }, 300_000);
});

describe('rows computed on worker threads alone', () => {
  const text = readFileSync(demo('ipm-traction'), 'utf8');
  const p = loadProjectText(text);
  const speeds = mapAxis(0, 1300, 13), torques = mapAxis(-300, 300, 9);
  it('from the sources (tsx): the same arrays as on this thread, least current and min-loss', async () => {
    for (const minLoss of [false, true]) {
      const here = await efficiencyMapThreaded(text, p, 'hot', minLoss, speeds, torques, 1);
      const there = await efficiencyMapThreaded(text, p, 'hot', minLoss, speeds, torques, 2, { workersOnly: true });
      expect(there).toEqual(here);
      expect(here.feasible.reduce((a, b) => a + b, 0)).toBeGreaterThan(20);
    }
  }, 120_000);

  /** a worker of `script` given one job; its answer */
  const serve = async (script: URL, data: object, job: MapWorkerJob): Promise<any> => {
    const w = new Worker(script, { workerData: data });
    try {
      return await new Promise<any>((ok, fail) => {
        w.once('message', ok);
        w.once('error', fail);
        w.postMessage(job);
      });
    } finally {
      await w.terminate();
    }
  };

  it('the built file itself serves as the worker (workerData names the task), and so does the lean worker bundle beside it', async () => {
    expect(ensureBundle()).toBe('');
    for (const file of [CLI_BUNDLE, mapWorkerBundle()]) {
      const out = sharedMap(speeds, torques);
      const reply = await serve(pathToFileURL(file), { task: MAP_WORKER_TASK }, { projectText: text, corner: 'cold', minLoss: false, out, counter: rowCounter() });
      expect(reply.ok).toBe(true);
      expect(ownMap(out)).toEqual(efficiencyRows(p, { corner: 'cold', minLoss: false, torques }, speeds));
    }
  }, 300_000);

  it('a worker that read another project file ahead computes the project it is sent', async () => {
    expect(ensureBundle()).toBe('');
    const out = sharedMap(speeds, torques);
    const reply = await serve(pathToFileURL(CLI_BUNDLE), { task: MAP_WORKER_TASK, projectPath: demo('spm-48v') }, { projectText: text, corner: 'hot', minLoss: false, out, counter: rowCounter() });
    expect(reply.ok).toBe(true);
    expect(ownMap(out)).toEqual(efficiencyRows(p, { corner: 'hot', minLoss: false, torques }, speeds));
  }, 300_000);
});

/** every array of two maps the same bit for bit (NaN payloads included) */
const sameBits = (a: EfficiencyMap, b: EfficiencyMap): boolean =>
  (['speeds', 'torques', ...MAP_ARRAYS] as const).every((k) => {
    const x = a[k], y = b[k];
    return x.length === y.length && Buffer.compare(new Uint8Array(x.buffer, x.byteOffset, x.byteLength), new Uint8Array(y.buffer, y.byteOffset, y.byteLength)) === 0;
  });

describe('the map across threads is the single-thread map bit for bit', () => {
  const text = readFileSync(demo('ipm-traction'), 'utf8');
  const p = loadProjectText(text);
  const speeds = mapAxis(0, 1400, 40), torques = mapAxis(-320, 320, 33);
  it('a worker started at the process entry (prestartMapWorkers) and one started with the map, least current', async () => {
    const one = await efficiencyMapThreaded(text, p, 'hot', false, speeds, torques, 1);
    prestartMapWorkers(['efficiency', demo('ipm-traction'), '--threads', '2']);
    const two = await efficiencyMapThreaded(text, p, 'hot', false, speeds, torques, 2, { workersOnly: true });
    expect(sameBits(two, one)).toBe(true);
    expect(one.feasible.reduce((a, b) => a + b, 0)).toBeGreaterThan(500);
  }, 120_000);

  it('the built CLI: 1 and 2 threads, 60 x 60, hot and cold', () => {
    expect(ensureBundle()).toBe('');
    for (const corner of ['hot', 'cold']) {
      const argv = ['efficiency', demo('ipm-traction'), '--speed-points', '60', '--torque-points', '60', '--corner', corner, '--json'];
      const [one, two] = ['1', '2'].map((t) => spawnSync(process.execPath, [CLI_BUNDLE, ...argv, '--threads', t], { encoding: 'utf8', timeout: 60_000 }));
      expect(two!.status).toBe(0);
      expect(results(two!.stdout)).toEqual(results(one!.stdout));
    }
  }, 300_000);
});
