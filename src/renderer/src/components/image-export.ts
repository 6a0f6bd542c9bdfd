// Plot images through plotly's image API, each with a title, its legend and the conditions block,
// and the datasheet as one self-contained HTML file (the same page the CLI's `datasheet` writes).
import Plotly from 'plotly.js-dist-min';
import type { Data, Layout } from 'plotly.js-dist-min';
import type { ResolvedProject } from '../../../core/project/project';
import type { DatasheetResults } from '../../../core/reports/datasheet-results';
import { datasheetHtml } from '../../../core/reports/datasheet-html';
import { figureConditions, isoDate } from '../../../core/reports/figure-conditions';
import { dataUrlToBytes, svgDataUrlToText } from '../state/file-bridge';
import type { Exporter } from '../state/exporter';
import { EXPORT_SIZE, exportLayout } from './figure-export-layout';

const PLOTS = ['envelope-plot', 'datasheet-plot', 'traces-plot', 'bode-plot', 'plane-plot', 'fluxmap-psid-plot', 'efficiency-plot', 'duty-plane-plot'];

/** What each plot shows, for the exported image's title. */
const PLOT_TITLES: Record<string, string> = {
  envelope: 'torque against speed, hot and cold',
  datasheet: 'torque against speed, hot and cold',
  'datasheet-envelope': 'torque against speed, hot and cold',
  traces: 'load-step response',
  bode: 'current and speed loops, open-loop frequency response',
  plane: 'current plane (id, iq): limits, MTPA, MTPV and voltage ellipses',
  'fluxmap-psid': 'flux map, ψd against id at several iq',
  'fluxmap-psiq': 'flux map, ψq against iq at several id',
  'fluxmap-plane': 'flux map, MTPA and constant torque on the current plane',
  'fluxmap-inductance': 'flux map, apparent and incremental inductances along MTPA',
  efficiency: 'efficiency over speed and shaft torque',
  'duty-plane': 'duty cycle on the torque-speed plane over the hot peak envelope',
  'efficiency-system': 'system efficiency (DC link to shaft) over speed and shaft torque',
  'efficiency-motor': 'motor efficiency over speed and shaft torque',
  'efficiency-inverter': 'inverter efficiency over speed and shaft torque',
};

/** The first plot shown on the current view, exported as PNG or SVG with title and conditions. */
export async function exportVisiblePlot(format: 'png' | 'svg', project: ResolvedProject, exporter: Exporter): Promise<boolean> {
  const el = PLOTS.map((id) => document.querySelector<HTMLElement>(`[data-testid="${id}"]`)).find((e) => e !== null);
  if (!el) return false;
  const name = (el.dataset.testid ?? 'plot').replace('-plot', '');
  await exportPlotImage(el, format, name, project, exporter);
  return true;
}

/** The title of an exported figure: the project's name and what the plot shows. */
export const figureTitle = (project: ResolvedProject, name: string, what?: string): string =>
  `${project.name.trim() || 'Unnamed project'}: ${what ?? PLOT_TITLES[name] ?? name}`;

/**
 * A plot element as a PNG or SVG file named `name`, through plotly's image API, drawn with a title,
 * its legend and the conditions (project, bus, temperatures, current limits, date, version); says how it went.
 * `what`: what the plot shows, for the title (default: by the plot's name); `moreConditions`: lines
 * before the project's conditions (the run's own, e.g. the PWM model).
 */
export function exportPlotImage(el: HTMLElement, format: 'png' | 'svg', name: string, project: ResolvedProject, exporter: Exporter, what?: string, moreConditions: string[] = []): Promise<boolean> {
  const image = async () => {
    const gd = el as unknown as { data?: Data[]; layout?: Partial<Layout> };
    const layout = exportLayout(gd.layout ?? {}, figureTitle(project, name, what), [...moreConditions, ...figureConditions(project, { date: isoDate(new Date()) })]);
    const fig = { data: gd.data ?? [], layout } as unknown as Parameters<typeof Plotly.toImage>[0];
    return Plotly.toImage(fig, { format, width: EXPORT_SIZE.width, height: EXPORT_SIZE.height, scale: format === 'png' ? 2 : 1 });
  };
  return format === 'png'
    ? exporter.exportAndTell('plot-png', async () => dataUrlToBytes(await image()), `${name}.png`)
    : exporter.exportAndTell('plot-svg', async () => svgDataUrlToText(await image()), `${name}.svg`);
}

/**
 * The datasheet as one self-contained HTML file, built by core from the results on screen, with the
 * step of its envelope tables the user set (rpm; undefined: the default round step).
 */
export async function exportDatasheetHtml(results: DatasheetResults, tableStep_rpm: number | undefined, exporter: Exporter): Promise<boolean> {
  let html: string;
  try {
    html = datasheetHtml(results, { date: isoDate(new Date()), tableStep_rpm, stepField: 'table step' });
  } catch (e) {
    exporter.tell(`The datasheet could not be exported: ${e instanceof Error ? e.message : String(e)}. Nothing was written.`);
    return true; // said already
  }
  const base = (results.project.name.trim() || 'datasheet').replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'datasheet';
  return exporter.exportAndTell('datasheet', () => html, `${base}-datasheet.html`);
}
