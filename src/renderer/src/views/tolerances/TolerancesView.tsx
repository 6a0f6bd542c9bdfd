// Tolerances view (a project with a `tolerances` section): the worst case over the parameter bands.
// Corners: every combination of the band ends (core/project/tolerance-corners.ts) in a worker (the
// percentage of corners done as progress, cancel terminates it), each
// corner's values and per point verdict and least torque margin, the binding corner first and
// marked, and the least Imax and least bus over every corner. Monte Carlo: the file's samples, seed
// and distribution, the samples shared in chunks between up to navigator.hardwareConcurrency workers
// (state/sample-run.ts; the same result whatever the worker count), the pass fraction per point and
// overall with its standard error, histograms of the margins and the rank-correlation sensitivities
// (core/reports/tolerance-statistics.ts). The bands and settings are edited here through the form's
// draft. Exports: PNG/SVG of each figure with its conditions, CSV of the samples
// (core/reports/tolerance-sample-csv.ts, as the CLI's `tolerance-sample --csv`).
import { memo, useEffect, useMemo, useRef, useState } from 'react';
import type { ResolvedProject } from '../../../../core/project/project';
import { toleranceParameters, type ToleranceParameter } from '../../../../core/project/tolerance-apply';
import type { CornersResult } from '../../../../core/project/tolerance-corners';
import type { SampleChunk } from '../../../../core/project/tolerance-sample';
import type { MonteCarloSettings, TolerancesSection } from '../../../../core/project/tolerance-schema';
import { monteCarloSummary } from '../../../../core/reports/tolerance-statistics';
import { sampleCsv } from '../../../../core/reports/tolerance-sample-csv';
import { useWorkerRun } from '../../state/worker-run';
import { hardwareWorkers, useSampleRun } from '../../state/sample-run';
import { useExporter } from '../../state/exporter';
import { CURVE, Plot, readTheme } from '../../components/Plot';
import { num } from '../../components/format';
import { exportPlotImage } from '../../components/image-export';
import type { CornersDone, ToleranceRequest } from '../../workers/tolerance-protocol';
import { bandsCaption, cornerRows, marginHistogramFigure, passRows, sensitivityFigure, shortPath as short } from './tolerance-figures';
import { MonteCarloFields, ToleranceBands } from './ToleranceInputs';

const makeWorker = (): Worker => new Worker(new URL('../../workers/tolerance-worker.ts', import.meta.url), { type: 'module' });

type CornersSolved = CornersDone & { projectText: string };
interface SamplesSolved {
  chunk: SampleChunk;
  mc: MonteCarloSettings;
  thermal: boolean;
  params: ToleranceParameter[];
  labels: string[];
  workers: number;
  wall_ms: number;
  busy_ms: number;
  projectText: string;
}

const BINDING_BG = 'rgba(224,138,0,0.22)';

export const TolerancesView = memo(function TolerancesView({ project, theme }: { project: ResolvedProject; theme: 'light' | 'dark' }) {
  const exporter = useExporter();
  const projectText = useMemo(() => JSON.stringify(project.file), [project]);
  const section = project.file.tolerances as TolerancesSection | undefined;
  const mc = section?.monteCarlo ?? { samples: 1000, seed: 1, distribution: 'uniform' as const, sigmaOfBand: 0.33 };
  const params = useMemo(() => {
    try {
      return toleranceParameters(project.file);
    } catch {
      return [];
    }
  }, [project]);
  const labels = project.requirements.map((r) => r.label);
  const torques = project.requirements.map((r) => r.torque_Nm);

  // corners: one worker, run again for an edited project (the last request wins)
  const [corners, setCorners] = useState<CornersSolved | null>(null);
  const askedCorners = useRef(projectText);
  const cornersRun = useWorkerRun<ToleranceRequest, CornersDone>('tolerance', (m) => setCorners({ corners: m.corners, compute_ms: m.compute_ms, projectText: askedCorners.current }));
  const startCorners = () => {
    askedCorners.current = projectText;
    cornersRun.start(makeWorker(), { kind: 'corners', projectText });
  };
  useEffect(() => {
    const h = setTimeout(startCorners, 200);
    return () => clearTimeout(h);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [projectText]);

  // Monte Carlo: on demand, across workers
  const [workersText, setWorkersText] = useState(String(hardwareWorkers()));
  const workers = Number(workersText);
  const workersBad = !(Number.isInteger(workers) && workers >= 1 && workers <= 16);
  const [thermal, setThermal] = useState(false);
  const [samples, setSamples] = useState<SamplesSolved | null>(null);
  const asked = useRef<Omit<SamplesSolved, 'chunk' | 'workers' | 'wall_ms' | 'busy_ms'> | null>(null);
  const mcRun = useSampleRun((d) => asked.current && setSamples({ ...asked.current, chunk: d.chunk, workers: d.workers, wall_ms: d.wall_ms, busy_ms: d.busy_ms }));
  const startSamples = () => {
    if (workersBad) return;
    const th = thermal && project.thermal !== undefined;
    asked.current = { mc, thermal: th, params, labels, projectText };
    mcRun.start(makeWorker, { projectText, mc, thermal: th }, workers);
  };
  const summary = useMemo(() => (samples ? monteCarloSummary(samples.chunk, samples.params, samples.labels) : null), [samples]);

  const c: CornersResult | null = corners?.corners ?? null;
  const rows = useMemo(() => (c ? cornerRows(c, torques) : []), [c]); // eslint-disable-line react-hooks/exhaustive-deps
  const caption = samples ? `${bandsCaption(samples.params, (x) => num(x))}; margins the least of hot and cold${samples.thermal ? ', S1 checked' : ''}` : '';
  const hist = useMemo(() => (summary ? marginHistogramFigure(summary, readTheme(), CURVE[theme], caption) : null), [summary, theme]); // eslint-disable-line react-hooks/exhaustive-deps
  const sens = useMemo(() => (summary && samples ? sensitivityFigure(summary, samples.params.map((p) => p.path), readTheme(), caption) : null), [summary, samples, theme]); // eslint-disable-line react-hooks/exhaustive-deps
  const histEl = useRef<HTMLDivElement | null>(null);
  const sensEl = useRef<HTMLDivElement | null>(null);

  const mcWords = (s: SamplesSolved): string => `Monte Carlo, ${s.mc.samples} samples, seed ${s.mc.seed}, ${s.mc.distribution}${s.mc.distribution === 'normal' ? ` (sigma ${s.mc.sigmaOfBand} of the half band, truncated)` : ''} over ${s.params.map((p) => `${p.path} ${num(p.min)}–${num(p.max)}${p.unit ? ` ${p.unit}` : ''}`).join(', ')}; margins the least of hot and cold${s.thermal ? ', S1 checked' : ''}`;
  const save = (which: 'margins' | 'sensitivity', format: 'png' | 'svg') => {
    const el = which === 'margins' ? histEl.current : sensEl.current;
    if (!el || !samples) return;
    // the title short enough for one line; the bands are the figure's own caption
    const run = `${samples.mc.samples} samples, seed ${samples.mc.seed}, ${samples.mc.distribution}${samples.mc.distribution === 'normal' ? ` σ ${samples.mc.sigmaOfBand}` : ''}`;
    const what = which === 'margins' ? `torque margins, ${run}` : `margin rank correlations, ${run}`;
    void exportPlotImage(el, format, `tolerance-${which}`, project, exporter, what);
  };
  const saveCsv = () => {
    if (!samples) return;
    const s = samples;
    const comment = `# torquewise tolerance samples; project: ${project.name || 'unnamed'}; ${s.mc.samples} samples, seed ${s.mc.seed}, ${s.mc.distribution}; margins are the least torque margin of hot and cold, N·m`;
    void exporter.exportAndTell('tolerance-csv', () => sampleCsv(s.chunk, s.params, s.labels, comment), 'tolerance-samples.csv');
  };

  const cornersStale = corners !== null && corners.projectText !== projectText;
  const samplesStale = samples !== null && samples.projectText !== projectText;
  const mr = mcRun.run;
  const cr = cornersRun.run;
  return (
    <div data-testid="view-tolerances">
      <div className="card">
        <h4>Bands (edits go to the file's <code>tolerances</code> section)</h4>
        <ToleranceBands file={project.file} params={params} runProblem={cornersRun.run.kind === 'error' ? cornersRun.run.message : undefined} />
      </div>

      <div className="card" data-testid="tol-corners">
        <h4>
          Corners{' '}
          <button className="btn small no-print" data-testid="tol-corners-run" onClick={startCorners} disabled={cr.kind === 'running'}>Compute</button>{' '}
          <button className="btn small danger no-print" data-testid="tol-corners-cancel" disabled={cr.kind !== 'running'} onClick={cornersRun.cancel}>Cancel</button>{' '}
          {cr.kind === 'running' && <span data-testid="tol-corners-progress"><progress className="progress" max={1} value={cr.fraction} /> <span data-testid="tol-corners-percent">{Math.round(cr.fraction * 100)} %</span> of the corners sized hot and cold…</span>}
          {cr.kind === 'cancelled' && <span data-testid="tol-corners-cancelled">Cancelled; the previous result (if any) is shown.</span>}
        </h4>
        {cr.kind === 'error' && <div className="finding danger" data-testid="tol-corners-error">{cr.message}</div>}
        {!c ? <div className="empty">{cr.kind === 'running' ? 'Evaluating the corners…' : 'No corners yet.'}</div> : (
          <>
            <div className={c.allMet ? 'finding info' : 'finding danger'} data-testid="tol-corners-summary" data-all-met={c.allMet} role="note">
              <strong>{c.allMet ? 'Every point met at every corner.' : `A point is NOT met at ${c.corners.filter((k) => !k.met).length} of ${c.corners.length} corners.`}</strong>{' '}
              Least Imax meeting every point at every corner: <strong data-testid="tol-min-imax" data-value={c.minImax_A ?? ''}>{c.minImax_A === null ? 'none (a point lies beyond MTPV at some corner)' : `${num(c.minImax_A)} A peak`}</strong>
              {' '}(file {num(project.inverter.Imax)} A); least Vdc: <strong data-testid="tol-min-vdc" data-value={c.minVdc_V ?? ''}>{c.minVdc_V === null ? 'none (some corner needs more than its current limit at any bus)' : `${num(c.minVdc_V)} V`}</strong> (file {num(project.inverter.Vdc)} V).
            </div>
            <div className="key">
              {c.corners.length} corners ({c.plan === 'every-combination' ? 'every combination of the band ends' : 'one at a time, and all at the lower and all at the upper ends'}), each sized hot and cold{project.thermal ? ', continuous points against the S1 torque' : ''}; margin = torque available − torque asked at the point's speed (the S1 margin where less), N·m; computed in {corners!.compute_ms.toFixed(0)} ms (background).{cornersStale && ' (Recompute for the edited project.)'}
            </div>
            <div style={{ maxHeight: 360, overflow: 'auto' }}>
              <table className="data compact" data-testid="tol-corner-table">
                <thead>
                  <tr>
                    <th>#</th>
                    {c.parameters.map((p) => <th key={p.path} title={p.path}>{short(p.path)}{p.unit ? ` (${p.unit})` : ''}</th>)}
                    {c.requirements.map((q) => <th key={q.label}>{q.label} N·m</th>)}
                  </tr>
                </thead>
                <tbody>
                  {rows.map((r) => (
                    <tr key={r.index} data-testid={r.binding ? 'tol-binding-corner' : undefined} style={r.binding ? { background: BINDING_BG } : undefined} title={r.binding ? 'the binding corner: the least margin relative to the torque asked' : undefined}>
                      <td>{r.index}{r.binding ? ' binds' : ''}</td>
                      {r.values.map((v, j) => <td key={j} className="num">{num(v)}</td>)}
                      {r.requirements.map((q, j) => <td key={j} className={`num ${q.met ? 'pass' : 'fail'}`}>{num(q.margin_Nm, 3)}</td>)}
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
            <table className="data compact" style={{ marginTop: 6 }}>
              <tbody>
                {c.requirements.map((q) => (
                  <tr key={q.label}><td>{q.label}</td><td className={q.metAtEveryCorner ? 'pass' : 'fail'}>{q.metAtEveryCorner ? 'met at every corner' : `NOT met at ${c.corners.filter((k) => !k.requirements[c.requirements.indexOf(q)]!.met).length} corners`}</td><td>worst margin {num(q.worstMargin_Nm, 3)} N·m at corner {q.bindingCorner}</td></tr>
                ))}
              </tbody>
            </table>
          </>
        )}
      </div>

      <div className="card" data-testid="tol-mc">
        <h4>Monte Carlo</h4>
        <div className="toolbar no-print">
          <MonteCarloFields />
          <label title="Web Workers sharing the samples (the result does not depend on their number)">workers <input type="text" data-testid="mc-workers" style={{ width: 40 }} className={workersBad ? 'bad' : undefined} value={workersText} onChange={(e) => setWorkersText(e.target.value)} /></label>
          {project.thermal !== undefined && <label><input type="checkbox" data-testid="mc-thermal" checked={thermal} onChange={(e) => setThermal(e.target.checked)} /> S1 check of continuous points</label>}
          <button className="btn" data-testid="mc-run" onClick={startSamples} disabled={mr.kind === 'running' || workersBad || params.length === 0}>Run</button>
          <button className="btn danger" data-testid="mc-cancel" disabled={mr.kind !== 'running'} onClick={mcRun.cancel}>Cancel</button>
          {mr.kind === 'running' && <span><progress className="progress" data-testid="mc-progress" max={mr.total} value={mr.done} /> {mr.done} of {mr.total} samples on {mr.workers} worker{mr.workers === 1 ? '' : 's'}</span>}
          {mr.kind === 'cancelled' && <span data-testid="mc-cancelled">Cancelled; the previous result (if any) is shown.</span>}
          <span style={{ flex: 1 }} />
          <button className="btn small" onClick={saveCsv} disabled={!samples} data-testid="mc-csv">CSV</button>
        </div>
        {workersBad && <div className="finding warning">Workers: a whole number from 1 to 16.</div>}
        {mr.kind === 'error' && <div className="finding danger" data-testid="mc-error">{mr.message}</div>}
        {!summary || !samples ? <div className="empty">{mr.kind === 'running' ? 'Sampling…' : 'No samples yet: Run.'}</div> : (
          <>
            <div className="key" data-testid="mc-conditions" data-wall-ms={samples.wall_ms.toFixed(0)} data-workers={samples.workers} data-busy-ms={samples.busy_ms.toFixed(0)}>
              {mcWords(samples)}; computed in {(samples.wall_ms / 1000).toFixed(2)} s on {samples.workers} worker{samples.workers === 1 ? '' : 's'} ({(samples.busy_ms / 1000).toFixed(2)} s of worker time in the samples).{samplesStale && ' (Run again for the edited project.)'}
            </div>
            <table className="data compact" data-testid="mc-pass">
              <thead><tr><th>point</th><th>met, % of samples</th><th>± standard error</th><th>least margin N·m</th><th>mean margin N·m</th></tr></thead>
              <tbody>
                {passRows(summary).map((r) => (
                  <tr key={r.label} data-testid={r.label === 'every point' ? 'mc-pass-all' : undefined} data-value={r.pct}>
                    <td>{r.label === 'every point' ? <strong>every point</strong> : r.label}</td>
                    <td className={`num ${r.pct === 100 ? 'pass' : 'fail'}`}>{r.pct.toFixed(1)} %</td>
                    <td className="num">{r.sePct.toFixed(2)} %</td>
                    <td className="num">{num(r.leastMargin_Nm, 3)}</td>
                    <td className="num">{Number.isFinite(r.meanMargin_Nm) ? num(r.meanMargin_Nm, 3) : ''}</td>
                  </tr>
                ))}
              </tbody>
            </table>
            <div style={{ display: 'grid', gridTemplateColumns: 'minmax(0, 1fr)', gap: 12, marginTop: 8 }}>
              <div>
                <h4>
                  Torque margins (red: not met){' '}
                  <button className="btn small no-print" onClick={() => save('margins', 'png')} data-testid="mc-hist-png">PNG</button>{' '}
                  <button className="btn small no-print" onClick={() => save('margins', 'svg')} data-testid="mc-hist-svg">SVG</button>
                </h4>
                {hist && <Plot data={hist.data} layout={hist.layout} height={Math.max(300, 50 + 230 * Math.ceil(summary.requirements.length / 3))} testId="tolerance-margins-plot" elRef={(el) => (histEl.current = el)} />}
              </div>
              <div>
                <h4>
                  Sensitivity: rank correlation of each margin with each parameter{' '}
                  <button className="btn small no-print" onClick={() => save('sensitivity', 'png')} data-testid="mc-sens-png">PNG</button>{' '}
                  <button className="btn small no-print" onClick={() => save('sensitivity', 'svg')}>SVG</button>
                </h4>
                {sens && <Plot data={sens.data} layout={sens.layout} height={Math.max(220, 80 + 36 * summary.requirements.length)} testId="tolerance-sensitivity-plot" elRef={(el) => (sensEl.current = el)} />}
              </div>
            </div>
          </>
        )}
      </div>
    </div>
  );
});
