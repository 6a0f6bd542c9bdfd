// Load steps view: the scenario editor, a run button (the simulation runs in a Web Worker, with
// progress and cancel), stacked traces on one time axis (traces-figure.ts), the metrics table,
// saturation shaded; with a measured or estimated angle, the source named with its findings, the
// estimated speed over the true one, the angle error and its rms and peak (angle-figures.ts).
import { memo, useMemo, useRef } from 'react';
import { useWorkerRun } from '../../state/worker-run';
import type { ResolvedProject } from '../../../../core/project/project';
import { SQRT2 } from '../../../../core/base/units';
import { Plot, readTheme } from '../../components/Plot';
import { Section } from '../../components/Section';
import { CONTROL_SUMMARY, InputSummary, ScenarioSummary } from '../../components/input-summary';
import { jumpToField } from '../../components/jump-to-field';
import { rpmText, sig3 } from '../../components/trace-scales';
import { fieldPhrase, plainMessage, severityPhrase } from '../../../../core/reports/phrases';
import type { SimReply, SimRequest } from '../../workers/sim-protocol';
import type { SimDone } from '../../state/simulation-run';
import { useExporter } from '../../state/exporter';
import { tracesCsv } from '../../components/exports';
import { num } from '../../components/format';
import { PwmControl } from './PwmControl';
import { SwitchingPanel } from './SwitchingPanel';
import { inputsKey, keepAveraged } from './switching-figures';
import { tracesFigure, tracesHeight } from './traces-figure';
import { AngleCard } from './AngleCard';
import { angleFindings, angleMetricRows, angleSourceText, handoverSpeed, runFile } from './angle-figures';

const ms = (v: number): string => `${sig3(v * 1e3)} ms`;
const METRICS: Array<[keyof SimDone['metrics'], string, (v: number) => string]> = [
  ['finalSpeed_rpm', 'final speed', (v) => `${rpmText(v)} rpm`],
  ['speedOvershoot_pct', 'speed overshoot (% of the speed step)', (v) => `${sig3(v)} %`],
  ['riseTime_s', 'rise time (10 % to 90 % of the speed step)', ms],
  ['settlingTime_s', 'settling time (to within 2 % of the speed step)', ms],
  ['loadStepDip_rpm', 'speed dip after the load step', (v) => `${rpmText(v)} rpm`],
  ['loadStepRecovery_s', 'recovery after the load step (error back within 5 % of the dip)', ms],
  ['steadyStateError_rpm', 'steady-state speed error', (v) => `${rpmText(v)} rpm`],
  ['peakCurrent_A', 'peak phase current', (v) => `${sig3(v)} A peak (${sig3(v / SQRT2)} A rms)`],
  ['rmsCurrent_A', 'rms phase current', (v) => `${sig3(v * SQRT2)} A peak (${sig3(v)} A rms)`],
  ['voltageSaturation_s', 'time in voltage saturation', ms],
  ['energyFromBus_J', 'energy from the DC link', (v) => `${sig3(v)} J`],
];

/**
 * `result`: the last finished run, kept by the app (it survives switching views); `setResult` keeps
 * a new one.
 */
export const LoadStepsView = memo(function LoadStepsView({ project, theme, stale, result, setResult }: { project: ResolvedProject; theme: 'light' | 'dark'; stale: boolean; result: SimDone | null; setResult: (r: SimDone) => void }) {
  const exporter = useExporter();

  // the inverter model and the inputs of the run asked for, for the run that comes back
  const asked = useRef<{ pwmModel: 'average' | 'switching'; inputsKey: string }>({ pwmModel: 'average', inputsKey: '' });
  const { run, start: startRun, cancel } = useWorkerRun<SimRequest, Omit<Extract<SimReply, { kind: 'done' }>, 'kind'>>('simulation', (m) =>
    setResult(keepAveraged(result, { ...m.result, findings: m.findings, project: project.name, ...asked.current })),
  );
  const start = () => {
    asked.current = { pwmModel: project.file.control?.pwm?.model === 'switching' ? 'switching' : 'average', inputsKey: inputsKey(project.file) };
    startRun(new Worker(new URL('../../workers/sim-worker.ts', import.meta.url), { type: 'module' }), { kind: 'run', projectText: JSON.stringify(project.file), maxPoints: 4000 });
  };

  // the file the shown run was made from (its inputs less control.pwm): its angle source, not the one edited since
  const file = useMemo(() => (result ? runFile(result.inputsKey, project.file) : null), [result, project.file]);
  const fig = useMemo(() => (result ? tracesFigure(result, theme, readTheme(), handoverSpeed(file)) : null), [result, theme, file]);
  const hasScenario = project.file.scenario !== undefined;
  // the findings about the angle source go with the angle's line above the traces (when it shows)
  const general = useMemo(() => {
    if (!result) return [];
    const shown = angleSourceText(file) !== null && result.traces.thetaError_rad !== undefined ? new Set(angleFindings(result.findings)) : new Set();
    return result.findings.filter((f) => !shown.has(f));
  }, [result, file]);
  const sat = result?.events.filter((e) => e.kind === 'voltage-saturation' || e.kind === 'current-limit') ?? [];
  const other = result?.events.filter((e) => e.kind !== 'voltage-saturation' && e.kind !== 'current-limit') ?? [];

  return (
    <div data-testid="view-loadsteps" style={{ display: 'grid', gridTemplateColumns: '340px minmax(0, 1fr)', gap: 12 }}>
      <div>
        <Section title="Scenario (edit in the side panel)">
          <ScenarioSummary testId="loadsteps-scenario" />
        </Section>
        <Section title="Controller (edit in the side panel)">
          <InputSummary items={CONTROL_SUMMARY} testId="loadsteps-control" note="Click a name to edit it in the side panel." />
        </Section>
        <Section title="PWM: inverter model">
          <PwmControl />
        </Section>
      </div>
      <div>
        <div className="toolbar">
          <button className="btn primary" data-testid="run" disabled={run.kind === 'running' || !hasScenario || stale} onClick={start}>
            Run load-step test
          </button>
          <button className="btn danger" data-testid="cancel" disabled={run.kind !== 'running'} onClick={cancel}>
            Cancel
          </button>
          {run.kind === 'running' && (
            <>
              <progress className="progress" data-testid="progress" max={1} value={run.fraction} /> {Math.round(run.fraction * 100)} %
            </>
          )}
          {run.kind === 'cancelled' && <span data-testid="cancelled">Cancelled; the previous result (if any) is shown.</span>}
          <span style={{ flex: 1 }} />
          {result && (
            <button className="btn small" onClick={() => void exporter.exportAndTell('traces-csv', () => tracesCsv(result.traces), 'traces.csv')}>
              Traces CSV
            </button>
          )}
        </div>
        {run.kind === 'error' && <div className="finding danger" data-testid="sim-error">{run.message}</div>}
        {result ? (
          <>
            {typeof result.diagnostic === 'string' && <div className="finding danger">{result.diagnostic}</div>}
            {general.length > 0 && (
              <div data-testid="sim-findings">
                {general.map((f, i) => (
                  <div key={i} className={`finding ${f.severity}`}>
                    <strong>{severityPhrase(f.severity)}</strong>
                    {f.field && (
                      <>
                        {', '}
                        <button className="link" onClick={() => jumpToField(f.field!)}>{fieldPhrase(f.field.replace(/\[(\d+)\]/g, '.$1'))}</button>
                      </>
                    )}
                    : {plainMessage(f.message)}
                  </div>
                ))}
              </div>
            )}
            {result.pwmModel === 'switching' && <SwitchingPanel result={result} project={project} theme={theme} />}
            <div className="card">
              <h4>
                Traces — {result.project}{result.pwmModel === 'switching' ? ' (switching model)' : ''}
                <span style={{ fontWeight: 400, fontSize: 12, marginLeft: 10 }}>shaded: voltage saturation (amber), current limit (red)</span>
              </h4>
              <AngleCard result={result} file={file} polePairs={project.machine20.polePairs} />
              {fig && <Plot data={fig.data} layout={fig.layout} height={tracesHeight(result)} testId="traces-plot" />}
            </div>
            <div className="cols">
              <div className="card">
                <h4>Metrics</h4>
                <table className="data" data-testid="metrics">
                  <tbody>
                    {METRICS.map(([k, label, f]) => {
                      const v = result.metrics[k];
                      return (
                        <tr key={k}>
                          <td>{label}</td>
                          <td className="num" data-metric={k}>{typeof v === 'number' && Number.isFinite(v) ? f(v) : '–'}</td>
                        </tr>
                      );
                    })}
                    {angleMetricRows(result.metrics).map((m) => (
                      <tr key={m.key}>
                        <td>{m.label}</td>
                        <td className="num" data-metric={m.key} data-value={m.value}>{m.text}</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
                {result.loadSteps.length > 1 && (
                  <table className="data compact" data-testid="load-steps" style={{ marginTop: 8 }}>
                    <thead>
                      <tr>
                        <th className="num">load at</th>
                        <th className="num">speed dip</th>
                        <th className="num">recovery (within 5 % of the dip)</th>
                      </tr>
                    </thead>
                    <tbody>
                      {result.loadSteps.map((l, i) => (
                        <tr key={i}>
                          <td className="num">{ms(l.t_s)}</td>
                          <td className="num">{l.settled ? (l.dip_rpm === null ? '–' : `${rpmText(l.dip_rpm)} rpm`) : 'not settled'}</td>
                          <td className="num">{l.recovery_s === null ? '–' : ms(l.recovery_s)}</td>
                        </tr>
                      ))}
                    </tbody>
                  </table>
                )}
              </div>
              <div className="card">
                <h4>Events</h4>
                {sat.length === 0 && other.length === 0 && <div className="finding">No limit reached.</div>}
                {[...other, ...sat].slice(0, 12).map((e, i) => (
                  <div key={i} className={`finding ${e.kind === 'divergence' || e.kind === 'overspeed' ? 'danger' : 'warning'}`}>
                    {num(e.t_s * 1e3)}
                    {e.tEnd_s !== undefined ? `–${num(e.tEnd_s * 1e3)}` : ''} ms: {e.message}
                  </div>
                ))}
                {sat.length + other.length > 12 && <div className="hint">… and {sat.length + other.length - 12} more.</div>}
                <div className="hint" style={{ fontSize: 12, marginTop: 6 }}>
                  {typeof result.stats.controlSteps === 'number' && `${result.stats.controlSteps} control periods, `}
                  {typeof result.stats.evaluationsPerPeriod === 'number' && `${num(result.stats.evaluationsPerPeriod)} derivative evaluations per period (median), `}
                  {typeof result.stats.wall_s === 'number' && `${num(result.stats.wall_s * 1e3)} ms wall time`}
                </div>
              </div>
            </div>
          </>
        ) : (
          <div className="empty" data-testid="loadsteps-empty">
            {!hasScenario ? (
              <>
                No scenario yet:{' '}
                <button className="link" onClick={() => jumpToField('scenario')}>add one in the side panel</button> to run a load-step test.
              </>
            ) : stale ? (
              'Correct the marked inputs in the side panel, then run the test.'
            ) : (
              'No run yet: press “Run load-step test”.'
            )}
          </div>
        )}
      </div>
    </div>
  );
});
