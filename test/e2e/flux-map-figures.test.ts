// The flux-map view's four figures drawn by plotly in headless Chromium at 1440 x 900, from the
// core's curves of two maps of an invented traction motor (the traction demo's hot terms): one
// tabulated from constant Ld, Lq, psiM (straight flux lines, flat inductances), one saturating.
// Screenshots in test-results/ (fluxmap-figures-constant.png, fluxmap-figures-saturating.png).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launch, ROOT, shotPath } from './harness';
import { loadProjectText } from '../../src/core/project/project';
import { FluxMapModel, type FluxMapData } from '../../src/core/machine/flux-map';
import { fluxMapCurves } from '../../src/core/reports/flux-map-curves';
import { fluxMapFigures, type FluxMapFigures } from '../../src/renderer/src/views/flux-map/flux-map-figures';
import { CURVE, type PlotTheme } from '../../src/renderer/src/components/plot-style';

// the light theme's colours (src/renderer/src/app/styles.css)
const theme: PlotTheme = { ink: '#111111', muted: '#5e5e5e', line: '#b9b5a8', panel: '#ffffff', bg: '#f7f6f2', ok: '#116b2f', bad: '#b0141c', dark: false };
const p = loadProjectText(readFileSync(join(ROOT, 'resources', 'demo-ipm-traction.json'), 'utf8'));
const h = p.hot, I = p.peak.Imax;

function tabulate(psid: (id: number, iq: number) => number, psiq: (id: number, iq: number) => number): FluxMapData {
  const ids = Array.from({ length: 41 }, (_, k) => -1.5 * I + (2.5 * I * k) / 40);
  const iqs = Array.from({ length: 41 }, (_, k) => (1.5 * I * k) / 40);
  return { magnetTemp_C: 20, id_A: ids, iq_A: iqs, psid_Wb: ids.map((id) => iqs.map((iq) => psid(id, iq))), psiq_Wb: ids.map((id) => iqs.map((iq) => psiq(id, iq))) };
}
const constant = tabulate((id) => h.psiM + h.Ld * id, (_id, iq) => h.Lq * iq);
// invented saturation (a picture, not a published model): the q axis saturates (tanh), the d axis
// less so, and psi_d falls with q current (cross-saturation)
const bq = 0.5 * I, bd = 1.2 * I;
const saturating = tabulate(
  (id, iq) => h.psiM * (1 - (0.15 * (iq / I) ** 2) / (1 + (iq / I) ** 2)) + h.Ld * bd * Math.tanh(id / bd),
  (id, iq) => (h.Lq * bq * Math.tanh(iq / bq)) / (1 + 0.2 * (id / I) ** 2),
);
const figures = (map: FluxMapData): FluxMapFigures => fluxMapFigures(fluxMapCurves(new FluxMapModel(map, h.polePairs, h.Rs), I), map, theme, CURVE.light);

let browser: Browser;
let page: Page;

beforeAll(async () => {
  browser = await launch();
  page = await (await browser.newContext({ viewport: { width: 1440, height: 900 } })).newPage();
}, 60_000);

afterAll(async () => {
  await browser?.close();
});

async function draw(f: FluxMapFigures, title: string): Promise<number[]> {
  await page.setContent(`<!doctype html><html><body style="margin:0;background:${theme.bg};font-family:system-ui,sans-serif">
    <h3 style="margin:8px 12px">${title}</h3>
    <div style="display:grid;grid-template-columns:1fr 1fr;gap:12px;padding:0 12px">
      <div id="psid" style="height:400px;background:#fff"></div><div id="plane" style="height:400px;background:#fff"></div>
      <div id="psiq" style="height:400px;background:#fff"></div><div id="ind" style="height:400px;background:#fff"></div>
    </div></body></html>`);
  await page.addScriptTag({ path: join(ROOT, 'node_modules', 'plotly.js-dist-min', 'plotly.min.js') });
  return page.evaluate(async (figs) => {
    const P = (window as unknown as { Plotly: { newPlot(el: string, d: unknown, l: unknown): Promise<unknown> } }).Plotly;
    const ids = ['psid', 'psiq', 'ind', 'plane'] as const;
    const keys = ['psid', 'psiq', 'inductance', 'plane'] as const;
    for (let k = 0; k < 4; k++) await P.newPlot(ids[k], figs[keys[k]].data, { ...figs[keys[k]].layout, height: 400 });
    return ids.map((id) => document.querySelectorAll(`#${id} .scatterlayer .trace, #${id} .contourlayer .contour`).length);
  }, f as unknown as Record<string, { data: unknown[]; layout: Record<string, unknown> }>);
}

describe('flux-map figures in a browser', () => {
  it('a map of constant Ld, Lq, psiM: straight flux lines, flat inductances', async () => {
    const drawn = await draw(figures(constant), 'Flux map (tabulated from constant Ld, Lq, ψm): invented traction motor, hot corner');
    expect(drawn.slice(0, 3)).toEqual([5, 5, 5]);
    expect(drawn[3]).toBeGreaterThanOrEqual(4);
    await page.screenshot({ path: shotPath('fluxmap-figures-constant') });
  });

  it('a saturating map', async () => {
    const drawn = await draw(figures(saturating), 'Flux map (invented saturation): traction motor, hot corner');
    expect(drawn.slice(0, 3)).toEqual([5, 5, 5]);
    await page.screenshot({ path: shotPath('fluxmap-figures-saturating') });
  });
});
