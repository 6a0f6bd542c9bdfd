// The efficiency tab in the built app (headless Chromium, 1440 x 900), on the traction demo (invented
// loss data): the map solved in the worker and drawn as contours with the envelope, a peak system
// efficiency in a plausible band, a hovered point's loss bar, the map's CSV export; screenshot in
// test-results/efficiency-view.png; a clicked point chosen and kept, the loss saved by loss-minimising
// control as a map with its CSV columns (screenshot test-results/efficiency-loss-saved.png); a finer map
// cancelled.
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { closeApp, openApp, shotPath, type AppSession } from './harness';
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

describe('the efficiency tab', () => {
  it('solves the traction demo map in the worker and shows a hovered point\'s losses', async () => {
    await page.selectOption('[data-testid="demo-picker"]', 'demo-ipm-traction.json');
    await page.waitForSelector('[data-testid="envelope-plot"] .scatterlayer .trace');
    await page.click('[data-testid="tab-efficiency"]');
    await page.waitForSelector('[data-testid="efficiency-plot"] .contourlayer .contour', { state: 'attached', timeout: 60_000 });
    await page.waitForSelector('[data-testid="eff-peak-system"]');
    const peak = Number(await page.getAttribute('[data-testid="eff-peak-system"]', 'data-value'));
    // a traction drive's best system efficiency lies between 80 and 99 % (invented data: a plausible band; common practice (no source))
    expect(peak).toBeGreaterThan(0.8);
    expect(peak).toBeLessThan(0.99);
    expect(await page.textContent('[data-testid="eff-peak-system"]')).toMatch(/Peak system efficiency \d+\.\d %/);
    expect(await page.textContent('[data-testid="eff-conditions"]')).toMatch(/60 × 60 points/);
    // the envelope (motoring and generating) and the requirement points over the contours
    expect(await page.$$eval('[data-testid="efficiency-plot"] .scatterlayer .trace', (els) => els.length)).toBeGreaterThanOrEqual(3);

    // hover a point at about a third of the top speed and a fifth of the largest motoring torque
    const box = (await page.locator('[data-testid="efficiency-plot"] .nsewdrag').first().boundingBox())!;
    await page.mouse.move(box.x + 0.33 * box.width, box.y + 0.4 * box.height);
    await page.waitForSelector('[data-testid="eff-loss-bar"] .barlayer .trace', { state: 'attached', timeout: 20_000 });
    expect(await page.$$eval('[data-testid="eff-loss-bar"] .barlayer .point', (els) => els.length)).toBe(4);
    const table = (await page.textContent('[data-testid="eff-point-table"]')) ?? '';
    expect(table).toMatch(/motor efficiency\d+\.\d %inverter efficiency\d+\.\d %system efficiency\d+\.\d %/);
    await page.screenshot({ path: shotPath('efficiency-view') });

    // the CSV: one record per grid point with the header asked for
    const [download] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid="eff-csv"]')]);
    const rows = parseCsv(readFileSync((await download.path())!, 'utf8'));
    expect(rows[0]).toEqual(['speed_rpm', 'torque_Nm', 'feasible', 'motor', 'inverter', 'system', 'copper_W', 'iron_W', 'mechanical_W', 'inverter_W', 'dcPower_W']);
    expect(rows.length).toBe(1 + 60 * 60);
    expect(pageErrors).toEqual([]);
  }, 120_000);

  it('a clicked point stays chosen and marked; the loss saved by loss-minimising control is mapped and exported', async () => {
    const box = (await page.locator('[data-testid="efficiency-plot"] .nsewdrag').first().boundingBox())!;
    const traces = await page.$$eval('[data-testid="efficiency-plot"] .scatterlayer .trace', (els) => els.length);
    await page.mouse.click(box.x + 0.25 * box.width, box.y + 0.3 * box.height);
    await page.mouse.move(box.x + box.width + 200, box.y - 100);
    await page.waitForSelector('[data-testid="eff-point-kind"][data-kind="chosen"]', { timeout: 20_000 });
    const chosen = await page.textContent('[data-testid="eff-point-label"]');
    // the chosen point is marked: one more marker trace over the contours
    expect(await page.$$eval('[data-testid="efficiency-plot"] .scatterlayer .trace', (els) => els.length)).toBe(traces + 1);
    // a hover previews another point; leaving the map brings the chosen one back
    await page.mouse.move(box.x + 0.45 * box.width, box.y + 0.6 * box.height);
    await page.waitForSelector('[data-testid="eff-point-kind"][data-kind="preview"]', { timeout: 20_000 });
    await page.mouse.move(box.x + box.width + 200, box.y - 100);
    await page.waitForSelector('[data-testid="eff-point-kind"][data-kind="chosen"]', { timeout: 20_000 });
    expect(await page.textContent('[data-testid="eff-point-label"]')).toBe(chosen);

    await page.selectOption('[data-testid="eff-quantity"]', 'lossSaved');
    await page.waitForSelector('[data-testid="eff-most-saved"]', { timeout: 60_000 });
    await page.waitForSelector('[data-testid="efficiency-plot"] .contourlayer .contour', { state: 'attached' });
    expect(await page.textContent('[data-testid="efficiency-plot"] .cbtitle')).toBe('loss saved, W');
    // loss-minimising control never loses more than the least current (Morimoto et al. (1994), IEEE Trans. Ind. Electron. 41(5))
    expect(Number(await page.getAttribute('[data-testid="eff-most-saved"]', 'data-value'))).toBeGreaterThan(0);
    expect(await page.textContent('[data-testid="eff-point-saved"]')).toMatch(/loss saved-?\d/);
    expect(await page.$$eval('[data-testid="eff-loss-bar"] .barlayer .trace', (els) => els.length)).toBe(2);
    await page.screenshot({ path: shotPath('efficiency-loss-saved') });

    const [download] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid="eff-csv"]')]);
    const rows = parseCsv(readFileSync((await download.path())!, 'utf8'));
    expect(rows[0]!.slice(-4)).toEqual(['lossLeastCurrent_W', 'lossMinLoss_W', 'lossSaved_W', 'systemGain_pts']);
    expect(rows.length).toBe(1 + 60 * 60);
    const saved = rows.slice(1).map((r) => r[13]!).filter((v) => v !== '').map(Number);
    expect(saved.length).toBeGreaterThan(1000);
    for (const v of saved) expect(v).toBeGreaterThanOrEqual(0);
    await page.selectOption('[data-testid="eff-quantity"]', 'system');
    expect(pageErrors).toEqual([]);
  }, 120_000);

  it('cancels a finer map: the worker stops and the previous map stays', async () => {
    await page.fill('[data-testid="eff-points"]', '150');
    await page.press('[data-testid="eff-points"]', 'Enter');
    await page.waitForSelector('[data-testid="eff-progress"]', { timeout: 20_000 });
    await page.click('[data-testid="eff-cancel"]');
    await page.waitForSelector('[data-testid="eff-cancelled"]');
    expect(await page.$$('[data-testid="eff-progress"]')).toHaveLength(0);
    expect(await page.textContent('[data-testid="eff-conditions"]')).toMatch(/60 × 60 points/);
    await page.waitForTimeout(1500);
    // terminated: no map of 150 x 150 arrives afterwards
    expect(await page.textContent('[data-testid="eff-conditions"]')).toMatch(/60 × 60 points/);
    expect(pageErrors).toEqual([]);
  }, 120_000);
});
