// The torque-speed and power-speed figures (peak and continuous, motoring and generating, hot and
// cold; requirement points, region bands, base and maximum speed), drawn by the Envelope view and
// the Datasheet view alike.
import type { Data, Layout } from 'plotly.js-dist-min';
import { describeLimit } from '../../../core/drive/current-limits';
import type { CurrentLimits } from '../../../core/drive/current-limit-types';
import { RAD_S_TO_RPM } from '../../../core/base/units';
import { envelopeBranch } from '../../../core/steady-state/envelope-branch';
import { axis, baseLayout, CURVE, readTheme, REGION_FILL } from './plot-style';
import { pointVerdict, type Curve, type Results } from '../state/compute';
import { plotText } from './plot-text';
import { placeSpeedMarks } from './speed-marks';
import { chooseTextPositions, textBox, type Box, type TextPosition } from './label-layout';
import type { DatasheetContinuous } from '../../../core/reports/datasheet-parts';
import { S1_NO_LEGEND, s1Traces } from './s1-traces';
const REGION_NAME = { mtpa: 'MTPA', 'field-weakening': 'field weakening', mtpv: 'MTPV' } as const;

export type Show = { peak: boolean; continuous: boolean; hot: boolean; cold: boolean; generating: boolean };

function curveStyle(c: Curve, col: (typeof CURVE)['light'] | (typeof CURVE)['dark']) {
  const colour = c.current === 'peak' ? (c.corner === 'hot' ? col.hot : col.cold) : c.corner === 'hot' ? col.hotCont : col.coldCont;
  return { color: colour, width: c.current === 'peak' ? 2.4 : 1.6, dash: c.corner === 'hot' ? 'solid' : 'dash' };
}

/** A curve's legend name: its effective current limit, which rating binds it, and the magnet corner. */
const curveName = (c: Curve, limits: CurrentLimits) => `${describeLimit(c.current === 'peak' ? 'peak' : 'continuous', limits[c.current === 'peak' ? 'peak' : 'continuous'])}, ${c.corner} magnet`;

/** Contiguous runs of a region along the reference envelope (feasible points only). */
export function regionRuns(r: Results): Array<{ region: keyof typeof REGION_NAME; x0: number; x1: number }> {
  const e = r.main;
  const runs: Array<{ region: keyof typeof REGION_NAME; x0: number; x1: number }> = [];
  for (let k = 0; k < e.speed.length; k++) {
    if (!e.feasible[k]) continue;
    const x = e.speed[k]! * RAD_S_TO_RPM;
    const reg = e.region[k]!;
    const last = runs[runs.length - 1];
    if (last && last.region === reg) last.x1 = x;
    else {
      if (last) last.x1 = (last.x1 + x) / 2;
      runs.push({ region: reg, x0: last ? last.x1 : x, x1: x });
    }
  }
  return runs;
}

/**
 * The figure; `s1` (the continuous torque from the thermal network, when the project has one) adds
 * its curves after the envelopes', drawn with the continuous curves (show.continuous).
 */
export function torqueSpeedFigure(r: Results, theme: 'light' | 'dark', show: Show, withPower: boolean, plotWidth_px = 460, s1: DatasheetContinuous | null = null): { data: Data[]; layout: Layout } {
  const t = readTheme();
  const col = CURVE[theme];
  const data: Data[] = [];
  const endMarks: Data[] = [];
  // one trace per (current, corner): motoring, a gap, then generating (fewer traces draw faster)
  for (const current of ['peak', 'continuous'] as const) {
    for (const corner of ['hot', 'cold'] as const) {
      if (!show[current] || !show[corner]) continue;
      const x: Array<number | null> = [];
      const yT: Array<number | null> = [];
      const yP: Array<number | null> = [];
      let first: Curve | null = null;
      const ends: Array<{ rpm: number; direction: Curve['direction'] }> = [];
      for (const c of r.curves) {
        if (c.current !== current || c.corner !== corner || (c.direction === 'generating' && !show.generating)) continue;
        first ??= c;
        if (x.length) {
          x.push(null);
          yT.push(null);
          yP.push(null);
        }
        // each branch cut where its torque reaches zero, ending on the zero line at that speed
        const b = envelopeBranch(c.env);
        for (let k = 0; k < b.speed_rpm.length; k++) {
          const gap = Number.isNaN(b.speed_rpm[k]!);
          x.push(gap ? null : b.speed_rpm[k]!);
          yT.push(gap ? null : b.torque_Nm[k]!);
          yP.push(gap ? null : b.power_W[k]! / 1000);
        }
        for (const w of b.ends_rpm) ends.push({ rpm: w, direction: c.direction });
      }
      if (!first) continue;
      const st = curveStyle(first, col);
      const name = curveName(first, r.project.currentLimits);
      // the speeds where the curve stops, labelled once where the motoring and generating ends nearly meet
      const span = r.speedMax * RAD_S_TO_RPM;
      const shown = ends.filter((e, i) => !(e.direction === 'generating' && ends.some((m, j) => j < i && m.direction === 'motoring' && Math.abs(m.rpm - e.rpm) < 0.03 * span)));
      if (shown.length) {
        const label = (e: { rpm: number; direction: string }) => {
          const twin = ends.find((g) => g !== e && g.direction !== e.direction && Math.abs(g.rpm - e.rpm) < 0.03 * span);
          return twin ? `${Math.round(e.rpm)} / ${Math.round(twin.rpm)} rpm` : `${Math.round(e.rpm)} rpm`;
        };
        endMarks.push({
          type: 'scatter',
          mode: 'markers+text',
          x: shown.map((e) => e.rpm),
          y: shown.map(() => 0),
          text: shown.map(label),
          // a shared label sits above the zero line for the hot corner and below it for the cold one (they never cover each other)
          textposition: shown.map((e) => {
            const shared = ends.some((g) => g !== e && g.direction !== e.direction && Math.abs(g.rpm - e.rpm) < 0.03 * span);
            const up = shared ? corner === 'hot' : e.direction === 'motoring';
            return up ? 'top left' : 'bottom left';
          }),
          textfont: { size: 11, color: st.color },
          marker: { size: 7, color: st.color },
          name: `${name}: end`,
          legendgroup: name,
          showlegend: false,
          hovertemplate: `${name} ends: torque reaches zero at %{x:.0f} rpm<extra></extra>`,
        });
      }
      data.push({ type: 'scatter', mode: 'lines', x, y: yT, name, legendgroup: name, line: st, hovertemplate: `${name}<br>%{x:.0f} rpm, %{y:.4g} N·m<extra></extra>` });
      if (withPower) {
        data.push({ type: 'scatter', mode: 'lines', x, y: yP, xaxis: 'x', yaxis: 'y2', name, legendgroup: name, showlegend: false, line: st, hovertemplate: `${name}<br>%{x:.0f} rpm, %{y:.4g} kW<extra></extra>` });
      }
    }
  }
  if (s1 && show.continuous) data.push(...s1Traces(s1, col.s1, show.generating, withPower));
  data.push(...endMarks);
  const runs = regionRuns(r);
  const fill = REGION_FILL[theme];
  const shapes: Record<string, unknown>[] = runs.map((run) => ({
    type: 'rect',
    xref: 'x',
    yref: 'paper',
    x0: run.x0,
    x1: run.x1,
    y0: 0,
    y1: 1,
    fillcolor: fill[run.region],
    line: { width: 0 },
    layer: 'below',
  }));
  const top_rpm = r.speedMax * RAD_S_TO_RPM;
  // torque axis range from the drawn data (a fixed range lets labels sit in data coordinates)
  let tMin = 0;
  let tMax = 0;
  for (const c of r.curves) {
    if (!show[c.current] || !show[c.corner] || (c.direction === 'generating' && !show.generating)) continue;
    for (let k = 0; k < c.env.torque.length; k++) {
      const v = c.env.torque[k]!;
      if (v < tMin) tMin = v;
      if (v > tMax) tMax = v;
    }
  }
  for (const q of r.project.requirements) {
    tMin = Math.min(tMin, q.torque_Nm);
    tMax = Math.max(tMax, q.torque_Nm);
  }
  const pad = 0.08 * (tMax - tMin || 1);
  const yRange = [tMin - pad, tMax + 1.6 * pad];
  // region names and base/maximum speed as one text trace (cheaper to draw than annotations);
  // a name that does not fit across its band (about 6.5 px a character) is shortened
  const lx: number[] = [];
  const ly: number[] = [];
  const lt: string[] = [];
  const lp: string[] = [];
  for (const run of runs) {
    if (run.x1 - run.x0 < 0.025 * top_rpm) continue;
    const long = REGION_NAME[run.region];
    const fits = (run.x1 - run.x0) / top_rpm > (long.length * 6.5 + 8) / plotWidth_px;
    lx.push((run.x0 + run.x1) / 2);
    ly.push(yRange[1]!);
    lt.push(fits ? long : run.region === 'field-weakening' ? 'FW' : long);
    lp.push('bottom center');
  }
  const marks: Array<{ x: number; text: string }> = [];
  for (const [w, label] of [
    [r.main.baseSpeed, 'base'],
    [r.main.maxSpeed, 'max'],
  ] as Array<[number | null, string]>) {
    if (w === null || !(w > 0) || w > r.speedMax) continue;
    const x = w * RAD_S_TO_RPM;
    shapes.push({ type: 'line', xref: 'x', yref: 'paper', x0: x, x1: x, y0: 0, y1: 1, line: { color: t.ink, width: 1.2, dash: 'dot' } });
    marks.push({ x, text: `${label} ${Math.round(x)} rpm` });
  }
  // one row of labels is about 16 px of a plot area about 260 px tall
  const rowH = ((yRange[1]! - yRange[0]!) * 16) / 260;
  for (const m of placeSpeedMarks(marks, top_rpm, plotWidth_px)) {
    lx.push(m.x);
    ly.push(yRange[0]! + m.row * rowH);
    lt.push(m.text);
    lp.push(m.position);
  }
  // requirement points as pass/fail markers; each label beside its point where it is clear of the
  // other labels (estimated boxes on a plot area about plotWidth_px x 260 px)
  const req = r.project.requirements;
  const W = plotWidth_px;
  const H = 260;
  const toPx = (x: number, y: number): [number, number] => [(x / top_rpm) * W, ((yRange[1]! - y) / (yRange[1]! - yRange[0]!)) * H];
  const taken: Box[] = [];
  for (let k = 0; k < lx.length; k++) {
    const [px, py] = toPx(lx[k]!, ly[k]!);
    taken.push(textBox(px, py, lt[k]!, lp[k] as TextPosition));
  }
  // the drawn curves as soft obstacles: a label on a line only when every other place is worse
  const curvePts: Box[] = [];
  for (const c of r.curves) {
    if (!show[c.current] || !show[c.corner] || (c.direction === 'generating' && !show.generating)) continue;
    const e = c.env;
    for (let k = 0; k < e.speed.length; k++) {
      if (!e.feasible[k]) continue;
      const [px, py] = toPx(e.speed[k]! * RAD_S_TO_RPM, e.torque[k]!);
      curvePts.push([px - 1.5, py - 1.5, px + 1.5, py + 1.5]);
    }
  }
  // a label is the file's text: plain text to plotly, never its markup
  const labelOf = (i: number): string => {
    const f = pointVerdict(r, i).fails;
    const label = plotText(req[i]!.label);
    return f === 'cold' || f === 'hot' ? `${label} (fails ${f})` : label;
  };
  // each label beside its point, or a line or two above or below it where that is clearer
  const LINE = 15;
  const perPx = (yRange[1]! - yRange[0]!) / H;
  type Spot = { line: number; side: 'left' | 'right' };
  const spots = chooseTextPositions<Spot>(
    req.map((q, i) => {
      const met = pointVerdict(r, i).met;
      const side: Spot['side'] = q.speed_rpm > 0.72 * top_rpm ? 'left' : 'right';
      const other: Spot['side'] = side === 'left' ? 'right' : 'left';
      // a missed point lies outside the envelope: its label prefers the side away from zero torque
      const away = q.torque_Nm >= 0 ? 1 : -1;
      const lines = met ? [0, 1, -1, 2, -2] : [away, 0, 2 * away, -away, -2 * away];
      const [px, py] = toPx(q.speed_rpm, q.torque_Nm);
      return { px, py, text: labelOf(i), candidates: [side, other].flatMap((sd) => lines.map((line) => ({ line, side: sd }))) };
    }),
    { width: W, height: H },
    taken,
    curvePts,
    (c, px, py, text) => textBox(px, py - c.line * LINE, text, `middle ${c.side}`),
  ).map((c) => ({ dy: c.line * LINE * perPx, position: `middle ${c.side}` as TextPosition }));
  for (const met of [true, false]) {
    const idx = req.map((_, i) => i).filter((i) => pointVerdict(r, i).met === met);
    if (!idx.length) continue;
    data.push({
      type: 'scatter',
      mode: 'markers',
      x: idx.map((i) => req[i]!.speed_rpm),
      y: idx.map((i) => req[i]!.torque_Nm),
      text: idx.map(labelOf),
      name: met ? 'requirement met' : 'requirement not met',
      marker: met
        ? { symbol: 'circle', size: 11, color: t.ok, line: { color: t.panel, width: 1.5 } }
        : { symbol: 'x-thin-open', size: 13, color: t.bad, line: { width: 3, color: t.bad } },
      hovertemplate: `%{text}: %{x:.0f} rpm, %{y:.4g} N·m — ${met ? 'met' : 'NOT met'}<extra></extra>`,
    });
    data.push({
      type: 'scatter',
      mode: 'text',
      x: idx.map((i) => req[i]!.speed_rpm),
      y: idx.map((i) => req[i]!.torque_Nm + spots[i]!.dy),
      text: idx.map(labelOf),
      textposition: idx.map((i) => spots[i]!.position),
      textfont: { size: 11, color: met ? t.ok : t.bad },
      hoverinfo: 'skip',
      showlegend: false,
    });
  }
  data.push({
    type: 'scatter',
    mode: 'text',
    x: lx,
    y: ly,
    text: lt,
    textposition: lp,
    textfont: { size: 11, color: t.ink },
    hoverinfo: 'skip',
    showlegend: false,
  });
  const xTitle = 'speed, rpm (mechanical)';
  const layout: Layout = baseLayout(t, {
    margin: { l: 70, r: 16, t: 12, b: 40 },
    hovermode: 'closest',
    showlegend: true,
    legend: { orientation: 'h', x: 0, y: withPower ? -0.1 : -0.3, font: { size: 11 } },
    xaxis: axis(t, withPower ? '' : xTitle, { range: [0, r.speedMax * RAD_S_TO_RPM], anchor: withPower ? 'y2' : 'y', showticklabels: true }),
    yaxis: axis(t, 'torque, N·m', withPower ? { domain: [0.45, 1], range: yRange } : { range: yRange }),
    ...(withPower ? { yaxis2: axis(t, 'mechanical power, kW', { domain: [0, 0.37] }) } : {}),
    shapes,
  });
  if (withPower) (layout.xaxis as Record<string, unknown>).title = { text: xTitle, font: { size: 12 } };
  return { data, layout };
}

/** The power-speed plot: the power traces of the combined figure on their own axes, with the legend. */
export function powerSpeedFigure(r: Results, theme: 'light' | 'dark', show: Show, s1: DatasheetContinuous | null = null): { data: Data[]; layout: Layout } {
  const both = torqueSpeedFigure(r, theme, show, true, 460, s1);
  const data = both.data.filter((d) => d.yaxis === 'y2').map((d) => ({ ...d, yaxis: 'y', showlegend: (d as { meta?: unknown }).meta !== S1_NO_LEGEND }));
  const l = both.layout as Record<string, any>;
  const layout: Layout = {
    ...l,
    // the legend's entries name the effective limits (long): it starts below the speed axis's title
    // and wraps onto its own rows in the bottom margin
    margin: { l: 70, r: 16, t: 30, b: 100 },
    yaxis: { ...l.yaxis2, domain: [0, 1] },
    xaxis: { ...l.xaxis, anchor: 'y' },
    legend: { orientation: 'h', x: 0, y: -0.36, yanchor: 'top', font: { size: 11 } },
  };
  delete (layout as Record<string, unknown>).yaxis2;
  return { data, layout };
}

/** The torque-speed plot alone, without a legend (the power plot below carries it). */
export function torqueOnlyFigure(r: Results, theme: 'light' | 'dark', show: Show, s1: DatasheetContinuous | null = null): { data: Data[]; layout: Layout } {
  const f = torqueSpeedFigure(r, theme, show, false, 460, s1);
  // the top margin holds the plot's toolbar, clear of the region labels along the top edge
  return { data: f.data, layout: { ...f.layout, showlegend: false, margin: { l: 70, r: 16, t: 30, b: 40 } } };
}
