/** The part of plotly.js (dist-min bundle) this page uses. */
declare module 'plotly.js-dist-min' {
  export type PlotData = Record<string, unknown>;
  export type Layout = Record<string, unknown>;
  export type Config = Record<string, unknown>;
  export interface ImageOptions {
    format: 'png' | 'svg' | 'jpeg' | 'webp';
    width?: number;
    height?: number;
    filename?: string;
    scale?: number;
  }
  export interface PlotlyHTMLElement extends HTMLElement {
    data: PlotData[];
    layout: Layout;
  }
  const Plotly: {
    newPlot(el: HTMLElement, data: PlotData[], layout?: Layout, config?: Config): Promise<PlotlyHTMLElement>;
    react(el: HTMLElement, data: PlotData[], layout?: Layout, config?: Config): Promise<PlotlyHTMLElement>;
    purge(el: HTMLElement): void;
    toImage(el: HTMLElement, opts: ImageOptions): Promise<string>;
    downloadImage(el: HTMLElement, opts: ImageOptions): Promise<string>;
    Plots: { resize(el: HTMLElement): void };
  };
  export default Plotly;
}
