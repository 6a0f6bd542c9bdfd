// Duty cycle view (a project with `thermal` and `dutyCycle` sections): the cycle evaluated by the
// core (core/simulation/duty-cycle.ts) in the thermal worker, repeated to its periodic state, with
// progress and cancel; its instants on the torque-speed plane over the hot peak envelope (coloured by
// time, the instants outside marked), the temperature traces with their limits, the energy balance,
// the summary numbers and the verdict with its caution. Exports: PNG/SVG of each figure with its
// conditions, CSV of the traces (core/reports/duty-cycle-trace-csv.ts).
import { memo, useEffect, useMemo, useRef, useState } from 'react';
import { useWorkerRun } from '../../state/worker-run';
import { dutyCycleTraceCsv } from '../../../../core/reports/duty-cycle-trace-csv';
import { describeLimit } from '../../../../core/drive/current-limits';
import type { DutyCycleResult } from '../../../../core/simulation/duty-cycle';
import { CURVE, Plot, readTheme } from '../../components/Plot';
import { num } from '../../components/format';
import { exportPlotImage } from '../../components/image-export';
import { useExporter } from '../../state/exporter';
import { curveKey, type EnvelopeResults } from '../../state/compute';
import type { DutyCycleDone, ThermalRequest } from '../../workers/thermal-protocol';
import { cyclePlaneFigure, defaultStep, ENERGY_BARS, energyFigure, energyValues_kJ, temperatureFigure, TEMP_NAME } from './duty-cycle-figures';

type Solved = DutyCycleDone & { projectText: string; step_s: number };

/** The caution beside every verdict: a lumped model's estimate, never a rating. */
export const DUTY_CYCLE_CAUTION =
  'An estimate from a lumped thermal model and the data given (the demos\' are invented). Hot windings, housings and heat sinks burn, and ' +
  'overheated insulation or magnets fail for good: rate the machine by tests to IEC 60034-1 and follow local codes and licensed practice.';

const kJ = (j: number): string => `${num(j / 1000)} kJ`;

export const DutyCycleView = memo(function DutyCycleView({ results, theme }: { results: EnvelopeResults; theme: 'light' | 'dark' }) {
  const exporter = useExporter();
  const project = results.project;
  const th = project.thermal!;
  const cycle = project.dutyCycle!;
  const period = cycle.t_s[cycle.t_s.length - 1]! - cycle.t_s[0]!;
  const autoStep = defaultStep(period);
  const [stepText, setStepText] = useState(String(autoStep));
  const step = Number(stepText);
  const stepBad = !(Number.isFinite(step) && step > 0 && period / step <= 2e6);
  const [solved, setSolved] = useState<Solved | null>(null);
  const projectText = useMemo(() => JSON.stringify(project.file), [project]);
  const asked = useRef({ projectText, step_s: step });
  const { run, start: startRun, cancel } = useWorkerRun<ThermalRequest, DutyCycleDone>('duty-cycle', (m) => setSolved({ result: m.result, compute_ms: m.compute_ms, ...asked.current }));
  const start = () => {
    if (stepBad) return;
    asked.current = { projectText, step_s: step };
    startRun(new Worker(new URL('../../workers/thermal-worker.ts', import.meta.url), { type: 'module' }), { kind: 'duty-cycle', projectText, step_s: step });
  };
  // run again for an edited project (the last request wins)
  useEffect(() => {
    const h = setTimeout(start, 200);
    return () => clearTimeout(h);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [projectText]);

  const env = useMemo(() => {
    const find = (d: 'motoring' | 'generating') => results.curves.find((k) => k.key === curveKey('hot', 'peak', d))!.env;
    return { motoring: find('motoring'), generating: find('generating') };
  }, [results]);
  const r: DutyCycleResult | null = solved?.result ?? null;
  const plane = useMemo(() => (r ? cyclePlaneFigure(r, env, readTheme(), CURVE[theme]) : null), [r, env, theme]);
  const temps = useMemo(() => (r ? temperatureFigure(r, th, readTheme(), CURVE[theme]) : null), [r, th, theme]);
  const energy = useMemo(() => (r ? energyFigure(r, readTheme(), CURVE[theme]) : null), [r, theme]);
  const planeEl = useRef<HTMLDivElement | null>(null);
  const tempEl = useRef<HTMLDivElement | null>(null);
  const energyEl = useRef<HTMLDivElement | null>(null);

  const conditions = `duty cycle "${cycle.label}", periodic state (the last of ${r?.repeats ?? '?'} repeats), coolant ${th.coolantTemp_C} °C, step ${solved?.step_s ?? step} s`;
  const save = (which: 'plane' | 'temperatures' | 'energy', format: 'png' | 'svg') => {
    const el = which === 'plane' ? planeEl.current : which === 'temperatures' ? tempEl.current : energyEl.current;
    const what = which === 'plane' ? `${conditions}: the cycle on the torque-speed plane over the hot peak envelope` : which === 'temperatures' ? `${conditions}: temperatures and their limits` : `${conditions}: energy balance per cycle`;
    if (el) void exportPlotImage(el, format, `duty-cycle-${which}`, project, exporter, what);
  };
  const saveCsv = () => {
    if (!r) return;
    const comments = [`# torquewise duty cycle; project: ${project.name || 'unnamed'}; cycle: ${r.label}; the last of ${r.repeats} repeats; current in A peak`];
    void exporter.exportAndTell('duty-cycle-csv', () => dutyCycleTraceCsv(r, comments), 'duty-cycle.csv');
  };
  const stale = solved !== null && (solved.projectText !== projectText || solved.step_s !== step);
  const verdictClass = r ? (r.verdict.status === 'within-limits' ? 'finding info' : 'finding danger') : '';
  const e = r?.energies;
  const limitOf = (k: 'winding' | 'stator' | 'magnet' | 'junction'): string =>
    k === 'winding' ? `limit ${th.windingMax_C} °C` : k === 'magnet' ? `limit ${th.magnetMax_C} °C` : k === 'junction' ? (th.junctionMax_C !== undefined && th.junctionToCoolant_K_per_W !== undefined ? `limit ${th.junctionMax_C} °C` : 'not rated') : '';

  return (
    <div data-testid="view-duty-cycle">
      <div className="toolbar no-print">
        <span>Cycle: <strong>{cycle.label}</strong>, {num(period)} s</span>
        <label title="the cycle is evaluated at this step (linear between its samples)">
          step{' '}
          <input data-testid="dc-step" style={{ width: 70 }} className={stepBad ? 'bad' : undefined} value={stepText} onChange={(ev) => setStepText(ev.target.value)} onKeyDown={(ev) => ev.key === 'Enter' && start()} /> s
        </label>
        <button className="btn" data-testid="dc-run" onClick={start} disabled={run.kind === 'running' || stepBad}>Compute</button>
        <button className="btn danger" data-testid="dc-cancel" disabled={run.kind !== 'running'} onClick={cancel}>Cancel</button>
        {run.kind === 'running' && (
          <span>
            <progress className="progress" data-testid="dc-progress" max={1} value={run.fraction} /> {Math.round(run.fraction * 100)} % of the current repeat
          </span>
        )}
        {run.kind === 'cancelled' && <span data-testid="dc-cancelled">Cancelled; the previous result (if any) is shown.</span>}
        <span className="spacer" style={{ flex: 1 }} />
        <span style={{ display: 'inline-flex', gap: 6 }}>
          <button className="btn small" onClick={() => save('plane', 'png')} disabled={!r} data-testid="dc-png">PNG</button>
          <button className="btn small" onClick={() => save('plane', 'svg')} disabled={!r} data-testid="dc-svg">SVG</button>
          <button className="btn small" onClick={saveCsv} disabled={!r} data-testid="dc-csv">CSV</button>
        </span>
      </div>
      {stepBad && <div className="finding warning">Step: give a positive number of seconds (at most 2 000 000 instants per cycle).</div>}
      {run.kind === 'error' && <div className="finding danger" data-testid="dc-error">{run.message}</div>}
      <div className="key" data-testid="dc-conditions">
        <span>
          Quasi-static: the steady loss point at each instant at the temperatures reached (peak limits, {num(project.peak.Imax)} A peak, bus {num(project.inverter.Vdc)} V), the thermal
          network integrated in time, the cycle repeated from the coolant temperature until its end temperatures change by less than 0.1 K; shown: the last repeat.
          {solved && ` ${solved.result.t_s.length} instants, ${solved.result.solves.total} loss points solved, in ${solved.compute_ms.toFixed(0)} ms (background).`}
          {stale && ' (Recompute for the edited project or step.)'}
        </span>
      </div>
      {!r ? (
        <div className="empty">{run.kind === 'running' ? 'Evaluating the duty cycle…' : 'No result yet.'}</div>
      ) : (
        <>
          <div className={verdictClass} data-testid="dc-verdict" data-status={r.verdict.status} role="note">
            <strong>Verdict{r.converged ? '' : ' (NOT converged)'}:</strong> {r.verdict.status === 'within-limits' ? 'within limits' : r.verdict.text}. {DUTY_CYCLE_CAUTION}
          </div>
          <div style={{ display: 'grid', gridTemplateColumns: 'minmax(0, 1fr) minmax(0, 1fr)', gap: 12 }}>
            <div className="card">
              <h4>The cycle on the torque-speed plane (hot peak envelope)</h4>
              {plane && <Plot data={plane.data} layout={plane.layout} height={380} testId="duty-plane-plot" elRef={(el) => (planeEl.current = el)} />}
            </div>
            <div className="card">
              <h4>
                Temperatures in the periodic cycle (dashed: limits){' '}
                <button className="btn small no-print" onClick={() => save('temperatures', 'png')} data-testid="dc-temp-png">PNG</button>{' '}
                <button className="btn small no-print" onClick={() => save('temperatures', 'svg')}>SVG</button>
              </h4>
              {temps && <Plot data={temps.data} layout={temps.layout} height={380} testId="duty-temperature-plot" elRef={(el) => (tempEl.current = el)} />}
            </div>
          </div>
          <div style={{ display: 'grid', gridTemplateColumns: 'minmax(0, 1fr) minmax(0, 1fr)', gap: 12 }}>
            <div className="card" data-testid="dc-summary">
              <h4>Summary (last repeat)</h4>
              <table className="data compact">
                <tbody>
                  <tr><td style={{ whiteSpace: 'nowrap' }}>repeats to the periodic state</td><td data-testid="dc-repeats">{r.repeats}{r.converged ? '' : ' (not converged)'} (last change {num(r.lastChange_K, 3)} K)</td></tr>
                  <tr><td style={{ whiteSpace: 'nowrap' }}>RMS torque</td><td data-testid="dc-rms-torque" data-value={r.rmsTorque_Nm}>{num(r.rmsTorque_Nm)} N·m</td></tr>
                  <tr><td style={{ whiteSpace: 'nowrap' }}>RMS current</td><td data-testid="dc-rms-current" data-value={r.rmsCurrent_A}>{num(r.rmsCurrent_A)} A peak ({num(r.rmsCurrent_A / Math.SQRT2)} A rms); {describeLimit('continuous', project.currentLimits.continuous)}</td></tr>
                  <tr><td style={{ whiteSpace: 'nowrap' }}>peak current</td><td data-testid="dc-peak-current">{num(r.peakCurrent.value)} A peak at {num(r.peakCurrent.t_s)} s; {describeLimit('peak', project.currentLimits.peak)}</td></tr>
                  {(['winding', 'stator', 'magnet', 'junction'] as const).map((k) => (
                    <tr key={k}><td style={{ whiteSpace: 'nowrap' }}>peak {TEMP_NAME[k]}</td><td data-testid={`dc-peak-${k}`} data-value={r.peaks[k].value}>{num(r.peaks[k].value)} °C at {num(r.peaks[k].t_s)} s {limitOf(k) && `(${limitOf(k)})`}</td></tr>
                  ))}
                  <tr><td style={{ whiteSpace: 'nowrap' }}>outside the envelope</td><td data-testid="dc-outside">{r.outside.length === 0 ? 'never' : r.outside.slice(0, 4).map((o) => `${num(o.from_s)}–${num(o.to_s)} s (${o.limitedBy})`).join('; ') + (r.outside.length > 4 ? `; … ${r.outside.length} in all` : '')}</td></tr>
                </tbody>
              </table>
            </div>
            <div className="card" data-testid="dc-energy">
              <h4>
                Energy per cycle{' '}
                <button className="btn small no-print" onClick={() => save('energy', 'png')}>PNG</button>{' '}
                <button className="btn small no-print" onClick={() => save('energy', 'svg')}>SVG</button>
              </h4>
              {energy && <Plot data={energy.data} layout={energy.layout} height={240} testId="duty-energy-plot" elRef={(el) => (energyEl.current = el)} />}
              {e && (
                <table className="data compact">
                  <tbody>
                    {ENERGY_BARS.map((name, i) => (
                      <tr key={name}><td>{name}</td><td className="num">{num(energyValues_kJ(r)[i]!)} kJ</td></tr>
                    ))}
                    <tr><td>heat to the coolant</td><td className="num">{kJ(e.heatRemoved_J)}</td></tr>
                    <tr><td>balance: DC link − shaft − losses</td><td className="num" data-testid="dc-balance">{num(e.balanceResidual * 100, 2)} % of the larger side</td></tr>
                  </tbody>
                </table>
              )}
            </div>
          </div>
        </>
      )}
    </div>
  );
});
