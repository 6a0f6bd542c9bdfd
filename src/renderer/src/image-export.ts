// Plot images through plotly's image API, and the datasheet as one self-contained HTML file.
import Plotly from 'plotly.js-dist-min';
import css from './styles.css?raw';
import { dataUrlToBytes, exportAndTell, svgDataUrlToText, tell } from './file-bridge';

const PLOTS = ['envelope-plot', 'datasheet-plot', 'traces-plot', 'bode-plot', 'plane-plot'];

/** The first plot shown on the current view, exported as PNG or SVG. */
export async function exportVisiblePlot(format: 'png' | 'svg'): Promise<boolean> {
  const el = PLOTS.map((id) => document.querySelector<HTMLElement>(`[data-testid="${id}"]`)).find((e) => e !== null);
  if (!el) return false;
  const name = (el.dataset.testid ?? 'plot').replace('-plot', '');
  await exportPlotImage(el, format, name);
  return true;
}

/** A plot element as a PNG or SVG file named `name`, through plotly's image API; says how it went. */
export function exportPlotImage(el: HTMLElement, format: 'png' | 'svg', name: string): Promise<boolean> {
  const image = () => Plotly.toImage(el, { format, width: 1200, height: 800, scale: format === 'png' ? 2 : 1 });
  return format === 'png'
    ? exportAndTell('plot-png', async () => dataUrlToBytes(await image()), `${name}.png`)
    : exportAndTell('plot-svg', async () => svgDataUrlToText(await image()), `${name}.svg`);
}

const escape = (s: string): string => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

/**
 * plotly's SVG text as an element, parsed in an inert XML document (never as HTML of the live page):
 * scripts, foreign objects, event-handler attributes and links out of the image are dropped.
 */
export function svgElement(text: string): SVGSVGElement | null {
  const doc = new DOMParser().parseFromString(text, 'image/svg+xml');
  const root = doc.documentElement;
  if (root.localName !== 'svg' || doc.getElementsByTagName('parsererror').length) return null;
  for (const n of Array.from(root.querySelectorAll('script, foreignObject'))) n.remove();
  for (const el of [root, ...Array.from(root.querySelectorAll('*'))]) {
    for (const a of Array.from(el.attributes)) {
      const href = a.localName === 'href' && !a.value.startsWith('#') && !a.value.startsWith('data:image/');
      if (a.name.toLowerCase().startsWith('on') || href) el.removeAttribute(a.name);
    }
  }
  return root as unknown as SVGSVGElement;
}

/** The Datasheet view as a static HTML page: its tables and cautions, the plot as inline SVG. */
export async function exportDatasheetHtml(): Promise<boolean> {
  const view = document.querySelector<HTMLElement>('[data-testid="view-datasheet"]');
  const plot = document.querySelector<HTMLElement>('[data-testid="datasheet-plot"]');
  if (!view || !plot) return false;
  let svg: string;
  try {
    svg = svgDataUrlToText(await Plotly.toImage(plot, { format: 'svg', width: 900, height: 520 }));
  } catch (e) {
    tell(`The datasheet could not be exported: the plot image failed (${e instanceof Error ? e.message : String(e)}). Nothing was written.`);
    return true; // said already
  }
  const copy = view.cloneNode(true) as HTMLElement;
  copy.querySelectorAll('.no-print, .toolbar').forEach((n) => n.remove());
  const slot = copy.querySelector('[data-testid="datasheet-plot"]');
  const image = svgElement(svg);
  if (slot && image) {
    const box = document.createElement('div');
    box.className = 'plot-image';
    box.appendChild(document.importNode(image, true));
    slot.replaceWith(box);
  }
  const title = escape(document.querySelector('.sheet-head h2')?.textContent ?? 'Torquewise datasheet');
  const html = `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${title}</title><style>${css}</style></head><body data-theme="light"><div class="view">${copy.outerHTML}</div></body></html>`;
  return exportAndTell('datasheet', () => html, 'datasheet.html');
}
