// Load steps view: the scenario editor, a run button (the simulation runs in a Web Worker, with
// progress and cancel), stacked traces on one time axis, the metrics table, saturation shaded.
import { memo, useEffect, useMemo, useRef, useState } from 'react';
import { useWorkerRun } from '../../state/worker-run';
import type { Data, Layout } from 'plotly.js-dist-min';
import type { ResolvedProject } from '../../../../core/project/project';
import { SQRT2 } from '../../../../core/base/units';
import { axis, baseLayout, Plot, readTheme } from '../../components/Plot';
import { Section } from '../../components/Section';
import { CONTROL_SUMMARY, InputSummary, ScenarioSummary } from '../../components/input-summary';
import { jumpToField } from '../../components/jump-to-field';
import { rpmText, sig3, speedError, speedErrorRange } from '../../components/trace-scales';
import { fieldPhrase, plainMessage, severityPhrase } from '../../../../core/reports/phrases';
import type { SimReply, SimRequest } from '../../workers/sim-protocol';
import type { SimDone } from '../../state/simulation-run';
import { useExporter } from '../../state/exporter';
import { tracesCsv } from '../../components/exports';
import { num } from '../../components/format';
import { PwmControl } from './PwmControl';
import { SwitchingPanel } from './SwitchingPanel';
import { inputsKey, keepAveraged } from './switching-figures';


/** Colours of the traces: distinct within each plot and never one colour for two quantities. */
const TRACE = {
  light: { ref: '#555555', speed: '#0b5cad', error: '#00796b', torque: '#6a3d9a', load: '#8d6e00', id: '#e65100', iq: '#00838f', volt: '#c51b7d', a: '#b3261e', b: '#558b2f', c: '#283593' },
  dark: { ref: '#bbbbbb', speed: '#79c0ff', error: '#4dd0c4', torque: '#d2a8ff', load: '#f2cc60', id: '#ffa657', iq: '#56d4dd', volt: '#ff8ccf', a: '#ff7b72', b: '#aed581', c: '#9fa8ff' },
} as const;

const ROWS = 6;
const GAP = 0.03;
const domain = (i: number): [number, number] => {
  const h = (1 - GAP * (ROWS - 1)) / ROWS;
  const top = 1 - i * (h + GAP);
  return [top - h, top];
};

export function tracesFigure(r: SimDone, theme: 'light' | 'dark'): { data: Data[]; layout: Layout } {
  const t = readTheme();
  const col = TRACE[theme];
  const tr = r.traces;
  const x = tr.t_s!;
  const data: Data[] = [];
  const groups = ['speed, rpm', 'speed error, rpm', 'torque, N·m', 'dq currents, A peak', 'voltage', 'phase currents, A peak'];
  const line = (y: Float64Array | undefined, name: string, row: number, colour: string, dash = 'solid', width = 1.6, digits = '.4g') => {
    if (!y) return;
    data.push({
      type: 'scatter',
      mode: 'lines',
      x,
      y,
      name,
      xaxis: 'x',
      yaxis: row === 0 ? 'y' : `y${row + 1}`,
      line: { color: colour, width, dash },
      legendgroup: `row${row}`,
      legendgrouptitle: { text: groups[row] },
      hovertemplate: `${name}: %{y:${digits}}<extra>%{x:.4f} s</extra>`,
    } as Data);
  };
  line(tr.speedRef_rpm, 'reference', 0, col.ref, 'dash', 1.4, '.0f');
  line(tr.speed_rpm, 'speed', 0, col.speed, 'solid', 2, '.1f');
  if (tr.speedRef_rpm && tr.speed_rpm) line(speedError(tr.speedRef_rpm, tr.speed_rpm), 'reference − speed', 1, col.error, 'solid', 1.6, '.2f');
  line(tr.torque_Nm, 'motor torque', 2, col.torque, 'solid', 1.6, '.3g');
  line(tr.loadTorque_Nm, 'load torque', 2, col.load, 'dash', 1.6, '.3g');
  line(tr.idRef_A, 'id reference', 3, col.id, 'dot', 1.3, '.3g');
  line(tr.iqRef_A, 'iq reference', 3, col.iq, 'dot', 1.3, '.3g');
  line(tr.id_A, 'id', 3, col.id, 'solid', 1.6, '.3g');
  line(tr.iq_A, 'iq', 3, col.iq, 'solid', 1.6, '.3g');
  line(tr.vNorm, '|v| / Vmax', 4, col.volt, 'solid', 1.6, '.3f');
  line(tr.ia_A, 'ia', 5, col.a, 'solid', 1.1, '.3g');
  line(tr.ib_A, 'ib', 5, col.b, 'solid', 1.1, '.3g');
  line(tr.ic_A, 'ic', 5, col.c, 'solid', 1.1, '.3g');
  const zoom = speedErrorRange(r.loadSteps);
  const titles = ['speed, rpm', 'error, rpm', 'torque, N·m', 'id, iq, A peak', '|v| / Vmax', 'ia, ib, ic, A'];
  // the error row is zoomed to the load dips: its legend group says so
  if (zoom) for (const d of data as Array<{ legendgroup?: string; legendgrouptitle?: { text: string } }>) if (d.legendgroup === 'row1') d.legendgrouptitle = { text: 'speed error (zoomed), rpm' };
  const layout: Record<string, unknown> = baseLayout(t, {
    margin: { l: 84, r: 150, t: 10, b: 44 },
    hovermode: 'x',
    legend: { orientation: 'v', x: 1.01, y: 1, font: { size: 11 }, tracegroupgap: 14, groupclick: 'toggleitem' },
    xaxis: axis(t, 'time, s', { anchor: `y${ROWS}`, range: [x[0], x[x.length - 1]] }),
  });
  for (let i = 0; i < ROWS; i++) {
    const extra: Record<string, unknown> = { domain: domain(i) };
    if (i === 4) extra.range = [0, 1.15];
    if (i === 1 && zoom) extra.range = zoom;
    layout[i === 0 ? 'yaxis' : `yaxis${i + 1}`] = axis(t, titles[i]!, extra);
  }
  // the x axis ticks appear once at the bottom; every row shares it
  const fill = theme === 'dark' ? 'rgba(255,179,64,0.16)' : 'rgba(224,138,0,0.16)';
  const fillI = theme === 'dark' ? 'rgba(255,123,114,0.13)' : 'rgba(179,38,30,0.10)';
  const shapes: Record<string, unknown>[] = [];
  const end = x[x.length - 1] ?? 0;
  for (const e of r.events) {
    if (e.kind !== 'voltage-saturation' && e.kind !== 'current-limit') continue;
    shapes.push({
      type: 'rect',
      xref: 'x',
      yref: 'paper',
      x0: e.t_s,
      x1: e.tEnd_s ?? end,
      y0: 0,
      y1: 1,
      fillcolor: e.kind === 'voltage-saturation' ? fill : fillI,
      line: { width: 0 },
      layer: 'below',
    });
  }
  layout.shapes = shapes;
  return { data, layout };
}

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

  const fig = useMemo(() => (result ? tracesFigure(result, theme) : null), [result, theme]);
  const hasScenario = project.file.scenario !== undefined;
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
            {result.findings.length > 0 && (
              <div data-testid="sim-findings">
                {result.findings.map((f, i) => (
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
              {fig && <Plot data={fig.data} layout={fig.layout} height={660} testId="traces-plot" />}
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
