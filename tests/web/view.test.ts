/**
 * The browser view in a real browser (Debian's Chromium driven by playwright-core): the page is
 * built (or a current build reused), served by `furrow view`'s server on a free port of
 * 127.0.0.1, and used as an engineer would — open the blazed example, cancel a sweep, run a
 * small wavelength sweep, export its CSV, type a bad value, change the blaze (and so the depth),
 * follow the design link. Sweeps stay small (orders ±5, 8 slices, 13 points).
 *
 * Skipped, with a message, only where /usr/bin/chromium is absent and CI is not 'true'; under CI
 * a missing Chromium fails the run (.ci/run installs it).
 */
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Command } from 'commander';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ensureWebBuild, readInitialDesign, startViewServer, type ViewServer } from '../../src/cli/view.ts';
import { main } from '../../src/cli/main.ts';
import { registerSweepCommands } from '../../src/cli/sweep-command.ts';
import { formatCell } from '../../src/sweep/index.ts';

const CHROMIUM = '/usr/bin/chromium';
const HAVE_CHROMIUM = existsSync(CHROMIUM);
const IN_CI = process.env.CI === 'true';
const REPO = fileURLToPath(new URL('../../', import.meta.url));
const ARTIFACTS = join(REPO, 'test-artifacts', 'web');

if (!HAVE_CHROMIUM && !IN_CI) {
  console.warn('tests/web skipped: /usr/bin/chromium is not installed (apt-get install -y chromium); CI installs it and runs them');
}
const suite = HAVE_CHROMIUM || IN_CI ? describe : describe.skip;

/** A plotted trace as the page holds it (plotly keeps the data on the graph element). */
interface Trace {
  column: string;
  x: Array<number | string>;
  y: Array<number | null>;
}

async function traces(page: Page, id: string): Promise<Trace[]> {
  return page.evaluate((el) => {
    const gd = document.getElementById(el) as unknown as { data?: Array<{ meta?: { column?: string }; x: unknown[]; y: unknown[] }> };
    return (gd.data ?? []).map((t) => ({ column: String(t.meta?.column), x: t.x as Array<number | string>, y: t.y as Array<number | null> }));
  }, id);
}

/** Parse CSV text as written by formatCell (quoted cells only for text with commas or quotes). */
function parseCsv(text: string): string[][] {
  return text
    .trimEnd()
    .split('\n')
    .map((line) => {
      const cells: string[] = [];
      let i = 0;
      while (i <= line.length) {
        if (line[i] === '"') {
          let v = '';
          i++;
          while (i < line.length && !(line[i] === '"' && line[i + 1] !== '"')) {
            v += line[i] === '"' ? '"' : line[i];
            i += line[i] === '"' ? 2 : 1;
          }
          cells.push(v);
          i += 2;
        } else {
          const j = line.indexOf(',', i);
          const end = j < 0 ? line.length : j;
          cells.push(line.slice(i, end));
          i = end + 1;
        }
      }
      return cells;
    });
}

/** `furrow sweep …` as the CLI registers it, in-process (worker threads and all). */
async function cliSweep(...args: string[]): Promise<void> {
  const program = new Command().name('furrow').exitOverride();
  registerSweepCommands(program, () => {});
  await program.parseAsync(['node', 'furrow', 'sweep', ...args]);
}

/** The CLI's output for a command, in-process (as `furrow …` prints it). */
async function cli(...args: string[]): Promise<{ code: number; text: string }> {
  const lines: string[] = [];
  const code = await main(['node', 'furrow', ...args], (s) => lines.push(s));
  return { code, text: lines.join('\n') };
}

const argmax = (y: Array<number | null>): number => y.reduce<number>((best, v, i) => ((v ?? -1) > (y[best] ?? -1) ? i : best), 0);

suite('browser view (Chromium)', () => {
  let server: ViewServer;
  let context: BrowserContext;
  let page: Page;
  let profileDir: string;
  let work: string;
  const problems: string[] = [];

  beforeAll(async () => {
    if (!HAVE_CHROMIUM) throw new Error(`CI=true but ${CHROMIUM} is missing: .ci/run installs it with apt-get`);
    mkdirSync(ARTIFACTS, { recursive: true });
    work = mkdtempSync(join(tmpdir(), 'furrow-web-'));
    const { dir } = await ensureWebBuild();
    server = await startViewServer({ dir, port: 0 });
    profileDir = mkdtempSync(join(tmpdir(), 'furrow-chromium-'));
    context = await chromium.launchPersistentContext(profileDir, {
      executablePath: CHROMIUM,
      headless: true,
      acceptDownloads: true,
      viewport: { width: 1440, height: 1000 },
      args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
    });
    page = await context.newPage();
    page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
    page.on('console', (m) => {
      if (m.type() === 'error') problems.push(`console error: ${m.text()}`);
    });
  });

  afterAll(async () => {
    await context?.close();
    await server?.close();
    if (profileDir) rmSync(profileDir, { recursive: true, force: true });
  });

  it('opens on the blazed aluminium example and draws its cross-section with every material', async () => {
    await page.goto(server.url);
    await page.waitForSelector('body[data-ready="true"]');
    expect(await page.textContent('#doc-title')).toMatch(/Blazed aluminium reflection grating/);
    const legend = await page.$$eval('#profile svg .legend-name', (els) => els.map((e) => e.textContent));
    expect(legend).toEqual(['air', 'Al-LD', 'fused-silica']);
    // the sliced sawtooth: 20 slices of Al / air / Al segments over two periods, plus the drawn bands
    expect(await page.$$eval('#profile svg rect[data-material="Al-LD"]', (els) => els.length)).toBeGreaterThan(40);
    expect(await page.textContent('#derived-height')).toBe('397.3 nm');
  });

  it('a running sweep stops on Cancel', async () => {
    // the example re-runs its default sweep (31 wavelengths at ±25 orders) on load: seconds of work
    await page.waitForSelector('#plot-main[data-state="running"]');
    await page.click('#cancel');
    await page.waitForSelector('#plot-main[data-state="cancelled"]');
    expect(await page.textContent('#progress-text')).toMatch(/^cancelled after \d+ of 31 points$/);
    expect(await page.isDisabled('#export-csv')).toBe(true);
  });

  it("a wavelength sweep exports the CLI's CSV for the same sweep and plots exactly what it exports", async () => {
    await page.uncheck('#auto-run');
    await page.selectOption('#example-select', 'blazed-aluminium-spectrometer');
    await page.fill('#f-orders', '5');
    await page.fill('#f-slices', '8');
    await page.selectOption('#axis-0 .param', 'incidence.wavelength');
    await page.fill('#axis-0 .from', '400');
    await page.fill('#axis-0 .to', '700');
    await page.fill('#axis-0 .count', '13');
    expect(await page.isChecked('#side-R')).toBe(true);
    expect(await page.isChecked('#side-T')).toBe(false); // an aluminium-coated grating: reflected orders only
    await page.click('#run');
    await page.waitForSelector('#plot-main[data-state="done"]');
    expect(await page.textContent('#sweep-message')).toBe('');

    // the CLI, on the design the page holds, with the same sweep
    const designPath = join(work, 'blazed.json');
    writeFileSync(designPath, await page.inputValue('#design-json'));
    const csvPath = join(work, 'cli.csv');
    await cliSweep(designPath, '--param', 'incidence.wavelength=400nm:700nm:13', '--sides', 'R', '--pol', 'TE,TM,unpolarized', '--orders-out', 'all', '--workers', '1', '--quiet', '-o', csvPath);
    const cliTable = parseCsv(readFileSync(csvPath, 'utf8'));

    // the page's CSV export
    const [download] = await Promise.all([page.waitForEvent('download'), page.click('#export-csv')]);
    expect(download.suggestedFilename()).toMatch(/-sweep\.csv$/);
    const saved = join(work, 'page.csv');
    await download.saveAs(saved);
    const pageTable = parseCsv(readFileSync(saved, 'utf8'));

    // same columns, points, axis values, statuses and empty cells as the CLI's file; the numbers
    // agree to 1e-10 — not to the bit, because Chromium's JavaScript engine and Node 20's compute
    // Math.sin, cos, exp, log, pow and atan2 with last-bit differences (ECMA-262 leaves them
    // implementation-approximated), which the eigen-solves carry on (measured here: ≤ 1e-13)
    const header = cliTable[0]!;
    expect(pageTable[0]).toEqual(header);
    expect(pageTable).toHaveLength(14);
    expect(cliTable).toHaveLength(14);
    const exact = new Set(['point_index', 'wavelength_nm', 'status', 'error']);
    let worst = 0;
    for (let i = 1; i < 14; i++) {
      header.forEach((c, k) => {
        const a = pageTable[i]![k]!;
        const b = cliTable[i]![k]!;
        if (exact.has(c) || a === '' || b === '') expect(a, `${c} at point ${i - 1}`).toBe(b);
        else worst = Math.max(worst, Math.abs(Number(a) - Number(b)));
      });
    }
    expect(worst).toBeLessThan(1e-10);

    // every efficiency and total column is plotted, point by point, with the numbers of the page's CSV
    const plotted = [...(await traces(page, 'plot-main')), ...(await traces(page, 'plot-totals'))];
    const wanted = header.filter((c) => /^(R|T)_-?\d+_(TE|TM|unpol)$/.test(c) || /^(R|T|A)_(TE|TM|unpol)$/.test(c));
    expect(wanted.length).toBeGreaterThan(10);
    expect(plotted.map((t) => t.column).sort()).toEqual([...wanted].sort());
    const body = pageTable.slice(1);
    const xCol = header.indexOf('wavelength_nm');
    for (const t of plotted) {
      const col = header.indexOf(t.column);
      expect(t.x.map((v) => formatCell(v))).toEqual(body.map((r) => r[xCol]));
      expect(t.y.map((v) => (v === null ? '' : formatCell(v)))).toEqual(body.map((r) => r[col]));
    }

    await page.screenshot({ path: join(ARTIFACTS, 'sweep-blazed.png'), fullPage: true });
  });

  it('exports the plot as PNG and SVG and the design as its JSON file', async () => {
    const save = async (button: string, name: string): Promise<{ file: string; bytes: Buffer }> => {
      const [d] = await Promise.all([page.waitForEvent('download'), page.click(button)]);
      const file = join(work, name);
      await d.saveAs(file);
      return { file: d.suggestedFilename(), bytes: readFileSync(file) };
    };
    const png = await save('#export-png', 'plot.png');
    expect(png.file).toMatch(/-efficiency\.png$/);
    expect([...png.bytes.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]); // PNG signature
    const svg = await save('#export-svg', 'plot.svg');
    expect(svg.file).toMatch(/-efficiency\.svg$/);
    const svgText = svg.bytes.toString('utf8');
    expect(svgText).toMatch(/^<svg/);
    expect(svgText).toContain('Wavelength λ (nm)');
    const json = await save('#save-design', 'design.json');
    expect(json.file).toMatch(/^blazed-aluminium-reflection-grating-600-lines-mm[a-z0-9-]*\.json$/);
    expect(json.bytes.toString('utf8')).toBe(await page.inputValue('#design-json'));
    expect(JSON.parse(json.bytes.toString('utf8')).orders).toBe(5);
  });

  it("a bad field shows the CLI's message beside it, and clears when fixed", async () => {
    await page.fill('#f-coatingThickness', '-20');
    const inline = page.locator('[data-field="coatingThickness"] .field-error');
    await inline.waitFor({ state: 'visible' });
    const shown = (await inline.textContent())!;
    expect(shown).toBe('grating.coating.thickness: expected a coating thickness > 0, found -20 nm; give a positive length like "350 nm"');

    const bad = join(work, 'bad.json');
    writeFileSync(bad, await page.inputValue('#design-json'));
    const r = await cli('solve', bad);
    expect(r.code).toBe(2);
    expect(r.text).toBe(`furrow: invalid design — ${shown}`);
    expect(await page.textContent('[data-testid="design-message"]')).toBe(`invalid design — ${shown}`);
    await page.screenshot({ path: join(ARTIFACTS, 'inline-error.png') });

    await page.fill('#f-coatingThickness', '150');
    await inline.waitFor({ state: 'hidden' });
    expect(await page.textContent('[data-testid="design-message"]')).toBe('');
  });

  it('a deeper blaze moves the TE and TM curves of order −1 toward longer wavelengths', async () => {
    const before = await traces(page, 'plot-main');
    const te0 = before.find((t) => t.column === 'R_-1_TE')!.y;
    const tm0 = before.find((t) => t.column === 'R_-1_TM')!.y;
    const height0 = await page.textContent('#derived-height');
    const runsDone = (n: number) =>
      page.waitForFunction((k) => Number(document.getElementById('plot-main')?.dataset['runs']) > k && document.getElementById('plot-main')?.dataset['state'] === 'done', n);
    const runs = async (): Promise<number> => Number(await page.getAttribute('#plot-main', 'data-runs'));

    // switching re-runs on re-runs the sweep as it stands; then an edit alone starts the next one
    const n0 = await runs();
    await page.check('#auto-run');
    await runsDone(n0);
    const n1 = await runs();
    await page.fill('#f-blazeDeg', '13');
    await runsDone(n1);

    // the sawtooth's depth follows its blaze angle (depth = Λ / (cot θB + cot β))
    const height1 = await page.textContent('#derived-height');
    expect(height1).not.toBe(height0);
    expect(parseFloat(height1!)).toBeGreaterThan(parseFloat(height0!));
    const after = await traces(page, 'plot-main');
    const te1 = after.find((t) => t.column === 'R_-1_TE')!.y;
    const tm1 = after.find((t) => t.column === 'R_-1_TM')!.y;
    expect(te1).toHaveLength(13);
    // scalar blaze rule (common practice): λB = 2Λ·sinθB goes from 500 nm to 750 nm, so the peak moves right
    expect(argmax(te1)).toBeGreaterThan(argmax(te0));
    expect(argmax(tm1)).toBeGreaterThan(argmax(tm0));
    expect(Math.max(...te1.map((v, i) => Math.abs(v! - te0[i]!)))).toBeGreaterThan(0.1);
    expect(Math.max(...tm1.map((v, i) => Math.abs(v! - tm0[i]!)))).toBeGreaterThan(0.1);
    await page.screenshot({ path: join(ARTIFACTS, 'blaze-13deg.png'), fullPage: true });
  });

  it('the page address carries the design: a second tab opened on it holds the same design', async () => {
    await page.waitForFunction(() => location.hash.startsWith('#d='));
    const text = await page.inputValue('#design-json');
    await page.waitForFunction((t) => location.hash.length > 3 && (document.getElementById('design-json') as HTMLTextAreaElement).value === t, text);
    const url = page.url();
    const other = await context.newPage();
    await other.goto(url);
    await other.waitForSelector('body[data-ready="true"]');
    expect(await other.inputValue('#design-json')).toBe(text);
    expect(await other.inputValue('#f-blazeDeg')).toBe('13');
    await other.close();
  });

  it('`furrow view design.json` opens the page on that design', async () => {
    const { dir } = await ensureWebBuild();
    const own = await startViewServer({ dir, design: readInitialDesign(join(REPO, 'src/design/examples/gold-sinusoid-plasmon.json')) });
    const other = await context.newPage();
    try {
      await other.goto(own.url);
      await other.waitForSelector('body[data-ready="true"]');
      expect(await other.textContent('#doc-title')).toMatch(/^Gold-coated sinusoidal grating/);
      expect(await other.inputValue('#f-profile')).toBe('sinusoidal');
      expect(await other.$$eval('#profile svg .legend-name', (els) => els.map((e) => e.textContent))).toEqual(['air', 'Au-LD', '1.64', '1.52']);
    } finally {
      await other.close();
      await own.close();
    }
  });

  it('opened from a file (no server), the page says it must be served', async () => {
    const { dir } = await ensureWebBuild();
    const other = await context.newPage();
    try {
      await other.goto(pathToFileURL(join(dir, 'index.html')).href);
      await other.waitForSelector('#file-banner', { state: 'visible' });
      expect(await other.textContent('#file-banner')).toMatch(/served over http\(s\): run\s+furrow view/);
    } finally {
      await other.close();
    }
  });

  it('the page logged no errors', () => {
    expect(problems).toEqual([]);
  });
});
