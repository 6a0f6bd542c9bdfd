// The tuning view's gain schedule: for a project whose model is not linear (a flux map) the core's
// schedule along MTPA (core/project/tuning-from-project.ts) as table cells in the report's units
// (core/reports/gain-schedule-table.ts), and the figure of Kp per axis against current; for a
// constant-parameter machine only the line saying the gains stay put. No physics here. Free of
// plotly's runtime, so it is checked in node (test/renderer-gain-schedule.test.ts).
import type { Data, Layout } from 'plotly.js-dist-min';
import type { ResolvedProject } from '../../../../core/project/project';
import type { GainSchedule } from '../../../../core/control/gain-schedule';
import { gainScheduleFromProject } from '../../../../core/project/tuning-from-project';
import { CONSTANT_GAINS_LINE, GAIN_SCHEDULE_COLUMNS, gainScheduleCaption, gainScheduleCells } from '../../../../core/reports/gain-schedule-table';
import { isInputError } from '../../../../core/base/errors';
import { axis, baseLayout, type CurveColours, type PlotTheme } from '../../components/plot-style';

export type GainScheduleView =
  | { kind: 'constant'; line: string }
  | { kind: 'schedule'; schedule: GainSchedule; caption: string; headers: string[]; keys: string[]; cells: number[][] }
  | { kind: 'error'; message: string };

/** What the tuning view shows about gains against current for a project. */
export function gainScheduleView(p: ResolvedProject): GainScheduleView {
  if (p.models.hot.linear !== null) return { kind: 'constant', line: CONSTANT_GAINS_LINE };
  try {
    const schedule = gainScheduleFromProject(p);
    return {
      kind: 'schedule',
      schedule,
      caption: gainScheduleCaption(schedule),
      headers: GAIN_SCHEDULE_COLUMNS.map((c) => c.header),
      keys: GAIN_SCHEDULE_COLUMNS.map((c) => c.key),
      cells: gainScheduleCells(schedule),
    };
  } catch (e) {
    return { kind: 'error', message: isInputError(e) ? e.message : `Gain schedule failed: ${e instanceof Error ? e.message : String(e)}` };
  }
}

/** Kp on each axis against the current magnitude (A peak), d dashed as in the Bode plot. */
export function gainScheduleFigure(s: GainSchedule, t: PlotTheme, col: CurveColours): { data: Data[]; layout: Layout } {
  const I = s.rows.map((r) => r.current_A);
  const data: Data[] = [
    { type: 'scatter', mode: 'lines+markers', x: I, y: s.rows.map((r) => r.Kp_d), name: 'Kp, d axis', line: { color: col.id, width: 2.2, dash: 'dash' }, marker: { size: 5 }, hovertemplate: 'd axis<br>%{x:.4g} A peak, Kp %{y:.4g} V/A<extra></extra>' },
    { type: 'scatter', mode: 'lines+markers', x: I, y: s.rows.map((r) => r.Kp_q), name: 'Kp, q axis', line: { color: col.iq, width: 2.2 }, marker: { size: 5 }, hovertemplate: 'q axis<br>%{x:.4g} A peak, Kp %{y:.4g} V/A<extra></extra>' },
  ];
  const layout = baseLayout(t, {
    margin: { l: 64, r: 16, t: 12, b: 48 },
    hovermode: 'closest',
    xaxis: axis(t, 'current magnitude along MTPA, A peak', { rangemode: 'tozero' }),
    yaxis: axis(t, 'proportional gain Kp, V/A', { rangemode: 'tozero' }),
    legend: { orientation: 'h', x: 0, y: -0.28, font: { size: 11 } },
  });
  return { data, layout };
}
