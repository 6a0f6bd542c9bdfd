// The Load steps view in the built app (headless Chromium, 1440 x 900), on the servo demo:
// - with its encoder (2048 lines): the estimated speed drawn over the true speed, the angle error in
//   electrical degrees on its own row, the rms and peak in the metrics, the encoder named; screenshots
//   test-results/load-steps-encoder.png, load-steps-encoder-traces.png, load-steps-encoder-zoom.png,
//   load-steps-encoder-metrics.png;
// - the 48 V demo with its sensorless observer: the hand-over marked, the validity finding beside the
//   angle source; screenshots test-results/load-steps-sensorless.png, load-steps-sensorless-traces.png, load-steps-sensorless-dark.png;
// - with the switching model: the zoom window moved from the run's end to the first load step and to
//   times typed in, each run's window where it was put; a start after the run refused beside its
//   field; screenshots test-results/switching-window-load-step.png, switching-window-times.png.
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
    // zoomed by a drag on the speed row to the start-up, 3 to 15 ms: the estimate lags the true speed while it accelerates
    const box = (await page.locator('[data-testid="traces-plot"] .draglayer .xy .nsewdrag').boundingBox())!;
    const xAt = (t: number) => box.x + (box.width * t) / 0.1;
    await page.mouse.move(xAt(0.003), box.y + box.height / 2);
    await page.mouse.down();
    await page.mouse.move(xAt(0.009), box.y + box.height / 2, { steps: 4 });
    await page.mouse.move(xAt(0.015), box.y + box.height / 2, { steps: 4 });
    await page.mouse.up();
    await page.mouse.move(0, 0);
    await page.waitForTimeout(300);
    await page.locator('[data-testid="traces-plot"]').screenshot({ path: shotPath('load-steps-encoder-zoom') });
    await page.locator('[data-testid="traces-plot"]').dblclick({ position: { x: box.width / 2 + 84, y: 40 } });
    await page.locator('[data-testid="metrics"]').scrollIntoViewIfNeeded();
    await page.screenshot({ path: shotPath('load-steps-encoder-metrics') });

    expect(pageErrors).toEqual([]);
  }, 180_000);

  it('runs the 48 V demo (sensorless): the observer named with its PLL, the hand-over speed marked, its validity finding beside it', async () => {
    await page.selectOption('[data-testid="demo-picker"]', 'demo-spm-48v.json');
    await page.waitForFunction(() => (document.querySelector('.inputs [data-path="motor.Rs"]') as HTMLInputElement | null)?.value === '0.012');
    await page.click('[data-testid="tab-loadsteps"]');
    await runEnabled();
    await page.click('[data-testid="run"]');
    await page.waitForFunction(() => /^sensorless observer, PLL 1 kHz, open-loop start-up handing over at 700 rpm/.test(document.querySelector('[data-testid="angle-source-text"]')?.textContent ?? ''), undefined, { timeout: 60_000 });
    // the observer's validity: the back-EMF and the current model's weight bound it from below, the start-up hands over above (common practice (no source))
    expect(await page.textContent('[data-testid="angle-source"]')).toMatch(/sensorless observer is not valid below \d+ rpm/);
    expect(await page.$$eval('[data-testid="traces-plot"] .annotation-text', (els) => els.map((e) => e.textContent))).toContain('sensorless hand-over 700 rpm');
    const c = await curves();
    const est = c.find((t) => t.name === 'speed, estimated')!;
    // locked at the end: the estimate at the 3000 rpm reference within 1 % (common practice (no source))
    expect(Math.abs(est.y[est.y.length - 1]! - 3000)).toBeLessThan(30);
    const pk = Number(await page.getAttribute('[data-metric="angleErrorPeak_rad"]', 'data-value'));
    expect(pk).toBeGreaterThan(0);
    expect(pk).toBeLessThan(Math.PI / 6);
    await page.locator('[data-testid="traces-plot"]').screenshot({ path: shotPath('load-steps-sensorless-traces') });
    await page.locator('[data-testid="angle-source"]').scrollIntoViewIfNeeded();
    await page.screenshot({ path: shotPath('load-steps-sensorless') });
    // the dark theme: the estimate and the angle error in colours of their own there too
    await page.click('[data-testid="theme-toggle"]');
    await page.waitForTimeout(300);
    await page.locator('[data-testid="traces-plot"]').screenshot({ path: shotPath('load-steps-sensorless-dark') });
    await page.click('[data-testid="theme-toggle"]');
    expect(pageErrors).toEqual([]);
  }, 180_000);

  it('moves the switching model\'s zoom window: the run\'s end, the first load step, times typed in', async () => {
    await page.selectOption('[data-testid="demo-picker"]', 'demo-servo-axis.json');
    await page.waitForFunction(() => (document.querySelector('.inputs [data-path="motor.Rs"]') as HTMLInputElement | null)?.value === '1.1');
    const windowOf = async () => {
      const t = (await page.textContent('[data-testid="switching-panel"] h4')) ?? '';
      const m = /window ([\d.]+) to ([\d.]+) ms/.exec(t);
      return m ? [Number(m[1]), Number(m[2])] : null;
    };
    const runSwitching = async () => {
      await runEnabled();
      await page.click('[data-testid="run"]');
      await page.waitForSelector('[data-testid="progress"]', { state: 'detached', timeout: 60_000 });
      await page.waitForSelector('[data-testid="switching-window-plot"] .scatterlayer .trace', { timeout: 60_000 });
    };
    await page.click('[data-testid="pwm-switching"]');
    await page.waitForSelector('[data-testid="pwm-window-at"]');
    expect(await page.inputValue('[data-testid="pwm-window-at"]')).toBe('end');
    await runSwitching();
    // the default: the run's last two fundamental periods, 2000 rpm x 4 pole pairs = 133 Hz, 15 ms before the 100 ms end
    const end = (await windowOf())!;
    expect(end[1]).toBeCloseTo(100, 0);
    expect(end[1] - end[0]).toBeGreaterThan(13);
    expect(end[1] - end[0]).toBeLessThan(16);

    // at the first load step (50 ms): 15 ms from a quarter of it before, the step marked
    await page.selectOption('[data-testid="pwm-window-at"]', 'load-step');
    await runSwitching();
    await page.waitForFunction(() => /window 46\.25 to 61\.25 ms/.test(document.querySelector('[data-testid="switching-panel"] h4')?.textContent ?? ''));
    expect(await page.textContent('[data-testid="switching-window-plot"] .annotation-text')).toBe('load step 50 ms');
    await page.locator('[data-testid="switching-window-plot"]').scrollIntoViewIfNeeded();
    await page.screenshot({ path: shotPath('switching-window-load-step') });

    // times typed in: 20 to 25 ms
    await page.selectOption('[data-testid="pwm-window-at"]', 'times');
    await page.fill('[data-testid="pwm-window-from"]', '0.02');
    await page.fill('[data-testid="pwm-window-to"]', '0.025');
    expect(await page.textContent('[data-testid="pwm-control"]')).toMatch(/= 20 ms/);
    await runSwitching();
    await page.waitForFunction(() => /window 20 to 25 ms/.test(document.querySelector('[data-testid="switching-panel"] h4')?.textContent ?? ''));
    const t = await page.$eval('[data-testid="switching-window-plot"]', (el) => Array.from((el as unknown as { data: Array<{ x: ArrayLike<number> }> }).data[0]!.x));
    expect(t[0]).toBeGreaterThanOrEqual(20);
    expect(t[t.length - 1]).toBeLessThanOrEqual(25);
    expect(t.length).toBeGreaterThan(80 * 4); // 80 carrier periods of 62.5 µs, several switching instants each
    await page.screenshot({ path: shotPath('switching-window-times') });

    // a start after the 0.1 s run: the schema's message beside the field, no run
    await page.fill('[data-testid="pwm-window-from"]', '0.2');
    await page.fill('[data-testid="pwm-window-to"]', '0.3');
    await page.waitForSelector('[data-msg-for="control.pwm.window_s.from"]');
    expect(await page.textContent('[data-msg-for="control.pwm.window_s.from"]')).toMatch(/must be < scenario\.duration_s \(0\.1 s\)/);
    expect(await page.isEnabled('[data-testid="run"]')).toBe(false);
    expect(pageErrors).toEqual([]);
  }, 180_000);
});
