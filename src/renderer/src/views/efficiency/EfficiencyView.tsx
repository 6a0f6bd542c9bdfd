// Efficiency view: the contour map of motor, inverter or system efficiency over speed and shaft
// torque (motoring and generating) at the hot or cold corner, with least-current or loss-minimising
// control, or of the loss saved by loss-minimising control (W); with the peak envelope, the
// requirement points and the chosen point. The map is solved in a Web Worker (progress, cancel); a
// clicked point's loss breakdown (hover previews it) comes from the core's loss point. Exports:
// PNG/SVG with title and conditions, and CSV.
import { memo, useEffect, useMemo, useRef, useState } from 'react';
import { useWorkerRun } from '../../state/worker-run';
import { EFFICIENCY_APP_CSV_COLUMNS, EFFICIENCY_GAIN_CSV_COLUMNS, efficiencyMapCsv } from '../../../../core/reports/efficiency-map-report';
import type { EfficiencyMap, MapControl } from '../../../../core/steady-state/efficiency-map';
import type { MinLossGainMap } from '../../../../core/steady-state/min-loss-gain-map';
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
import { efficiencyFigure, LOSS_SAVED_LABEL, lossBarFigure, lossSavedFigure, type ChosenMark, type MapQuantity, QUANTITY_LABEL } from './efficiency-figures';

type Solved = { map: EfficiencyMap; gain: MinLossGainMap | null; corner: MapCorner; control: MapControl; points: number; compute_ms: number; projectText: string };

const CONTROL_TEXT: Record<MapControl, string> = {
  'least-current': 'least-current control (MTPA, field weakening)',
  'min-loss': 'loss-minimising control (least copper + iron + inverter loss within both limits)',
};

/** A plotly hover or click event's first point as a map point, or null. */
function eventPoint(ev: { points?: Array<{ x?: unknown; y?: unknown }> }): ChosenMark | null {
  const p = ev.points?.[0];
  return p && typeof p.x === 'number' && typeof p.y === 'number' ? { speed_rpm: p.x, torque_Nm: p.y } : null;
}

const pct = (x: number | undefined): string => (x !== undefined && Number.isFinite(x) ? `${(100 * x).toFixed(1)} %` : '–');

export const EfficiencyView = memo(function EfficiencyView({ results, theme }: { results: EnvelopeResults; theme: 'light' | 'dark' }) {
  const exporter = useExporter();
  const project = results.project;
  const [quantity, setQuantity] = useState<MapQuantity>('system');
  const [control, setControl] = useState<MapControl>('least-current');
  const [corner, setCorner] = useState<MapCorner>('hot');
  const [points, setPoints] = useState(60);
  const [pointsText, setPointsText] = useState('60');
  const [solved, setSolved] = useState<Solved | null>(null);
  // the clicked point stays until the next click; a hovered point previews its losses meanwhile
  const [chosen, setChosen] = useState<ChosenMark | null>(null);
  const [hovered, setHovered] = useState<ChosenMark | null>(null);
  const picked = hovered ?? chosen;
  const needGain = quantity === 'lossSaved';
  const el = useRef<HTMLDivElement | null>(null);
  const projectText = useMemo(() => JSON.stringify(project.file), [project]);

  const env = useMemo(() => {
    const find = (c: MapCorner, d: 'motoring' | 'generating') => results.curves.find((k) => k.key === curveKey(c, 'peak', d))!.env;
    let tmax = 0;
    for (const c of results.curves) if (c.current === 'peak') for (const t of c.env.torque) tmax = Math.max(tmax, Math.abs(t));
    return { motoring: find(corner, 'motoring'), generating: find(corner, 'generating'), corner, torqueMax: 1.05 * tmax };
  }, [results, corner]);

  const { run, start: startRun, cancel } = useWorkerRun<EfficiencyRequest, Omit<Extract<EfficiencyReply, { kind: 'done' }>, 'kind'>>('efficiency', (m) =>
    setSolved({ map: m.map, gain: m.gain, compute_ms: m.compute_ms, ...asked.current }),
  );
  // what the running map was asked with (a setting changed while it runs labels only the next map)
  const asked = useRef({ corner, control, points, projectText });
  const start = () => {
    asked.current = { corner, control, points, projectText };
    startRun(new Worker(new URL('../../workers/efficiency-worker.ts', import.meta.url), { type: 'module' }), {
      kind: 'map', projectText, grid: { corner, points, speedMax: results.speedMax, torqueMax: env.torqueMax }, control, gain: needGain,
    });
  };
  // solved again whenever the project, the corner, the grid or the control changes, or the gain is first
  // asked for (the last request wins); a map that already holds the gain serves the efficiencies too
  const gainHeld = solved !== null && solved.gain !== null && solved.projectText === projectText && solved.corner === corner && solved.points === points && solved.control === control;
  useEffect(() => {
    if (gainHeld && run.kind !== 'running') return;
    const h = setTimeout(start, 150);
    return () => clearTimeout(h);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [projectText, corner, points, results.speedMax, env.torqueMax, control, needGain]);

  const reqs = useMemo(() => project.requirements.map((r) => ({ label: r.label, speed_rpm: r.speed_rpm, torque_Nm: r.torque_Nm })), [project]);
  const effQuantity: EfficiencyQuantity = quantity === 'lossSaved' ? 'system' : quantity;
  const fig = useMemo(() => {
    if (!solved) return null;
    const e = { motoring: env.motoring, generating: env.generating, corner: solved.corner };
    if (quantity === 'lossSaved') return solved.gain ? lossSavedFigure(solved.gain, e, reqs, readTheme(), CURVE[theme], chosen) : null;
    return efficiencyFigure(solved.map, quantity, e, reqs, readTheme(), CURVE[theme], chosen);
  }, [solved, quantity, env, reqs, theme, chosen]);
  const best = useMemo(() => (solved ? bestPoint(solved.map, effQuantity) : null), [solved, effQuantity]);
  const mostSaved = useMemo(() => {
    const g = solved?.gain;
    if (!g) return null;
    let at = -1;
    for (let k = 0; k < g.feasible.length; k++) if (g.feasible[k] === 1 && (at < 0 || g.lossSaved[k]! > g.lossSaved[at]!)) at = k;
    const nT = g.torques.length;
    return at < 0 ? null : { value: g.lossSaved[at]!, gain_pts: g.systemGain_pts[at]!, speed: g.speeds[Math.floor(at / nT)]!, torque: g.torques[at % nT]! };
  }, [solved]);
  const bestSystem = useMemo(() => (solved ? bestPoint(solved.map, 'system') : null), [solved]);

  // the shown point's losses, by the core's loss point on the map's machine at the peak limits, with the
  // map's control; for the loss saved, under both rules
  const point = useMemo((): { pt: LossPoint | null; other: LossPoint | null; error: string | null } | null => {
    if (!picked || !solved) return null;
    try {
      const m = project.models[solved.corner];
      const c = lossConditionsFromProject(project);
      const w = picked.speed_rpm * RPM_TO_RAD_S;
      const solve = (minLoss: boolean) => solveLossPoint(m, project.peak, c, w, picked.torque_Nm, { minLoss });
      if (quantity === 'lossSaved') return { pt: solve(false), other: solve(true), error: null };
      return { pt: solve(solved.control === 'min-loss'), other: null, error: null };
    } catch (e) {
      return { pt: null, other: null, error: e instanceof Error ? e.message : String(e) };
    }
  }, [picked, solved, project, quantity]);
  const bar = useMemo(() => (point?.pt?.feasible ? lossBarFigure(point.pt, readTheme(), CURVE[theme], point.other?.feasible ? point.other : undefined) : null), [point, theme]);
  const totalLoss = (p: LossPoint) => p.losses.copper_W + p.losses.iron_W + p.losses.mechanical_W + p.losses.inverter_W;

  const save = (format: 'png' | 'svg') => {
    const c = solved?.corner ?? corner;
    const ctl = solved?.control ?? control;
    const what = quantity === 'lossSaved'
      ? `${LOSS_SAVED_LABEL} over least-current control (W), ${c} corner, at the peak limits`
      : `${quantity} efficiency map, ${c} corner, ${CONTROL_TEXT[ctl].replace(/ \(.*\)$/, '')} at the peak limits`;
    if (el.current) void exportPlotImage(el.current, format, `efficiency-${quantity}-${c}${ctl === 'min-loss' ? '-min-loss' : ''}`, project, exporter, what);
  };
  const saveCsv = () => {
    if (!solved) return;
    const columns = solved.gain ? [...EFFICIENCY_APP_CSV_COLUMNS, ...EFFICIENCY_GAIN_CSV_COLUMNS] : EFFICIENCY_APP_CSV_COLUMNS;
    void exporter.exportAndTell('efficiency-csv', () => efficiencyMapCsv(solved.map, [], columns, solved.gain ?? undefined), `efficiency-map-${solved.corner}${solved.control === 'min-loss' ? '-min-loss' : ''}.csv`);
  };
  const commitPoints = (text: string) => {
    const n = Number(text);
    if (Number.isInteger(n) && n >= GRID_POINTS_MIN && n <= GRID_POINTS_MAX) setPoints(n);
  };
  const pointsBad = !(Number.isInteger(Number(pointsText)) && Number(pointsText) >= GRID_POINTS_MIN && Number(pointsText) <= GRID_POINTS_MAX);
  const stale = solved !== null && (solved.projectText !== projectText || solved.corner !== corner || solved.control !== control || (needGain && !solved.gain));

  return (
    <div data-testid="view-efficiency">
      <div className="toolbar no-print">
        <label>
          Show{' '}
          <select data-testid="eff-quantity" value={quantity} onChange={(e) => setQuantity(e.target.value as MapQuantity)}>
            <option value="system">system efficiency</option>
            <option value="motor">motor efficiency</option>
            <option value="inverter">inverter efficiency</option>
            <option value="lossSaved">{LOSS_SAVED_LABEL} (W)</option>
          </select>
        </label>
        <label title="the rule that chooses the current at each point">
          Control{' '}
          <select data-testid="eff-control" value={control} onChange={(e) => setControl(e.target.value as MapControl)}>
            <option value="least-current">least current</option>
            <option value="min-loss">loss-minimising</option>
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
        <span style={{ display: 'inline-flex', gap: 6 }}>
          <button className="btn small" onClick={() => save('png')} disabled={!solved} data-testid="eff-png">PNG</button>
          <button className="btn small" onClick={() => save('svg')} disabled={!solved} data-testid="eff-svg">SVG</button>
          <button className="btn small" onClick={saveCsv} disabled={!solved} data-testid="eff-csv">CSV</button>
        </span>
      </div>
      {pointsBad && <div className="finding warning">Grid: give a whole number of points per axis from {GRID_POINTS_MIN} to {GRID_POINTS_MAX}.</div>}
      {run.kind === 'error' && <div className="finding danger" data-testid="eff-error">{run.message}</div>}
      <div className="key" data-testid="eff-conditions">
        <span>
          {corner === 'hot' ? `Hot corner: winding at ${project.conditions.windingTemp_C} °C, magnet at ${project.conditions.magnetTemp_C} °C` : `Cold corner: winding and magnet at ${project.conditions.coldTemp_C} °C`}; {quantity === 'lossSaved' ? `loss saved by ${CONTROL_TEXT['min-loss']} over ${CONTROL_TEXT['least-current']}, W,` : CONTROL_TEXT[solved?.control ?? control]} at the peak
          limits ({num(project.peak.Imax)} A peak, {num(project.peak.Vmax)} V peak phase), bus {num(project.inverter.Vdc)} V. Generating: electrical out over
          mechanical in. {quantity === 'lossSaved' ? 'Contours in W from 0.' : 'Contours every 2 % from 70 % (lower values in the lowest colour).'}
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
          {quantity === 'lossSaved' && mostSaved && (
            <span data-testid="eff-most-saved" data-value={mostSaved.value}>
              {`; loss-minimising control saves up to ${num(mostSaved.value)} W (${mostSaved.gain_pts.toFixed(2)} points of system efficiency) at ${Math.round(mostSaved.speed * RAD_S_TO_RPM)} rpm, ${num(mostSaved.torque)} N·m`}
            </span>
          )}
          {quantity !== 'system' && quantity !== 'lossSaved' && best && (
            <span data-testid="eff-peak-shown">
              {`; peak ${quantity} efficiency ${pct(best.value)} at ${Math.round(best.speed * RAD_S_TO_RPM)} rpm, ${num(best.torque)} N·m`}
            </span>
          )}
        </div>
      )}
      <div style={{ display: 'grid', gridTemplateColumns: 'minmax(0, 2fr) minmax(0, 1fr)', gap: 12 }}>
        <div className="card">
          <h4>{quantity === 'lossSaved' ? `${LOSS_SAVED_LABEL[0]!.toUpperCase()}${LOSS_SAVED_LABEL.slice(1)}, W, over speed and shaft torque` : `${QUANTITY_LABEL[quantity]} efficiency over speed and shaft torque`}</h4>
          {fig ? (
            <Plot
              data={fig.data}
              layout={fig.layout}
              height={560}
              testId="efficiency-plot"
              elRef={(e) => (el.current = e)}
              onHover={(ev: { points?: Array<{ x?: unknown; y?: unknown }> }) => {
                const p = eventPoint(ev);
                if (p) setHovered(p);
              }}
              onUnhover={() => setHovered(null)}
              onClick={(ev: { points?: Array<{ x?: unknown; y?: unknown }> }) => {
                const p = eventPoint(ev);
                if (p) setChosen(p);
              }}
            />
          ) : (
            <div className="empty">{run.kind === 'running' ? 'Computing the map…' : 'No map yet.'}</div>
          )}
        </div>
        <div className="card" data-testid="eff-point">
          <h4>Losses at a point (click the map to choose; hover previews)</h4>
          {!point && <div className="hint">Click a point of the map to see its losses; hovering previews a point.</div>}
          {picked && (
            <div className="hint" data-testid="eff-point-kind" data-kind={hovered ? 'preview' : 'chosen'}>
              {hovered ? (chosen ? 'Preview (the chosen point returns when the pointer leaves the map).' : 'Preview: click to choose this point.') : 'The chosen point (marked on the map).'}
            </div>
          )}
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
                power factor {num(point.pt.powerFactor, 3)}, DC link {num(point.pt.dcPower_W)} W
                {point.other ? ` (least current; ${num(point.other.current)} A peak loss-minimising)` : `, ${point.pt.control === 'min-loss' ? 'loss-minimising' : 'least current'}`}.
              </div>
              <Plot data={bar.data} layout={bar.layout} height={300} testId="eff-loss-bar" />
              <table className="data compact" data-testid="eff-point-table">
                <tbody>
                  <tr><td>motor efficiency</td><td className="num">{pct(point.pt.efficiency.motor)}</td></tr>
                  <tr><td>inverter efficiency</td><td className="num">{pct(point.pt.efficiency.inverter)}</td></tr>
                  <tr><td>system efficiency</td><td className="num">{pct(point.pt.efficiency.system)}</td></tr>
                  <tr><td>total loss</td><td className="num">{num(totalLoss(point.pt))} W</td></tr>
                  {point.other?.feasible && (
                    <>
                      <tr><td>total loss, loss-minimising</td><td className="num">{num(totalLoss(point.other))} W</td></tr>
                      <tr data-testid="eff-point-saved"><td>loss saved</td><td className="num">{num(totalLoss(point.pt) - totalLoss(point.other))} W</td></tr>
                      <tr><td>system efficiency, loss-minimising</td><td className="num">{pct(point.other.efficiency.system)}</td></tr>
                    </>
                  )}
                </tbody>
              </table>
            </>
          )}
        </div>
      </div>
    </div>
  );
});
