declare module 'plotly.js-dist-min' {
  // The subset of the plotly.js API that Torquewise uses; data and layout are plain objects.
  export type Data = Record<string, unknown>;
  export type Layout = Record<string, unknown>;
  export type Config = Record<string, unknown>;
  export interface PlotlyHTMLElement extends HTMLElement {
    on(event: string, handler: (ev: any) => void): void;
    removeAllListeners?(event: string): void;
  }
  export function newPlot(root: HTMLElement | string, data: Data[], layout?: Layout, config?: Config): Promise<PlotlyHTMLElement>;
  export function react(root: HTMLElement | string, data: Data[], layout?: Layout, config?: Config): Promise<PlotlyHTMLElement>;
  export function purge(root: HTMLElement | string): void;
  export function relayout(root: HTMLElement | string, update: Layout): Promise<PlotlyHTMLElement>;
  export function toImage(root: HTMLElement | string, opts: { format: 'png' | 'svg' | 'jpeg' | 'webp'; width?: number; height?: number; scale?: number }): Promise<string>;
  export function downloadImage(root: HTMLElement | string, opts: { format: 'png' | 'svg' | 'jpeg' | 'webp'; width?: number; height?: number; filename?: string }): Promise<string>;
  const Plotly: {
    newPlot: typeof newPlot;
    react: typeof react;
    purge: typeof purge;
    relayout: typeof relayout;
    toImage: typeof toImage;
    downloadImage: typeof downloadImage;
  };
  export default Plotly;
}
