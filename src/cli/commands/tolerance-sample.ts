import type { Command } from '../command';
import { numberFlag } from '../args';
import { fmt, table } from '../table';
import { toleranceParameters, tolerancesOf } from '../../core/project/tolerance-apply';
import { MAX_MONTE_CARLO_SAMPLES, type MonteCarloSettings } from '../../core/project/tolerance-schema';
import { monteCarloSummary } from '../../core/reports/tolerance-statistics';
import { toleranceSamplesThreaded } from '../tolerance-workers';
import { requireTolerances } from './corners';
import { sampleCsv } from '../../core/reports/tolerance-sample-csv';
import { terminalProgress } from '../terminal-progress';

export const toleranceSampleCommand: Command = {
  name: 'tolerance-sample',
  summary: 'Monte Carlo over the tolerance bands: the fraction meeting each requirement, margin histograms, rank sensitivities (seeded, across threads)',
  usage: 'tolerance-sample <project.json> [--samples N] [--seed S] [--threads N] [--thermal] [--csv FILE] [--json]',
  flags: { samples: 'number', seed: 'number', threads: 'number', thermal: 'switch', csv: 'output' },
  async run(p, args, input) {
    requireTolerances(p, 'tolerance-sample');
    const fromFile = tolerancesOf(p.file)!.monteCarlo;
    const mc: MonteCarloSettings = {
      ...fromFile,
      samples: numberFlag(args, 'samples', { min: 1, max: MAX_MONTE_CARLO_SAMPLES, integer: true }) ?? fromFile.samples,
      seed: numberFlag(args, 'seed', { min: 0, max: 0xffffffff, integer: true }) ?? fromFile.seed,
    };
    const threads = numberFlag(args, 'threads', { min: 1, max: 64, integer: true }) ?? 1;
    const thermal = args.flags.has('thermal');
    const params = toleranceParameters(p.file);
    const labels = p.requirements.map((r) => r.label);
    const t0 = performance.now(), cpu0 = process.cpuUsage();
    // without the project's text (a library call) this thread computes every sample
    const progress = terminalProgress('samples');
    let c;
    try {
      c = await toleranceSamplesThreaded(input?.projectText ?? '', p.file, mc, input === undefined ? 1 : threads, { thermal, ...(progress.onStep ? { onSamples: progress.onStep } : {}) });
    } finally {
      progress.end();
    }
    const wall_s = (performance.now() - t0) / 1e3;
    // the CPU time of every thread of the process meanwhile (user + system): the work, whatever else the cores run
    const cpu = process.cpuUsage(cpu0), cpu_s = (cpu.user + cpu.system) / 1e6;
    const summary = monteCarloSummary(c, params, labels);
    const json = {
      monteCarlo: mc, threads, thermal, wall_s, cpu_s,
      parameters: params.map((q) => ({ path: q.path, nominal: q.nominal, min: q.min, max: q.max, unit: q.unit })),
      ...summary,
    };
    const pct = (f: number, se: number): string => `${fmt(100 * f)} % ± ${fmt(100 * se, 2)}`;
    const rows = summary.requirements.map((q) => [q.label, pct(q.fraction, q.standardError), q.margin.min, q.margin.mean,
      Object.entries(q.sensitivity).filter(([, r]) => r !== null && Math.abs(r) >= 0.1).sort((a, b) => Math.abs(b[1]!) - Math.abs(a[1]!)).slice(0, 3).map(([k, r]) => `${k} ${fmt(r!, 2)}`).join(', ') || '-']);
    const lines = [
      `${p.name}: Monte Carlo, ${mc.samples} samples (seed ${mc.seed}, ${mc.distribution}${mc.distribution === 'normal' ? `, sigma ${fmt(mc.sigmaOfBand)} of the half band, truncated to the band` : ''}) of ${params.length} toleranced parameter${params.length === 1 ? '' : 's'}, each sized hot and cold${thermal ? ', with the S1 check of the continuous points' : ' (the S1 thermal check of continuous points: --thermal)'}`,
      '',
      ...table(['point', 'met (± standard error)', 'least margin N·m', 'mean margin N·m', 'margin follows (rank correlation)'], rows),
      '',
      `every point met: ${pct(summary.allMet.fraction, summary.allMet.standardError)}`,
      `computed in ${fmt(wall_s)} s on ${threads} thread${threads === 1 ? '' : 's'}`,
    ];
    const comment = `# torquewise tolerance samples; project: ${p.name || 'unnamed'}; ${mc.samples} samples, seed ${mc.seed}, ${mc.distribution}; margins are the least torque margin of hot and cold, N·m`;
    return { json, lines, ...(args.flags.has('csv') ? { files: [{ flag: 'csv', contents: sampleCsv(c, params, labels, comment) }] } : {}) };
  },
};
