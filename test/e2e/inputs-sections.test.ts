// The input side's Losses, Thermal network and Duty cycle sections in the built app (headless
// Chromium, 1440 x 900) on the traction demo (invented data): the file's values in their fields with
// units, the core's message beside a bad field, each part switched off and on through the form
// (written to and deleted from the saved file), the duty cycle as a summary; screenshot in
// test-results/inputs-sections.png.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { closeApp, openApp, ROOT, shotPath, type AppSession } from './harness';

let app: AppSession | undefined;
let page: Page;
let pageErrors: string[] = [];

const input = (path: string) => `.inputs [data-path="${path}"]`;
const msgFor = (path: string) => `.inputs [data-msg-for="${path}"]`;
const demo = JSON.parse(readFileSync(join(ROOT, 'resources', 'demo-ipm-traction.json'), 'utf8'));

/** The project as the app saves it (the web page's Save is a download). */
async function saved(): Promise<Record<string, any>> {
  const [download] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid="save"]')]);
  return JSON.parse(readFileSync((await download.path())!, 'utf8'));
}

beforeAll(async () => {
  app = await openApp({ acceptDownloads: true, consoleErrors: true });
  ({ page, errors: pageErrors } = app);
  page.on('dialog', (d) => void d.accept()); // opening a file or a demo over edits asks first
}, 120_000);

afterAll(async () => {
  await closeApp(app);
});

describe('the losses, thermal and duty-cycle sections', () => {
  it("shows the traction demo's losses, thermal network and duty cycle", async () => {
    expect(await page.textContent('[data-testid="project-name"]')).toContain('traction');
    expect(await page.inputValue(input('losses.iron.kh'))).toBe(String(demo.losses.iron.kh));
    expect(await page.inputValue(input('losses.windage.kw'))).toBe(String(demo.losses.windage.kw));
    for (const [k, v] of Object.entries(demo.losses.inverter)) expect(await page.inputValue(input(`losses.inverter.${k}`)), k).toBe(String(v));
    for (const [k, v] of Object.entries(demo.thermal)) expect(await page.inputValue(input(`thermal.${k}`)), k).toBe(String(v));
    // units from the schema's keys: Ω for the slope resistances, A peak for the reference current
    const unitOf = (p: string) => page.$eval(input(p), (el) => el.parentElement!.querySelector('.unit')!.textContent);
    expect(await unitOf('losses.inverter.rce')).toBe('Ω');
    expect(await unitOf('losses.inverter.Iref_A')).toBe('A peak');
    expect(await unitOf('thermal.windingToStator_K_per_W')).toBe('K/W');
    // the network's time constants from the typed terms: 1900 J/K x 0.03 K/W = 57 s, 11500 x 0.015 = 172.5 s,
    // and (0.03 + 0.015) K/W x 1 kW = 45 K (first-order RC network; common practice, no source)
    expect(await page.textContent('[data-testid="thermal-derived"]')).toBe('time constants: winding 57 s, stator 172.5 s; steady winding rise 45 K per kW of copper loss');
    // the duty cycle as a summary, never as rows
    expect(await page.inputValue(input('dutyCycle.label'))).toBe(demo.dutyCycle.label);
    expect(await page.textContent('[data-testid="duty-samples"]')).toBe('24');
    expect(await page.textContent('[data-testid="duty-duration"]')).toBe('120 s (2 min)');
    expect(await page.textContent('[data-testid="duty-speed"]')).toBe('0 to 8000 rpm');
    expect(await page.textContent('[data-testid="duty-torque"]')).toBe('-80 to 200 N·m');
    expect(await page.$$('.inputs [data-path^="dutyCycle.t_s"]')).toHaveLength(0);
    expect(await page.$$eval('[data-testid="duty-spark-speed"] path', (els) => (els[0]?.getAttribute('d') ?? '').length)).toBeGreaterThan(40);
  });

  it("shows the core's message beside a bad field, naming the field, and clears it when put right", async () => {
    await page.fill(input('thermal.windingMax_C'), '60');
    expect(await (await page.waitForSelector(msgFor('thermal.windingMax_C'))).textContent()).toContain('must be > thermal.coolantTemp_C (65 °C)');
    expect(await page.textContent('[data-testid="status"]')).toContain('input problem');
    await page.fill(input('thermal.windingMax_C'), '180');
    await page.waitForSelector(msgFor('thermal.windingMax_C'), { state: 'detached' });

    await page.fill(input('losses.iron.beta'), '5');
    expect(await (await page.waitForSelector(msgFor('losses.iron.beta'))).textContent()).toMatch(/<= 3/);
    await page.fill(input('losses.iron.beta'), '2');
    await page.waitForSelector(msgFor('losses.iron.beta'), { state: 'detached' });

    // a reference current is required while a switching energy is above zero
    await page.fill(input('losses.inverter.Iref_A'), '');
    expect(await (await page.waitForSelector(msgFor('losses.inverter.Iref_A'))).textContent()).toContain('is required when losses.inverter.EonEoff_J is above 0');
    await page.fill(input('losses.inverter.Iref_A'), '200');
    await page.waitForSelector(msgFor('losses.inverter.Iref_A'), { state: 'detached' });

    // the junction's resistance alone: its limit is asked for
    await page.fill(input('thermal.junctionMax_C'), '');
    expect(await (await page.waitForSelector(msgFor('thermal.junctionMax_C'))).textContent()).toMatch(/must be|required|number/);
    await page.fill(input('thermal.junctionMax_C'), '150');
    await page.waitForSelector(msgFor('thermal.junctionMax_C'), { state: 'detached' });
    expect(await page.textContent('[data-testid="status"]')).not.toContain('input problem');
  });

  it('switches each part off and on: deleted from and written to the saved file', async () => {
    await page.uncheck(input('losses.inverter:present'));
    await page.waitForSelector(input('losses.inverter.Vce0'), { state: 'detached' });
    await page.uncheck(input('thermal.junction:present'));
    await page.waitForSelector(input('thermal.junctionMax_C'), { state: 'detached' });
    await page.check(input('thermal.statorToCoolantBySpeed:present'));
    await page.waitForSelector(input('thermal.statorToCoolantBySpeed.K_per_W.2'));
    let file = await saved();
    expect(file.losses.inverter).toBeUndefined();
    expect(file.losses.iron).toEqual(demo.losses.iron);
    expect(file.thermal.junctionToCoolant_K_per_W).toBeUndefined();
    expect(file.thermal.junctionMax_C).toBeUndefined();
    expect(file.thermal.statorToCoolantBySpeed).toEqual({ speed_rpm: [0, 1500, 3000], K_per_W: [0.06, 0.03, 0.02] });
    expect(file.thermal.coolantTemp_C).toBe(65);

    // a row of the speed table edited in place, a bad row named by the core
    await page.fill(input('thermal.statorToCoolantBySpeed.speed_rpm.2'), '1000');
    expect(await (await page.waitForSelector(msgFor('thermal.statorToCoolantBySpeed.speed_rpm.2'))).textContent()).toContain('strictly ascending');
    await page.fill(input('thermal.statorToCoolantBySpeed.speed_rpm.2'), '4000');
    await page.waitForSelector(msgFor('thermal.statorToCoolantBySpeed.speed_rpm.2'), { state: 'detached' });

    // switched on again: the starting values, then the demo's own restored by typing
    await page.check(input('losses.inverter:present'));
    expect(await page.inputValue(input('losses.inverter.EonEoff_J'))).toBe('0.022');
    await page.check(input('thermal.junction:present'));
    expect(await page.inputValue(input('thermal.junctionToCoolant_K_per_W'))).toBe('0.15');
    await page.uncheck(input('thermal.statorToCoolantBySpeed:present'));

    // every losses part off: the section leaves the file
    await page.uncheck(input('losses.iron:present'));
    await page.uncheck(input('losses.windage:present'));
    await page.uncheck(input('losses.inverter:present'));
    file = await saved();
    expect(file.losses).toBeUndefined();
    expect(file.thermal.statorToCoolantBySpeed).toBeUndefined();
    expect(file.thermal.junctionMax_C).toBe(150);

    // a new duty cycle from the rated (continuous) point, 4000 rpm and 90 N·m
    await page.uncheck(input('dutyCycle:present'));
    await page.waitForSelector('[data-testid="duty-summary"]', { state: 'detached' });
    await page.check(input('dutyCycle:present'));
    expect(await page.textContent('[data-testid="duty-samples"]')).toBe('7');
    expect(await page.textContent('[data-testid="duty-speed"]')).toBe('0 to 4000 rpm');
    expect(await page.textContent('[data-testid="duty-torque"]')).toBe('-45 to 90 N·m');
    await page.fill(input('dutyCycle.label'), 'urban loop');
    file = await saved();
    expect(file.dutyCycle.label).toBe('urban loop');
    expect(file.dutyCycle.t_s).toHaveLength(7);
    expect(pageErrors).toEqual([]);
  }, 60_000);

  it("names the first bad sample of an opened file's duty cycle under its summary", async () => {
    const bad = { ...demo, dutyCycle: { ...demo.dutyCycle, t_s: [...demo.dutyCycle.t_s] } };
    bad.dutyCycle.t_s[5] = bad.dutyCycle.t_s[4]; // 8.01 s twice
    const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.click('[data-testid="open"]')]);
    await chooser.setFiles({ name: 'bad-cycle.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(bad)) });
    const msg = await page.waitForSelector(msgFor('dutyCycle'));
    expect(await msg.textContent()).toBe('dutyCycle.t_s[5] must be > dutyCycle.t_s[4] (8.01 s): the times must be strictly ascending');
    // the summary still reads what it can
    expect(await page.textContent('[data-testid="duty-samples"]')).toBe('24');
  });

  it('screenshots the new sections on the traction demo', async () => {
    // the demo again, with its own values (by way of another demo: the picker may still show it)
    await page.selectOption('[data-testid="demo-picker"]', 'demo-servo-axis.json');
    await page.waitForFunction(() => !/traction/.test(document.querySelector('[data-testid="project-name"]')?.textContent ?? ''));
    await page.selectOption('[data-testid="demo-picker"]', 'demo-ipm-traction.json');
    await page.waitForFunction(() => /traction/.test(document.querySelector('[data-testid="project-name"]')?.textContent ?? ''));
    await page.waitForSelector('[data-testid="envelope-plot"] .scatterlayer .trace');
    expect(await page.inputValue(input('losses.inverter.Vce0'))).toBe('0.8');
    await page.evaluate(() => document.querySelector('[data-testid="sec-losses"]')!.scrollIntoView());
    await page.screenshot({ path: shotPath('inputs-sections') });
    // the envelope is still drawn, and nothing went wrong in the page
    expect(await page.$$eval('[data-testid="envelope-plot"] .scatterlayer .trace', (els) => els.length)).toBeGreaterThanOrEqual(4);
    expect(pageErrors).toEqual([]);
  });
});
