// Tuning view: bandwidths (or gains) in, gains out, Bode plots with crossover and margins, warnings.
import { memo, useMemo } from 'react';
import type { Data, Layout } from 'plotly.js-dist-min';
import type { ResolvedProject } from '../../../../core/project/project';
import { type LoopReport, type TuningReport } from '../../../../core/control/tuning';
import { tuneFromProject } from '../../../../core/project/tuning-from-project';
import { isInputError } from '../../../../core/base/errors';
import { axis, baseLayout, CURVE, Plot, readTheme } from '../../components/Plot';
import { num } from '../../components/format';
import { CONTROL_SUMMARY, InputSummary } from '../../components/input-summary';
import { GainScheduleCard } from './GainScheduleCard';
import { CurrentTableCard } from './CurrentTableCard';
import { EstimatorCard } from './EstimatorCard';

/** The controller inputs the tuning depends on (shown read-only; edited in the side panel). */
const TUNING_INPUTS = ['control.fCtrl_Hz', 'control.delaySamples', 'control.currentBandwidth_Hz', 'control.speedBandwidth_Hz', 'control.speedTuning.method', 'control.speedTuning.a', 'control.speedLoopDivider'];
import { plainMessage, severityPhrase } from '../../../../core/reports/phrases';

interface Loop {
  key: string;
  name: string;
  rep: LoopReport;
  colour: string;
  kpUnit: string;
  kiUnit: string;
}

function loops(rep: TuningReport, theme: 'light' | 'dark'): Loop[] {
  const col = CURVE[theme];
  const out: Loop[] = [{ key: 'current-d', name: rep.currentQ ? 'current loop, d axis' : 'current loop (d and q)', rep: rep.current, colour: col.id, kpUnit: 'V/A', kiUnit: 'V/(A·s)' }];
  if (rep.currentQ) out.push({ key: 'current-q', name: 'current loop, q axis', rep: rep.currentQ, colour: col.iq, kpUnit: 'V/A', kiUnit: 'V/(A·s)' });
  out.push({ key: 'speed', name: 'speed loop', rep: rep.speed, colour: col.volt, kpUnit: 'N·m·s/rad', kiUnit: 'N·m/rad' });
  return out;
}

export function bodeFigure(rep: TuningReport, theme: 'light' | 'dark'): { data: Data[]; layout: Layout } {
  const t = readTheme();
  const data: Data[] = [];
  const shapes: Record<string, unknown>[] = [];
  const annotations: Record<string, unknown>[] = [];
  for (const l of [...loops(rep, theme)].reverse()) {
    const b = l.rep.bode;
    const ln = { color: l.colour, width: l.key === 'current-d' ? 2.6 : 2, dash: l.key === 'current-d' ? 'dash' : 'solid' };
    data.push({ type: 'scatter', mode: 'lines', x: b.f_Hz, y: b.mag_dB, name: l.name, legendgroup: l.key, line: ln, hovertemplate: `${l.name}<br>%{x:.4g} Hz, %{y:.3g} dB<extra></extra>` });
    data.push({
      type: 'scatter',
      mode: 'lines',
      x: b.f_Hz,
      y: b.phase_deg,
      yaxis: 'y2',
      name: l.name,
      legendgroup: l.key,
      showlegend: false,
      line: ln,
      hovertemplate: `${l.name}<br>%{x:.4g} Hz, %{y:.4g}°<extra></extra>`,
    });
    const fc = l.rep.crossover_Hz;
    if (fc !== null && fc > 0) {
      shapes.push({ type: 'line', xref: 'x', yref: 'paper', x0: fc, x1: fc, y0: 0, y1: 1, line: { color: l.colour, width: 1, dash: 'dot' } });
      const pm = l.rep.phaseMargin_deg;
      if (pm !== null) {
        // the phase margin drawn as a bar from -180° up to the phase at crossover
        shapes.push({ type: 'line', xref: 'x', yref: 'y2', x0: fc, x1: fc, y0: -180, y1: -180 + pm, line: { color: l.colour, width: 4 } });
        annotations.push({ x: Math.log10(fc), y: -180 + pm, xref: 'x', yref: 'y2', text: `PM ${num(pm, 3)}°`, showarrow: true, arrowhead: 0, ax: 30, ay: -18, font: { size: 11, color: l.colour } });
      }
      annotations.push({ x: Math.log10(fc), y: 0, xref: 'x', yref: 'y', text: `${num(fc, 3)} Hz`, showarrow: true, arrowhead: 0, ax: 26, ay: -22, font: { size: 11, color: l.colour } });
    }
  }
  shapes.push({ type: 'line', xref: 'paper', yref: 'y', x0: 0, x1: 1, y0: 0, y1: 0, line: { color: t.ink, width: 1 } });
  shapes.push({ type: 'line', xref: 'paper', yref: 'y2', x0: 0, x1: 1, y0: -180, y1: -180, line: { color: t.bad, width: 1, dash: 'dash' } });
  const layout = baseLayout(t, {
    margin: { l: 70, r: 20, t: 20, b: 50 },
    hovermode: 'closest',
    xaxis: axis(t, 'frequency, Hz', { type: 'log', anchor: 'y2', dtick: 1, exponentformat: 'SI' }),
    yaxis: axis(t, 'open-loop gain, dB', { domain: [0.55, 1] }),
    // the x axis is shared: gain on top, phase below
    yaxis2: axis(t, 'open-loop phase, degrees', { domain: [0, 0.45], dtick: 90 }),
    legend: { orientation: 'h', x: 0, y: -0.12 },
    shapes,
    annotations,
  });
  return { data, layout };
}

export const TuningView = memo(function TuningView({ project, theme }: { project: ResolvedProject; theme: 'light' | 'dark' }) {
  const tuned = useMemo(() => {
    try {
      return { rep: tuneFromProject(project), error: null as string | null };
    } catch (e) {
      return { rep: null, error: isInputError(e) ? e.message : `Tuning failed: ${e instanceof Error ? e.message : String(e)}` };
    }
  }, [project]);
  const fig = useMemo(() => (tuned.rep ? bodeFigure(tuned.rep, theme) : null), [tuned, theme]);
  return (
    <div data-testid="view-tuning">
      <div className="cols">
        <div>
          <div className="card">
            <h4>Loops in</h4>
            {project.file.control === undefined && <div className="finding">No control section: the defaults are used (current bandwidth fCtrl/20, speed bandwidth a tenth of it).</div>}
            <InputSummary
              testId="tuning-inputs"
              items={CONTROL_SUMMARY.filter((i) => TUNING_INPUTS.includes(i.path))}
              note="Edited in the side panel (Control): click a name to go there."
            />
            <div className="hint" style={{ fontSize: 12 }}>
              Current PI by internal model control: Kp = L·ωc, Ki = Rs·ωc (hot winding). Gains can be given instead in the Control section.
            </div>
          </div>
          {tuned.rep && (
            <div className="card">
              <h4>Gains and margins out</h4>
              <table className="data" data-testid="tuning-table">
                <thead>
                  <tr>
                    <th />
                    {loops(tuned.rep, theme).map((l) => (
                      <th key={l.key} className="num">{l.name}</th>
                    ))}
                  </tr>
                </thead>
                <tbody>
                  {(
                    [
                      ['Kp', (l: Loop) => `${num(l.rep.Kp)} ${l.kpUnit}`],
                      ['Ki', (l: Loop) => `${num(l.rep.Ki)} ${l.kiUnit}`],
                      ['aimed bandwidth', (l: Loop) => `${num(l.rep.design_Hz)} Hz`],
                      ['closed-loop bandwidth (−3 dB)', (l: Loop) => (l.rep.phaseMargin_deg !== null && l.rep.phaseMargin_deg <= 0 ? '– (unstable)' : l.rep.bandwidth_Hz === null ? '–' : `${num(l.rep.bandwidth_Hz)} Hz`)],
                      ['gain crossover', (l: Loop) => (l.rep.crossover_Hz === null ? '–' : `${num(l.rep.crossover_Hz)} Hz`)],
                      ['phase margin', (l: Loop) => (l.rep.phaseMargin_deg === null ? '–' : `${num(l.rep.phaseMargin_deg, 3)}°`)],
                      ['gain margin', (l: Loop) => (l.rep.gainMargin_dB === null ? '–' : `${num(l.rep.gainMargin_dB, 3)} dB`)],
                      ['closed-loop peaking', (l: Loop) => (l.rep.peaking_dB === null ? '–' : `${num(l.rep.peaking_dB, 2)} dB`)],
                      ['phase margin, continuous approx.', (l: Loop) => (l.rep.continuous.phaseMargin_deg === null ? '–' : `${num(l.rep.continuous.phaseMargin_deg, 3)}°`)],
                    ] as Array<[string, (l: Loop) => string]>
                  ).map(([label, f]) => (
                    <tr key={label}>
                      <td>{label}</td>
                      {loops(tuned.rep!, theme).map((l) => (
                        <td key={l.key} className="num" data-cell={`${l.key}:${label}`}>{f(l)}</td>
                      ))}
                    </tr>
                  ))}
                </tbody>
              </table>
              <div className="hint" style={{ fontSize: 12, marginTop: 6 }}>
                Margins of the sampled loops as the controller runs them: discrete PI, zero-order hold, winding (and shaft) discretised,
                {' '}{num(tuned.rep.current.samplePeriod_s * 1e6)} µs period with {num(tuned.rep.currentDelay_s / tuned.rep.current.samplePeriod_s - 0.5)} period(s) of delay,
                up to half the sample rate. The continuous approximation (delay e^(−s·{num(tuned.rep.currentDelay_s * 1e6)} µs)) is shown for comparison.
                Speed rule uses an equivalent lag of {num(tuned.rep.speedLagEquivalent_s * 1e3)} ms.
              </div>
              {project.models.hot.linear !== null && <GainScheduleCard project={project} theme={theme} />}
            </div>
          )}
          {tuned.rep?.estimator && <EstimatorCard rep={tuned.rep} theme={theme} />}
          <div className="card" data-testid="tuning-warnings">
            <h4>Warnings</h4>
            {tuned.error && <div className="finding danger">{tuned.error}</div>}
            {tuned.rep && tuned.rep.warnings.length === 0 && <div className="finding">None: bandwidths below fCtrl/10, phase margins at or above 45°, gain margins at or above 6 dB, closed-loop peaking at most 3 dB.</div>}
            {tuned.rep?.warnings.map((w) => (
              <div key={w.code + w.message} className={`finding ${w.severity}`} data-code={w.code}>
                <strong>{severityPhrase(w.severity)}:</strong> {plainMessage(w.message)}
              </div>
            ))}
          </div>
          {project.models.hot.linear === null && <GainScheduleCard project={project} theme={theme} />}
          <CurrentTableCard project={project} />
        </div>
        <div className="card">
          <h4>Open loops: gain and phase</h4>
          {fig ? <Plot data={fig.data} layout={fig.layout} height={640} testId="bode-plot" /> : <div className="empty">No tuning.</div>}
        </div>
      </div>
    </div>
  );
});
