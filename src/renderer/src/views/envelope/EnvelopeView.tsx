// Envelope view: torque-speed and power-speed (peak and continuous, motoring and generating, hot and
// cold), requirement points, region bands, base and maximum speed; for a project with a `thermal`
// section also the continuous (S1) torque from the thermal network, its binding limit named (solved in
// the thermal worker: about 0.2 s for a flux-map machine); beside it the current plane.
import { describeLimit, describeLimits } from '../../../../core/drive/current-limits';
import { memo, useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { DatasheetContinuous } from '../../../../core/reports/datasheet-parts';
import { useWorkerRun } from '../../state/worker-run';
import type { S1Done, ThermalRequest } from '../../workers/thermal-protocol';
import type { Data, Layout } from 'plotly.js-dist-min';
import { solveOperatingPoint } from '../../../../core/steady-state/operating-point';
import { constantTorqueIq, mtpaCurrentForTorque } from '../../../../core/steady-state/mtpa';
import { RAD_S_TO_RPM, RPM_TO_RAD_S, SQRT2 } from '../../../../core/base/units';
import { parsePlotTop } from '../../../../core/reports/speed-range';
import type { OperatingPoint } from '../../../../core/steady-state/operating-point-types';
import { axis, baseLayout, CURVE, Plot, readTheme, REGION_FILL } from '../../components/Plot';
import { planeCurves, pointVerdict, type EnvelopeOptions, type Results } from '../../state/compute';
import { envelopeCsv } from '../../components/exports';
import { useExporter } from '../../state/exporter';
import { exportPlotImage } from '../../components/image-export';
import { num } from '../../components/format';
import { Cautions } from '../../components/cautions';
import { powerSpeedFigure, torqueOnlyFigure, type Show } from '../../components/torque-speed-figure';
import { useAfterPaint } from '../../state/after-paint';
import { sameRange, withXRange, xRangeFromRelayout, type SpeedRange } from '../../components/linked-axes';
import { notReachablePhrase, regionPhrase } from '../../../../core/reports/phrases';
import { declutterShifts } from '../../components/label-layout';


function parseSpeeds(text: string): number[] {
  return text
    .split(/[,;\s]+/)
    .map(Number)
    .filter((v) => Number.isFinite(v) && v > 0)
    .slice(0, 6);
}

function defaultSpeeds(r: Results): string {
  const wb = r.main.baseSpeed * RAD_S_TO_RPM;
  const top = r.speedMax * RAD_S_TO_RPM;
  const round = (x: number) => Math.round(x / 100) * 100 || Math.round(x);
  return [wb, 2 * wb, 3.5 * wb]
    .filter((x) => x > 0 && x <= top)
    .map(round)
    .join(', ');
}

export function planeFigure(r: Results, theme: 'light' | 'dark', speeds: number[], op: OperatingPoint | null): { data: Data[]; layout: Layout } {
  const t = readTheme();
  const col = CURVE[theme];
  const p = r.project;
  // the model the solvers are given (a flux map's when the project has one)
  const m = p.models.hot;
  const Imax = p.peak.Imax;
  const Icont = p.continuous.Imax;
  const mtpvSpeeds: number[] = [];
  const w0 = Math.max(r.main.baseSpeed, 1e-3);
  for (let k = 0; k <= 80; k++) mtpvSpeeds.push(w0 * Math.pow(40, k / 80));
  const span = 1.2 * Imax;
  // constant-torque lines from the engine's locus, at fractions of the zero-speed torque
  const T0 = r.main.torque[0]!;
  const pc = planeCurves(m, p.peak.Vmax, Imax, speeds, mtpvSpeeds, { torques: [0.25, 0.5, 0.75, 1].map((f) => f * T0), lo: -span, hi: 0.25 * Imax, span });
  const data: Data[] = [];
  const circle = (R: number) => {
    const x: number[] = [];
    const y: number[] = [];
    for (let k = 0; k <= 180; k++) {
      x.push(R * Math.cos((k / 180) * 2 * Math.PI));
      y.push(R * Math.sin((k / 180) * 2 * Math.PI));
    }
    return { x, y };
  };
  const ci = circle(Imax);
  data.push({ type: 'scatter', mode: 'lines', ...ci, name: `|i| = ${describeLimit('peak', p.currentLimits.peak)}`, line: { color: t.ink, width: 2 }, hoverinfo: 'skip' });
  const cc = circle(Icont);
  data.push({ type: 'scatter', mode: 'lines', ...cc, name: `|i| = ${describeLimit('continuous', p.currentLimits.continuous)}`, line: { color: t.muted, width: 1.4, dash: 'dash' }, hoverinfo: 'skip' });
  const dashes = ['solid', 'dash', 'dot', 'dashdot', 'longdash', 'longdashdot'];
  const annotations: Record<string, unknown>[] = [];
  pc.ellipses.forEach((el, i) => {
    data.push({
      type: 'scatter',
      mode: 'lines',
      x: el.id,
      y: el.iq,
      name: i === 0 ? '|v| = Vmax at the speeds marked' : `${Math.round(el.speed_rpm)} rpm`,
      legendgroup: 'volt',
      showlegend: i === 0,
      line: { color: col.volt, width: 1.6, dash: dashes[i % dashes.length] },
      hoverinfo: 'skip',
    });
    // label where the ellipse crosses the positive iq half-axis nearest the top of the view
    let best = -1;
    for (let k = 0; k < el.id.length; k++) {
      const x = el.id[k]!;
      const y = el.iq[k]!;
      if (y > 0 && y < span * 0.97 && x > -span && x < 0.25 * Imax && (best < 0 || y > el.iq[best]!)) best = k;
    }
    if (best >= 0) {
      annotations.push({ x: el.id[best], y: el.iq[best], text: `${Math.round(el.speed_rpm)} rpm`, showarrow: false, yanchor: 'bottom', font: { size: 10, color: col.volt }, bgcolor: t.panel });
    }
  });
  data.push({ type: 'scatter', mode: 'lines', x: pc.mtpa.id, y: pc.mtpa.iq, name: 'MTPA', line: { color: col.mtpa, width: 2 }, hoverinfo: 'skip' });
  if (pc.mtpv.id.length > 1) data.push({ type: 'scatter', mode: 'lines', x: pc.mtpv.id, y: pc.mtpv.iq, name: 'MTPV', line: { color: col.mtpv, width: 2, dash: 'dashdot' }, hoverinfo: 'skip' });
  pc.torque.forEach(({ T, id: x, iq: y }, i) => {
    data.push({
      type: 'scatter',
      mode: 'lines',
      x,
      y,
      name: i === 0 ? 'constant torque' : '',
      showlegend: i === 0,
      legendgroup: 'ct',
      line: { color: t.muted, width: 1, dash: 'dot' },
      hoverinfo: 'skip',
    });
    // label near where the line leaves the view (top edge or right end), away from the MTPA
    // corner where the voltage-ellipse labels sit
    // (each a little lower than the one before, so that neighbours do not cover each other)
    const top = (0.9 - 0.14 * i) * span;
    let last = -1;
    for (let k = 0; k < x.length; k++) if (x[k] !== null && y[k]! > 0 && y[k]! <= top) last = k;
    const at = last >= 0 ? { id: x[last]!, iq: y[last]! } : mtpaCurrentForTorque(m, T);
    annotations.push({ x: at.id, y: at.iq, text: `${num(T, 3)} N·m`, showarrow: false, xanchor: 'right', yanchor: 'bottom', font: { size: 10, color: t.muted }, bgcolor: t.panel });
  });
  // the path of the reference envelope through the plane
  const e = r.main;
  const px: number[] = [];
  const py: number[] = [];
  for (let k = 0; k < e.speed.length; k++) if (e.feasible[k]) {
    px.push(e.id[k]!);
    py.push(e.iq[k]!);
  }
  data.push({ type: 'scatter', mode: 'lines', x: px, y: py, name: 'envelope path', line: { color: col.hot, width: 3 }, opacity: 0.5, hoverinfo: 'skip' });
  // the current of zero flux (−ψm/Ld for constant parameters), the model's inverse at ψ = 0
  const zero = new Float64Array(2);
  m.current(0, 0, zero);
  const ch = zero[0]!;
  if (ch > -span && Math.abs(zero[1]!) < span) {
    // the voltage ellipses are centred here: the label sits below on the panel colour, readable over them
    data.push({ type: 'scatter', mode: 'markers', x: [ch], y: [zero[1]!], showlegend: false, marker: { symbol: 'x', size: 9, color: col.volt }, hoverinfo: 'skip' });
    annotations.push({ x: ch, y: zero[1]!, text: m.linear ? '−ψm/Ld' : 'ψ = 0', showarrow: false, yanchor: 'top', yshift: -6, font: { size: 10, color: col.volt }, bgcolor: t.panel });
  }
  if (op) {
    data.push({
      type: 'scatter',
      mode: 'markers',
      x: [op.id],
      y: [op.iq],
      name: op.feasible ? 'operating point' : 'operating point (not reachable)',
      marker: { symbol: op.feasible ? 'circle' : 'circle-open', size: 13, color: op.feasible ? t.ok : t.bad, line: { width: 2, color: op.feasible ? t.ink : t.bad } },
      hoverinfo: 'skip',
    });
  }
  // labels kept off each other: the plot area is about 320 px for the 2.4·Imax of the iq axis, the
  // same scale on both axes
  const k = 320 / (2 * span);
  const shifts = declutterShifts(
    annotations.map((a) => ({
      px: ((a.x as number) + span) * k,
      py: (span - (a.y as number)) * k,
      text: String(a.text),
      xanchor: (a.xanchor as 'left' | 'right' | undefined) ?? 'center',
      yanchor: (a.yanchor as 'top' | 'bottom' | undefined) ?? 'middle',
      yshift: a.yshift as number | undefined,
    })),
  );
  annotations.forEach((a, i) => {
    if (shifts[i] !== 0 || a.yshift !== undefined) a.yshift = shifts[i];
  });
  const layout: Layout = baseLayout(t, {
    margin: { l: 64, r: 16, t: 16, b: 40 },
    showlegend: true,
    legend: { orientation: 'h', x: 0, y: -0.1, font: { size: 10 } },
    hovermode: false,
    // fixed ranges from the project's current limit (never plotly's autorange memory of an earlier edit)
    xaxis: axis(t, 'id, A peak', { range: [-span, 0.25 * Imax], autorange: false, constrain: 'domain' }),
    yaxis: axis(t, 'iq, A peak', { range: [-span, span], autorange: false, scaleanchor: 'x', scaleratio: 1, constrain: 'domain' }),
    annotations,
  });
  return { data, layout };
}

export const EnvelopeView = memo(function EnvelopeView({ results, opts, setOpts, theme }: { results: Results; opts: EnvelopeOptions; setOpts: (o: EnvelopeOptions) => void; theme: 'light' | 'dark' }) {
  const exporter = useExporter();
  const [show, setShow] = useState<Show>({ peak: true, continuous: true, hot: true, cold: true, generating: true });
  const [speedText, setSpeedText] = useState<string | null>(null);
  const [op, setOp] = useState<OperatingPoint | null>(null);
  const [topText, setTopText] = useState('');
  const topParsed = parsePlotTop(topText);
  const topMsg = 'message' in topParsed ? topParsed.message : null;
  const envEl = useRef<HTMLDivElement | null>(null);
  // the torque plot follows each edit at once; the power plot and the current plane are built and
  // drawn after that frame is painted
  const late = useAfterPaint(results);
  // Each plot is rebuilt (and redrawn) only when what it shows changes. `results` changes twice per
  // edit: with the new curves, then again when the sizing verdicts follow a frame later. The curves
  // (`curves` keeps its identity until the envelopes are recomputed) are all the power plot and the
  // current plane show; the torque plot also marks each requirement met or not, so it is redrawn for
  // the verdicts only when a mark changes.
  const curves = results.curves;
  const lateCurves = late.curves;
  const marksKey = results.project.requirements.map((_, i) => pointVerdict(results, i).fails ?? 'met').join();
  const speeds = useMemo(() => parseSpeeds(speedText ?? defaultSpeeds(late)), [speedText, lateCurves]);
  // one speed range for the torque and the power plot: a zoom or pan on either applies to both
  const [xRange, setXRange] = useState<SpeedRange | null>(null);
  // the S1 curve (projects with a thermal section): solved off the window's thread after each new set
  // of curves (once typing pauses); the last one stays drawn until the next arrives
  const thermal = results.project.thermal;
  const [s1, setS1] = useState<{ s1: DatasheetContinuous; compute_ms: number } | null>(null);
  const [showS1, setShowS1] = useState(true);
  const { run: s1Run, start: startS1 } = useWorkerRun<ThermalRequest, S1Done>('continuous-torque', (m) => setS1(m.s1 ? { s1: m.s1, compute_ms: m.compute_ms } : null));
  useEffect(() => {
    if (thermal === undefined) {
      setS1(null);
      return;
    }
    const h = setTimeout(() => {
      startS1(new Worker(new URL('../../workers/thermal-worker.ts', import.meta.url), { type: 'module' }), {
        kind: 's1', projectText: JSON.stringify(results.project.file), speedMax: results.speedMax, points: results.points,
      });
    }, 150);
    return () => clearTimeout(h);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [curves, thermal]);
  const s1Shown = thermal !== undefined && showS1 ? (s1?.s1 ?? null) : null;
  const fig0 = useMemo(() => torqueOnlyFigure(results, theme, show, s1Shown), [curves, marksKey, theme, show, s1Shown]);
  const pfig0 = useMemo(() => powerSpeedFigure(late, theme, show, s1Shown), [lateCurves, theme, show, s1Shown]);
  const fig = useMemo(() => ({ data: fig0.data, layout: withXRange(fig0.layout, xRange) }), [fig0, xRange]);
  const pfig = useMemo(() => ({ data: pfig0.data, layout: withXRange(pfig0.layout, xRange) }), [pfig0, xRange]);
  const onSpeedZoom = useCallback((ev: Record<string, unknown>) => {
    const r = xRangeFromRelayout(ev);
    if (r === null) return;
    setXRange((cur) => (r === 'reset' ? null : sameRange(cur, r) ? cur : r));
  }, []);
  const plane = useMemo(() => planeFigure(late, theme, speeds, op), [lateCurves, theme, speeds, op]);

  const onHover = useCallback(
    (ev: any) => {
      const pt = ev?.points?.[0];
      if (!pt) return;
      const onPower = pt.data?.yaxis === 'y2';
      let speed_rpm: number = Array.isArray(ev.xvals) && Number.isFinite(ev.xvals[0]) ? ev.xvals[0] : pt.x;
      let y: number = Array.isArray(ev.yvals) && Number.isFinite(ev.yvals[0]) ? ev.yvals[0] : pt.y;
      if (!Number.isFinite(speed_rpm) || !Number.isFinite(y)) return;
      speed_rpm = Math.max(0, speed_rpm);
      const w = speed_rpm * RPM_TO_RAD_S;
      const torque = onPower ? (w > 0 ? (y * 1000) / w : 0) : y;
      y = torque;
      try {
        setOp(solveOperatingPoint(results.project.models.hot, results.project.peak, w, torque));
      } catch {
        setOp(null);
      }
    },
    [results],
  );

  const onDrawn = useCallback(() => {
    const marks = performance.getEntriesByName('tw-edit', 'mark');
    if (!marks.length) return;
    const start = marks[marks.length - 1]!.startTime;
    const drawn = performance.now();
    requestAnimationFrame(() => {
      const ms = performance.now() - start;
      (window.__twPerf ??= []).push(ms);
      const at = (name: string): number => {
        const m = performance.getEntriesByName(name, 'mark');
        const t = m.length ? m[m.length - 1]!.startTime - start : NaN;
        return t >= 0 ? t : NaN;
      };
      (window.__twPerfPhases ??= []).push({
        check: at('tw-check'),
        compute: at('tw-compute'),
        computed: at('tw-computed'),
        plot: at('tw-plot:envelope-plot'),
        plotted: drawn - start,
        frame: ms,
      });
      performance.clearMarks('tw-edit');
    });
  }, []);

  const exportImage = async (format: 'png' | 'svg') => {
    if (!envEl.current) return;
    await exportPlotImage(envEl.current, format, 'envelope', results.project, exporter);
  };

  const toggle = (k: keyof Show) => setShow((s) => ({ ...s, [k]: !s[k] }));
  return (
    <div data-testid="view-envelope">
      <Cautions results={results} hazardsOnly compact testId="envelope-cautions" />
      <div className="toolbar no-print">
        <span>Show:</span>
        {(
          [
            ['peak', 'peak current'],
            ['continuous', 'continuous current'],
            ['hot', 'hot magnet'],
            ['cold', 'cold magnet'],
            ['generating', 'generating'],
          ] as Array<[keyof Show, string]>
        ).map(([k, label]) => (
          <label key={k}>
            <input type="checkbox" checked={show[k]} onChange={() => toggle(k)} /> {label}
          </label>
        ))}
        {thermal !== undefined && (
          <label title="continuous (S1) torque from the project's thermal network">
            <input type="checkbox" data-testid="show-s1" checked={showS1} onChange={() => setShowS1((v) => !v)} /> S1
          </label>
        )}
        <label>
          plot to{' '}
          <input
            type="text"
            size={7}
            data-testid="speed-max"
            value={topText}
            className={topMsg ? 'invalid' : undefined}
            aria-invalid={topMsg ? true : undefined}
            placeholder={String(Math.round(results.speedMax * RAD_S_TO_RPM))}
            onChange={(e) => {
              setTopText(e.target.value);
              const r = parsePlotTop(e.target.value);
              if ('message' in r) return; // the typed text stays, the plot keeps its last valid top
              setXRange(null); // a new top speed shows the whole range again
              setOpts({ ...opts, speedMax: r.rpm === null ? null : r.rpm * RPM_TO_RAD_S });
            }}
          />{' '}
          rpm
          {topMsg && <span className="msg" data-testid="speed-max-msg">plot to {topMsg}</span>}
        </label>
        <span className="spacer" style={{ flex: 1 }} />
        <button className="btn small" onClick={() => void exportImage('png')} data-testid="export-png">PNG</button>
        <button className="btn small" onClick={() => void exportImage('svg')} data-testid="export-svg">SVG</button>
        <button className="btn small" data-testid="export-csv" onClick={() => void exporter.exportAndTell('envelope-csv', () => envelopeCsv(results), 'envelope.csv')}>
          CSV
        </button>
      </div>
      <div className="cols">
        <div className="card">
          <h4>Torque and power against speed</h4>
          <div className="key" aria-label="line key">
            <span style={{ color: CURVE[theme].hot }}>━ peak current, hot magnet</span>
            <span style={{ color: CURVE[theme].cold }}>┅ peak, cold</span>
            <span style={{ color: CURVE[theme].hotCont }}>━ continuous, hot</span>
            <span style={{ color: CURVE[theme].coldCont }}>┅ continuous, cold</span>
            <span>● met ✕ not met</span>
          </div>
          {thermal !== undefined && (
            <div className="key" aria-label="S1 key" data-testid="s1-key" data-ready={s1 ? 'yes' : 'no'}>
              <span style={{ color: CURVE[theme].s1 }}>
                ━ S1 continuous (thermal), coolant {num(thermal.coolantTemp_C)} °C: line style names the binding limit (━ winding, ╌ magnet, ┈ junction, ▬ ▬ current, ─·─ voltage; hover for the temperatures)
              </span>
              <span data-testid="s1-status">
                {s1Run.kind === 'error' ? `S1 curve: ${s1Run.message}` : s1Run.kind === 'running' && !s1 ? 'S1 curve: computing…' : s1 ? `S1 curve in ${s1.compute_ms.toFixed(0)} ms (background)` : ''}
              </span>
            </div>
          )}
          <div className="key" aria-label="current limits" data-testid="envelope-limits">
            <span>{describeLimits(results.project.currentLimits)}</span>
          </div>
          <div className="key" aria-label="shading key" data-testid="region-key">
            <span>Shaded bands: control region along the <strong style={{ color: CURVE[theme].hot }}>peak-current, hot-magnet motoring</strong> curve:</span>
            <span><span className="swatch" style={{ background: REGION_FILL[theme].mtpa }} /> MTPA</span>
            <span><span className="swatch" style={{ background: REGION_FILL[theme]['field-weakening'] }} /> field weakening</span>
            <span><span className="swatch" style={{ background: REGION_FILL[theme].mtpv }} /> MTPV</span>
          </div>
          <Plot data={fig.data} layout={fig.layout} height={330} testId="envelope-plot" onHover={onHover} onRelayout={onSpeedZoom} onDrawn={onDrawn} elRef={(el) => (envEl.current = el)} />
          <Plot data={pfig.data} layout={pfig.layout} height={340} testId="power-plot" onRelayout={onSpeedZoom} defer />
          <div className="readout" data-testid="summary-line">
            base speed {Math.round(results.main.baseSpeed * RAD_S_TO_RPM)} rpm · maximum speed{' '}
            {results.main.maxSpeed === null ? 'unbounded (current limit reaches past the voltage-ellipse centre)' : `${Math.round(results.main.maxSpeed * RAD_S_TO_RPM)} rpm`} · peak current, hot magnet, motoring ·
            characteristic current ψm/Ld = {num(results.main.characteristicCurrent)} A peak
          </div>
        </div>
        <div className="card">
          <h4>Current plane (hot magnet, peak limits)</h4>
          <div className="toolbar">
            <label>
              voltage limits at{' '}
              <input type="text" size={22} data-testid="ellipse-speeds" value={speedText ?? defaultSpeeds(results)} onChange={(e) => setSpeedText(e.target.value)} /> rpm
            </label>
          </div>
          <Plot data={plane.data} layout={plane.layout} height={560} testId="plane-plot" defer />
          <div className="readout" data-testid="op-readout">
            {op ? (
              <>
                {Math.round(op.speed * RAD_S_TO_RPM)} rpm, {num(op.torque)} N·m: id {num(op.id)} A, iq {num(op.iq)} A, |i| {num(op.current)} A peak ({num(op.current / SQRT2)} A
                rms), |v| {num(op.voltage)} V peak, {op.feasible ? regionPhrase(op.region) : notReachablePhrase(op.limitedBy)}
              </>
            ) : (
              'Move the pointer over the torque-speed plot to place an operating point.'
            )}
          </div>
        </div>
      </div>
    </div>
  );
});
