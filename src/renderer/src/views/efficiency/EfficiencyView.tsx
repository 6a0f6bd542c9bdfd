// Efficiency view: the contour map of motor, inverter or system efficiency over speed and shaft
// torque (motoring and generating) at the hot or cold corner, with the peak envelope and the
// requirement points; the map is solved in a Web Worker (progress, cancel), a hovered point's loss
// breakdown comes from the core's loss point. Exports: PNG/SVG with title and conditions, and CSV.
import { memo, useEffect, useMemo, useRef, useState } from 'react';
import { useWorkerRun } from '../../state/worker-run';
import { EFFICIENCY_APP_CSV_COLUMNS, efficiencyMapCsv } from '../../../../core/reports/efficiency-map-report';
import type { EfficiencyMap } from '../../../../core/steady-state/efficiency-map';
import { solveLossPoint, type LossPoint } from '../../../../core/steady-state/loss-point';
import { lossConditionsFromProject } from '../../../../core/project/loss-conditions-from-project';
import { bestPoint, GRID_POINTS_MAX, GRID_POINTS_MIN, type EfficiencyQuantity, type MapCorner } from '../../../../core/reports/efficiency-map-grid';
import { RAD_S_TO_RPM, RPM_TO_RAD_S } from '../../../../core/base/units';
import { CURVE, Plot, readTheme } from '../../components/Plot';
import { num } from '../../components/format';
import { exportPlotImage } from '../../components/image-export';
import { useExporter } from '../../state/exporter';
import { curveKey, type EnvelopeResults } from '../../state/compute';
import type { EfficiencyReply, EfficiencyRequest } from '../../workers/efficiency-protocol';
import { efficiencyFigure, lossBarFigure, QUANTITY_LABEL } from './efficiency-figures';

type Solved = { map: EfficiencyMap; corner: MapCorner; compute_ms: number; projectText: string };

const pct = (x: number | undefined): string => (x !== undefined && Number.isFinite(x) ? `${(100 * x).toFixed(1)} %` : '–');

export const EfficiencyView = memo(function EfficiencyView({ results, theme }: { results: EnvelopeResults; theme: 'light' | 'dark' }) {
  const exporter = useExporter();
  const project = results.project;
  const [quantity, setQuantity] = useState<EfficiencyQuantity>('system');
  const [corner, setCorner] = useState<MapCorner>('hot');
  const [points, setPoints] = useState(60);
  const [pointsText, setPointsText] = useState('60');
  const [solved, setSolved] = useState<Solved | null>(null);
  const [picked, setPicked] = useState<{ speed_rpm: number; torque_Nm: number } | null>(null);
  const el = useRef<HTMLDivElement | null>(null);
  const projectText = useMemo(() => JSON.stringify(project.file), [project]);

  const env = useMemo(() => {
    const find = (c: MapCorner, d: 'motoring' | 'generating') => results.curves.find((k) => k.key === curveKey(c, 'peak', d))!.env;
    let tmax = 0;
    for (const c of results.curves) if (c.current === 'peak') for (const t of c.env.torque) tmax = Math.max(tmax, Math.abs(t));
    return { motoring: find(corner, 'motoring'), generating: find(corner, 'generating'), corner, torqueMax: 1.05 * tmax };
  }, [results, corner]);

  const { run, start: startRun, cancel } = useWorkerRun<EfficiencyRequest, Omit<Extract<EfficiencyReply, { kind: 'done' }>, 'kind'>>('efficiency', (m) =>
    setSolved({ map: m.map, corner, compute_ms: m.compute_ms, projectText }),
  );
  const start = () =>
    startRun(new Worker(new URL('../../workers/efficiency-worker.ts', import.meta.url), { type: 'module' }), { kind: 'map', projectText, grid: { corner, points, speedMax: results.speedMax, torqueMax: env.torqueMax } });
  // solved again whenever the project, the corner or the grid changes (the last request wins)
  useEffect(() => {
    const h = setTimeout(start, 150);
    return () => clearTimeout(h);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [projectText, corner, points, results.speedMax, env.torqueMax]);

  const reqs = useMemo(() => project.requirements.map((r) => ({ label: r.label, speed_rpm: r.speed_rpm, torque_Nm: r.torque_Nm })), [project]);
  const fig = useMemo(
    () => (solved ? efficiencyFigure(solved.map, quantity, { motoring: env.motoring, generating: env.generating, corner: solved.corner }, reqs, readTheme(), CURVE[theme]) : null),
    [solved, quantity, env, reqs, theme],
  );
  const best = useMemo(() => (solved ? bestPoint(solved.map, quantity) : null), [solved, quantity]);
  const bestSystem = useMemo(() => (solved ? bestPoint(solved.map, 'system') : null), [solved]);

  // the hovered point's losses, by the core's loss point on the map's machine at the peak limits
  const point = useMemo((): { pt: LossPoint | null; error: string | null } | null => {
    if (!picked || !solved) return null;
    try {
      const m = project.models[solved.corner];
      return { pt: solveLossPoint(m, project.peak, lossConditionsFromProject(project), picked.speed_rpm * RPM_TO_RAD_S, picked.torque_Nm), error: null };
    } catch (e) {
      return { pt: null, error: e instanceof Error ? e.message : String(e) };
    }
  }, [picked, solved, project]);
  const bar = useMemo(() => (point?.pt?.feasible ? lossBarFigure(point.pt, readTheme(), CURVE[theme]) : null), [point, theme]);

  const save = (format: 'png' | 'svg') => {
    const c = solved?.corner ?? corner;
    const what = `${quantity} efficiency map, ${c} corner, least-current control at the peak limits`;
    if (el.current) void exportPlotImage(el.current, format, `efficiency-${quantity}-${c}`, project, exporter, what);
  };
  const saveCsv = () => {
    if (solved) void exporter.exportAndTell('envelope-csv', () => efficiencyMapCsv(solved.map, [], EFFICIENCY_APP_CSV_COLUMNS), `efficiency-map-${solved.corner}.csv`);
  };
  const commitPoints = (text: string) => {
    const n = Number(text);
    if (Number.isInteger(n) && n >= GRID_POINTS_MIN && n <= GRID_POINTS_MAX) setPoints(n);
  };
  const pointsBad = !(Number.isInteger(Number(pointsText)) && Number(pointsText) >= GRID_POINTS_MIN && Number(pointsText) <= GRID_POINTS_MAX);
  const stale = solved !== null && (solved.projectText !== projectText || solved.corner !== corner);

  return (
    <div data-testid="view-efficiency">
      <div className="toolbar no-print">
        <label>
          Efficiency{' '}
          <select data-testid="eff-quantity" value={quantity} onChange={(e) => setQuantity(e.target.value as EfficiencyQuantity)}>
            <option value="system">system</option>
            <option value="motor">motor</option>
            <option value="inverter">inverter</option>
          </select>
        </label>
        <label>
          Corner{' '}
          <select data-testid="eff-corner" value={corner} onChange={(e) => setCorner(e.target.value as MapCorner)}>
            <option value="hot">hot</option>
            <option value="cold">cold</option>
          </select>
        </label>
        <label title={`points per axis, ${GRID_POINTS_MIN} to ${GRID_POINTS_MAX}`}>
          Grid{' '}
          <input
            data-testid="eff-points"
            style={{ width: 56 }}
            className={pointsBad ? 'bad' : undefined}
            value={pointsText}
            onChange={(e) => setPointsText(e.target.value)}
            onBlur={(e) => commitPoints(e.target.value)}
            onKeyDown={(e) => e.key === 'Enter' && commitPoints((e.target as HTMLInputElement).value)}
          />{' '}
          × same
        </label>
        <button className="btn" data-testid="eff-run" onClick={start} disabled={run.kind === 'running'}>Compute</button>
        <button className="btn danger" data-testid="eff-cancel" disabled={run.kind !== 'running'} onClick={cancel}>Cancel</button>
        {run.kind === 'running' && (
          <span>
            <progress className="progress" data-testid="eff-progress" max={1} value={run.fraction} /> {Math.round(run.fraction * 100)} %
          </span>
        )}
        {run.kind === 'cancelled' && <span data-testid="eff-cancelled">Cancelled; the previous map (if any) is shown.</span>}
        <span className="spacer" style={{ flex: 1 }} />
        <button className="btn small" onClick={() => save('png')} disabled={!solved} data-testid="eff-png">PNG</button>
        <button className="btn small" onClick={() => save('svg')} disabled={!solved} data-testid="eff-svg">SVG</button>
        <button className="btn small" onClick={saveCsv} disabled={!solved} data-testid="eff-csv">CSV</button>
      </div>
      {pointsBad && <div className="finding warning">Grid: give a whole number of points per axis from {GRID_POINTS_MIN} to {GRID_POINTS_MAX}.</div>}
      {run.kind === 'error' && <div className="finding danger" data-testid="eff-error">{run.message}</div>}
      <div className="key" data-testid="eff-conditions">
        <span>
          {corner === 'hot' ? `Hot corner: winding at ${project.conditions.windingTemp_C} °C, magnet at ${project.conditions.magnetTemp_C} °C` : `Cold corner: winding and magnet at ${project.conditions.coldTemp_C} °C`}; least-current control (MTPA, field weakening) at the peak
          limits ({num(project.peak.Imax)} A peak, {num(project.peak.Vmax)} V peak phase), bus {num(project.inverter.Vdc)} V. Generating: electrical out over
          mechanical in. Contours every 2 % from 70 % (lower values in the lowest colour).
          {solved && ` ${solved.map.speeds.length} × ${solved.map.torques.length} points in ${solved.compute_ms.toFixed(0)} ms.`}
          {stale && ' (Recomputing for the edited project.)'}
        </span>
      </div>
      {solved && (
        <div className="key" data-testid="eff-peak">
          <span data-testid="eff-peak-system" data-value={bestSystem?.value ?? ''}>
            {`Peak system efficiency ${pct(bestSystem?.value)}`}
            {bestSystem && ` at ${Math.round(bestSystem.speed * RAD_S_TO_RPM)} rpm, ${num(bestSystem.torque)} N·m`}
          </span>
          {quantity !== 'system' && best && (
            <span data-testid="eff-peak-shown">
              {`; peak ${quantity} efficiency ${pct(best.value)} at ${Math.round(best.speed * RAD_S_TO_RPM)} rpm, ${num(best.torque)} N·m`}
            </span>
          )}
        </div>
      )}
      <div style={{ display: 'grid', gridTemplateColumns: 'minmax(0, 2fr) minmax(0, 1fr)', gap: 12 }}>
        <div className="card">
          <h4>{QUANTITY_LABEL[quantity]} efficiency over speed and shaft torque</h4>
          {fig ? (
            <Plot
              data={fig.data}
              layout={fig.layout}
              height={560}
              testId="efficiency-plot"
              elRef={(e) => (el.current = e)}
              onHover={(ev: { points?: Array<{ x?: unknown; y?: unknown }> }) => {
                const p = ev.points?.[0];
                if (p && typeof p.x === 'number' && typeof p.y === 'number') setPicked({ speed_rpm: p.x, torque_Nm: p.y });
              }}
            />
          ) : (
            <div className="empty">{run.kind === 'running' ? 'Computing the map…' : 'No map yet.'}</div>
          )}
        </div>
        <div className="card" data-testid="eff-point">
          <h4>Losses at a point (hover the map)</h4>
          {!point && <div className="hint">Hover a point of the map to see its losses.</div>}
          {point?.error && <div className="finding danger">{point.error}</div>}
          {point?.pt && !point.pt.feasible && (
            <div className="hint" data-testid="eff-point-outside">
              {Math.round(picked!.speed_rpm)} rpm, {num(picked!.torque_Nm)} N·m is outside the envelope (limited by {point.pt.limitedBy}).
            </div>
          )}
          {point?.pt?.feasible && bar && (
            <>
              <div className="hint" data-testid="eff-point-label">
                {Math.round(picked!.speed_rpm)} rpm, {num(picked!.torque_Nm)} N·m shaft ({num(point.pt.torqueEm_Nm)} N·m electromagnetic), {num(point.pt.current)} A peak,
                power factor {num(point.pt.powerFactor, 3)}, DC link {num(point.pt.dcPower_W)} W.
              </div>
              <Plot data={bar.data} layout={bar.layout} height={300} testId="eff-loss-bar" />
              <table className="data compact" data-testid="eff-point-table">
                <tbody>
                  <tr><td>motor efficiency</td><td className="num">{pct(point.pt.efficiency.motor)}</td></tr>
                  <tr><td>inverter efficiency</td><td className="num">{pct(point.pt.efficiency.inverter)}</td></tr>
                  <tr><td>system efficiency</td><td className="num">{pct(point.pt.efficiency.system)}</td></tr>
                  <tr><td>total loss</td><td className="num">{num(point.pt.losses.copper_W + point.pt.losses.iron_W + point.pt.losses.mechanical_W + point.pt.losses.inverter_W)} W</td></tr>
                </tbody>
              </table>
            </>
          )}
        </div>
      </div>
    </div>
  );
});
