// The compare tab in the built app (headless Chromium, 1440 x 900), on the 48 V demo: a second project
// file (the demo with a 20 % stronger magnet, invented) added through the web page's file input; the two
// variants' envelopes hot and cold overlaid, the table with a column each, Kt moved by the magnet's ratio,
// the load-step rows once the worker has simulated both (screenshot in test-results/compare-view.png); then
// an opened file's named variants as columns of their own, one left out by its check box.
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { closeApp, openApp, ROOT, shotPath, type AppSession } from './harness';

let app: AppSession | undefined;
let page: Page;
let pageErrors: string[] = [];

beforeAll(async () => {
  app = await openApp();
  ({ page, errors: pageErrors } = app);
}, 120_000);

afterAll(async () => {
  await closeApp(app);
});

/** The cells of the table row whose label is `label`, one per variant. */
const rowCells = (label: string) => page.$$eval(`[data-testid="compare-table"] tr[data-row="${label}"] td.num`, (tds) => tds.map((td) => td.textContent ?? ''));

describe('the compare tab', () => {
  it('compares the open project with a second file: envelopes overlaid, one column each, load steps', async () => {
    const demo = JSON.parse(readFileSync(join(ROOT, 'resources', 'demo-spm-48v.json'), 'utf8'));
    const strong = { ...demo, motor: { ...demo.motor, psiM: demo.motor.psiM * 1.2 } };
    const file = join(mkdtempSync(join(tmpdir(), 'tw-compare-e2e-')), 'strong-magnet.json');
    writeFileSync(file, JSON.stringify(strong));

    await page.selectOption('[data-testid="demo-picker"]', 'demo-spm-48v.json');
    await page.waitForSelector('[data-testid="envelope-plot"] .scatterlayer .trace');
    await page.click('[data-testid="tab-compare"]');
    await page.waitForSelector('[data-testid="compare-table"]', { timeout: 60_000 });
    const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.click('[data-testid="compare-add-file"]')]);
    await chooser.setFiles(file);
    await page.waitForFunction(() => document.querySelectorAll('[data-testid="compare-column"]').length === 2, undefined, { timeout: 60_000 });
    expect(await page.$$eval('[data-testid="compare-column"]', (th) => th.map((t) => t.textContent))).toEqual(['open project', 'strong-magnet']);
    // two variants, hot and cold each, and the requirement markers: at least four curves
    await page.waitForFunction(() => document.querySelectorAll('[data-testid="compare-plot"] .scatterlayer .trace').length >= 4, undefined, { timeout: 30_000 });

    // Kt = 1.5 p psiM (Krishnan 2010, Permanent Magnet Synchronous and Brushless DC Motor Drives): up by the magnet's 20 %
    const kt = (await rowCells('Kt hot')).map(Number);
    expect(kt[1]! / kt[0]!).toBeCloseTo(1.2, 3);
    // the same requirement points in both: a verdict in every cell
    for (const c of await rowCells('rated: hot')) expect(c).toMatch(/^met, \+/);

    // the load steps, simulated in the worker after the steady results
    await page.waitForSelector('[data-testid="compare-sim-done"]', { timeout: 90_000 });
    const dips = (await rowCells('load-step speed dip')).map(Number);
    expect(dips).toHaveLength(2);
    for (const d of dips) expect(d).toBeGreaterThan(0);
    const ms = Number(await page.getAttribute('[data-testid="compare-sim-done"]', 'data-ms'));
    expect(ms).toBeGreaterThan(0);
    await page.screenshot({ path: shotPath('compare-view'), fullPage: true });
    expect(pageErrors).toEqual([]);
  }, 180_000);

  it('an opened file\'s named variants are columns of their own, each one can be left out', async () => {
    const demo = JSON.parse(readFileSync(join(ROOT, 'resources', 'demo-spm-48v.json'), 'utf8'));
    demo.variants = [
      { name: 'strong magnet', overrides: { 'motor.psiM': demo.motor.psiM * 1.2 } },
      { name: '60 V bus', overrides: { 'inverter.Vdc': 60 } },
    ];
    const file = join(mkdtempSync(join(tmpdir(), 'tw-compare-e2e-')), 'spm-variants.json');
    writeFileSync(file, JSON.stringify(demo));
    const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.click('[data-testid="open"]')]);
    await chooser.setFiles(file);
    await page.click('[data-testid="tab-compare"]');
    const columns = () => page.$$eval('[data-testid="compare-column"]', (th) => th.map((t) => t.textContent));
    // the file added before stays: the open project, its two variants, the added file
    await page.waitForFunction(() => document.querySelectorAll('[data-testid="compare-column"]').length === 4, undefined, { timeout: 60_000 });
    expect(await columns()).toEqual(['open project', 'strong magnet', '60 V bus', 'strong-magnet']);
    // the voltage limit follows the bus less two device drops: Vmax = utilisation x (Vdc - 2 drop) / sqrt(3) for SVPWM (Holmes and Lipo 2003, Pulse Width Modulation for Power Converters)
    const vmax = (await rowCells('voltage limit')).map(Number);
    const drop2 = 2 * demo.inverter.deviceDrop;
    expect(vmax[2]! / vmax[0]!).toBeCloseTo((60 - drop2) / (48 - drop2), 3);
    await page.uncheck('[data-testid="compare-own-60 V bus"]');
    await page.waitForFunction(() => document.querySelectorAll('[data-testid="compare-column"]').length === 3, undefined, { timeout: 60_000 });
    expect(await columns()).toEqual(['open project', 'strong magnet', 'strong-magnet']);
    // the named variant and the file with the same magnet give the same Kt
    const kt = await rowCells('Kt hot');
    expect(kt[1]).toBe(kt[2]);
    expect(pageErrors).toEqual([]);
  }, 180_000);
});
