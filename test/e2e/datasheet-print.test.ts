// End-to-end: the datasheet (the HTML the app exports and the CLI writes) in Chromium: it fits every
// window width and prints portrait on A4 and Letter with no plot clipped and nothing wider than its card.
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launch, ROOT, shotPath, SHOTS } from './harness';
import { loadProjectText } from '../../src/core/project/project';
import { computeDatasheetResults } from '../../src/core/reports/datasheet-results';
import { datasheetHtml } from '../../src/core/reports/datasheet-html';

const DEMOS = ['demo-ipm-traction', 'demo-servo-axis', 'demo-spm-48v'] as const;
const sheet = (demo: string): string =>
  datasheetHtml(computeDatasheetResults(loadProjectText(readFileSync(join(ROOT, 'resources', `${demo}.json`), 'utf8'))), { date: '2026-12-03' });

/** Paper sizes, mm, and the page margins of the datasheet's @page rule (left and right 11 mm). */
const PAPER = { A4: { w: 210, h: 297 }, Letter: { w: 215.9, h: 279.4 } } as const;
const SIDE_MARGINS_MM = 22;
const PX_PER_MM = 96 / 25.4;

let browser: Browser;
let page: Page;

beforeAll(async () => {
  browser = await launch();
  page = await browser.newPage();
}, 120_000);

afterAll(async () => {
  await browser?.close();
});

/** Every card's content within the card, every svg within its card and the page; the offenders, described. */
async function overflows(): Promise<string[]> {
  return page.evaluate(() => {
    const bad: string[] = [];
    const pageWidth = document.documentElement.clientWidth;
    const cards = Array.from(document.querySelectorAll<HTMLElement>('.card, .caution'));
    if (cards.length < 6) bad.push(`only ${cards.length} cards`);
    for (const card of cards) {
      const box = card.getBoundingClientRect();
      if (card.scrollWidth > card.clientWidth) bad.push(`${card.querySelector('h1, h2')?.textContent}: scrollWidth ${card.scrollWidth} > ${card.clientWidth}`);
      if (box.right > pageWidth + 0.5) bad.push(`card right ${box.right} > page ${pageWidth}`);
      for (const el of Array.from(card.querySelectorAll<HTMLElement | SVGElement>('*'))) {
        if (el.closest('svg') && el.tagName.toLowerCase() !== 'svg') continue; // an svg's inside is scaled with it
        const r = el.getBoundingClientRect();
        if (r.width === 0) continue;
        if (r.right > box.right + 0.5 || r.left < box.left - 0.5) bad.push(`<${el.tagName.toLowerCase()}> ${r.left.toFixed(1)}..${r.right.toFixed(1)} outside its card ${box.left.toFixed(1)}..${box.right.toFixed(1)}`);
        // a box that scrolls, or a table cell whose text spills out of it
        const cell = el.tagName === 'TD' || el.tagName === 'TH';
        if (el instanceof HTMLElement && el.clientWidth > 0 && el.scrollWidth > el.clientWidth + 1 && (cell || getComputedStyle(el).overflowX !== 'visible')) bad.push(`<${el.tagName.toLowerCase()}> "${el.textContent?.slice(0, 30)}" overflows: ${el.scrollWidth} > ${el.clientWidth}`);
      }
    }
    for (const svg of Array.from(document.querySelectorAll('svg'))) {
      const r = svg.getBoundingClientRect();
      const card = svg.closest('.card')!.getBoundingClientRect();
      if (r.right > card.right + 0.5 || r.left < card.left - 0.5 || r.right > pageWidth + 0.5) bad.push(`svg ${svg.getAttribute('data-testid')} ${r.left}..${r.right} beyond card/page`);
      // scaled to fit, not shrunk to a stamp
      if (r.width < 0.85 * (card.width - 26)) bad.push(`svg ${svg.getAttribute('data-testid')} only ${r.width} px wide in a ${card.width} px card`);
    }
    return bad;
  });
}

describe('datasheet in the browser and on paper', () => {
  it('fits the window at every width, without a clipped plot', async () => {
    for (const demo of DEMOS) {
      await page.setContent(sheet(demo));
      for (const width of [360, 600, 900, 1440]) {
        await page.setViewportSize({ width, height: 900 });
        expect(await overflows(), `${demo} at ${width} px`).toEqual([]);
        // no horizontal scroll of the page either
        expect(await page.evaluate(() => document.documentElement.scrollWidth <= document.documentElement.clientWidth)).toBe(true);
      }
      if (demo === 'demo-servo-axis') {
        await page.setViewportSize({ width: 360, height: 800 });
        await page.screenshot({ path: shotPath('datasheet-360px'), fullPage: true });
      }
    }
  });

  for (const format of ['A4', 'Letter'] as const) {
    it(`prints portrait on ${format}: nothing overflows its card, charts within the page's content width`, async () => {
      const contentPx = (PAPER[format].w - SIDE_MARGINS_MM) * PX_PER_MM;
      for (const demo of DEMOS) {
        await page.setContent(sheet(demo));
        await page.emulateMedia({ media: 'print' });
        // the print layout at the width of the page's content box
        await page.setViewportSize({ width: Math.floor(contentPx), height: 1000 });
        expect(await overflows(), `${demo} on ${format}`).toEqual([]);
        const svgRight = await page.$$eval('svg', (els) => Math.max(...els.map((e) => e.getBoundingClientRect().right)));
        expect(svgRight).toBeLessThanOrEqual(contentPx);
        const pdf = await page.pdf({ format, printBackground: true });
        const file = join(SHOTS, `datasheet-${demo}-${format}.pdf`);
        writeFileSync(file, pdf);
        // the paper Chromium used: portrait, the format's size in points (1 pt = 1/72 in)
        const box = /\/MediaBox\s*\[\s*0\s+0\s+([\d.]+)\s+([\d.]+)\s*\]/.exec(pdf.toString('latin1'));
        expect(box).not.toBeNull();
        // (Chromium rounds the paper to whole device pixels: within 1.5 pt)
        expect(Math.abs(Number(box![1]) - (PAPER[format].w / 25.4) * 72)).toBeLessThan(1.5);
        expect(Math.abs(Number(box![2]) - (PAPER[format].h / 25.4) * 72)).toBeLessThan(1.5);
        const pages = (pdf.toString('latin1').match(/\/Type\s*\/Page[^s]/g) ?? []).length;
        expect(pages).toBeGreaterThanOrEqual(3);
        expect(pages).toBeLessThanOrEqual(8);
        await page.emulateMedia({ media: 'screen' });
      }
    });
  }
});
