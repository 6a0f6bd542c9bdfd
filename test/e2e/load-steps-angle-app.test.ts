// The Load steps view with a measured angle in the built app (headless Chromium, 1440 x 900): the
// servo demo (an encoder of 2048 lines) run, its estimated speed drawn over the true speed, the angle
// error in electrical degrees on its own row, the rms and peak in the metrics, the encoder named.
// Screenshots test-results/load-steps-encoder.png, load-steps-encoder-traces.png, load-steps-encoder-metrics.png.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { closeApp, openApp, shotPath, type AppSession } from './harness';

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

const runEnabled = () => page.waitForFunction(() => !(document.querySelector('[data-testid="run"]') as HTMLButtonElement).disabled);

/** The traces plot's curves as plotly holds them: name, y axis, y values. */
const curves = () =>
  page.$eval('[data-testid="traces-plot"]', (el) =>
    ((el as unknown as { data: Array<{ name: string; yaxis: string; y: ArrayLike<number> }> }).data ?? []).map((t) => ({ name: t.name, yaxis: t.yaxis, y: Array.from(t.y) })),
  );

describe('the Load steps view with an encoder', () => {
  it('runs the servo demo and shows the estimated speed over the true speed and the angle error in electrical degrees', async () => {
    await page.selectOption('[data-testid="demo-picker"]', 'demo-servo-axis.json');
    // the servo motor's 1.1 ohm in the side panel: the demo is loaded
    await page.waitForFunction(() => (document.querySelector('.inputs [data-path="motor.Rs"]') as HTMLInputElement | null)?.value === '1.1');
    await page.click('[data-testid="tab-loadsteps"]');
    await runEnabled();
    await page.click('[data-testid="run"]');
    await page.waitForSelector('[data-testid="traces-plot"] .scatterlayer .trace', { timeout: 60_000 });
    await page.waitForSelector('[data-testid="angle-source"]');
    expect(await page.textContent('[data-testid="angle-source-text"]')).toMatch(/^encoder, 2048 lines \(8192 counts per revolution, 0\.176 ° electrical per count\)/);

    const c = await curves();
    const est = c.find((t) => t.name === 'speed, estimated')!;
    const tru = c.find((t) => t.name === 'speed (true)')!;
    const err = c.find((t) => t.name === 'estimated − true angle')!;
    expect(est.yaxis).toBe('y');
    expect(err.yaxis).toBe('y3');
    // the estimate ends at the 2000 rpm reference with the true speed (within 1 %, common practice (no source))
    expect(Math.abs(est.y[est.y.length - 1]! - 2000)).toBeLessThan(20);
    expect(Math.abs(est.y[est.y.length - 1]! - tru.y[tru.y.length - 1]!)).toBeLessThan(20);
    // the encoder's quadrature count bounds the angle error: 360 * 4 pole pairs / 8192 counts = 0.176 ° electrical (common practice (no source))
    const peak = Math.max(...err.y.map(Math.abs));
    expect(peak).toBeGreaterThan(0.01);
    expect(peak).toBeLessThanOrEqual(0.1758);
    expect(await page.textContent('[data-testid="traces-plot"] .g-y3title')).toBe('angle error, ° el.');
    const rms = Number(await page.getAttribute('[data-metric="angleErrorRms_rad"]', 'data-value'));
    const pk = Number(await page.getAttribute('[data-metric="angleErrorPeak_rad"]', 'data-value'));
    expect(rms).toBeGreaterThan(0);
    expect(rms).toBeLessThan(pk);
    expect((pk * 180) / Math.PI).toBeLessThanOrEqual(0.1758);
    expect(await page.textContent('[data-metric="angleErrorPeak_rad"]')).toMatch(/° electrical \(\d/);
    await page.screenshot({ path: shotPath('load-steps-encoder') });
    await page.locator('[data-testid="traces-plot"]').screenshot({ path: shotPath('load-steps-encoder-traces') });
    await page.locator('[data-testid="metrics"]').scrollIntoViewIfNeeded();
    await page.screenshot({ path: shotPath('load-steps-encoder-metrics') });

    expect(pageErrors).toEqual([]);
  }, 180_000);
});
