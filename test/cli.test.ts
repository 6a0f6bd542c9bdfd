// The command line as a user meets it: one JSON document with --json, exit codes 0/2/1,
// one line naming the field for bad input, files written by --csv.
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { TRACE_NAMES } from '../src/core/simulation/simulate';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { runCli } from './cli-run';

const root = resolve(__dirname, '..');
const demo = (name: string) => join(root, 'resources', `demo-${name}.json`);

const run = runCli;

const dir = mkdtempSync(join(tmpdir(), 'tw-cli-'));
/** a copy of the servo demo with the true rotor angle (control.angle ideal): for the checks about the loops and limits, not the angle source */
const servoIdeal = (): string => {
  const o = JSON.parse(readFileSync(demo('servo-axis'), 'utf8'));
  o.control.angle = { source: 'ideal' };
  const f = join(dir, 'demo-servo-axis-ideal.json');
  writeFileSync(f, JSON.stringify(o));
  return f;
};

/** An invented lossless surface-magnet project for closed-form checks. */
function spmProject(over: Record<string, unknown> = {}): string {
  const f = join(dir, `spm-${Math.random().toString(36).slice(2)}.json`);
  writeFileSync(f, JSON.stringify({
    format: 'torquewise-project', version: 1, name: 'invented lossless SPM',
    motor: { polePairs: 3, Rs: 0, Ld: 0.001, Lq: 0.001, psiM: 0.05, inertia: 0.001 },
    inverter: { Vdc: 300, Imax: 30, Icont: 15, modulation: 'svpwm' },
    conditions: { windingTemp_C: 20 },
    requirements: [{ label: 'a', speed_rpm: 1000, torque_Nm: 2 }],
    ...over,
  }));
  return f;
}

describe('cli --json documents', () => {
  it('envelope: points with the issue keys, regions from the three names, base speed in closed form', async () => {
    const r = await run('envelope', spmProject(), '--points', '50', '--json');
    expect(r.code).toBe(0);
    expect(r.out.trim().split('\n')).toHaveLength(1);
    const doc = JSON.parse(r.out);
    expect(doc.points).toHaveLength(50);
    for (const q of doc.points) {
      expect(Object.keys(q).sort()).toEqual(['current_A', 'feasible', 'id_A', 'iq_A', 'power_W', 'region', 'speed_rpm', 'torque_Nm', 'voltage_V']);
      expect(q.feasible ? ['mtpa', 'field-weakening', 'mtpv'] : ['beyond-max-speed']).toContain(q.region);
    }
    // lossless SPM electrical base speed omega_b = Vmax / sqrt(psiM² + (L Imax)²)
    // (Soong and Miller, 1994, Field-weakening performance of brushless synchronous AC motor drives)
    const Vmax = 300 / Math.sqrt(3);
    const wb = Vmax / Math.hypot(0.05, 0.001 * 30) / 3;
    expect(doc.baseSpeed_rpm).toBeCloseTo((wb * 60) / (2 * Math.PI), 6);
    // psiM/Ld = 50 A > Imax = 30 A: finite maximum speed Vmax / (p (psiM - L Imax)) (same source)
    expect(doc.maxSpeed_rpm).toBeCloseTo(((Vmax / (3 * (0.05 - 0.03))) * 60) / (2 * Math.PI), 4);
    expect(doc.characteristicCurrent_A).toBeCloseTo(50, 12);
    // torque at standstill = 1.5 p psiM Imax (common practice (no source))
    expect(doc.points[0].torque_Nm).toBeCloseTo(1.5 * 3 * 0.05 * 30, 9);
  });

  it('point: feasible MTPA point and an infeasible one naming the binding limit', async () => {
    const ok = JSON.parse((await run('point', spmProject(), '--speed', '1000', '--torque', '2', '--json')).out);
    expect(ok).toMatchObject({ feasible: true, limitedBy: 'none' });
    expect(ok.id_A).toBeCloseTo(0, 9);
    expect(ok.iq_A).toBeCloseTo(2 / (1.5 * 3 * 0.05), 9); // iq = T / (1.5 p psiM) for an SPM (common practice (no source))
    const big = JSON.parse((await run('point', spmProject(), '--speed', '100', '--torque', '50', '--json')).out);
    expect(big.feasible).toBe(false);
    expect(big.limitedBy).toBe('current');
    expect(big.current_A).toBeGreaterThan(30);
  });

  it('size: least Imax and Vdc with a verdict per point', async () => {
    const doc = JSON.parse((await run('size', spmProject(), '--json')).out);
    expect(doc.minImax_A).toBeCloseTo(2 / (1.5 * 3 * 0.05), 6); // MTPA current of the only point
    expect(doc.minVdc_V).toBeGreaterThan(0);
    expect(doc.points[0]).toMatchObject({ label: 'a', met: true });
    // the same keys in both corners, headrooms included
    const keys = ['current_A', 'currentHeadroom_A', 'label', 'limitedBy', 'met', 'speed_rpm', 'torqueAvailable_Nm', 'torque_Nm', 'voltageHeadroom_V', 'voltage_V',
      'duty', 'currentLimit_A', 'currentLimitBinds', 'torqueShortfall_Nm', 'headroomNote'];
    expect(Object.keys(doc.points[0]).sort()).toEqual([...keys].sort());
    expect(Object.keys(doc.cold.points[0]).sort()).toEqual([...keys].sort());
    expect(doc.points[0].currentHeadroom_A).toBeCloseTo(30 - 2 / (1.5 * 3 * 0.05), 6); // Imax minus the MTPA current
  });

  it('params: model, corners and findings', async () => {
    const doc = JSON.parse((await run('params', demo('ipm-traction'), '--json')).out);
    expect(doc.model.polePairs).toBe(4);
    expect(doc.hot.model.Rs).toBeGreaterThan(doc.cold.model.Rs);
    expect(doc.hot.model.psiM).toBeLessThan(doc.cold.model.psiM);
    expect(doc.interpretation.length).toBeGreaterThan(0);
    expect(doc.findings.some((f: { severity: string }) => f.severity === 'danger')).toBe(true);
  });

  it('simulate and tune: the documents of the issue', async () => {
    const sim = JSON.parse((await run('simulate', servoIdeal(), '--json')).out);
    expect(Object.keys(sim).sort()).toEqual(expect.arrayContaining(['events', 'metrics', 'stats', 'traces']));
    for (const k of ['finalSpeed_rpm', 'speedOvershoot_pct', 'riseTime_s', 'settlingTime_s', 'loadStepDip_rpm', 'loadStepRecovery_s', 'peakCurrent_A', 'rmsCurrent_A', 'voltageSaturation_s']) {
      expect(sim.metrics).toHaveProperty(k);
    }
    for (const k of ['t_s', 'speed_rpm', 'torque_Nm', 'id_A', 'iq_A', 'vd_V', 'vq_V', 'ia_A', 'ib_A', 'ic_A']) {
      expect(Array.isArray(sim.traces[k])).toBe(true);
      expect(sim.traces[k].length).toBe(sim.traces.t_s.length);
    }
    expect(sim.metrics.finalSpeed_rpm).toBeCloseTo(2000, -1);
    // beyond the keys: every trace channel and metric of the engine, findings, the diagnostic
    expect(Object.keys(sim.traces).sort()).toEqual([...TRACE_NAMES].sort());
    expect(sim.metrics).toHaveProperty('energyFromBus_J');
    expect(sim.metrics).toHaveProperty('steadyStateError_rpm');
    // 15.75 A against the inverter's 15 A in the speed step; 0.44 ms at the modulation limit in the
    // speed step; the sampled current loops' margins (PM 39°, GM 4.7 dB, peaking 5.3 dB, see
    // tuning.test.ts) are cautions on the d and q axes
    expect(sim.findings.map((f: { code: string }) => f.code)).toEqual([
      'phase-margin-caution', 'gain-margin-low', 'closed-loop-peaking',
      'phase-margin-caution', 'gain-margin-low', 'closed-loop-peaking',
      'current-above-limit', 'voltage-saturation',
    ]);
    expect(sim.findings.find((f: { code: string }) => f.code === 'current-above-limit').field).toBe('inverter.Imax');
    expect(sim.currentLimits.peak).toEqual({ A: 15, binds: 'inverter', inverter_A: 15, motor_A: 16 }); // the demo's invented motor peak 16 A
    expect(sim.diagnostic).toBeNull();
    // the exact periods (on by default for a constant-parameter machine): the derivative at the period's start and two nodes
    expect(sim.stats.evaluationsPerPeriod).toBe(3);
    // --max-points bounds the trace length; the metrics are the same (they use every sample)
    const short = JSON.parse((await run('simulate', servoIdeal(), '--max-points', '200', '--json')).out);
    expect(short.traces.t_s.length).toBeLessThanOrEqual(200);
    expect(short.metrics.loadStepDip_rpm).toBe(sim.metrics.loadStepDip_rpm);
    const tune = JSON.parse((await run('tune', demo('servo-axis'), '--json')).out);
    expect(tune.current.Kp).toBeGreaterThan(0);
    expect(tune.speed.phaseMargin_deg).toBeGreaterThan(30);
  });

  it('points past the maximum speed are marked, not labelled MTPV', async () => {
    // servo demo: maximum speed about 12 880 rpm at the hot corner; plotted to 20 000 rpm
    const env = JSON.parse((await run('envelope', demo('servo-axis'), '--speed-max', '20000', '--points', '51', '--json')).out);
    const first = env.points[0];
    const last = env.points[env.points.length - 1];
    expect(first.feasible).toBe(true);
    expect(first.region).toBe('mtpa');
    expect(last.feasible).toBe(false);
    expect(last.region).toBe('beyond-max-speed');
    expect(last.torque_Nm).toBe(0);
    for (const q of env.points) expect(q.feasible).toBe(q.speed_rpm <= env.maxSpeed_rpm * (1 + 1e-9));
  });

  it('--csv writes the envelope table', async () => {
    const out = join(dir, 'env.csv');
    const r = await run('envelope', spmProject(), '--points', '5', '--csv', out);
    expect(r.code).toBe(0);
    const all = readFileSync(out, 'utf8').trim().split('\r\n');
    // '#' comment rows first (quoted cells): the project and the current limit the curve is drawn at, and which binds
    expect(all[0]).toBe('"# torquewise envelope; project: invented lossless SPM; motoring, hot corner"');
    expect(all[1]).toMatch(/^"# drawn at peak 30 A peak \(21\.21 A rms\): inverter; Vmax 173\.2 V peak phase; continuous 15 A peak \(10\.61 A rms\): inverter"$/);
    const lines = all.filter((l) => !l.startsWith('"#'));
    expect(lines[0]).toMatch(/^"speed_rpm","torque_Nm","power_W","id_A","iq_A"/);
    expect(lines).toHaveLength(6);
  });
});

describe('cli: which current limit binds', () => {
  // traction demo (invented): motor peak 318 A rms = 449.7 A peak below the inverter's 450 A;
  // continuous: inverter 226 A peak against the motor's 160 A rms = 226.3 A peak
  const traction = demo('ipm-traction');
  const peakWords = /peak 449\.7 A peak \(318 A rms\): motor/;

  it('every command says it in its text and carries currentLimits in its JSON', async () => {
    for (const [cmd, extra] of [['params', []], ['envelope', ['--points', '20']], ['size', []], ['point', ['--speed', '1000', '--torque', '100']]] as const) {
      const t = await run(cmd, traction, ...extra);
      expect(t.code).toBe(0);
      expect(t.out).toMatch(peakWords);
      const doc = JSON.parse((await run(cmd, traction, ...extra, '--json')).out);
      expect(doc.currentLimits.peak.binds).toBe('motor');
      expect(doc.currentLimits.peak.A).toBeCloseTo(318 * Math.SQRT2, 9);
      expect(doc.currentLimits.peak.inverter_A).toBe(450);
      expect(doc.currentLimits.continuous).toMatchObject({ A: 226, binds: 'inverter' });
    }
    const sim = await run('simulate', servoIdeal());
    expect(sim.out).toMatch(/current reference limited to the peak 15 A peak \(10\.61 A rms\): inverter/);
    expect(sim.out).toMatch(/caution, inverter peak current: the phase current reached 15\.75 A peak/);
  });

  it('size: a continuous point is checked against the continuous limit, and the text says so', async () => {
    const f = spmProject({ requirements: [
      { label: 'peak', speed_rpm: 1000, torque_Nm: 3 },
      { label: 'held', speed_rpm: 1000, torque_Nm: 3, duty: 'continuous' },
    ] });
    const doc = JSON.parse((await run('size', f, '--json')).out);
    // iq = T / (1.5 p psiM) = 3 / 0.225 = 13.33 A: within Imax 30 A and Icont 15 A
    // (SPM: common practice (no source))
    expect(doc.points[0]).toMatchObject({ duty: 'peak', met: true, currentLimit_A: 30 });
    expect(doc.points[1]).toMatchObject({ duty: 'continuous', met: true, currentLimit_A: 15 });
    expect(doc.points[1].currentHeadroom_A).toBeCloseTo(15 - 3 / 0.225, 6);
    expect(doc.minIcont_A).toBeCloseTo(3 / 0.225, 6);
    const text = (await run('size', f)).out;
    expect(text).toMatch(/held \(continuous duty\): met, current headroom 1\.667 A peak \(continuous limit\), voltage headroom/);
    // 4 N·m continuous needs 17.8 A > 15 A: not met, the shortfall and the binding limit instead of headroom
    const g = spmProject({ requirements: [{ label: 'held', speed_rpm: 1000, torque_Nm: 4, duty: 'continuous' }] });
    const d2 = JSON.parse((await run('size', g, '--json')).out);
    expect(d2.points[0].met).toBe(false);
    expect(d2.points[0].currentHeadroom_A).toBeNull();
    expect(d2.points[0].torqueShortfall_Nm).toBeCloseTo(4 - 1.5 * 3 * 0.05 * 15, 9); // 4 - 3.375 N·m at 15 A
    expect((await run('size', g)).out).toMatch(/held \(continuous duty\): NOT met, short by 0\.625 N·m: 3\.375 N·m available, limited by the continuous current limit 15 A peak \(inverter's Icont\)/);
  });
});

describe('cli: a file with several problems', () => {
  it('prints every problem, one line each naming its field, and exits 2', async () => {
    const f = spmProject({
      motor: { polePairs: 3, Rs: -1, Ld: 0.001, Lq: 0.001, psiM: 0.05, inertia: 0.001, peakCurrent: { value: 10, basis: 'rms' } },
      inverter: { Vdc: 300, Imax: 30, Icont: 15, modulation: 'spwm' },
      requirements: [{ label: 'a', speed_rpm: 1000, torque_Nm: '2' }],
    });
    const r = await run('params', f);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    const lines = r.err.trim().split('\n');
    expect(lines.map((l) => /^torquewise: (\S+) /.exec(l)?.[1])).toEqual(['motor.Rs', 'motor.peakCurrent', 'inverter.modulation', 'requirements[0].torque_Nm']);
    expect(lines[1]).toMatch(/10 A rms = 14\.14 A peak.*accepted only in nameplate\.ratedCurrent and nameplate\.peakCurrent/);
  });

  it('a minimal file (no conditions, no modulation) runs, with the defaults said as findings', async () => {
    const f = join(dir, 'minimal.json');
    writeFileSync(f, JSON.stringify({
      format: 'torquewise-project', version: 1, name: 'minimal (invented)',
      motor: { polePairs: 3, Rs: 0.1, Ld: 0.001, Lq: 0.001, psiM: 0.05, inertia: 0.001, maxSpeed_rpm: 3000 },
      inverter: { Vdc: 300, Imax: 30, Icont: 15 },
    }));
    const r = await run('params', f);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/note, temperatures: No conditions given: every temperature/);
    expect(r.out).toMatch(/note, modulation: No modulation given: space-vector PWM/);
  });
});

describe('cli bad input: exit 2 and one line naming the field', () => {
  const cases: Array<[string, string[], RegExp]> = [
    ['unknown command', ['spin', 'x.json'], /^torquewise: command 'spin' is unknown/],
    ['missing file', ['envelope'], /^torquewise: project file is missing/],
    ['a file that does not exist', ['envelope', join(dir, 'nope.json')], /^torquewise: project file '.*nope\.json' does not exist$/m],
    ['bad number', ['envelope', demo('spm-48v'), '--points', 'many'], /--points must be a number/],
    ['unknown option', ['envelope', demo('spm-48v'), '--colour', 'red'], /--colour is not an option of 'envelope'/],
    ['absurd point count', ['envelope', demo('spm-48v'), '--points', '1e9'], /--points must be <= /],
    // a device or a pipe is not read at all: it could block forever
    ['a device instead of a file', ['params', '/dev/zero'], /^torquewise: project file '\/dev\/zero' is not a regular file$/m],
    ['a folder instead of a file', ['params', dir], /is not a regular file/],
    ['words after the file', ['params', demo('spm-48v'), 'extra'], /^torquewise: arguments 'extra' is not expected after the project file/],
    ['an empty number', ['point', demo('spm-48v'), '--speed', '', '--torque', '1'], /--speed must be a number rpm \(got ''\)/],
    ['a hexadecimal number', ['point', demo('spm-48v'), '--speed', '1000', '--torque', '0x10'], /--torque must be a number/],
  ];
  for (const [what, argv, re] of cases) {
    it(what, async () => {
      const r = await run(...argv);
      expect(r.code).toBe(2);
      expect(r.err).toMatch(re);
      expect(r.err.trim().split('\n')).toHaveLength(1);
      expect(r.err).not.toMatch(/\n\s+at /); // no stack trace
      expect(r.out).toBe('');
    });
  }
  it('control characters from the file reach the terminal escaped, not raw', async () => {
    const f = spmProject({ name: 'motor\u001b[2J\r\nfake line' });
    const r = await run('params', f);
    expect(r.code).toBe(0);
    expect(r.out).not.toMatch(/[\u001b\r]/);
    expect(r.out).toContain('motor\\u001b[2J\\u000d');
    const k = spmProject({ ['bad\u001bkey']: 1 });
    const e = await run('params', k);
    expect(e.code).toBe(2);
    expect(e.err).not.toMatch(/\u001b/);
    expect(e.err.trim().split('\n')).toHaveLength(1);
  });

  it('invalid UTF-8 is refused naming the byte offset, with the same words as the desktop app', async () => {
    const good = Buffer.from(JSON.stringify({ format: 'torquewise-project', version: 1, name: 'caf\u00e9' }));
    const at = good.indexOf(0xc3); // é is C3 A9; cut it to a lone lead byte followed by A9 -> FF
    const bad = Buffer.from(good);
    bad[at + 1] = 0xff;
    const f = join(dir, 'latin.json');
    writeFileSync(f, bad);
    const r = await run('params', f);
    expect(r.code).toBe(2);
    const why = `is not UTF-8 text (an invalid byte sequence at byte offset ${at}, starting with 0xC3)`;
    expect(r.err).toBe(`torquewise: project file '${f}' ${why}\n`);
    const { openProjectFile } = await import('../src/node/project-file');
    expect(await openProjectFile(f)).toEqual({ ok: false, canceled: false, message: `Could not open "latin.json": it ${why}.` });
  });

  it('a key given twice in the file is refused naming its path (JSON.parse alone keeps the last)', async () => {
    const f = join(dir, 'twice.json');
    writeFileSync(f, readFileSync(demo('spm-48v'), 'utf8').replace('"inverter": {', '"inverter": {\n    "Imax": 1,'));
    const r = await run('size', f);
    expect(r.code).toBe(2);
    expect(r.err).toBe('torquewise: inverter.Imax is given twice in one object; give each key once (which of the values was meant is a guess)\n');
  });

  it('an option given twice is refused naming it', async () => {
    for (const argv of [['envelope', demo('spm-48v'), '--points', '10', '--points', '20'], ['envelope', demo('spm-48v'), '--json', '--json'], ['envelope', demo('spm-48v'), '--csv', 'a.csv', '--csv=b.csv']]) {
      const r = await run(...argv);
      expect(r.code).toBe(2);
      expect(r.err).toMatch(/^torquewise: --(points|json|csv) is given more than once; give each option once\n$/);
      expect(r.out).toBe('');
    }
  });

  it('a negative inductance in the file', async () => {
    const f = spmProject({ motor: { polePairs: 3, Rs: 0.1, Ld: -0.001, Lq: 0.001, psiM: 0.05, inertia: 0.001 } });
    const r = await run('params', f);
    expect(r.code).toBe(2);
    expect(r.err.trim()).toMatch(/^torquewise: motor\.Ld must be >= 1e-9 H/);
  });
});

describe('cli entry point', () => {
  it('npm run -s cli prints one JSON document and exits 0; bad input exits 2', () => {
    const ok = spawnSync('npm', ['run', '-s', 'cli', '--', 'point', demo('servo-axis'), '--speed', '1000', '--torque', '1', '--json'], { cwd: root, encoding: 'utf8' });
    expect(ok.status).toBe(0);
    expect(JSON.parse(ok.stdout).feasible).toBe(true);
    const bad = spawnSync('npm', ['run', '-s', 'cli', '--', 'point', demo('servo-axis'), '--speed', 'fast'], { cwd: root, encoding: 'utf8' });
    expect(bad.status).toBe(2);
    expect(bad.stderr.trim()).toBe("torquewise: --speed must be a number rpm (got 'fast')");
  });
});
