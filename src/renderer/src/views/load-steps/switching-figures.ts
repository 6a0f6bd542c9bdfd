// The switching model's figures in the Load steps view, pure (plotly's types only, testable in node):
// the ripple window (phase currents at full resolution with the applied phase voltage and the DC-link
// current), the ripple's envelope over the fundamental, the phase current's spectrum (harmonic
// amplitudes as bars, THD stated), the averaged and switching runs overlaid (their decimated speed
// and dq currents), the summary rows, the window as CSV, and which averaged run a switching run keeps.
import type { Data, Layout } from 'plotly.js-dist-min';
import type { SwitchingResult } from '../../../../core/simulation/switching-result';
import { csvDocument, type CsvCell } from '../../../../core/reports/csv';
import { axis, baseLayout, type CurveColours, type PlotTheme } from '../../components/plot-style';
import { num } from '../../components/format';
import type { SimDone } from '../../state/simulation-run';

type Figure = { data: Data[]; layout: Layout };

/** How the modulations read on screen. */
export const MODULATION_NAMES: Record<string, string> = { sinusoidal: 'sinusoidal PWM', svpwm: 'SVPWM (min-max injection)', dpwm1: 'DPWM1 (discontinuous)' };

/** The switching run's conditions in one line: carrier, dead time, modulation. */
export function switchingConditions(s: SwitchingResult): string {
  return `switching model: carrier ${num(s.fsw_Hz / 1e3)} kHz, dead time ${num(s.deadTime_s * 1e6)} µs, ${MODULATION_NAMES[s.modulation] ?? s.modulation}`;
}

const stack = (rows: number, i: number, gap = 0.06): [number, number] => {
  const h = (1 - gap * (rows - 1)) / rows;
  const top = 1 - i * (h + gap);
  return [Math.max(0, top - h), top];
};

/**
 * The ripple window: phase currents ia, ib, ic at every segment boundary (straight between them, as the
 * current runs between switching instants), the applied phase voltage va and the DC-link current idc
 * (each the value over the segment ending at its boundary: drawn as steps, vertical first), on one
 * time axis in ms; `range_ms` the part shown (the whole window when absent; when given, ia alone on
 * an axis fitted to its samples there, ib and ic hidden in the legend); `marks` instants drawn as
 * labelled dashed lines across the rows (the load step), those within the window only.
 */
export function rippleWindowFigure(s: SwitchingResult, t: PlotTheme, col: CurveColours, range_ms?: [number, number] | null, marks: ReadonlyArray<{ t_s: number; label: string }> = []): Figure {
  const w = s.window;
  const x = Array.from(w.t_s, (v) => v * 1e3);
  const tr = (y: Float64Array, name: string, yaxis: string, colour: string, shape: 'linear' | 'vh', width = 1.2): Data =>
    ({ type: 'scatter', mode: 'lines', x, y: Array.from(y), name, yaxis, line: { color: colour, width, shape }, hovertemplate: `${name}: %{y:.4g}<extra>%{x:.4f} ms</extra>` }) as Data;
  const data: Data[] = [
    tr(w.ia_A, 'ia', 'y', col.a, 'linear', 1.5),
    tr(w.ib_A, 'ib', 'y', col.b, 'linear'),
    tr(w.ic_A, 'ic', 'y', col.c, 'linear'),
    tr(w.va_V, 'va (applied, phase to neutral)', 'y2', col.mtpv, 'vh'),
    tr(w.idc_A, 'idc (DC link)', 'y3', col.load, 'vh'),
  ];
  // zoomed to a few carrier periods: ia alone on an axis fitted to it there, so its ripple reads (ib, ic a click away in the legend)
  let iaRange: [number, number] | null = null;
  if (range_ms) {
    let lo = Infinity, hi = -Infinity;
    for (let j = 0; j < x.length; j++) if (x[j]! >= range_ms[0] && x[j]! <= range_ms[1]) (lo = Math.min(lo, w.ia_A[j]!), hi = Math.max(hi, w.ia_A[j]!));
    if (hi >= lo) {
      const pad = Math.max(0.15 * (hi - lo), 1e-3 * Math.max(1, Math.abs(hi)));
      iaRange = [lo - pad, hi + pad];
      for (const d of data.slice(1, 3) as Array<{ visible?: unknown }>) d.visible = 'legendonly';
    }
  }
  const layout = baseLayout(t, {
    margin: { l: 70, r: 16, t: 10, b: 44 },
    hovermode: 'x',
    legend: { orientation: 'h', x: 0, y: 1.06, yanchor: 'bottom', font: { size: 11 } },
    xaxis: axis(t, 'time, ms', { anchor: 'y3', range: range_ms ?? [x[0] ?? 0, x[x.length - 1] ?? 1] }),
    yaxis: axis(t, iaRange ? 'ia, A' : 'ia, ib, ic, A', iaRange ? { domain: stack(3, 0), range: iaRange } : { domain: stack(3, 0) }),
    yaxis2: axis(t, 'va, V', { domain: stack(3, 1) }),
    yaxis3: axis(t, 'idc, A', { domain: stack(3, 2) }),
  } as Layout);
  const inside = marks.filter((m) => w.t_s.length > 0 && m.t_s >= w.t_s[0]! && m.t_s <= w.t_s[w.t_s.length - 1]!);
  if (inside.length) {
    const l = layout as Record<string, unknown>;
    l.shapes = inside.map((m) => ({ type: 'line', xref: 'x', yref: 'paper', x0: m.t_s * 1e3, x1: m.t_s * 1e3, y0: 0, y1: 1, line: { color: t.muted, width: 1.2, dash: 'dash' } }));
    l.annotations = inside.map((m) => ({ xref: 'x', yref: 'paper', x: m.t_s * 1e3, y: 1, xanchor: 'left', yanchor: 'top', showarrow: false, text: m.label, font: { size: 11, color: t.ink }, bgcolor: t.panel }));
  }
  return { data, layout };
}

/** Where the ripple window may zoom: the whole window, or a few carrier periods at ia's peak or at its zero crossing. */
export type WindowZoom = 'window' | 'peak' | 'zero';

/**
 * The time range (ms) of `periods` carrier periods centred on ia's largest sample (`peak`) or on its
 * first rising zero crossing (`zero`) in the window; null for the whole window.
 */
export function windowZoom(s: SwitchingResult, at: WindowZoom, periods = 4): [number, number] | null {
  const { t_s: t, ia_A: ia } = s.window;
  if (at === 'window' || t.length < 2) return null;
  let k = 0;
  if (at === 'peak') {
    for (let j = 1; j < ia.length; j++) if (ia[j]! > ia[k]!) k = j;
  } else {
    k = -1;
    for (let j = 1; j < ia.length && k < 0; j++) if (ia[j - 1]! < 0 && ia[j]! >= 0) k = j;
    if (k < 0) return null;
  }
  const half = (periods / 2 / s.fsw_Hz) * 1e3;
  const lo = t[0]! * 1e3, hi = t[t.length - 1]! * 1e3;
  const c = Math.min(Math.max(t[k]! * 1e3, lo + half), hi - half);
  return [Math.max(lo, c - half), Math.min(hi, c + half)];
}

/** The ripple's peak-to-peak envelope over one fundamental period, against the electrical angle in degrees. */
export function rippleEnvelopeFigure(s: SwitchingResult, t: PlotTheme, col: CurveColours): Figure {
  const e = s.rippleEnvelope;
  const data: Data[] = [
    {
      type: 'scatter',
      mode: 'lines',
      x: Array.from(e.angle_rad, (a) => (a * 180) / Math.PI),
      y: Array.from(e.peakToPeak_A),
      name: 'ripple, peak to peak',
      line: { color: col.a, width: 1.6, shape: 'hvh' },
      hovertemplate: '%{y:.3g} A p-p<extra>%{x:.0f}°</extra>',
    } as Data,
  ];
  const layout = baseLayout(t, {
    margin: { l: 70, r: 16, t: 10, b: 44 },
    showlegend: false,
    xaxis: axis(t, 'electrical angle of phase a, °', { range: [0, 360], dtick: 60 }),
    yaxis: axis(t, 'ia ripple, A peak to peak', { rangemode: 'tozero' }),
  } as Layout);
  return { data, layout };
}

/**
 * The phase-a current's spectrum: one bar per harmonic order 1..thdMaxHarmonic (A peak), the
 * fundamental in its own colour; `log`: a logarithmic amplitude axis (orders with no amplitude are
 * left out there: a bar of zero has no place on it).
 */
export function spectrumFigure(s: SwitchingResult, log: boolean, t: PlotTheme, col: CurveColours): Figure {
  const n = Math.min(s.harmonics_A.length - 1, s.thdMaxHarmonic);
  const x: number[] = [];
  const y: number[] = [];
  const colours: string[] = [];
  for (let k = 1; k <= n; k++) {
    const a = s.harmonics_A[k]!;
    if (log && !(a > 0)) continue;
    x.push(k);
    y.push(a);
    colours.push(k === 1 ? col.c : col.a);
  }
  const data: Data[] = [
    { type: 'bar', x, y, customdata: x.map((k) => k * s.fundamental_Hz), name: 'harmonic amplitude', marker: { color: colours }, hovertemplate: 'order %{x} (%{customdata:.4g} Hz): %{y:.4g} A peak<extra></extra>' } as Data,
  ];
  const layout = baseLayout(t, {
    margin: { l: 70, r: 16, t: 30, b: 44 },
    showlegend: false,
    bargap: 0.25,
    title: { text: Number.isFinite(s.thd) ? `ia spectrum: THD ${num(s.thd * 100, 3)} % (orders 2 to ${s.thdMaxHarmonic})` : 'ia spectrum: no whole fundamental period analysed', font: { size: 12 }, x: 0.01, xanchor: 'left' },
    xaxis: axis(t, `harmonic order (fundamental ${num(s.fundamental_Hz, 3)} Hz)`, { range: [0.4, n + 0.6] }),
    yaxis: axis(t, 'amplitude, A peak', log ? { type: 'log' } : { rangemode: 'tozero' }),
  } as Layout);
  return { data, layout };
}

/**
 * The averaged and the switching runs overlaid on one time axis: speed (rpm) and the dq currents
 * (A peak), the averaged run dashed over the switching one (both decimated as the runs record them).
 */
export function overlayFigure(avg: SimDone, sw: SimDone, t: PlotTheme, col: CurveColours): Figure {
  const data: Data[] = [];
  const line = (r: SimDone, key: 'speed_rpm' | 'iq_A' | 'id_A', name: string, yaxis: string, colour: string, dash: string, width: number) => {
    const y = r.traces[key];
    if (!y) return;
    data.push({ type: 'scatter', mode: 'lines', x: r.traces.t_s, y, name, yaxis, line: { color: colour, dash, width }, hovertemplate: `${name}: %{y:.4g}<extra>%{x:.4f} s</extra>` } as Data);
  };
  // the switching run under, the averaged run dashed over it: where they agree both stay visible
  line(sw, 'speed_rpm', 'speed, switching', 'y', col.cold, 'solid', 2.2);
  line(avg, 'speed_rpm', 'speed, averaged', 'y', col.ref, 'dash', 1.4);
  line(sw, 'iq_A', 'iq, switching', 'y2', col.iq, 'solid', 1.8);
  line(avg, 'iq_A', 'iq, averaged', 'y2', col.ref, 'dash', 1.4);
  line(sw, 'id_A', 'id, switching', 'y2', col.id, 'solid', 1.8);
  line(avg, 'id_A', 'id, averaged', 'y2', col.load, 'dash', 1.4);
  const x = sw.traces.t_s;
  const layout = baseLayout(t, {
    margin: { l: 70, r: 16, t: 10, b: 44 },
    hovermode: 'x',
    legend: { orientation: 'h', x: 0, y: 1.04, yanchor: 'bottom', font: { size: 11 } },
    xaxis: axis(t, 'time, s', { anchor: 'y2', range: [x[0] ?? 0, x[x.length - 1] ?? 1] }),
    yaxis: axis(t, 'speed, rpm', { domain: stack(2, 0) }),
    yaxis2: axis(t, 'id, iq, A peak', { domain: stack(2, 1) }),
  } as Layout);
  return { data, layout };
}

/** The summary card's rows: label, value text, and the number behind it (for tests and data attributes). */
export function switchingSummary(s: SwitchingResult): Array<{ key: string; label: string; text: string; value: number }> {
  const rows = [
    { key: 'rippleMax', label: 'phase-current ripple, largest (peak to peak per carrier period)', value: s.ripplePeakToPeak_A.max, text: `${num(s.ripplePeakToPeak_A.max, 3)} A` },
    { key: 'rippleMean', label: 'phase-current ripple, mean over the fundamental', value: s.ripplePeakToPeak_A.mean, text: `${num(s.ripplePeakToPeak_A.mean, 3)} A` },
    { key: 'thd', label: `THD of the phase current (orders 2 to ${s.thdMaxHarmonic})`, value: s.thd, text: Number.isFinite(s.thd) ? `${num(s.thd * 100, 3)} %` : '–' },
    { key: 'deadTime', label: 'fundamental voltage lost to dead time and device drop', value: s.deadTimeVoltageError_V, text: `${num(s.deadTimeVoltageError_V, 3)} V peak (phase)` },
    { key: 'dcMean', label: 'DC-link current, mean', value: s.dcLink.mean_A, text: `${num(s.dcLink.mean_A, 3)} A` },
    { key: 'dcRms', label: 'DC-link current, rms', value: s.dcLink.rms_A, text: `${num(s.dcLink.rms_A, 3)} A rms` },
    { key: 'dcRipple', label: 'DC-link ripple current, rms (the bus capacitor carries it)', value: s.dcLink.rippleRms_A, text: `${num(s.dcLink.rippleRms_A, 3)} A rms` },
  ];
  return rows;
}

/** The full-resolution window as CSV: the `comments` (one cell each), then t_s, ia_A, ib_A, ic_A, va_V, idc_A. */
export function switchingWindowCsv(s: SwitchingResult, comments: readonly string[] = []): string {
  const w = s.window;
  const cols = [w.t_s, w.ia_A, w.ib_A, w.ic_A, w.va_V, w.idc_A];
  const n = Math.min(...cols.map((c) => c.length));
  function* rows(): Generator<CsvCell[]> {
    for (const c of comments) yield [c];
    yield ['t_s', 'ia_A', 'ib_A', 'ic_A', 'va_V', 'idc_A'];
    for (let i = 0; i < n; i++) yield cols.map((c) => c[i]!);
  }
  return csvDocument(rows());
}

/** Where the zoom window sits, as the PWM control offers it: control.pwm.windowAt, or window_s given as times. */
export type WindowMode = 'end' | 'load-step' | 'times';
export const WINDOW_MODES: Record<WindowMode, string> = { end: 'at the run\'s end', 'load-step': 'at the first load step', times: 'from … to … (times)' };
export const WINDOW_HINTS: Record<WindowMode, string> = {
  end: 'the last two fundamental periods of the run',
  'load-step': 'two fundamental periods at the speed asked there, from a quarter of it before the step',
  times: 'full-resolution traces between these times',
};

/** The window mode of a control.pwm subtree (as edited: any JSON). */
export function windowModeOf(pwm: unknown): WindowMode {
  const o = pwm && typeof pwm === 'object' && !Array.isArray(pwm) ? (pwm as Record<string, unknown>) : {};
  if (o.window_s !== undefined) return 'times';
  return o.windowAt === 'load-step' ? 'load-step' : 'end';
}

/** Times to start from when the user asks for a window by times: the middle tenth of the run after its half (10 ms of a 0.1 s run), s. */
export function suggestedWindow(duration_s: number | null): { from: number; to: number } {
  const T = duration_s !== null && duration_s > 0 ? duration_s : 0.1;
  const r = (v: number) => +v.toPrecision(6);
  return { from: r(T / 2), to: r(T * 0.6) };
}

/** The project's inputs apart from control.pwm, as text: runs with equal keys differ only in the inverter model. */
export function inputsKey(file: unknown): string {
  const f = JSON.parse(JSON.stringify(file ?? null)) as { control?: Record<string, unknown> } | null;
  if (f && f.control && typeof f.control === 'object') delete f.control.pwm;
  return JSON.stringify(f);
}

/**
 * A finished run as the view keeps it: a switching run carries the last averaged run of the same
 * inputs (the run shown before it, or the one that run carried); an averaged run carries none.
 */
export function keepAveraged(prev: SimDone | null, next: SimDone): SimDone {
  if (next.pwmModel !== 'switching') return { ...next, averaged: undefined };
  const avg = prev && prev.inputsKey === next.inputsKey ? (prev.pwmModel === 'switching' ? prev.averaged : prev) : undefined;
  return { ...next, averaged: avg };
}
