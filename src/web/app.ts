/**
 * The browser view: a design editor (form and JSON, checked with the CLI's messages), the
 * cross-section, a sweep computed in Web Workers by the engine's own sweep functions, plots of
 * the efficiencies, exports (CSV as the CLI writes it, plot images, the design file) and the
 * design carried in the page address.
 */
import './mathjs.ts';
import { planSweep } from '../sweep/index.ts';
import type { SweepPlan, SweepRow } from '../sweep/types.ts';
import { InputError } from '../design/index.ts';
import { sweepCsv } from './csv.ts';
import { checkDesign, type DesignCheck } from './design-check.ts';
import { DEFAULT_EXAMPLE, EXAMPLES } from './examples.ts';
import { assignErrors, FIELDS, type FieldDef } from './form.ts';
import { designText } from './json-text.ts';
import { clearPlots, columnLabel, downloadPlot, drawSweep, readColumns } from './plots.ts';
import { SweepPool, type RunHandle } from './pool.ts';
import { lengthLabel, profileSvg } from './profile-view.ts';
import { designToHash, hashToDesign } from './share.ts';
import { PanelError, paramChoices, specFromPanel, type PanelSettings, type ParamChoice } from './sweep-panel.ts';
import { readerOf, type Tables } from './tables.ts';

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

function $<T extends HTMLElement = HTMLElement>(id: string): T {
  const el = document.getElementById(id);
  if (!el) throw new Error(`the page has no #${id}`);
  return el as T;
}

const ui = {
  docTitle: $('doc-title'),
  exampleSelect: $<HTMLSelectElement>('example-select'),
  openButton: $<HTMLButtonElement>('open-button'),
  openFile: $<HTMLInputElement>('open-file'),
  saveDesign: $<HTMLButtonElement>('save-design'),
  copyLink: $<HTMLButtonElement>('copy-link'),
  form: $<HTMLFormElement>('design-form'),
  json: $<HTMLTextAreaElement>('design-json'),
  status: $('design-status'),
  message: $('design-message'),
  warnings: $('design-warnings'),
  notes: $('design-notes'),
  profile: $('profile'),
  sweepForm: $<HTMLFormElement>('sweep-form'),
  orders: $<HTMLInputElement>('sweep-orders'),
  mount: $<HTMLSelectElement>('sweep-mount'),
  mountOrder: $<HTMLInputElement>('sweep-mount-order'),
  run: $<HTMLButtonElement>('run'),
  cancel: $<HTMLButtonElement>('cancel'),
  autoRun: $<HTMLInputElement>('auto-run'),
  progress: $<HTMLProgressElement>('progress'),
  progressText: $('progress-text'),
  sweepMessage: $('sweep-message'),
  mapControls: $('map-controls'),
  mapColumn: $<HTMLSelectElement>('map-column'),
  plotMain: $('plot-main'),
  plotTotals: $('plot-totals'),
  exportCsv: $<HTMLButtonElement>('export-csv'),
  exportPng: $<HTMLButtonElement>('export-png'),
  exportSvg: $<HTMLButtonElement>('export-svg'),
};

interface AxisUi {
  fieldset: HTMLFieldSetElement;
  param: HTMLSelectElement;
  from: HTMLInputElement;
  to: HTMLInputElement;
  count: HTMLInputElement;
  unit: HTMLElement;
}
const axisUi: AxisUi[] = [0, 1].map((k) => {
  const fieldset = $<HTMLFieldSetElement>(`axis-${k}`);
  const q = <T extends HTMLElement>(sel: string): T => fieldset.querySelector(sel) as T;
  return { fieldset, param: q('.param'), from: q('.from'), to: q('.to'), count: q('.count'), unit: q('.unit') };
});

const state = {
  text: '',
  /** name used in a JSON syntax error, as the CLI uses the file's path */
  source: 'design',
  tables: null as Tables | null,
  check: null as DesignCheck | null,
  choices: [] as ParamChoice[],
  plan: null as SweepPlan | null,
  rows: [] as Array<SweepRow | undefined>,
  run: null as RunHandle | null,
  completedRuns: 0,
  complete: false,
};

/** `?workers=N` in the address sets the number of workers (default: one per core the browser reports). */
function workerCount(): number | undefined {
  const n = Number(new URLSearchParams(location.search).get('workers'));
  return Number.isInteger(n) && n >= 1 && n <= 64 ? n : undefined;
}
const pool = new SweepPool(workerCount());

// ---------------------------------------------------------------- design form

const GROUPS: ReadonlyArray<readonly [FieldDef['group'], string]> = [
  ['design', 'Grating and media'],
  ['grating', 'Profile'],
  ['coating', 'Coating'],
  ['incidence', 'Incidence'],
  ['numerics', 'Computation'],
];

const fieldEls = new Map<string, { wrap: HTMLElement; input: HTMLInputElement | HTMLSelectElement; error: HTMLElement }>();
let derivedHeight: HTMLElement;

function buildForm(): void {
  for (const [group, title] of GROUPS) {
    const fs = document.createElement('fieldset');
    const lg = document.createElement('legend');
    lg.textContent = title;
    fs.append(lg);
    for (const f of FIELDS.filter((x) => x.group === group)) {
      const wrap = document.createElement('div');
      wrap.className = 'field';
      wrap.dataset['field'] = f.id;
      const label = document.createElement('label');
      label.htmlFor = `f-${f.id}`;
      label.textContent = f.label;
      if (f.title) label.title = f.title;
      const control = document.createElement('div');
      control.className = 'control';
      let input: HTMLInputElement | HTMLSelectElement;
      if (f.kind === 'select') {
        const sel = document.createElement('select');
        for (const [v, t] of f.options ?? []) {
          const o = new Option(t, v);
          // shown when the file has them, edited in the JSON
          o.disabled = v === 'jones' || v === 'layers';
          sel.add(o);
        }
        input = sel;
      } else {
        const inp = document.createElement('input');
        inp.type = f.kind === 'number' ? 'number' : 'text';
        if (f.step) inp.step = f.step;
        if (f.placeholder) inp.placeholder = f.placeholder;
        input = inp;
      }
      input.id = `f-${f.id}`;
      input.name = f.id;
      if (f.title) input.title = f.title;
      control.append(input);
      if (f.unit) {
        const u = document.createElement('span');
        u.className = 'unit';
        u.textContent = f.unit;
        control.append(u);
      }
      const error = document.createElement('div');
      error.className = 'field-error';
      error.hidden = true;
      error.setAttribute('role', 'alert');
      wrap.append(label, control, error);
      fs.append(wrap);
      fieldEls.set(f.id, { wrap, input, error });
      input.addEventListener(f.kind === 'select' ? 'change' : 'input', () => onFieldEdit(f, input.value));
    }
    if (group === 'grating') {
      const wrap = document.createElement('div');
      wrap.className = 'field';
      const label = document.createElement('label');
      label.textContent = 'Height of the profile';
      label.title = 'total height of the sliced profile, coating included';
      derivedHeight = document.createElement('span');
      derivedHeight.className = 'derived';
      derivedHeight.id = 'derived-height';
      wrap.append(label, derivedHeight);
      fs.append(wrap);
    }
    ui.form.append(fs);
  }
}

function onFieldEdit(f: FieldDef, value: string): void {
  const raw = state.check?.raw;
  if (!isObj(raw)) return;
  const d = structuredClone(raw);
  f.set(d, value);
  setDesign(designText(d), 'form');
}

function refreshForm(origin: Origin): void {
  const raw = state.check?.raw;
  const usable = isObj(raw);
  for (const fs of Array.from(ui.form.querySelectorAll('fieldset'))) fs.disabled = !usable;
  if (!usable) return;
  const visible: FieldDef[] = [];
  for (const f of FIELDS) {
    const el = fieldEls.get(f.id)!;
    const show = f.show(raw);
    el.wrap.hidden = !show;
    if (show) visible.push(f);
    if (origin !== 'form' || document.activeElement !== el.input) {
      const v = f.get(raw);
      if (el.input instanceof HTMLSelectElement && !Array.from(el.input.options).some((o) => o.value === v)) el.input.add(new Option(v, v));
      el.input.value = v;
    }
  }
  const { byField } = assignErrors(visible, state.check?.fieldErrors ?? new Map());
  for (const f of FIELDS) {
    const el = fieldEls.get(f.id)!;
    const msgs = byField.get(f.id);
    el.error.hidden = !msgs;
    el.error.textContent = msgs ? msgs.join('\n') : '';
    el.wrap.classList.toggle('invalid', !!msgs);
  }
  const h = state.check?.model?.depthUm;
  derivedHeight.textContent = h != null ? lengthLabel(h) : '—';
}

// ---------------------------------------------------------------- design state

type Origin = 'json' | 'form' | 'load';

function setDesign(text: string, origin: Origin): void {
  state.text = text;
  state.check = checkDesign(text, state.source, state.tables ? readerOf(state.tables) : undefined);
  if (origin !== 'json') ui.json.value = text;
  ui.json.classList.toggle('invalid', state.check.raw === null);
  refreshForm(origin);
  renderMessages();
  renderProfile();
  refreshTitle();
  scheduleHash();
  refreshSweepChoices(origin === 'load');
  if (origin === 'load') adoptSweepSection(state.check.raw);
  designChanged();
}

function loadDesign(text: string, source: string, tables: Tables | null): void {
  state.source = source;
  state.tables = tables;
  setDesign(text, 'load');
}

function renderMessages(): void {
  const c = state.check!;
  ui.message.textContent = c.message ?? '';
  ui.warnings.replaceChildren(...(c.problem?.warnings ?? []).map((w) => li(w)));
  const notes = c.problem?.notes ?? c.model?.notes ?? [];
  ui.notes.replaceChildren(...notes.map((n) => li(n)));
  if (c.problem) {
    const p = c.problem;
    const orders = typeof p.options.orders === 'number' ? `orders −${p.options.orders}…${p.options.orders}` : 'orders window';
    ui.status.textContent = `Valid design: ${p.structure.layers.length} layer${p.structure.layers.length === 1 ? '' : 's'}, ${orders} retained, λ = ${lengthLabel(p.incidence.wavelengthUm)}, θ = ${p.incidence.thetaDeg}°.`;
  } else ui.status.textContent = '';
}

function li(text: string): HTMLLIElement {
  const e = document.createElement('li');
  e.textContent = text;
  return e;
}

function renderProfile(): void {
  const m = state.check?.model;
  if (!m) {
    ui.profile.classList.add('stale');
    if (!ui.profile.querySelector('svg')) ui.profile.innerHTML = '<div class="placeholder">The drawing appears when the design is valid.</div>';
    return;
  }
  try {
    ui.profile.innerHTML = profileSvg(m, 2);
    ui.profile.classList.remove('stale');
  } catch (e) {
    ui.profile.innerHTML = '';
    const d = document.createElement('div');
    d.className = 'placeholder';
    d.textContent = `cannot draw this structure: ${e instanceof Error ? e.message : String(e)}`;
    ui.profile.append(d);
  }
}

function refreshTitle(): void {
  const raw = state.check?.raw;
  const t = isObj(raw) && typeof raw['title'] === 'string' ? raw['title'] : state.source;
  ui.docTitle.textContent = t;
  document.title = `${t} — Furrow`;
}

let hashTimer = 0;
let ownHash = '';
function scheduleHash(): void {
  clearTimeout(hashTimer);
  const text = state.text;
  hashTimer = window.setTimeout(() => {
    void designToHash(text).then((h) => {
      if (text !== state.text) return;
      ownHash = h;
      history.replaceState(null, '', h);
    });
  }, 300);
}

// ---------------------------------------------------------------- sweep panel

function fillParamSelect(k: number): void {
  const a = axisUi[k]!;
  const keep = a.param.value;
  a.param.replaceChildren();
  if (k > 0) a.param.add(new Option('(nothing else)', ''));
  for (const c of state.choices) a.param.add(new Option(c.label, c.path));
  const still = Array.from(a.param.options).some((o) => o.value === keep);
  a.param.value = still ? keep : k === 0 ? (state.choices[0]?.path ?? '') : '';
  if (!still) applyDefaults(k);
  refreshAxisUi(k);
}

function applyDefaults(k: number): void {
  const a = axisUi[k]!;
  const c = state.choices.find((x) => x.path === a.param.value);
  if (!c) return;
  [a.from.value, a.to.value, a.count.value] = c.defaults.map(String) as [string, string, string];
  if (k > 0) a.count.value = '11';
}

function refreshAxisUi(k: number): void {
  const a = axisUi[k]!;
  const c = state.choices.find((x) => x.path === a.param.value);
  a.unit.textContent = c?.unit ?? '';
  const off = !c;
  a.fieldset.classList.toggle('off', off);
  for (const i of [a.from, a.to, a.count]) i.disabled = off;
}

function refreshSweepChoices(reset: boolean): void {
  const choices = paramChoices(state.check?.raw);
  if (choices.length === 0) return; // not a design object: keep the panel as it is
  state.choices = choices;
  if (reset) for (const a of axisUi) a.param.value = '';
  fillParamSelect(0);
  fillParamSelect(1);
  if (reset) {
    // a newly opened design starts from every propagating order in every polarization at a fixed
    // angle; metal-coated gratings only reflect, so they start with the reflected orders
    const raw = state.check?.raw;
    const coated = isObj(raw) && isObj(raw['grating']) && raw['grating']['coating'] !== undefined;
    $<HTMLInputElement>('side-T').checked = !coated;
    $<HTMLInputElement>('side-R').checked = true;
    for (const p of ['TE', 'TM', 'unpolarized']) $<HTMLInputElement>(`pol-${p}`).checked = true;
    ui.orders.value = 'all';
    ui.mount.value = 'fixed';
    ui.mountOrder.hidden = true;
    ui.mapColumn.value = '';
  }
}

/** A design file's own "sweep" section sets the panel when the design is opened (what fits the panel). */
function adoptSweepSection(raw: unknown): void {
  if (!isObj(raw) || !isObj(raw['sweep'])) return;
  const s = raw['sweep'];
  const params = Array.isArray(s['parameters']) ? s['parameters'] : [];
  params.slice(0, 2).forEach((p, k) => {
    if (!isObj(p) || typeof p['path'] !== 'string') return;
    const a = axisUi[k]!;
    if (!Array.from(a.param.options).some((o) => o.value === p['path'])) return;
    a.param.value = p['path'];
    const numOf = (v: unknown): string => (typeof v === 'number' ? String(v) : typeof v === 'string' ? String(parseFloat(v)) : '');
    if (p['from'] !== undefined) a.from.value = numOf(p['from']);
    if (p['to'] !== undefined) a.to.value = numOf(p['to']);
    if (typeof p['count'] === 'number') a.count.value = String(p['count']);
    refreshAxisUi(k);
  });
  const o = isObj(s['outputs']) ? s['outputs'] : {};
  if (Array.isArray(o['orders'])) ui.orders.value = o['orders'].join(', ');
  if (Array.isArray(o['polarizations'])) for (const p of ['TE', 'TM', 'unpolarized']) $<HTMLInputElement>(`pol-${p}`).checked = o['polarizations'].includes(p);
  if (Array.isArray(o['sides'])) for (const p of ['R', 'T']) $<HTMLInputElement>(`side-${p}`).checked = o['sides'].includes(p);
  const m = isObj(s['mount']) ? s['mount'] : null;
  if (m && m['kind'] === 'littrow' && typeof m['order'] === 'number') {
    ui.mount.value = 'littrow';
    ui.mountOrder.value = String(m['order']);
    ui.mountOrder.hidden = false;
  }
}

function readPanel(): PanelSettings {
  const axes = axisUi
    .filter((a) => a.param.value !== '')
    .map((a) => ({ path: a.param.value, from: a.from.value, to: a.to.value, count: a.count.value }));
  const pols = (['TE', 'TM', 'unpolarized'] as const).filter((p) => $<HTMLInputElement>(`pol-${p}`).checked);
  const sides = (['R', 'T'] as const).filter((p) => $<HTMLInputElement>(`side-${p}`).checked);
  return {
    axes,
    orders: ui.orders.value,
    polarizations: pols,
    sides,
    mount: ui.mount.value === 'littrow' ? { kind: 'littrow', order: ui.mountOrder.value } : { kind: 'fixed' },
  };
}

// ---------------------------------------------------------------- running a sweep

/** Most points a sweep in the page may have: every row is kept in memory and plotted. */
const MAX_PAGE_POINTS = 100_000;

let runTimer = 0;
function designChanged(): void {
  clearTimeout(runTimer);
  if (!state.check?.problem && state.plan) ui.sweepMessage.textContent = 'The design has errors (see the design panel): the plots show the last sweep.';
  else if (ui.sweepMessage.textContent?.startsWith('The design has errors')) ui.sweepMessage.textContent = '';
  if (!ui.autoRun.checked) return;
  runTimer = window.setTimeout(() => {
    if (state.check?.problem) startSweep();
  }, 350);
}

function setRunState(s: 'running' | 'done' | 'cancelled' | 'failed' | 'idle'): void {
  ui.plotMain.dataset['state'] = s;
  ui.cancel.disabled = s !== 'running';
  const done = s === 'done';
  ui.exportCsv.disabled = !done;
  ui.exportPng.disabled = !done;
  ui.exportSvg.disabled = !done;
}

function startSweep(): void {
  clearTimeout(runTimer);
  ui.sweepMessage.textContent = '';
  const check = state.check;
  if (!check?.problem) {
    ui.sweepMessage.textContent = 'The design has errors (see the design panel); fix them to run a sweep.';
    return;
  }
  let plan: SweepPlan;
  try {
    const spec = specFromPanel(readPanel(), state.choices);
    plan = planSweep(check.raw, spec, state.tables ? readerOf(state.tables) : undefined);
  } catch (e) {
    if (e instanceof InputError || e instanceof PanelError) ui.sweepMessage.textContent = e.message;
    else ui.sweepMessage.textContent = `cannot plan this sweep: ${e instanceof Error ? e.message : String(e)}`;
    return;
  }
  if (plan.count > MAX_PAGE_POINTS) {
    ui.sweepMessage.textContent = `${plan.count} points is more than this page plots (${MAX_PAGE_POINTS}); run it with furrow sweep, which writes the rows to a file as they come.`;
    return;
  }
  state.plan = plan;
  state.rows = new Array<SweepRow | undefined>(plan.count);
  state.complete = false;
  fillMapColumns(plan);
  setRunState('running');
  ui.progress.max = plan.count;
  ui.progress.value = 0;
  ui.progressText.textContent = `0 / ${plan.count} points`;
  const workers = Math.min(pool.size, plan.count);
  const handle = pool.run(
    plan,
    state.tables,
    (rows) => {
      if (state.run !== handle) return;
      for (const r of rows) state.rows[r.index] = r;
      scheduleDraw();
    },
    (p) => {
      if (state.run !== handle) return;
      ui.progress.value = p.done;
      const eta = p.done > 0 ? ((p.total - p.done) * p.elapsedMs) / p.done / 1000 : NaN;
      ui.progressText.textContent = `${p.done} / ${p.total} points · ${workers} worker${workers === 1 ? '' : 's'} · ${(p.elapsedMs / 1000).toFixed(1)} s${p.done < p.total && Number.isFinite(eta) ? ` · ~${eta.toFixed(0)} s left` : ''}`;
    },
  );
  state.run = handle;
  const t0 = performance.now();
  handle.finished.then(
    async (outcome) => {
      if (state.run !== handle) return;
      state.run = null;
      if (outcome === 'cancelled') {
        setRunState('cancelled');
        const n = state.rows.filter(Boolean).length;
        ui.progressText.textContent = `cancelled after ${n} of ${plan.count} points`;
        return;
      }
      state.complete = true;
      await draw();
      const failed = state.rows.filter((r) => r?.status === 'failed');
      const engine = await pool.engine().catch(() => null);
      ui.progressText.textContent = `${plan.count} points in ${((performance.now() - t0) / 1000).toFixed(1)} s · ${workers} worker${workers === 1 ? '' : 's'}${engine ? ` · ${engine.backend === 'wasm' ? 'WebAssembly SIMD kernels' : 'TypeScript kernels'}` : ''}`;
      if (engine) ui.progressText.title = `dense kernels: ${engine.backend} (${engine.status})`;
      if (failed.length) ui.sweepMessage.textContent = `${failed.length} of ${plan.count} points failed; the first: ${failed[0]!.error ?? 'no reason given'}`;
      state.completedRuns++;
      ui.plotMain.dataset['runs'] = String(state.completedRuns);
      setRunState('done');
    },
    (e: unknown) => {
      if (state.run !== handle) return;
      state.run = null;
      setRunState('failed');
      ui.sweepMessage.textContent = `the sweep stopped: ${e instanceof Error ? e.message : String(e)}`;
    },
  );
}

function fillMapColumns(plan: SweepPlan): void {
  const twoD = plan.axes.length >= 2 && plan.combine === 'grid';
  ui.mapControls.hidden = !twoD;
  if (!twoD) return;
  const keep = ui.mapColumn.value;
  const cols = readColumns(plan);
  ui.mapColumn.replaceChildren(new Option('(the strongest order)', ''), ...[...cols.eff, ...cols.totals].map((c) => new Option(columnLabel(c), c.name)));
  ui.mapColumn.value = Array.from(ui.mapColumn.options).some((o) => o.value === keep) ? keep : '';
}

let drawQueued = false;
let drawChain: Promise<void> = Promise.resolve();
function scheduleDraw(): void {
  if (drawQueued) return;
  drawQueued = true;
  setTimeout(() => {
    drawQueued = false;
    void draw();
  }, 400);
}

function draw(): Promise<void> {
  drawChain = drawChain.then(async () => {
    const plan = state.plan;
    if (!plan) return;
    const col = plan.columns.indexOf(ui.mapColumn.value);
    try {
      const shown = await drawSweep(ui.plotMain, ui.plotTotals, plan, state.rows, col >= 0 ? col : null);
      if (shown !== null && state.complete) ui.mapColumn.value = plan.columns[shown] ?? '';
    } catch (e) {
      ui.sweepMessage.textContent = `cannot draw the plot: ${e instanceof Error ? e.message : String(e)}`;
    }
  });
  return drawChain;
}

// ---------------------------------------------------------------- files, links, exports

function slug(): string {
  const raw = state.check?.raw;
  const t = isObj(raw) && typeof raw['title'] === 'string' ? raw['title'] : state.source.replace(/\.json$/i, '');
  return (
    t
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-|-$/g, '')
      .slice(0, 60) || 'design'
  );
}

function download(name: string, type: string, text: string): void {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

async function openFiles(files: FileList): Promise<void> {
  const list = Array.from(files);
  const design = list.find((f) => /\.json$/i.test(f.name)) ?? list[0];
  if (!design) return;
  const tables: Record<string, { text: string }> = {};
  for (const f of list) if (f !== design) tables[f.name] = { text: await f.text() };
  loadDesign(await design.text(), design.name, Object.keys(tables).length ? tables : null);
}

function wire(): void {
  ui.exampleSelect.add(new Option('choose…', ''));
  for (const e of EXAMPLES) ui.exampleSelect.add(new Option(e.label, e.id));
  ui.exampleSelect.addEventListener('change', () => {
    const ex = EXAMPLES.find((e) => e.id === ui.exampleSelect.value);
    ui.exampleSelect.value = '';
    if (ex) loadDesign(designText(ex.design), `${ex.id}.json`, null);
  });
  ui.openFile.multiple = true;
  ui.openFile.accept = '.json,.csv,.txt,application/json,text/csv';
  ui.openButton.addEventListener('click', () => ui.openFile.click());
  ui.openFile.addEventListener('change', () => {
    if (ui.openFile.files?.length) void openFiles(ui.openFile.files);
    ui.openFile.value = '';
  });
  ui.saveDesign.addEventListener('click', () => download(`${slug()}.json`, 'application/json', state.text));
  ui.copyLink.addEventListener('click', async () => {
    const url = `${location.href.replace(/#.*$/, '')}${await designToHash(state.text)}`;
    try {
      await navigator.clipboard.writeText(url);
      ui.copyLink.textContent = 'Link copied';
    } catch {
      window.prompt('Copy this link:', url);
    }
    setTimeout(() => (ui.copyLink.textContent = 'Copy link'), 1500);
  });
  ui.json.addEventListener('input', () => setDesign(ui.json.value, 'json'));
  window.addEventListener('hashchange', () => {
    if (location.hash === ownHash) return;
    hashToDesign(location.hash).then(
      (t) => {
        if (t !== null && t !== state.text) loadDesign(t, 'design from the link', null);
      },
      (e: unknown) => (ui.message.textContent = e instanceof Error ? e.message : String(e)),
    );
  });

  axisUi.forEach((a, k) => {
    a.param.addEventListener('change', () => {
      applyDefaults(k);
      refreshAxisUi(k);
      designChanged();
    });
    for (const i of [a.from, a.to, a.count]) i.addEventListener('input', designChanged);
  });
  ui.sweepForm.addEventListener('change', (e) => {
    if ((e.target as HTMLElement).classList.contains('param')) return;
    designChanged();
  });
  ui.orders.addEventListener('input', designChanged);
  ui.mount.addEventListener('change', () => {
    ui.mountOrder.hidden = ui.mount.value !== 'littrow';
  });
  ui.run.addEventListener('click', () => startSweep());
  ui.cancel.addEventListener('click', () => state.run?.cancel());
  ui.autoRun.addEventListener('change', designChanged);
  ui.mapColumn.addEventListener('change', () => void draw());
  ui.exportCsv.addEventListener('click', () => {
    if (state.plan && state.complete) download(`${slug()}-sweep.csv`, 'text/csv', sweepCsv(state.plan, state.rows));
  });
  ui.exportPng.addEventListener('click', () => void downloadPlot(ui.plotMain, 'png', `${slug()}-efficiency`));
  ui.exportSvg.addEventListener('click', () => void downloadPlot(ui.plotMain, 'svg', `${slug()}-efficiency`));
}

async function start(): Promise<void> {
  buildForm();
  wire();
  setRunState('idle');
  let text: string | null = null;
  let source = 'design';
  let tables: Tables | null = null;
  try {
    text = await hashToDesign(location.hash);
    if (text !== null) source = 'design from the link';
  } catch (e) {
    ui.sweepMessage.textContent = e instanceof Error ? e.message : String(e);
  }
  if (text === null && location.protocol !== 'file:') {
    try {
      const r = await fetch('furrow-view/design.json', { cache: 'no-store' });
      if (r.status === 200) {
        const j = (await r.json()) as { name: string; text: string; tables: Tables };
        text = j.text;
        source = j.name;
        tables = Object.keys(j.tables).length ? j.tables : null;
      }
    } catch {
      // a static host without `furrow view` behind it: open the example
    }
  }
  if (text === null) {
    text = designText(DEFAULT_EXAMPLE.design);
    source = `${DEFAULT_EXAMPLE.id}.json`;
  }
  loadDesign(text, source, tables);
  await clearPlots(ui.plotMain, ui.plotTotals);
  document.body.dataset['ready'] = 'true';
}

void start();
