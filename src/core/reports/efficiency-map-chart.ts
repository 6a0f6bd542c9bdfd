/**
 * The datasheet's efficiency figure as SVG text: iso-lines of system efficiency over speed and shaft
 * torque (marching squares on the map's grid, mathematics/contour-lines.ts), each labelled with its
 * level, the hot corner's peak and continuous envelopes drawn over them, the best point motoring and
 * generating, title, axis titles with units, legend and the conditions every figure carries.
 */
import type { ResolvedProject } from '../project/project';
import type { Envelope } from '../steady-state/envelope';
import { envelopeBranch } from '../steady-state/envelope-branch';
import { contourLines } from '../mathematics/contour-lines';
import { figureConditions } from './figure-conditions';
import { DEFAULT_CHART, svgChart, textWidth, type ChartMarker, type ChartSeries, type ChartText } from './svg-chart';
import { datasheetEfficiencySummary, EFFICIENCY_LEVELS, type DatasheetEfficiency } from './datasheet-efficiency';
import { radSToRpm } from '../base/units';
import { TOOL_VERSION } from '../base/version';

export interface EfficiencyChartInput {
  project: ResolvedProject;
  efficiency: DatasheetEfficiency;
  /** drawn over the map: the map corner's envelopes, peak and continuous current, motoring and generating */
  envelopes: ReadonlyArray<{ current: 'peak' | 'continuous'; env: Envelope }>;
}

/** One colour per level of EFFICIENCY_LEVELS, cool (low) to warm (high). */
export const LEVEL_COLOURS: readonly string[] = ['#5e3c99', '#3b5bab', '#1f78b4', '#15858a', '#2e8b3a', '#6f7f00', '#a86f00', '#c8501b', '#b3261e'];

const PLOT_HEIGHT = 360;
const PEAK_COLOUR = '#1d1d1f';
/** a line shorter than this on the page (px) goes unlabelled; a longer one gets a label every LABEL_EVERY px */
const LABEL_MIN = 50;
const LABEL_EVERY = 240;

const pct = (x: number): string => `${(100 * x).toFixed(1)} %`;

export function efficiencyMapChart(input: EfficiencyChartInput, o: { date: string; version?: string }): string {
  const p = input.project;
  const { grid, map } = input.efficiency;
  const name = p.name.trim() || 'Unnamed project';
  const s = datasheetEfficiencySummary(input.efficiency);
  const speeds = Array.from(map.speeds, radSToRpm);
  const torques = map.torques;
  // page scale of the data, for the labels' spacing and overlap (the chart's axes round these spans a little)
  const sx = (DEFAULT_CHART.width - 84) / Math.max(speeds[speeds.length - 1]!, 1e-9);
  const sy = PLOT_HEIGHT / (2 * grid.torqueMax);
  const series: ChartSeries[] = [];
  const texts: ChartText[] = [];
  const boxes: Array<{ x0: number; y0: number; x1: number; y1: number }> = [];
  const peak = s.peakSystem?.efficiency ?? -Infinity;
  // the best points' dots and their labels (above motoring, below generating; y up here) keep the contour labels off
  for (const [q, up] of [[s.peakMotoring, 1], [s.peakGenerating, -1]] as const) {
    if (!q) continue;
    const px = q.speed_rpm * sx, py = q.torque_Nm * sy;
    boxes.push({ x0: px - 7, y0: py - 7, x1: px + 7, y1: py + 7 });
    boxes.push({ x0: px - 26, y0: up > 0 ? py + 6 : py - 24, x1: px + 26, y1: up > 0 ? py + 24 : py - 6 });
  }
  EFFICIENCY_LEVELS.forEach((level, n) => {
    if (!(level < peak)) return;
    const colour = LEVEL_COLOURS[n]!;
    const label = String(Math.round(100 * level)); // in per cent (a space would let the line show through)
    const w = textWidth(label, 10) + 4;
    const x: number[] = [];
    const y: number[] = [];
    for (const line of contourLines(speeds, torques, map.system, level)) {
      if (x.length) { x.push(NaN); y.push(NaN); }
      x.push(...line.x);
      y.push(...line.y);
      // labels along the line at even steps of its length on the page, where they cover no other
      const cum = [0];
      for (let k = 1; k < line.x.length; k++) cum.push(cum[k - 1]! + Math.hypot((line.x[k]! - line.x[k - 1]!) * sx, (line.y[k]! - line.y[k - 1]!) * sy));
      const len = cum[cum.length - 1]!;
      if (len < LABEL_MIN) continue;
      const count = Math.max(1, Math.round(len / LABEL_EVERY));
      for (let c = 0; c < count; c++) {
        // the even spot first, then spots either side of it along the line
        for (const shift of [0, 0.1, -0.1, 0.2, -0.2, 0.3, -0.3, 0.4, -0.4]) {
          const want = ((c + 0.5 + shift) * len) / count;
          if (want < 0 || want > len) continue;
          const k = Math.max(1, cum.findIndex((d) => d >= want));
          const t = cum[k]! > cum[k - 1]! ? (want - cum[k - 1]!) / (cum[k]! - cum[k - 1]!) : 0;
          const lx = line.x[k - 1]! + t * (line.x[k]! - line.x[k - 1]!);
          const ly = line.y[k - 1]! + t * (line.y[k]! - line.y[k - 1]!);
          const px = lx * sx, py = ly * sy;
          const box = { x0: px - w / 2, y0: py - 7, x1: px + w / 2, y1: py + 7 };
          if (boxes.some((b) => box.x0 < b.x1 && b.x0 < box.x1 && box.y0 < b.y1 && b.y0 < box.y1)) continue;
          boxes.push(box);
          texts.push({ x: lx, y: ly, text: label, colour });
          break;
        }
      }
    }
    series.push({ name: `${label} %`, colour, width: 1.3, x, y, legend: false });
  });
  // the envelopes over the map
  for (const current of ['peak', 'continuous'] as const) {
    const x: number[] = [];
    const y: number[] = [];
    for (const e of input.envelopes.filter((q) => q.current === current)) {
      const b = envelopeBranch(e.env);
      if (x.length) { x.push(NaN); y.push(NaN); }
      x.push(...b.speed_rpm);
      y.push(...b.torque_Nm);
    }
    if (x.length)
      series.push(current === 'peak'
        ? { name: `peak-current envelope, ${grid.corner} corner`, colour: '#1d1d1f', width: 2.2, x, y }
        : { name: `continuous-current envelope, ${grid.corner} corner`, colour: '#5a5a60', width: 1.6, dash: '7 4', x, y });
  }
  series.push({ name: 'iso-efficiency line, labelled with its level in %', colour: LEVEL_COLOURS[4]!, width: 1.3, x: [], y: [] });
  const markers: ChartMarker[] = [];
  for (const [q, side] of [[s.peakMotoring, 'above'], [s.peakGenerating, 'below']] as const) {
    if (q) markers.push({ x: q.speed_rpm, y: q.torque_Nm, shape: 'circle', colour: PEAK_COLOUR, label: pct(q.efficiency), side });
  }
  const caption = [
    ...figureConditions(p, { date: o.date, version: o.version ?? TOOL_VERSION }),
    `system efficiency: shaft power over DC-link power motoring, DC-link power over shaft power generating · copper, iron, mechanical and inverter losses · ` +
      `least current (MTPA, field weakening) at the peak limits, ${grid.corner} corner · grid ${map.speeds.length} speeds x ${torques.length} shaft torques; ` +
      'lines end within half a cell where the grid leaves the envelope · envelopes: electromagnetic torque',
  ];
  return svgChart({
    title: `${name}: system efficiency map, ${grid.corner} corner`,
    xLabel: 'speed, rpm (mechanical)',
    yLabel: 'shaft torque, N·m (negative: generating)',
    series,
    texts,
    markers,
    markerLegend: markers.length ? [{ name: 'highest system efficiency, motoring and generating', shape: 'circle', colour: PEAK_COLOUR }] : [],
    caption,
    xMin: 0,
    plotHeight: PLOT_HEIGHT,
    testId: 'chart-efficiency',
  });
}
