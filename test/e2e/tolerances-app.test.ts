// The Tolerances tab in the built app (headless Chromium, 1440 x 900), on the traction demo (invented
// bands): the corners computed in a worker (64 = 2^6 corners, the binding one first and marked, the
// least bus over every corner as the CLI's `corners` gives it), a band edited through the form (its
// schema message beside it, then put back), the file's Monte Carlo (1000 samples) run on one worker
// and on two with identical results, its figures as SVG and PNG with their conditions, its CSV export, and a larger run cancelled. Screenshots in
// test-results/tolerances-corners.png and test-results/tolerances-monte-carlo.png.
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { join } from 'node:path';
import { closeApp, openApp, shotPath, SHOTS, type AppSession } from './harness';
import { parseCsv } from '../../src/core/reports/csv';

let app: AppSession | undefined;
let page: Page;
let pageErrors: string[] = [];

beforeAll(async () => {
  app = await openApp({ acceptDownloads: true });
  ({ page, errors: pageErrors } = app);
}, 120_000);

afterAll(async () => {
  await closeApp(app);
});

/** The Monte Carlo run with `workers` workers to its end: the pass table's text and the run's wall time, ms. */
async function runSamples(workers: number): Promise<{ table: string; wall_ms: number; workers: number }> {
  await page.fill('[data-testid="mc-workers"]', String(workers));
  await page.click('[data-testid="mc-run"]');
  await page.waitForSelector(`[data-testid="mc-conditions"][data-workers="${workers}"]`, { timeout: 60_000 });
  await page.waitForSelector('[data-testid="mc-run"]:not([disabled])');
  const el = page.locator('[data-testid="mc-conditions"]');
  return {
    table: (await page.textContent('[data-testid="mc-pass"]')) ?? '',
    wall_ms: Number(await el.getAttribute('data-wall-ms')),
    workers: Number(await el.getAttribute('data-workers')),
  };
}

describe('the Tolerances tab', () => {
  it('computes the corners of the traction demo in a worker, the binding corner first and marked', async () => {
    await page.selectOption('[data-testid="demo-picker"]', 'demo-ipm-traction.json');
    await page.waitForSelector('[data-testid="envelope-plot"] .scatterlayer .trace');
    await page.click('[data-testid="tab-tolerances"]');
    await page.waitForSelector('[data-testid="tol-corners-summary"]', { timeout: 60_000 });
    // six toleranced parameters: every combination of the band ends, 2^6 corners (common practice (no source): a full two-level factorial)
    expect(await page.$$eval('[data-testid="tol-corner-table"] tbody tr', (els) => els.length)).toBe(64);
    const first = page.locator('[data-testid="tol-corner-table"] tbody tr').first();
    expect(await first.getAttribute('data-testid')).toBe('tol-binding-corner');
    // the same core as the CLI: `corners` on this file prints "least Vdc ... 395.4 V" and "least Imax: none" (README, the traction demo's corners)
    expect(Number(await page.getAttribute('[data-testid="tol-min-vdc"]', 'data-value'))).toBeCloseTo(395.4, 0);
    expect(await page.getAttribute('[data-testid="tol-min-imax"]', 'data-value')).toBe('');
    expect(await page.getAttribute('[data-testid="tol-corners-summary"]', 'data-all-met')).toBe('false');
    // the binding corner: the lowest bus (320 V) and the reduced current limit (427.5 A), as the CLI names it
    const binding = (await page.textContent('[data-testid="tol-binding-corner"]')) ?? '';
    expect(binding).toMatch(/320/);
    expect(binding).toMatch(/427\.5/);
    await page.screenshot({ path: shotPath('tolerances-corners'), fullPage: true });
    expect(pageErrors).toEqual([]);
  }, 120_000);

  it('edits a band through the form: the schema\'s message and a band end the file cannot take beside it, and the corners follow the fixed value', async () => {
    await page.fill('[data-testid="band-max-inverter.Vdc"]', '300');
    await page.waitForSelector('[data-testid="band-inverter.Vdc"] [data-testid="band-msg"]');
    expect(await page.textContent('[data-testid="band-inverter.Vdc"] [data-testid="band-msg"]')).toMatch(/min must be <= max/);
    await page.fill('[data-testid="band-max-inverter.Vdc"]', '380');
    await page.waitForSelector('[data-testid="band-inverter.Vdc"] [data-testid="band-msg"]', { state: 'detached' });
    // a lower end the file cannot take (a bus of 1 V, below twice the devices' drop): the corners' run stops, its message beside the band
    await page.fill('[data-testid="band-min-inverter.Vdc"]', '1');
    await page.waitForSelector('[data-testid="tol-corners-error"]', { timeout: 60_000 });
    expect(await page.textContent('[data-testid="band-inverter.Vdc"] [data-testid="band-msg"]')).toMatch(/^has its lower end at 1 V, which the file cannot take/);
    await page.fill('[data-testid="band-min-inverter.Vdc"]', '320');
    await page.waitForSelector('[data-testid="tol-corners-error"]', { state: 'detached', timeout: 60_000 });
    await page.waitForSelector('[data-testid="band-inverter.Vdc"] [data-testid="band-msg"]', { state: 'detached' });
    await page.waitForSelector('[data-testid="tol-corners-summary"]', { timeout: 60_000 });
    expect(Number(await page.getAttribute('[data-testid="tol-min-vdc"]', 'data-value'))).toBeCloseTo(395.4, 0);
    expect(pageErrors).toEqual([]);
  }, 120_000);

  it('runs the file\'s Monte Carlo on one worker and on two with the same result, and exports the samples', async () => {
    expect(await page.inputValue('[data-testid="mc-samples"]')).toBe('1000');
    const one = await runSamples(1);
    const two = await runSamples(2);
    // seeded per sample: the split between workers does not change a single number (issue 16: "results are identical whatever the number of workers")
    expect(two.table).toBe(one.table);
    expect(two.workers).toBe(2);
    console.log(`tolerances e2e: 1000 samples, 1 worker ${one.wall_ms} ms, 2 workers ${two.wall_ms} ms`);
    // the pass fraction overall lies between 0 and 100 % with its binomial standard error sqrt(f(1-f)/N) <= 1.6 % at N = 1000 (common practice (no source))
    const all = Number(await page.getAttribute('[data-testid="mc-pass-all"]', 'data-value'));
    expect(all).toBeGreaterThan(0);
    expect(all).toBeLessThan(100);
    expect(await page.$$eval('[data-testid="tolerance-margins-plot"] .barlayer .trace', (els) => els.length)).toBe(5);
    await page.waitForSelector('[data-testid="tolerance-sensitivity-plot"] .heatmaplayer', { state: 'attached' });
    // a tall window for the picture, so the whole Monte Carlo card is in it
    await page.setViewportSize({ width: 1440, height: 1900 });
    await page.locator('[data-testid="tol-mc"]').screenshot({ path: shotPath('tolerances-monte-carlo') });
    await page.setViewportSize({ width: 1440, height: 900 });

    // the figures as images: title, the Monte Carlo settings and the project's conditions (bus, limits, date, version)
    for (const [id, format] of [['mc-hist-svg', 'svg'], ['mc-sens-png', 'png'], ['mc-hist-png', 'png']] as const) {
      const [img] = await Promise.all([page.waitForEvent('download'), page.click(`[data-testid="${id}"]`)]);
      const file = join(SHOTS, `${id}-export.${format}`);
      await img.saveAs(file);
      if (format === 'svg') {
        const svg = readFileSync(file, 'utf8');
        expect(svg).toContain('torque margins, 1000 samples, seed 1, normal σ 0.33');
        expect(svg).toContain('bands: R 0.0342–0.0378');
        expect(svg).toMatch(/Torquewise \d+\.\d+\.\d+ · \d{4}-\d{2}-\d{2}/);
        expect(svg).toContain('Vdc 350 V');
      } else expect(readFileSync(file).subarray(1, 4).toString('latin1')).toBe('PNG');
    }

    const [download] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid="mc-csv"]')]);
    const rows = parseCsv(readFileSync((await download.path())!, 'utf8'));
    expect(rows[0]![0]).toMatch(/^# torquewise tolerance samples/);
    expect(rows[1]!.slice(0, 3)).toEqual(['sample', 'nameplate.R', 'nameplate.Ke']);
    expect(rows).toHaveLength(2 + 1000);
    // the overall fraction of the CSV's "all met" column is the table's
    const met = rows.slice(2).filter((r) => r[r.length - 1] === '1').length;
    expect(met / 10).toBeCloseTo(all, 6);
    expect(pageErrors).toEqual([]);
  }, 180_000);

  it('cancels a larger run: the workers stop and the previous result stays', async () => {
    const before = await page.textContent('[data-testid="mc-pass"]');
    await page.fill('[data-testid="mc-samples"]', '20000');
    await page.fill('[data-testid="mc-workers"]', '2');
    await page.click('[data-testid="mc-run"]');
    await page.waitForSelector('[data-testid="mc-progress"]', { timeout: 20_000 });
    await page.click('[data-testid="mc-cancel"]');
    await page.waitForSelector('[data-testid="mc-cancelled"]');
    expect(await page.$$('[data-testid="mc-progress"]')).toHaveLength(0);
    await page.waitForTimeout(1500);
    // terminated: no run of 20 000 samples arrives afterwards
    expect(await page.textContent('[data-testid="mc-pass"]')).toBe(before);
    expect(await page.textContent('[data-testid="mc-conditions"]')).toMatch(/1000 samples/);
    await page.fill('[data-testid="mc-samples"]', '1000');
    expect(pageErrors).toEqual([]);
  }, 120_000);
});
