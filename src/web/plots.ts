/**
 * Plots of a sweep with plotly: efficiency of each order against the swept parameter (TE solid,
 * TM dashed, unpolarized dotted; one colour per order), the totals R, T and A, and a map of one
 * column over a two-parameter grid. Everything plotted is read from the rows' cells by the
 * plan's column names, so the plot shows exactly what the CSV holds.
 */
import type { PlotData, Layout, Config } from 'plotly.js-dist-min';
import type { SweepPlan, SweepRow } from '../sweep/types.ts';

type PlotlyApi = typeof import('plotly.js-dist-min').default;
let plotly: Promise<PlotlyApi> | null = null;
/** plotly is large: it loads (as its own file) when the first plot is drawn, not with the page. */
function loadPlotly(): Promise<PlotlyApi> {
  plotly ??= import('plotly.js-dist-min').then((m) => m.default);
  return plotly;
}

type Pol = 'TE' | 'TM' | 'unpol' | 'req';

export interface EffColumn {
  readonly col: number;
  readonly name: string;
  readonly side: 'R' | 'T';
  readonly m: number;
  readonly pol: Pol;
}
export interface TotalColumn {
  readonly col: number;
  readonly name: string;
  readonly what: 'R' | 'T' | 'A';
  readonly pol: Pol;
}
export interface AxisColumn {
  readonly col: number;
  readonly title: string;
}
export interface Columns {
  readonly axes: ReadonlyArray<AxisColumn>;
  readonly eff: ReadonlyArray<EffColumn>;
  readonly totals: ReadonlyArray<TotalColumn>;
}

/** What the swept quantity is called on an axis. */
const LABELS: Readonly<Record<string, string>> = {
  'incidence.wavelength': 'Wavelength λ',
  'incidence.angleDeg': 'Angle of incidence θ',
  'incidence.azimuthDeg': 'Azimuth φ',
  'grating.depth': 'Groove depth',
  'grating.thickness': 'Grating thickness',
  'grating.duty': 'Duty cycle',
  'grating.blazeDeg': 'Blaze angle θB',
  'grating.apexDeg': 'Apex angle',
  'grating.sidewallDeg': 'Sidewall angle',
  'grating.slantDeg': 'Slant angle',
  'grating.deltaN': 'Index modulation Δn',
  'grating.coating.thickness': 'Coating thickness',
  period: 'Period Λ',
  grooveDensityPerMm: 'Groove density',
  orders: 'Retained orders M',
  slices: 'Slices',
};

const UNIT_TEXT: Readonly<Record<string, string>> = { nm: 'nm', um: 'µm', mm: 'mm', deg: 'deg' };

/** Axis title with its unit, e.g. "Wavelength λ (nm)". */
export function axisTitle(path: string, unit: string | null): string {
  const base = path.replace(/(Nm|Um)$/, '');
  const label = LABELS[base] ?? LABELS[path] ?? path;
  const u = unit ? (UNIT_TEXT[unit] ?? unit) : path === 'grooveDensityPerMm' ? 'lines/mm' : null;
  return u ? `${label} (${u})` : label;
}

const POL_TEXT: Readonly<Record<Pol, string>> = { TE: 'TE', TM: 'TM', unpol: 'unpolarized', req: 'requested' };
const signed = (m: number): string => (m > 0 ? `+${m}` : m < 0 ? `−${-m}` : '0');

/** The plan's columns by meaning (names as the sweep module writes them: R_-1_TE, T_TM, A_unpol …). */
export function readColumns(plan: SweepPlan): Columns {
  const axes = plan.axes.map((a) => ({ col: plan.columns.indexOf(a.column), title: axisTitle(a.path, a.unit) }));
  const eff: EffColumn[] = [];
  const totals: TotalColumn[] = [];
  plan.columns.forEach((c, col) => {
    let hit = /^(R|T)_(-?\d+)_(TE|TM|unpol|req)$/.exec(c);
    if (hit) {
      eff.push({ col, name: c, side: hit[1] as 'R' | 'T', m: Number(hit[2]), pol: hit[3] as Pol });
      return;
    }
    hit = /^(R|T|A)_(TE|TM|unpol|req)$/.exec(c);
    if (hit) totals.push({ col, name: c, what: hit[1] as 'R' | 'T' | 'A', pol: hit[2] as Pol });
  });
  return { axes, eff, totals };
}

/** A readable label for any output column. */
export function columnLabel(c: EffColumn | TotalColumn): string {
  if ('m' in c) return `${c.side === 'R' ? 'reflected' : 'transmitted'} order ${signed(c.m)}, ${POL_TEXT[c.pol]}`;
  return `${c.what === 'R' ? 'R (reflected)' : c.what === 'T' ? 'T (transmitted)' : 'A (absorbed)'}, ${POL_TEXT[c.pol]}`;
}

const ORDER_COLOURS = ['#1f5f8b', '#b5542c', '#3b7d3a', '#7a4e9c', '#a07a12', '#2a8a8a', '#8a2a4f', '#5a6470', '#c0392b', '#4a6fd0', '#6b8e23', '#9c6644'];
const TOTAL_COLOURS: Readonly<Record<'R' | 'T' | 'A', string>> = { R: '#1e2630', T: '#2f77b5', A: '#b5542c' };
const DASH: Readonly<Record<Pol, string>> = { TE: 'solid', TM: 'dash', unpol: 'dot', req: 'dashdot' };

const FONT = { family: 'system-ui, DejaVu Sans, Liberation Sans, sans-serif', size: 12, color: '#1e2630' };
const CONFIG: Config = { responsive: true, displaylogo: false, modeBarButtonsToRemove: ['select2d', 'lasso2d', 'autoScale2d'] };

function cellValue(row: SweepRow | undefined, col: number): number | null {
  if (!row) return null;
  const v = row.cells[col];
  return typeof v === 'number' && Number.isFinite(v) ? v : null;
}

function axisValues(plan: SweepPlan, k: number): Array<number | string> {
  return plan.axes[k]!.values.slice();
}

function baseLayout(xTitle: string, yTitle: string, title: string): Layout {
  return {
    title: { text: title, font: { ...FONT, size: 13 }, x: 0.01, xanchor: 'left' },
    font: FONT,
    // a fixed right margin holds the legend, so stacked plots share their x extent
    margin: { l: 64, r: 130, t: 36, b: 52 },
    paper_bgcolor: '#ffffff',
    plot_bgcolor: '#ffffff',
    hovermode: 'closest',
    xaxis: { title: { text: xTitle }, gridcolor: '#ebe8e1', zerolinecolor: '#d9d5cc', linecolor: '#8b939b', ticks: 'outside', mirror: true, showline: true },
    yaxis: { title: { text: yTitle }, gridcolor: '#ebe8e1', zerolinecolor: '#d9d5cc', linecolor: '#8b939b', ticks: 'outside', mirror: true, showline: true, rangemode: 'tozero' },
    legend: { orientation: 'v', x: 1.01, xanchor: 'left', y: 1, font: { ...FONT, size: 11 } },
  };
}

/**
 * Draw the sweep's plots (again); `rows[i]` is point i's row or undefined while it is pending.
 * @param mapColumn the column shown in a two-parameter map
 */
export async function drawSweep(main: HTMLElement, totals: HTMLElement, plan: SweepPlan, rows: ReadonlyArray<SweepRow | undefined>, mapColumn: number | null): Promise<number | null> {
  const Plotly = await loadPlotly();
  const cols = readColumns(plan);
  if (plan.axes.length >= 2 && plan.combine === 'grid') {
    const col = mapColumn ?? strongest(cols.eff, rows) ?? cols.totals[0]?.col ?? -1;
    await drawMap(main, plan, rows, cols, col);
    Plotly.purge(totals);
    totals.replaceChildren();
    totals.hidden = true;
    return col;
  }
  totals.hidden = false;
  const x = axisValues(plan, 0);
  const xTitle = cols.axes[0]!.title;
  const sideMs = [...new Set(cols.eff.map((c) => `${c.side}${c.m}`))];
  const traces: PlotData[] = cols.eff.map((c) => ({
    type: 'scatter',
    mode: plan.count <= 40 ? 'lines+markers' : 'lines',
    name: `${c.side} ${signed(c.m)} ${c.pol === 'unpol' ? 'unpol.' : c.pol}`,
    legendgroup: `${c.side}${c.m}`,
    x,
    y: rows.map((r) => cellValue(r, c.col)),
    line: { color: ORDER_COLOURS[sideMs.indexOf(`${c.side}${c.m}`) % ORDER_COLOURS.length], dash: DASH[c.pol], width: 1.8 },
    marker: { size: 4 },
    hovertemplate: `${columnLabel(c)}<br>${xTitle} = %{x}<br>η = %{y:.5f}<extra></extra>`,
    meta: { column: c.name },
  }));
  const what = plan.axes.length === 1 ? '' : ` (points taken together: ${plan.axes.map((a) => a.column).join(', ')})`;
  // both plots share one x range (a little margin so end markers are whole)
  const xs = x.filter((v): v is number => typeof v === 'number');
  const lo = Math.min(...xs);
  const hi = Math.max(...xs);
  const pad = hi > lo ? 0.015 * (hi - lo) : 1;
  const xRange = xs.length ? [lo - pad, hi + pad] : undefined;
  const mainLayout = baseLayout(xTitle, 'Efficiency η', `Efficiency of each order${what}`);
  (mainLayout['xaxis'] as Record<string, unknown>)['range'] = xRange;
  await Plotly.react(main, traces, mainLayout, CONFIG);
  const totalTraces: PlotData[] = cols.totals.map((c) => ({
    type: 'scatter',
    mode: 'lines',
    name: `${c.what} ${c.pol === 'unpol' ? 'unpol.' : c.pol}`,
    x,
    y: rows.map((r) => cellValue(r, c.col)),
    line: { color: TOTAL_COLOURS[c.what], dash: DASH[c.pol], width: 1.6 },
    hovertemplate: `${columnLabel(c)}<br>${xTitle} = %{x}<br>%{y:.5f}<extra></extra>`,
    meta: { column: c.name },
  }));
  const totalsLayout = baseLayout(xTitle, 'Fraction of incident power', 'Reflected R, transmitted T, absorbed A = 1 − R − T');
  totalsLayout['margin'] = { l: 64, r: 130, t: 34, b: 48 };
  (totalsLayout['xaxis'] as Record<string, unknown>)['range'] = xRange;
  await Plotly.react(totals, totalTraces, totalsLayout, CONFIG);
  return null;
}

/** The efficiency column with the largest sum over the rows computed so far. */
function strongest(eff: ReadonlyArray<EffColumn>, rows: ReadonlyArray<SweepRow | undefined>): number | null {
  let best: number | null = null;
  let most = -1;
  for (const c of eff) {
    const sum = rows.reduce((a, r) => a + (cellValue(r, c.col) ?? 0), 0);
    if (sum > most) {
      most = sum;
      best = c.col;
    }
  }
  return best;
}

async function drawMap(main: HTMLElement, plan: SweepPlan, rows: ReadonlyArray<SweepRow | undefined>, cols: Columns, col: number): Promise<void> {
  const Plotly = await loadPlotly();
  const x = axisValues(plan, 0);
  const y = axisValues(plan, 1);
  const n1 = y.length;
  // the grid runs with the first parameter slowest: point i·n1 + j is (x[i], y[j])
  const z = y.map((_, j) => x.map((__, i) => cellValue(rows[i * n1 + j], col)));
  const c = [...cols.eff, ...cols.totals].find((e) => e.col === col);
  const label = c ? columnLabel(c) : (plan.columns[col] ?? '');
  const xTitle = cols.axes[0]!.title;
  const yTitle = cols.axes[1]!.title;
  const trace: PlotData = {
    type: 'heatmap',
    x,
    y,
    z,
    colorscale: [
      [0, '#fbfaf6'],
      [0.25, '#d9c7a3'],
      [0.5, '#b98552'],
      [0.75, '#7f4a2a'],
      [1, '#2b1a12'],
    ],
    zmin: 0,
    colorbar: { title: { text: 'η' }, thickness: 14 },
    hovertemplate: `${xTitle} = %{x}<br>${yTitle} = %{y}<br>${label} = %{z:.5f}<extra></extra>`,
    meta: { column: plan.columns[col] },
  };
  const layout = baseLayout(xTitle, yTitle, `Map: ${label}`);
  (layout['yaxis'] as Record<string, unknown>)['rangemode'] = 'normal';
  await Plotly.react(main, [trace], layout, CONFIG);
}

/** Remove the plots. */
export async function clearPlots(...els: HTMLElement[]): Promise<void> {
  if (plotly) {
    const Plotly = await plotly;
    for (const el of els) Plotly.purge(el);
  }
  for (const el of els) el.replaceChildren();
}

/** Download the main plot as an image. */
export async function downloadPlot(el: HTMLElement, format: 'png' | 'svg', filename: string): Promise<void> {
  const Plotly = await loadPlotly();
  await Plotly.downloadImage(el, { format, filename, width: Math.max(900, el.clientWidth), height: Math.max(500, el.clientHeight), scale: format === 'png' ? 2 : 1 });
}
