import type { Command } from '../command';
import { numberFlag, stringFlag } from '../args';
import { InputError } from '../../core/base/errors';
import { computeDatasheetResults } from '../../core/reports/datasheet-results';
import { datasheetHtml, datasheetTableStep } from '../../core/reports/datasheet-html';
import { isoDate } from '../../core/reports/figure-conditions';
import { PLOT_SPEED_MAX_RPM } from '../../core/reports/speed-range';
import { radSToRpm, rpmToRadS } from '../../core/base/units';
import { TOOL_VERSION } from '../../core/base/version';
import { datasheetEfficiencySummary } from '../../core/reports/datasheet-efficiency';

/**
 * The date printed on the datasheet: today (UTC), or the day of SOURCE_DATE_EPOCH (seconds) when
 * that is set, so a CI run can write the same bytes twice (common practice for reproducible builds).
 */
export function datasheetDate(env: Record<string, string | undefined> = process.env, now: Date = new Date()): string {
  const epoch = env['SOURCE_DATE_EPOCH'];
  if (epoch !== undefined && /^\d+$/.test(epoch.trim())) return isoDate(new Date(Number(epoch.trim()) * 1000));
  return isoDate(now);
}

export const datasheetCommand: Command = {
  name: 'datasheet',
  summary: 'the datasheet as one self-contained HTML file (the same the app exports)',
  usage: 'datasheet <project.json> --out FILE.html [--step RPM] [--speed-max RPM] [--points N] [--json]',
  flags: { out: 'output', step: 'number', 'speed-max': 'number', points: 'number' },
  run(p, args) {
    const out = stringFlag(args, 'out');
    if (out === undefined || out.trim() === '') throw new InputError('--out', 'is required: the HTML file to write, e.g. --out datasheet.html');
    const speedMax = numberFlag(args, 'speed-max', { min: 1, max: PLOT_SPEED_MAX_RPM, unit: 'rpm' });
    const points = numberFlag(args, 'points', { min: 2, max: 100000, integer: true });
    const step = numberFlag(args, 'step', { unit: 'rpm' });
    const r = computeDatasheetResults(p, {
      ...(points !== undefined ? { points } : {}),
      ...(speedMax !== undefined ? { speedMax: rpmToRadS(speedMax) } : {}),
    });
    const date = datasheetDate();
    const html = datasheetHtml(r, { date, tableStep_rpm: step, stepField: '--step' });
    const bytes = Buffer.byteLength(html, 'utf8');
    const tableStep = datasheetTableStep(r, { tableStep_rpm: step });
    const total = r.sizing.points.length;
    const metBoth = r.sizing.points.filter((q, i) => q.met && r.sizingCold.points[i]?.met).length;
    const json = {
      out,
      bytes,
      project: p.name,
      date,
      version: TOOL_VERSION,
      speedMax_rpm: radSToRpm(r.speedMax),
      tableStep_rpm: tableStep,
      tableRows: Math.floor(radSToRpm(r.speedMax) / tableStep + 1e-9) + 1,
      requirements: {
        total,
        metHot: r.sizing.points.filter((q) => q.met).length,
        metCold: r.sizingCold.points.filter((q) => q.met).length,
        metBoth,
      },
      cautions: r.safety.findings.length + p.findings.filter((f) => f.severity !== 'info').length,
      // a file with a `losses` section: the efficiency map's summary (without one the document is as before)
      ...(r.efficiency ? { efficiency: datasheetEfficiencySummary(r.efficiency) } : {}),
    };
    // written by the CLI after this returns, atomically, never over the project file (src/cli/output-files.ts)
    const lines = [
      `${p.name}: datasheet written to ${out} (${bytes} bytes, ${date}, Torquewise ${TOOL_VERSION})`,
      `curves 0 to ${Math.round(json.speedMax_rpm)} rpm; envelope tables every ${tableStep} rpm (${json.tableRows} rows, hot and cold)`,
      `requirement points met hot and cold: ${metBoth} of ${total}`,
    ];
    const peak = json.efficiency?.peakSystem;
    if (json.efficiency)
      lines.push(
        `system efficiency map (${json.efficiency.corner} corner, least current, ${json.efficiency.speedPoints} x ${json.efficiency.torquePoints} grid): ` +
          (peak ? `highest ${(100 * peak.efficiency).toFixed(1)} % at ${Math.round(peak.speed_rpm)} rpm, ${Number(peak.torque_Nm.toPrecision(4))} N·m` : 'no point inside the envelope'),
      );
    return { json, lines, files: [{ flag: 'out', contents: html }] };
  },
};
