// The datasheet's figures for paper: the same SVG charts the exported datasheet carries (title,
// legend, conditions; scaled to the page by their viewBox), shown only when the view is printed,
// where a plotly plot drawn at the window's width would be clipped by a narrower page.
import { useLayoutEffect, useMemo, useRef } from 'react';
import type { DatasheetResults } from '../../../core/reports/datasheet-results';
import { datasheetCharts } from '../../../core/reports/datasheet-html';
import { isoDate } from '../../../core/reports/figure-conditions';

/**
 * SVG text (built by core, every text escaped) as an element, parsed in an inert XML document,
 * never as HTML of the live page; scripts, foreign objects, handlers and outside links are dropped.
 */
export function svgNode(text: string): SVGSVGElement | null {
  const doc = new DOMParser().parseFromString(text, 'image/svg+xml');
  const root = doc.documentElement;
  if (root.localName !== 'svg' || doc.getElementsByTagName('parsererror').length) return null;
  for (const n of Array.from(root.querySelectorAll('script, foreignObject'))) n.remove();
  for (const el of [root, ...Array.from(root.querySelectorAll('*'))]) {
    for (const a of Array.from(el.attributes)) {
      const href = a.localName === 'href' && !a.value.startsWith('#');
      if (a.name.toLowerCase().startsWith('on') || href) el.removeAttribute(a.name);
    }
  }
  return document.importNode(root, true) as unknown as SVGSVGElement;
}

export function PrintCharts({ results }: { results: DatasheetResults }) {
  const box = useRef<HTMLDivElement | null>(null);
  const charts = useMemo(() => datasheetCharts(results, { date: isoDate(new Date()) }), [results]);
  useLayoutEffect(() => {
    const el = box.current;
    if (!el) return;
    el.replaceChildren(...[charts.torque, charts.power].map(svgNode).filter((n): n is SVGSVGElement => n !== null));
  }, [charts]);
  return <div className="print-only print-charts" data-testid="print-charts" ref={box} />;
}
