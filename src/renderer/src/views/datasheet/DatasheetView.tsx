// Datasheet view: summary table, sizing verdict per requirement, cautions, the envelope plot, the
// system-efficiency map for a project with losses; export PNG/SVG/CSV and a print layout.
import { memo, useMemo, useRef } from 'react';
import { RAD_S_TO_RPM, SQRT2 } from '../../../../core/base/units';
import { Plot } from '../../components/Plot';
import { pointVerdict, type Results } from '../../state/compute';
import { torqueSpeedFigure } from '../../components/torque-speed-figure';
import { Cautions, isHazard } from '../../components/cautions';
import { envelopeCsv } from '../../components/exports';
import { useExporter } from '../../state/exporter';
import { amps, fixed, num, rpm } from '../../components/format';
import { describeLimits } from '../../../../core/drive/current-limits';
import { exportDatasheetHtml, exportPlotImage } from '../../components/image-export';
import { limitPhrase } from '../../../../core/reports/phrases';
import { figureConditions, isoDate } from '../../../../core/reports/figure-conditions';
import { TableStepField } from '../../components/TableStepField';
import { PrintCharts } from '../../components/PrintCharts';
import { datasheetEfficiencyOf } from '../../../../core/reports/datasheet-parts';
import { DatasheetEfficiencyCard, useDatasheetEfficiency } from './DatasheetEfficiency';

function peakOf(a: Float64Array, feasible: Uint8Array): number {
  let best = 0;
  for (let k = 0; k < a.length; k++) if (feasible[k] && Math.abs(a[k]!) > Math.abs(best)) best = a[k]!;
  return best;
}

/** An electrical time constant L/Rs, ms; with Rs = 0 it has no bound. */
export const tau = (s: number): string => (Number.isFinite(s) && s >= 0 ? `${num(s * 1e3)} ms` : 'unbounded (Rs = 0)');

/** `tableStep`: the step of the envelope tables (rpm; undefined: the default), kept by the app across views. */
export const DatasheetView = memo(function DatasheetView({ results, theme, tableStep, setTableStep }: { results: Results; theme: 'light' | 'dark'; tableStep: number | undefined; setTableStep: (step_rpm: number | undefined) => void }) {
  const exporter = useExporter();
  const plotEl = useRef<HTMLDivElement | null>(null);
  const p = results.project;
  const fig = useMemo(() => torqueSpeedFigure(results, theme, { peak: true, continuous: true, hot: true, cold: true, generating: true }, false, 330), [results, theme]);
  const peakHot = results.main;
  const contHot = results.curves.find((c) => c.key === 'continuous-hot-motoring')!.env;
  const c = results.constantsHot;
  const c20 = results.constantsCold;
  const s = results.safety;
  const efficiency = useDatasheetEfficiency(results);
  // the exported page carries the map the CLI's datasheet carries: the worker's, or solved here if it is not in yet
  const exportHtml = () => {
    const e = efficiency.grid === null ? null : efficiency.efficiency ?? datasheetEfficiencyOf(results);
    void exportDatasheetHtml(e ? { ...results, efficiency: e } : results, tableStep, exporter);
  };
  const exportImage = async (format: 'png' | 'svg') => {
    if (!plotEl.current) return;
    await exportPlotImage(plotEl.current, format, 'datasheet-envelope', p, exporter);
  };
  const rows: Array<[string, string]> = [
    ['pole pairs', `${p.hot.polePairs} (${2 * p.hot.polePairs} poles)`],
    ['Rs per phase', `${num(p.machine20.Rs * 1e3)} mΩ at 20 °C, ${num(p.hot.Rs * 1e3)} mΩ at ${p.conditions.windingTemp_C} °C`],
    ['Ld, Lq', `${num(p.hot.Ld * 1e3)} mH, ${num(p.hot.Lq * 1e3)} mH (saliency Lq/Ld ${num(c.saliency, 3)})`],
    ['ψm (peak)', `${num(p.machine20.psiM * 1e3)} mWb at 20 °C, ${num(p.hot.psiM * 1e3)} mWb at ${p.conditions.magnetTemp_C} °C, ${num(p.cold.psiM * 1e3)} mWb at ${p.conditions.coldTemp_C} °C`],
    ['Kt (id = 0, hot)', `${num(c.Kt_Nm_per_Arms)} N·m/A rms (${num(c.Kt_Nm_per_Apeak)} N·m/A peak)`],
    ['Ke (cold)', `${num(c20.Ke_VLLrms_per_krpm)} V line-line rms per 1000 rpm`],
    ['electrical time constants', `τd ${tau(c.tauD_s)}, τq ${tau(c.tauQ_s)} (hot)`],
    ['characteristic current ψm/Ld', `${amps(c.characteristicCurrent_A)}, hot; inverter Imax ${amps(p.inverter.Imax)}`],
    ['inverter', `${num(p.inverter.Vdc)} V bus, ${p.inverter.modulation}, Vmax ${num(p.peak.Vmax)} V peak phase; Imax ${amps(p.inverter.Imax)}, Icont ${amps(p.inverter.Icont)}`],
    ['effective current limits', describeLimits(p.currentLimits).replace(/^current limits: /, '')],
    ['base speed (peak current, hot)', rpm(peakHot.baseSpeed)],
    ['maximum speed (peak current, hot)', peakHot.maxSpeed === null ? 'unbounded (ψm/Ld below Imax)' : rpm(peakHot.maxSpeed)],
    ['peak torque (hot, standstill)', `${num(peakHot.torque[0])} N·m`],
    ['continuous torque (hot, standstill)', `${num(contHot.torque[0])} N·m`],
    ['peak power (hot)', `${num(peakOf(peakHot.power, peakHot.feasible) / 1000)} kW`],
    ['continuous power (hot)', `${num(peakOf(contHot.power, contHot.feasible) / 1000)} kW`],
    ['least Imax for all points', results.sizing.minImax === null || !Number.isFinite(results.sizing.minImax) ? 'no current meets all points' : amps(results.sizing.minImax)],
    ['least Vdc for all points', results.sizing.minVdc === null || !Number.isFinite(results.sizing.minVdc) ? '–' : `${num(results.sizing.minVdc)} V`],
    ['open-circuit back-EMF, cold', `${num(s.backEmfLineLinePeak_V)} V line-line peak at ${rpm(results.safetySpeed)} (${p.rated.maxSpeed_rad_s !== undefined ? 'rated maximum speed' : 'plot end'}), bus ${num(p.inverter.Vdc)} V`],
    ['uncontrolled-generator speed, cold', s.uncontrolledGeneratorSpeed_rad_s === null ? 'none (no magnet flux)' : rpm(s.uncontrolledGeneratorSpeed_rad_s)],
  ];
  return (
    <div data-testid="view-datasheet">
      <div className="print-only" style={{ fontSize: 10, marginBottom: 4 }} data-testid="print-conditions">
        {figureConditions(p, { date: isoDate(new Date()) }).map((line) => <div key={line}>{line}</div>)}
        <div>Speeds mechanical; currents peak phase with rms beside.</div>
      </div>
      <div className="toolbar no-print">
        <button className="btn" onClick={() => window.print()} data-testid="print">Print…</button>
        <button className="btn" onClick={() => void exportImage('png')}>Plot PNG</button>
        <button className="btn" onClick={() => void exportImage('svg')}>Plot SVG</button>
        <button className="btn" onClick={() => void exporter.exportAndTell('envelope-csv', () => envelopeCsv(results), 'envelope.csv')}>Envelope CSV</button>
        <button className="btn" data-testid="export-datasheet" onClick={exportHtml}>Datasheet HTML</button>
        <TableStepField speedMax={results.speedMax} step={tableStep} onStep={setTableStep} />
      </div>
      <div className="sheet-head">
        <h2>{p.name || 'Unnamed project'}</h2>
        <span className="hint">hot corner: winding {p.conditions.windingTemp_C} °C, magnet {p.conditions.magnetTemp_C} °C; cold corner {p.conditions.coldTemp_C} °C</span>
      </div>
      <Cautions results={results} testId="datasheet-cautions" />
      {!results.project.findings.concat(s.findings).some(isHazard) && <div className="caution">{s.caution}</div>}
      <div className="cols">
        <div className="card">
          <h4>Summary</h4>
          <table className="data" data-testid="summary">
            <tbody>
              {rows.map(([k, v]) => (
                <tr key={k}>
                  <th style={{ fontWeight: 500 }}>{k}</th>
                  <td>{v}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <div className="card">
          <h4>Torque against speed</h4>
          <div className="no-print">
            <Plot data={fig.data} layout={fig.layout} height={420} testId="datasheet-plot" elRef={(el) => (plotEl.current = el)} />
          </div>
          <PrintCharts results={results} />
        </div>
      </div>
      <DatasheetEfficiencyCard results={results} state={efficiency} />
      <div className="card">
        <h4>Sizing verdict per requirement (each against the current limit of its duty, peak unless marked continuous; figures for the hot magnet, verdicts hot and cold)</h4>
        <div className="table-scroll">
          <table className="data compact" data-testid="verdicts">
            <thead>
              <tr>
                <th>point</th>
                <th className="num">speed</th>
                <th className="num">torque asked</th>
                <th className="num">available</th>
                <th className="num">current</th>
                <th className="num">current headroom</th>
                <th className="num">voltage</th>
                <th className="num">voltage headroom</th>
                <th>limited by</th>
                <th>hot</th>
                <th>cold</th>
              </tr>
            </thead>
            <tbody>
              {results.sizing.points.map((pt, i) => {
                const cold = results.sizingCold.points[i];
                const v = pointVerdict(results, i);
                return (
                  <tr key={i} data-testid={`verdict-${i}`} data-met={v.met ? 'yes' : 'no'}>
                    <td>{pt.label}{pt.duty === 'continuous' ? ' (continuous)' : ''}</td>
                    <td className="num">{num(pt.speed_rpm)} rpm</td>
                    <td className="num">{num(pt.torque_Nm)} N·m</td>
                    <td className="num">{num(pt.torqueAvailable_Nm)} N·m</td>
                    <td className="num">
                      {num(pt.current_A)} A pk<br />
                      {num(pt.current_A / SQRT2)} A rms
                    </td>
                    <td className="num">{pt.currentHeadroom_A === null ? '–' : `${fixed(pt.currentHeadroom_A, 1)} A pk`}</td>
                    {/* a point out of reach has no operating voltage: what the solver reports there is the need, not a state */}
                    <td className="num" title={pt.met ? undefined : 'not reachable: no operating voltage'}>{pt.met ? `${num(pt.voltage_V)} V pk` : '–'}</td>
                    <td className="num">{pt.met ? `${fixed(pt.voltageHeadroom_V, 1)} V` : '–'}</td>
                    <td title={pt.headroomNote}>{pt.met ? (pt.limitedBy === 'none' ? '–' : 'field weakening') : limitPhrase(pt.limitedBy)}</td>
                    <td className={pt.met ? 'pass' : 'fail'}>{pt.met ? 'met' : 'NOT met'}</td>
                    <td className={cold?.met ? 'pass' : 'fail'} title={cold && !cold.met ? `cold magnet: ${limitPhrase(cold.limitedBy)}, ${num(cold.torqueAvailable_Nm)} N·m available` : undefined}>
                      {cold?.met ? 'met' : 'NOT met'}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
        <div className="hint" style={{ fontSize: 12 }}>
          Speeds mechanical; currents peak phase (amplitude-invariant dq) with rms beside; voltages peak phase. Plot spans 0 to {Math.round(results.speedMax * RAD_S_TO_RPM)} rpm.
        </div>
      </div>
    </div>
  );
});
