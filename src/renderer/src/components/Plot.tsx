// A thin React wrapper around plotly's `react` call, themed from the CSS variables.
import { useEffect, useLayoutEffect, useRef } from 'react';
import Plotly from 'plotly.js-dist-min';
import type { Data, Layout, PlotlyHTMLElement } from 'plotly.js-dist-min';

export { axis, baseLayout, CURVE, readTheme, REGION_FILL, type CurveColours, type PlotTheme } from './plot-style';

export interface PlotProps {
  data: Data[];
  layout: Layout;
  height: number;
  testId?: string;
  onHover?: (ev: any) => void;
  onUnhover?: () => void;
  /** Called with plotly's click event (a point of a trace clicked). */
  onClick?: (ev: any) => void;
  /** Called with plotly's relayout event (zoom, pan, reset, resize). */
  onRelayout?: (ev: Record<string, unknown>) => void;
  /** Called after each redraw finished (the promise of Plotly.react resolved). */
  onDrawn?: (el: PlotlyHTMLElement) => void;
  elRef?: (el: HTMLDivElement | null) => void;
  /** draw after the current frame (a secondary plot that may lag the main one by a frame) */
  defer?: boolean;
}

export function Plot({ data, layout, height, testId, onHover, onUnhover, onClick, onRelayout, onDrawn, elRef, defer }: PlotProps) {
  const ref = useRef<HTMLDivElement | null>(null);
  const hoverRef = useRef(onHover);
  const unhoverRef = useRef(onUnhover);
  const clickRef = useRef(onClick);
  clickRef.current = onClick;
  const relayoutRef = useRef(onRelayout);
  relayoutRef.current = onRelayout;
  const drawnRef = useRef(onDrawn);
  hoverRef.current = onHover;
  unhoverRef.current = onUnhover;
  drawnRef.current = onDrawn;
  const bound = useRef(false);

  // drawn in the commit itself (a layout effect): no frame is painted between the new DOM and the plot
  useLayoutEffect(() => {
    const el = ref.current;
    if (!el) return;
    let live = true;
    const draw = () => {
      if (!live) return;
      performance.mark(`tw-plot:${testId ?? ''}`);
      // a fresh copy of the layout each draw: plotly writes ranges it computed back into the layout it
      // is given, and a reused layout would carry one edit's ranges into the next
      void Plotly.react(el, data, structuredClone({ ...layout, height }), { displaylogo: false, responsive: true, modeBarButtonsToRemove: ['select2d', 'lasso2d', 'toImage'] }).then((gd) => {
        if (!live) return;
        if (!bound.current) {
          bound.current = true;
          gd.on('plotly_hover', (ev) => hoverRef.current?.(ev));
          gd.on('plotly_unhover', () => unhoverRef.current?.());
          gd.on('plotly_click', (ev) => clickRef.current?.(ev));
          gd.on('plotly_relayout', (ev) => relayoutRef.current?.(ev as unknown as Record<string, unknown>));
        }
        drawnRef.current?.(gd);
      });
    };
    // deferred: after the next frame is painted, so the main plot reaches the screen first
    let timer: ReturnType<typeof setTimeout> | null = null;
    let frame: number | null = null;
    if (defer) frame = requestAnimationFrame(() => (timer = setTimeout(draw, 0)));
    else draw();
    return () => {
      live = false;
      if (timer !== null) clearTimeout(timer);
      if (frame !== null) cancelAnimationFrame(frame);
    };
  }, [data, layout, height]);

  useEffect(() => {
    const el = ref.current;
    return () => {
      if (el) Plotly.purge(el);
    };
  }, []);

  return (
    <div
      className="plot"
      data-testid={testId}
      style={{ height }}
      ref={(el) => {
        ref.current = el;
        elRef?.(el);
      }}
    />
  );
}
