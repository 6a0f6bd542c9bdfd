// The thermal rating in the built app (headless Chromium, 1440 x 900), on the traction demo (invented
// thermal data and duty cycle): the S1 curve on the envelope, under the peak envelope; the Duty cycle
// tab run in the worker to its verdict, its figures, summary and CSV export (screenshots in
// test-results/envelope-s1.png and test-results/duty-cycle-view.png); a finer evaluation cancelled.
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { closeApp, openApp, shotPath, type AppSession } from './harness';
import { parseCsv } from '../../src/core/reports/csv';
import { DUTY_CYCLE_TRACE_CSV_HEADER } from '../../src/core/reports/duty-cycle-trace-csv';

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

type Trace = { name?: string; x: Array<number | null>; y: Array<number | null>; text?: string[] };
const plotData = (id: string): Promise<Trace[]> =>
  page.$eval(`[data-testid="${id}"]`, (el) => ((el as unknown as { data: Trace[] }).data ?? []).map((t) => ({ name: t.name, x: t.x, y: t.y, text: t.text })));

/** y of a polyline at x (linear between its points), or NaN outside it. */
function at(xs: number[], ys: number[], x: number): number {
  for (let k = 1; k < xs.length; k++) if (xs[k - 1]! <= x && x <= xs[k]!) return ys[k - 1]! + ((x - xs[k - 1]!) * (ys[k]! - ys[k - 1]!)) / (xs[k]! - xs[k - 1]! || 1);
  return Number.NaN;
}

describe('thermal rating in the app', () => {
  it('draws the S1 curve on the envelope, its limit named, under the hot peak envelope', async () => {
    await page.selectOption('[data-testid="demo-picker"]', 'demo-ipm-traction.json');
    await page.waitForSelector('[data-testid="s1-key"][data-ready="yes"]', { timeout: 60_000 });
    await page.waitForTimeout(300);
    expect(await page.textContent('[data-testid="s1-status"]')).toMatch(/S1 curve in \d+ ms/);
    const data = await plotData('envelope-plot');
    const s1 = data.filter((t) => t.name?.startsWith('S1 continuous (thermal)'));
    expect(s1.length).toBeGreaterThanOrEqual(2); // motoring and generating
    expect(s1.every((t) => (t.text ?? []).every((s) => /limited by (winding|magnet|inverter junction|continuous current|voltage)/.test(s)))).toBe(true);
    // the peak, hot-magnet curve's motoring branch (up to its first gap)
    const peak = data.find((t) => /^peak .*hot magnet$/.test(t.name ?? ''))!;
    const gap = peak.x.indexOf(null);
    const px = peak.x.slice(0, gap) as number[], py = peak.y.slice(0, gap) as number[];
    let checked = 0;
    for (const t of s1) {
      for (let k = 0; k < t.x.length; k++) {
        const y = t.y[k]!;
        if (!(y > 0)) continue;
        const yp = at(px, py, t.x[k]!);
        if (!Number.isFinite(yp)) continue;
        // the continuous rating lies under the short-time (peak) one (IEC 60034-1 duty types S1 and S2)
        expect(y).toBeLessThanOrEqual(yp * 1.001);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(100);
    await page.screenshot({ path: shotPath('envelope-s1') });
    expect(pageErrors).toEqual([]);
  }, 120_000);

  it('runs the duty cycle in the worker to its verdict, with its figures, summary and CSV', async () => {
    await page.click('[data-testid="tab-dutycycle"]');
    await page.waitForSelector('[data-testid="dc-verdict"]', { timeout: 60_000 });
    await page.waitForSelector('[data-testid="duty-temperature-plot"] .scatterlayer .trace', { state: 'attached' });
    // the invented cycle stays within its invented limits; the verdict carries the caution
    expect(await page.getAttribute('[data-testid="dc-verdict"]', 'data-status')).toBe('within-limits');
    const verdict = (await page.textContent('[data-testid="dc-verdict"]')) ?? '';
    expect(verdict).toMatch(/within limits/);
    expect(verdict).toMatch(/IEC 60034-1/);
    expect(verdict).toMatch(/local codes and licensed practice/);
    expect(await page.textContent('[data-testid="dc-conditions"]')).toMatch(/2401 instants/);
    const winding = Number(await page.getAttribute('[data-testid="dc-peak-winding"]', 'data-value'));
    // between the coolant (65 °C in the demo) and the winding limit (180 °C)
    expect(winding).toBeGreaterThan(65);
    expect(winding).toBeLessThan(180);
    // RMS current below the peak current (common practice (no source))
    expect(Number(await page.getAttribute('[data-testid="dc-rms-current"]', 'data-value'))).toBeGreaterThan(0);
    expect(await page.textContent('[data-testid="dc-repeats"]')).toMatch(/^\d+ \(last change/);
    const temps = await plotData('duty-temperature-plot');
    expect(temps.map((t) => t.name)).toEqual(['winding', 'stator', 'magnet', 'inverter junction', 'winding limit 180 °C', 'magnet limit 150 °C', 'inverter junction limit 150 °C', 'coolant 65 °C']);
    const plane = await plotData('duty-plane-plot');
    expect(plane.find((t) => t.name === 'cycle instants (colour: time)')!.x.length).toBe(2401);
    expect(await page.$$eval('[data-testid="duty-energy-plot"] .barlayer .point', (els) => els.length)).toBe(6);
    await page.screenshot({ path: shotPath('duty-cycle-view') });

    const [download] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid="dc-csv"]')]);
    const rows = parseCsv(readFileSync((await download.path())!, 'utf8'));
    expect(rows[0]![0]).toMatch(/^# torquewise duty cycle/);
    expect(rows[1]).toEqual([...DUTY_CYCLE_TRACE_CSV_HEADER]);
    expect(rows.length).toBe(2 + 2401);
    expect(pageErrors).toEqual([]);
  }, 120_000);

  it('cancels a finer evaluation: the worker stops and the previous result stays', async () => {
    await page.fill('[data-testid="dc-step"]', '0.0005');
    await page.click('[data-testid="dc-run"]');
    await page.waitForSelector('[data-testid="dc-progress"]', { timeout: 20_000 });
    await page.click('[data-testid="dc-cancel"]');
    await page.waitForSelector('[data-testid="dc-cancelled"]');
    expect(await page.$$('[data-testid="dc-progress"]')).toHaveLength(0);
    await page.waitForTimeout(1500);
    expect(await page.textContent('[data-testid="dc-conditions"]')).toMatch(/2401 instants/);
    expect(pageErrors).toEqual([]);
  }, 120_000);
});
