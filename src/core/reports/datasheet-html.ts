/**
 * The datasheet as one self-contained HTML page (text, no DOM): title and conditions, safety
 * cautions, model parameters, the torque-speed envelope hot and cold (motoring and generating) and
 * the power curve as inline SVG, the requirement points with their verdicts, and the envelope at
 * round speeds hot and cold. The app's export and the CLI's `datasheet` command both write this.
 * Print: portrait on A4 or Letter, charts scale to the page width, no card wider than the page.
 */
import type { Finding } from '../base/finding';
import type { LimitedBy } from '../steady-state/operating-point-types';
import type { DatasheetResults } from './datasheet-results';
import { envelopeBranch } from '../steady-state/envelope-branch';
import { defaultTableStep, envelopeTable, type EnvelopeTableRow } from '../steady-state/envelope-table';
import { figureConditions, MODULATION_WORDS, limitWords } from './figure-conditions';
import { SAFETY_CAUTION } from '../steady-state/safety';
import { escapeXml as esc, svgChart, type ChartMarker, type ChartSeries } from './svg-chart';
import { efficiencyMapChart } from './efficiency-map-chart';
import { continuousSeries } from './continuous-series';
import { datasheetEfficiencySummary, type EfficiencyPeak } from './datasheet-efficiency';
import { RAD_S_TO_RPM, SQRT2 } from '../base/units';
import { TOOL_NAME, TOOL_VERSION } from '../base/version';

export interface DatasheetOptions {
  /** the date printed, YYYY-MM-DD (the caller's clock) */
  date: string;
  /** default TOOL_VERSION */
  version?: string;
  /** speed step of the envelope tables, rpm; undefined: defaultTableStep of the range */
  tableStep_rpm?: number | undefined;
  /** the name a bad table step is reported under */
  stepField?: string;
}

/** Curve colours and dashes of the datasheet (light paper). */
export const DATASHEET_COLOURS = {
  'peak-hot': '#b3261e',
  'peak-cold': '#0b5cad',
  'continuous-hot': '#d9711c',
  'continuous-cold': '#23858d',
  s1: '#00695c',
  met: '#1f7a33',
  notMet: '#b3261e',
} as const;

const num = (x: number | null | undefined, digits = 4): string => {
  if (x === null || x === undefined || !Number.isFinite(x)) return '–';
  if (x === 0) return '0';
  const a = Math.abs(x);
  return a >= 1e-3 && a < 1e7 ? String(Number(x.toPrecision(digits))) : x.toExponential(digits - 1);
};
const amps = (peak: number): string => `${num(peak)} A peak (${num(peak / SQRT2)} A rms)`;
const rpm = (w: number | null): string => (w === null || !Number.isFinite(w) ? '–' : `${Math.round(w * RAD_S_TO_RPM)} rpm`);
const tau = (s: number): string => (Number.isFinite(s) && s >= 0 ? `${num(s * 1e3)} ms` : 'unbounded (Rs = 0)');

/** What limits a requirement point, in words. */
export const LIMITED_BY_WORDS: Record<LimitedBy, string> = {
  none: 'neither limit',
  current: 'current limit',
  voltage: 'voltage limit',
  'current-and-voltage': 'current and voltage limits',
  'beyond-mtpv': 'beyond the MTPV limit (no current gives it)',
};

/** Findings that carry the safety caution (the app's Datasheet view uses the same rule). */
export const isHazardFinding = (f: Finding): boolean =>
  f.severity === 'danger' || (f.severity === 'warning' && /demagnet|uncontrolled|braking|back-emf/i.test(f.code));

const CSS = `
:root { --ink: #1d1d1f; --muted: #5a5a60; --line: #c9c9cf; --ok: #1f7a33; --bad: #b3261e; }
* { box-sizing: border-box; }
html { -webkit-text-size-adjust: 100%; }
body { margin: 0; padding: 16px; font: 13px/1.4 system-ui, 'Segoe UI', Roboto, Arial, sans-serif; color: var(--ink); background: #ffffff; }
main { max-width: 960px; margin: 0 auto; }
h1 { font-size: 22px; margin: 0 0 2px; overflow-wrap: anywhere; }
h2 { font-size: 15px; margin: 0 0 6px; }
.sub { color: var(--muted); margin: 0 0 8px; }
.conditions { margin: 0; padding: 0; list-style: none; color: var(--muted); font-size: 12px; overflow-wrap: anywhere; }
.card { border: 1px solid var(--line); border-radius: 6px; padding: 10px 12px; margin: 10px 0; overflow: hidden; break-inside: avoid; page-break-inside: avoid; }
.card.table-card { break-inside: auto; page-break-inside: auto; }
.caution { border: 2px solid var(--bad); border-radius: 6px; padding: 8px 12px; margin: 10px 0; background: #fff4f2; overflow-wrap: anywhere; }
.finding { margin: 2px 0; overflow-wrap: anywhere; }
.finding.warning::before { content: 'Warning: '; font-weight: 600; }
.finding.info::before { content: 'Note: '; font-weight: 600; }
svg { display: block; max-width: 100%; height: auto; }
table { border-collapse: collapse; width: 100%; table-layout: fixed; }
th, td { border-bottom: 1px solid var(--line); padding: 3px 5px; text-align: left; vertical-align: top; overflow-wrap: anywhere; }
th { font-weight: 600; }
td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; }
table.params th { width: 34%; font-weight: 500; }
.pass { color: var(--ok); font-weight: 600; }
.fail { color: var(--bad); font-weight: 600; }
.note { color: var(--muted); font-size: 11.5px; margin: 6px 0 0; }
.pair { display: grid; grid-template-columns: 1fr 1fr; gap: 12px; }
.pair > div { min-width: 0; }
@media (max-width: 720px) { .pair { grid-template-columns: 1fr; } body { padding: 8px; } }
@page { size: portrait; margin: 12mm 11mm 14mm; }
@media print {
  body { padding: 0; font-size: 9.5pt; }
  main { max-width: none; }
  h1 { font-size: 16pt; }
  .card, .caution { margin: 6px 0; }
  table { font-size: 8pt; }
  .pair { grid-template-columns: 1fr; }
  thead { display: table-header-group; }
  tr { break-inside: avoid; page-break-inside: avoid; }
}
`;

type Key = 'peak-hot' | 'peak-cold' | 'continuous-hot' | 'continuous-cold';
const CURVE_NAME: Record<Key, string> = {
  'peak-hot': 'peak current, hot corner',
  'peak-cold': 'peak current, cold corner',
  'continuous-hot': 'continuous current, hot corner',
  'continuous-cold': 'continuous current, cold corner',
};

/** Motoring and generating branches of each (current, corner), each cut at zero torque, and their end speeds. */
function branches(r: DatasheetResults, quantity: 'torque' | 'power'): { series: ChartSeries[]; ends: ChartMarker[] } {
  const series: ChartSeries[] = [];
  const ends: ChartMarker[] = [];
  for (const current of ['peak', 'continuous'] as const) {
    for (const corner of ['hot', 'cold'] as const) {
      const key = `${current}-${corner}` as Key;
      const x: number[] = [];
      const y: number[] = [];
      for (const direction of ['motoring', 'generating'] as const) {
        const c = r.curves.find((q) => q.current === current && q.corner === corner && q.direction === direction);
        if (!c) continue;
        const b = envelopeBranch(c.env);
        if (x.length) { x.push(NaN); y.push(NaN); }
        x.push(...b.speed_rpm);
        y.push(...(quantity === 'torque' ? b.torque_Nm : b.power_W.map((p) => p / 1000)));
        for (const e of b.ends_rpm) {
          ends.push({ x: e, y: 0, shape: 'dot', colour: DATASHEET_COLOURS[key], label: `${Math.round(e)} rpm`, side: direction === 'motoring' ? 'above' : 'below' });
        }
      }
      if (x.length) {
        series.push({ name: CURVE_NAME[key], colour: DATASHEET_COLOURS[key], dash: current === 'continuous' ? '7 4' : undefined, width: current === 'peak' ? 2.2 : 1.8, x, y });
      }
    }
  }
  // the S1 curves of a file with a thermal network (none otherwise: the charts as before)
  if (r.continuous) series.push(...continuousSeries(r.continuous, quantity, DATASHEET_COLOURS.s1));
  // one label where the motoring and generating ends of a curve nearly meet
  const span = r.speedMax * RAD_S_TO_RPM;
  for (let i = 0; i < ends.length; i++) {
    for (let j = i + 1; j < ends.length; j++) {
      const a = ends[i]!, b = ends[j]!;
      if (a.colour === b.colour && a.label && b.label && Math.abs(a.x - b.x) < 0.03 * span) {
        a.label = a.label === b.label ? a.label : `${Math.round(a.x)} / ${Math.round(b.x)} rpm`;
        b.label = undefined;
      }
    }
  }
  return { series, ends };
}

function paramRows(r: DatasheetResults): Array<[string, string]> {
  const p = r.project;
  const c = r.constantsHot;
  const c20 = r.constantsCold;
  const s = r.safety;
  const peakHot = r.curves.find((q) => q.current === 'peak' && q.corner === 'hot' && q.direction === 'motoring')!.env;
  const contHot = r.curves.find((q) => q.current === 'continuous' && q.corner === 'hot' && q.direction === 'motoring')!.env;
  const peakOf = (a: Float64Array, feasible: Uint8Array) => {
    let best = 0;
    for (let k = 0; k < a.length; k++) if (feasible[k] && Math.abs(a[k]!) > Math.abs(best)) best = a[k]!;
    return best;
  };
  const t = p.conditions;
  return [
    ['pole pairs', `${p.hot.polePairs} (${2 * p.hot.polePairs} poles)`],
    ['Rs per phase', `${num(p.machine20.Rs * 1e3)} mΩ at 20 °C, ${num(p.hot.Rs * 1e3)} mΩ at ${num(t.windingTemp_C)} °C`],
    ['Ld, Lq', `${num(p.hot.Ld * 1e3)} mH, ${num(p.hot.Lq * 1e3)} mH (saliency Lq/Ld ${num(c.saliency, 3)})`],
    ['ψm (peak)', `${num(p.machine20.psiM * 1e3)} mWb at 20 °C, ${num(p.hot.psiM * 1e3)} mWb at ${num(t.magnetTemp_C)} °C, ${num(p.cold.psiM * 1e3)} mWb at ${num(t.coldTemp_C)} °C`],
    ['Kt (id = 0, hot)', `${num(c.Kt_Nm_per_Arms)} N·m/A rms (${num(c.Kt_Nm_per_Apeak)} N·m/A peak)`],
    ['Ke (cold)', `${num(c20.Ke_VLLrms_per_krpm)} V line-line rms per 1000 rpm`],
    ['electrical time constants', `τd ${tau(c.tauD_s)}, τq ${tau(c.tauQ_s)} (hot)`],
    ['characteristic current ψm/Ld', `${amps(c.characteristicCurrent_A)}, hot`],
    ['inverter', `${num(p.inverter.Vdc)} V bus, ${MODULATION_WORDS[p.inverter.modulation]}, Vmax ${num(p.peak.Vmax)} V peak phase; Imax ${amps(p.inverter.Imax)}, Icont ${amps(p.inverter.Icont)}`],
    ['effective peak current', limitWords(p.currentLimits.peak)],
    ['effective continuous current', limitWords(p.currentLimits.continuous)],
    ['base speed (peak current, hot)', rpm(peakHot.baseSpeed)],
    ['maximum speed (peak current, hot)', peakHot.maxSpeed === null ? 'unbounded (ψm/Ld inside the current limit)' : rpm(peakHot.maxSpeed)],
    ['maximum speed (continuous current, hot)', contHot.maxSpeed === null ? 'unbounded (ψm/Ld inside the current limit)' : rpm(contHot.maxSpeed)],
    ['peak torque (hot, standstill)', `${num(peakHot.torque[0])} N·m`],
    ['continuous torque (hot, standstill)', `${num(contHot.torque[0])} N·m`],
    ['peak power (hot)', `${num(peakOf(peakHot.power, peakHot.feasible) / 1000)} kW`],
    ['continuous power (hot)', `${num(peakOf(contHot.power, contHot.feasible) / 1000)} kW`],
    ['least Imax for all points', r.sizing.minImax === null || !Number.isFinite(r.sizing.minImax) ? 'no current meets all points' : amps(r.sizing.minImax)],
    ['least Vdc for all points', r.sizing.minVdc === null || !Number.isFinite(r.sizing.minVdc) ? '–' : `${num(r.sizing.minVdc)} V`],
    ['open-circuit back-EMF, cold', `${num(s.backEmfLineLinePeak_V)} V line-line peak at ${rpm(r.safetySpeed)} (${p.rated.maxSpeed_rad_s !== undefined ? 'rated maximum speed' : 'plot end'}), bus ${num(p.inverter.Vdc)} V`],
    ['uncontrolled-generator speed, cold', s.uncontrolledGeneratorSpeed_rad_s === null ? 'none (no magnet flux)' : rpm(s.uncontrolledGeneratorSpeed_rad_s)],
  ];
}

function requirementsCard(r: DatasheetResults): string {
  const pts = r.sizing.points;
  if (!pts.length) return '<section class="card"><h2>Requirement points</h2><p class="note">The project has no requirement points.</p></section>';
  const rows = pts.map((pt, i) => {
    const cold = r.sizingCold.points[i];
    const coldNote = cold && !cold.met ? ` (${esc(LIMITED_BY_WORDS[cold.limitedBy])}, ${num(cold.torqueAvailable_Nm)} N·m available)` : '';
    return (
      `<tr data-met="${pt.met && cold?.met ? 'yes' : 'no'}"><td>${esc(pt.label)}</td><td class="num">${num(pt.speed_rpm)}</td><td class="num">${num(pt.torque_Nm)}</td>` +
      `<td class="num">${num(pt.torqueAvailable_Nm)}</td><td class="num">${num(pt.current_A)}<br>${num(pt.current_A / SQRT2)} rms</td>` +
      `<td class="num">${pt.met ? num(pt.voltage_V) : '–'}</td><td>${esc(LIMITED_BY_WORDS[pt.limitedBy])}</td>` +
      `<td class="${pt.met ? 'pass' : 'fail'}">${pt.met ? 'met' : 'NOT met'}</td><td class="${cold?.met ? 'pass' : 'fail'}">${cold?.met ? 'met' : 'NOT met'}${coldNote}</td></tr>`
    );
  });
  return (
    '<section class="card table-card"><h2>Requirement points and verdicts (peak current)</h2>' +
    '<table data-testid="verdicts"><colgroup><col style="width:17%"><col style="width:9%"><col style="width:9%"><col style="width:10%"><col style="width:11%"><col style="width:9%"><col style="width:13%"><col style="width:8%"><col style="width:14%"></colgroup>' +
    '<thead><tr><th>point</th><th class="num">speed rpm</th><th class="num">torque asked N·m</th><th class="num">available, hot N·m</th><th class="num">current, hot A peak</th><th class="num">voltage, hot V peak</th><th>limited by (hot)</th><th>hot</th><th>cold</th></tr></thead>' +
    `<tbody>${rows.join('')}</tbody></table>` +
    '<p class="note">Available torque, current and voltage are for the hot corner (least torque per ampere); the cold corner (most back-EMF) is where voltage-limited points fail first. A point out of reach has no operating voltage.</p></section>'
  );
}

function tableCard(corner: 'hot' | 'cold', rows: EnvelopeTableRow[], step: number, r: DatasheetResults): string {
  const t = r.project.conditions;
  const temps = corner === 'hot' ? `winding ${num(t.windingTemp_C)} °C, magnet ${num(t.magnetTemp_C)} °C` : `${num(t.coldTemp_C)} °C`;
  const cell = (x: number | null, d = 4) => `<td class="num">${x === null ? '–' : num(x, d)}</td>`;
  const body = rows
    .map((q) => `<tr><td class="num">${q.speed_rpm}</td>${cell(q.peakMotoring_Nm)}${cell(q.peakMotoring_kW)}${cell(q.peakGenerating_Nm)}${cell(q.continuousMotoring_Nm)}${cell(q.continuousMotoring_kW)}${cell(q.continuousGenerating_Nm)}</tr>`)
    .join('');
  return (
    `<section class="card table-card"><h2>Envelope at round speeds, ${corner} corner (${temps})</h2>` +
    `<table data-testid="envelope-table-${corner}"><thead><tr><th class="num">speed rpm</th><th class="num">peak motoring N·m</th><th class="num">peak motoring kW</th><th class="num">peak generating N·m</th><th class="num">continuous motoring N·m</th><th class="num">continuous motoring kW</th><th class="num">continuous generating N·m</th></tr></thead>` +
    `<tbody>${body}</tbody></table><p class="note">Every ${num(step)} rpm. – : beyond the maximum speed of that curve (no torque of that sign within both limits).</p></section>`
  );
}

/** The step the envelope tables use for these results and options, rpm. */
export function datasheetTableStep(r: DatasheetResults, o: Pick<DatasheetOptions, 'tableStep_rpm'>): number {
  return o.tableStep_rpm ?? defaultTableStep(r.speedMax * RAD_S_TO_RPM);
}

/**
 * The datasheet's figures as SVG text: torque and power against speed, each with title, legend and
 * conditions, and the system-efficiency map when the results carry one (else null).
 */
export function datasheetCharts(r: DatasheetResults, o: Pick<DatasheetOptions, 'date' | 'version'>): { torque: string; power: string; efficiency: string | null } {
  const p = r.project;
  const name = p.name.trim() || 'Unnamed project';
  const conditions = figureConditions(p, { date: o.date, version: o.version ?? TOOL_VERSION });
  const torqueLines = branches(r, 'torque');
  const powerLines = branches(r, 'power');
  const points: ChartMarker[] = p.requirements.map((q, i) => {
    const met = (r.sizing.points[i]?.met ?? false) && (r.sizingCold.points[i]?.met ?? false);
    return { x: q.speed_rpm, y: q.torque_Nm, shape: met ? 'circle' : 'cross', colour: met ? DATASHEET_COLOURS.met : DATASHEET_COLOURS.notMet, label: met ? q.label : `${q.label} (not met)` };
  });
  const torque = svgChart({
    title: `${name}: torque against speed`,
    xLabel: 'speed, rpm (mechanical)',
    yLabel: 'torque, N·m',
    series: torqueLines.series,
    markers: [...torqueLines.ends, ...points],
    // only what the chart shows
    markerLegend: [
      ...(points.some((q) => q.shape === 'circle') ? [{ name: 'requirement met (hot and cold)', shape: 'circle' as const, colour: DATASHEET_COLOURS.met }] : []),
      ...(points.some((q) => q.shape === 'cross') ? [{ name: 'requirement not met', shape: 'cross' as const, colour: DATASHEET_COLOURS.notMet }] : []),
      ...(torqueLines.ends.length ? [{ name: 'curve ends: torque reaches zero', shape: 'dot' as const, colour: '#5a5a60' }] : []),
    ],
    caption: conditions,
    xMin: 0,
    testId: 'chart-torque',
  });
  const power = svgChart({
    title: `${name}: mechanical power against speed`,
    xLabel: 'speed, rpm (mechanical)',
    yLabel: 'power, kW (negative: generating)',
    series: powerLines.series,
    markers: powerLines.ends,
    caption: conditions,
    xMin: 0,
    plotHeight: 240,
    testId: 'chart-power',
  });
  const e = r.efficiency;
  const efficiency = e
    ? efficiencyMapChart(
        { project: p, efficiency: e, envelopes: r.curves.filter((q) => q.corner === e.grid.corner) },
        { date: o.date, version: o.version ?? TOOL_VERSION },
      )
    : null;
  return { torque, power, efficiency };
}

const peakWords = (q: EfficiencyPeak | null, what: string): string =>
  q === null ? `no ${what} point inside the envelope` : `${num(100 * q.efficiency)} % ${what} at ${Math.round(q.speed_rpm)} rpm, ${num(q.torque_Nm)} N·m`;

/** The efficiency map's card: the figure and its best points in words (empty without a map). */
function efficiencyCard(r: DatasheetResults, svg: string | null): string {
  if (!r.efficiency || svg === null) return '';
  const s = datasheetEfficiencySummary(r.efficiency);
  return (
    `<section class="card"><h2>System efficiency, ${s.corner} corner, least-current control</h2>${svg}` +
    `<p class="note" data-testid="efficiency-peaks">Highest system efficiency: ${esc(peakWords(s.peakMotoring, 'motoring'))}; ${esc(peakWords(s.peakGenerating, 'generating'))} ` +
    `(grid ${s.speedPoints} x ${s.torquePoints}, ${s.pointsInside} points inside the envelope).</p></section>`
  );
}

export function datasheetHtml(r: DatasheetResults, o: DatasheetOptions): string {
  const p = r.project;
  const name = p.name.trim() || 'Unnamed project';
  const conditions = figureConditions(p, { date: o.date, version: o.version ?? TOOL_VERSION });
  const top_rpm = r.speedMax * RAD_S_TO_RPM;
  const step = datasheetTableStep(r, o);
  const field = o.stepField ?? 'table step';
  const hot = envelopeTable(p.models.hot, p.peak, p.continuous, top_rpm, step, field);
  const cold = envelopeTable(p.models.cold, p.peak, p.continuous, top_rpm, step, field);

  const { torque: torqueSvg, power: powerSvg, efficiency: efficiencySvg } = datasheetCharts(r, { date: o.date, version: o.version ?? TOOL_VERSION });

  const findings = [...p.findings, ...r.safety.findings];
  const hazards = findings.filter(isHazardFinding);
  const others = findings.filter((f) => !isHazardFinding(f));
  const caution =
    `<div class="caution" role="alert" data-testid="cautions"><strong>Caution.</strong> ${hazards.map((h) => esc(h.message)).join(' ')} ${esc(SAFETY_CAUTION)} ` +
    'These figures come from a model; confirm them on the machine with the usual protective measures.</div>';
  const findingList = others.length
    ? `<section class="card"><h2>Findings</h2>${others.map((f) => `<div class="finding ${f.severity}">${esc(f.message)}${f.field ? ` <span class="note">(${esc(f.field)})</span>` : ''}</div>`).join('')}</section>`
    : '';
  const params = paramRows(r)
    .map(([k, v]) => `<tr><th>${esc(k)}</th><td>${esc(v)}</td></tr>`)
    .join('');

  return (
    '<!doctype html><html lang="en"><head><meta charset="utf-8">' +
    '<meta name="viewport" content="width=device-width, initial-scale=1">' +
    `<meta name="generator" content="${esc(`${TOOL_NAME} ${o.version ?? TOOL_VERSION}`)}">` +
    `<title>${esc(`${name}: datasheet`)}</title><style>${CSS}</style></head><body><main>` +
    `<header class="card" data-testid="sheet-head"><h1>${esc(name)}</h1><p class="sub">Torque-speed datasheet of a PMSM on its inverter, field-oriented control</p>` +
    `<ul class="conditions" data-testid="conditions">${conditions.map((l) => `<li>${esc(l)}</li>`).join('')}</ul></header>` +
    caution +
    findingList +
    `<section class="card"><h2>Model and drive</h2><table class="params" data-testid="summary"><tbody>${params}</tbody></table></section>` +
    `<section class="card"><h2>Torque-speed envelope, hot and cold, motoring and generating</h2>${torqueSvg}</section>` +
    `<section class="card"><h2>Power</h2>${powerSvg}</section>` +
    efficiencyCard(r, efficiencySvg) +
    requirementsCard(r) +
    tableCard('hot', hot, step, r) +
    tableCard('cold', cold, step, r) +
    '<footer class="note">Speeds mechanical. Currents peak phase (amplitude-invariant dq) with rms beside; voltages peak phase. ' +
    `Curves from 0 to ${Math.round(top_rpm)} rpm; a curve that stops ends on the zero-torque line at the speed printed there. ` +
    `${esc(TOOL_NAME)} ${esc(o.version ?? TOOL_VERSION)}, ${esc(o.date)}. High DC-bus voltage is dangerous: follow local codes, licensed practice and IEC 61800-5-1.</footer>` +
    '</main></body></html>'
  );
}
