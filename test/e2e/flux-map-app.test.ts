// The flux-map tab in the built app (headless Chromium, 1440 x 900): hidden for the demos (constant
// Ld, Lq, psiM or a nameplate); for a project carrying motor.fluxMap, shown with its four figures and
// screenshot (test-results/fluxmap-view.png). The second part runs once the project format takes a
// flux map (parseProject accepts motor.fluxMap).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { closeApp, openApp, ROOT, shotPath, type AppSession } from './harness';
import { loadProjectText } from '../../src/core/project/project';
import { parseProject } from '../../src/core/project/schema';

let app: AppSession | undefined;
let page: Page;
let pageErrors: string[] = [];

/** The servo demo with its constant Ld, Lq, psiM replaced by a map tabulated from them (iq >= 0, |i| <= 1.5 x the peak current). */
function servoWithMap(): Record<string, unknown> {
  const text = readFileSync(join(ROOT, 'resources', 'demo-servo-axis.json'), 'utf8');
  const json = JSON.parse(text) as { motor: Record<string, unknown> } & Record<string, unknown>;
  const p = loadProjectText(text);
  const m = p.machine20, span = 1.5 * p.peak.Imax;
  const ids = Array.from({ length: 21 }, (_, k) => -span + (2 * span * k) / 20);
  const iqs = Array.from({ length: 11 }, (_, k) => (span * k) / 10);
  const { Ld: _ld, Lq: _lq, psiM: _psi, ...motor } = json.motor;
  return {
    ...json,
    name: 'Invented demo: servo axis with a flux map (tabulated from constant Ld, Lq, psiM)',
    motor: {
      ...motor,
      fluxMap: {
        magnetTemp_C: 20,
        id_A: ids,
        iq_A: iqs,
        psid_Wb: ids.map((id) => iqs.map(() => m.Ld * id + m.psiM)),
        psiq_Wb: ids.map(() => iqs.map((iq) => m.Lq * iq)),
      },
    },
  };
}

const takesMaps = ((): boolean => {
  try {
    parseProject(servoWithMap());
    return true;
  } catch {
    return false;
  }
})();

beforeAll(async () => {
  app = await openApp();
  ({ page, errors: pageErrors } = app);
}, 120_000);

afterAll(async () => {
  await closeApp(app);
});

describe('the flux-map tab', () => {
  it('is not offered for the demos, which carry no map', async () => {
    for (const demo of ['demo-ipm-traction.json', 'demo-servo-axis.json', 'demo-spm-48v.json']) {
      await page.selectOption('[data-testid="demo-picker"]', demo);
      await page.waitForSelector('[data-testid="envelope-plot"] .scatterlayer .trace');
      expect(await page.$$('[data-testid="tab-fluxmap"]'), demo).toHaveLength(0);
      expect(await page.$$('[data-testid="tab-envelope"]')).toHaveLength(1);
    }
    expect(pageErrors).toEqual([]);
  });

  it.skipIf(!takesMaps)('is offered for a project with motor.fluxMap and draws its four figures', async () => {
    const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.click('[data-testid="open"]')]);
    await chooser.setFiles({ name: 'servo-flux-map.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(servoWithMap())) });
    await page.waitForSelector('[data-testid="tab-fluxmap"]', { timeout: 20_000 });
    await page.click('[data-testid="tab-fluxmap"]');
    for (const id of ['fluxmap-psid-plot', 'fluxmap-psiq-plot', 'fluxmap-plane-plot', 'fluxmap-inductance-plot']) {
      // attached, not 'visible': a flat line (the inductances of a constant map) has no height
      await page.waitForSelector(`[data-testid="${id}"] .scatterlayer .trace`, { state: 'attached', timeout: 20_000 });
    }
    expect(await page.$$eval('[data-testid="fluxmap-psid-plot"] .scatterlayer .trace', (els) => els.length)).toBe(5);
    expect(await page.textContent('[data-testid="fluxmap-inductance-table"]')).toMatch(/Ld apparent.*Lq incremental/s);
    await page.screenshot({ path: shotPath('fluxmap-view') });
    // back to a demo without a map: the tab goes and the envelope is shown
    await page.selectOption('[data-testid="demo-picker"]', 'demo-ipm-traction.json');
    await page.waitForFunction(() => !document.querySelector('[data-testid="tab-fluxmap"]'));
    await page.waitForSelector('[data-testid="view-envelope"]');
    expect(pageErrors).toEqual([]);
  });
});
