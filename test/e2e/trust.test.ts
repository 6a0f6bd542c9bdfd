// Text from a file is data in the page, and the page's bounds hold, in headless Chromium: a label
// full of plotly markup is drawn literally, a file above the size limit or with a list beyond the
// cap is refused before the form lays it out, and an autosave that cannot be restored is offered
// once, then kept aside.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { closeApp, openApp, ROOT, type AppSession } from './harness';
import { MAX_LIST_ENTRIES, MAX_PROJECT_BYTES } from '../../src/core/project/schema';

let app: AppSession | undefined;
let page: Page;
let pageErrors: string[] = [];

const demo = () => JSON.parse(readFileSync(join(ROOT, 'resources', 'demo-ipm-traction.json'), 'utf8')) as { requirements: Array<{ label: string }> } & Record<string, unknown>;

async function openFile(name: string, buffer: Buffer): Promise<void> {
  const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.click('[data-testid="open"]')]);
  await chooser.setFiles({ name, mimeType: 'application/json', buffer });
}

beforeAll(async () => {
  app = await openApp();
  ({ page, errors: pageErrors } = app);
}, 120_000);

afterAll(async () => {
  await closeApp(app);
});

describe('text from a file in the page', () => {
  it('a requirement label full of plotly markup is shown literally and makes no link', async () => {
    const label = '<a href="x">A</a><br>';
    const p = demo();
    p.requirements[0]!.label = label;
    await openFile('markup.json', Buffer.from(JSON.stringify(p)));
    await page.waitForFunction((l) => [...document.querySelectorAll('[data-testid="envelope-plot"] .textpoint text')].some((t) => (t.textContent ?? '').startsWith(l)), label, { timeout: 20_000 });
    const shown = await page.$$eval('[data-testid="envelope-plot"] .textpoint text', (els) => els.map((e) => e.textContent ?? ''));
    expect(shown.some((t) => t === label || t === `${label} (fails hot)` || t === `${label} (fails cold)`)).toBe(true);
    expect(await page.$$eval('[data-testid="envelope-plot"] a, [data-testid="envelope-plot"] [href], [data-testid="envelope-plot"] [*|href]', (els) => els.length)).toBe(0);
  });
});

describe('bounded work in the page', () => {
  it('a file above the size limit is refused before it is read', async () => {
    await openFile('huge.json', Buffer.alloc(MAX_PROJECT_BYTES + 1, 0x20));
    await page.waitForFunction(() => /Could not open "huge\.json": it is \d+ bytes/.test(document.querySelector('[data-testid="status"]')?.textContent ?? ''), undefined, { timeout: 20_000 });
    expect(await page.textContent('[data-testid="status"]')).toBe(`Could not open "huge.json": it is ${MAX_PROJECT_BYTES + 1} bytes, more than the ${MAX_PROJECT_BYTES} bytes a project may have.`);
  });

  it('20 000 requirements are refused by the list, naming it and the cap; the form keeps the project it had', async () => {
    const p = demo();
    const before = await page.$$eval('.inputs [data-path^="requirements."]', (els) => els.length);
    p.requirements = Array.from({ length: 20_000 }, (_, i) => ({ label: `p${i}`, speed_rpm: -1, torque_Nm: 'x' })) as never;
    await openFile('many.json', Buffer.from(JSON.stringify(p)));
    await page.waitForFunction(() => /many\.json was not opened/.test(document.querySelector('[data-testid="status"]')?.textContent ?? ''), undefined, { timeout: 20_000 });
    expect(await page.textContent('[data-testid="status"]')).toBe(`many.json was not opened: requirements must have at most ${MAX_LIST_ENTRIES} entries (it has 20000); nothing was changed.`);
    expect(await page.$$eval('.inputs [data-path^="requirements."]', (els) => els.length)).toBe(before);
  });
});

describe('web autosave that cannot be restored', () => {
  it('is offered once, then kept aside and not offered again', async () => {
    await page.evaluate(() => localStorage.setItem('torquewise.recovery', JSON.stringify({ text: '{"format": "torquewise-project", "requirements": [', documentPath: null, savedAt: '2026-01-02T03:04:05.000Z' })));
    const offers: string[] = [];
    page.on('dialog', (d) => {
      if (d.type() === 'confirm') offers.push(d.message());
      void d.accept();
    });
    await page.reload();
    await page.waitForSelector('[data-testid="envelope-plot"] .scatterlayer .trace');
    await page.waitForFunction(() => /recovered\.json is not valid JSON/.test(document.querySelector('[data-testid="status"]')?.textContent ?? ''), undefined, { timeout: 20_000 });
    expect(offers).toHaveLength(1);
    await page.reload();
    await page.waitForSelector('[data-testid="envelope-plot"] .scatterlayer .trace');
    const kept = await page.evaluate(() => Object.keys(localStorage).filter((k) => k.startsWith('torquewise.recovery.set-aside.')).map((k) => localStorage.getItem(k)));
    expect(offers).toHaveLength(1);
    expect(kept).toHaveLength(1);
    expect(JSON.parse(kept[0]!)).toMatchObject({ text: '{"format": "torquewise-project", "requirements": [', savedAt: '2026-01-02T03:04:05.000Z' });
    expect(await page.evaluate(() => localStorage.getItem('torquewise.recovery'))).toBeNull();
  });

  it('raised no page errors', () => {
    expect(pageErrors).toEqual([]);
  });
});
