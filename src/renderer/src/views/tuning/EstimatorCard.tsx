// The tuning view's card of the angle estimator (control.angle other than ideal): the type II loop's
// gains and margins (closed forms), the speed estimate's bandwidth, and the speed loop's open loop
// with and without the estimator's lag (core/control/estimator-loop.ts).
import { memo, useMemo } from 'react';
import type { Data } from 'plotly.js-dist-min';
import type { TuningReport } from '../../../../core/control/tuning';
import { axis, baseLayout, CURVE, Plot, readTheme } from '../../components/Plot';
import { num } from '../../components/format';

const dash = (x: number | null, unit: string, digits?: number): string => (x === null ? '–' : `${num(x, digits)} ${unit}`);

export const EstimatorCard = memo(function EstimatorCard({ rep, theme }: { rep: TuningReport; theme: 'light' | 'dark' }) {
  const e = rep.estimator;
  const fig = useMemo(() => {
    if (!e) return null;
    const t = readTheme();
    const col = CURVE[theme];
    const s = rep.speed.bode, w = e.speedLoop.bode;
    const data: Data[] = [
      { type: 'scatter', mode: 'lines', x: s.f_Hz, y: s.mag_dB, name: 'speed loop, true speed', line: { color: col.volt, width: 2 } },
      { type: 'scatter', mode: 'lines', x: w.f_Hz, y: w.mag_dB, name: `speed loop through the ${e.source}`, line: { color: col.iq, width: 2, dash: 'dash' } },
      { type: 'scatter', mode: 'lines', x: s.f_Hz, y: s.phase_deg, yaxis: 'y2', showlegend: false, name: 'speed loop, true speed', line: { color: col.volt, width: 2 } },
      { type: 'scatter', mode: 'lines', x: w.f_Hz, y: w.phase_deg, yaxis: 'y2', showlegend: false, name: `speed loop through the ${e.source}`, line: { color: col.iq, width: 2, dash: 'dash' } },
    ];
    const layout = baseLayout(t, {
      margin: { l: 70, r: 20, t: 10, b: 50 },
      xaxis: axis(t, 'frequency, Hz', { type: 'log', anchor: 'y2', dtick: 1, exponentformat: 'SI' }),
      yaxis: axis(t, 'open-loop gain, dB', { domain: [0.55, 1] }),
      yaxis2: axis(t, 'phase, degrees', { domain: [0, 0.45], dtick: 90 }),
      legend: { orientation: 'h', x: 0, y: -0.2 },
      shapes: [
        { type: 'line', xref: 'paper', yref: 'y', x0: 0, x1: 1, y0: 0, y1: 0, line: { color: t.ink, width: 1 } },
        { type: 'line', xref: 'paper', yref: 'y2', x0: 0, x1: 1, y0: -180, y1: -180, line: { color: t.bad, width: 1, dash: 'dash' } },
      ],
    });
    return { data, layout };
  }, [e, rep, theme]);
  if (!e) return null;
  const rows: Array<[string, string]> = [
    ['source', e.source],
    ...(e.kp !== null
      ? ([
          ['type II loop kp = 2ζωn', dash(e.kp, '1/s')],
          ['ki = ωn²', dash(e.ki, '1/s²')],
          ['natural frequency ωn, damping ζ', `${num(e.naturalFrequency_rad_s!)} rad/s, ${num(e.damping!, 3)}`],
          ['angle bandwidth (−3 dB)', dash(e.angleBandwidth_Hz, 'Hz')],
          ['loop crossover, phase margin', `${dash(e.crossover_Hz, 'Hz')}, ${dash(e.phaseMargin_deg, '°', 3)}`],
        ] as Array<[string, string]>)
      : []),
    ['speed estimate bandwidth (−3 dB)', dash(e.speedBandwidth_Hz, 'Hz')],
    ['speed loop through it: crossover', dash(e.speedLoop.crossover_Hz, 'Hz')],
    ['speed loop through it: phase margin', `${dash(e.speedLoop.phaseMargin_deg, '°', 3)} (${dash(rep.speed.phaseMargin_deg, '°', 3)} on the true speed)`],
  ];
  return (
    <div className="card" data-testid="tuning-estimator">
      <h4>Angle estimator</h4>
      <table className="data compact">
        <tbody>
          {rows.map(([k, v]) => (
            <tr key={k}>
              <td>{k}</td>
              <td className="num" data-cell={`estimator:${k}`}>{v}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <div className="hint" style={{ fontSize: 12, marginTop: 6 }}>
        Type II loop: kp = 2ζωn, ki = ωn², crossover and phase margin in closed form. An encoder&apos;s speed is the mean over its window
        (and its filter). The speed loop&apos;s sampled open loop is shown with and without the estimator&apos;s lag.
      </div>
      {fig && <Plot data={fig.data} layout={fig.layout} height={360} testId="estimator-bode-plot" />}
    </div>
  );
});
