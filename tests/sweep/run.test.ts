/**
 * `furrow sweep` as a process: the rows do not depend on the number of workers, they equal the
 * engine's evaluatePoint, the run header describes the run; and the pieces under it (ordered
 * writing, reading back a cut file, packing rows for transfer) on their own.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { createEvalContext, evaluatePoint, planSweep } from '../../src/sweep/index.ts';
import type { SweepRow } from '../../src/sweep/types.ts';
import { csvField, csvFields, OrderedWriter, rowText, scanRows, SweepFileError, sweepHash } from '../../src/cli/sweep-output.ts';
import { packRows, unpackRows } from '../../src/cli/sweep-protocol.ts';
import { runPoints } from '../../src/cli/sweep-run.ts';
import { readCsvColumns } from '../../src/cli/demo.ts';
import { sweepCommand, type SweepFlags } from '../../src/cli/sweep-command.ts';
import { specFromFlags } from '../../src/cli/sweep-spec.ts';
import { expectedCsv, furrow, smallDesign, tempDir, writeJson } from './run-helpers.ts';

const dir = tempDir();
const design = smallDesign();
const designPath = writeJson(dir, 'design.json', design);
// 12 wavelengths × 2 duty cycles: neighbouring points share models and layer modes in a worker's cache
const params = ['incidence.wavelength=400nm:800nm:12', 'grating.duty=0.35,0.5'];
const paramArgs = params.flatMap((p) => ['--param', p]);

describe('furrow sweep, one worker and two', () => {
  it('writes byte-identical CSV on this thread and on two worker threads, equal to evaluatePoint point by point', async () => {
    const a = join(dir, 'one.csv');
    const b = join(dir, 'two.csv');
    const r1 = await furrow(['sweep', designPath, ...paramArgs, '--workers', '1', '-o', a]);
    expect(r1.stdout + r1.stderr).toMatch(/sweep: 24 points → .*one\.csv/);
    expect(r1.code).toBe(0);
    const r2 = await furrow(['sweep', designPath, ...paramArgs, '--workers', '2', '--batch', '5', '-o', b]);
    expect(r2.code).toBe(0);
    const one = readFileSync(a, 'utf8');
    expect(readFileSync(b, 'utf8')).toBe(one);
    expect(one).toBe(expectedCsv(design, params));
    expect(one.split('\n')).toHaveLength(26); // header, 24 rows, '' after the last newline
  });

  it('beside the file, the run header names the sweep (hash of the plan), the block, the columns and the command', () => {
    const h = JSON.parse(readFileSync(join(dir, 'two.csv.run.json'), 'utf8'));
    const plan = planSweep(design, specFromFlags(design, { param: params }));
    expect(h.designHash).toBe(sweepHash(plan, new Map()));
    expect(h).toMatchObject({ furrowSweepRun: 1, points: 24, shard: null, format: 'csv', complete: true, written: 24, failed: 0, retainedOrders: 4 });
    expect(h.columns).toEqual(plan.columns);
    expect(h.command.slice(0, 3)).toEqual(['furrow', 'sweep', designPath]);
    expect(h.command).toContain('--workers');
    expect(JSON.parse(readFileSync(join(dir, 'one.csv.run.json'), 'utf8')).designHash).toBe(h.designHash);
  });

  it('JSON Lines carry the same values as the CSV, one object per point with the columns in order', async () => {
    const c = join(dir, 'rows.jsonl');
    const r = await furrow(['sweep', designPath, ...paramArgs, '--workers', '2', '-o', c]);
    expect(r.code).toBe(0);
    const csv = readFileSync(join(dir, 'one.csv'), 'utf8').trimEnd().split('\n');
    const columns = csv[0]!.split(',');
    const objects = readFileSync(c, 'utf8')
      .trimEnd()
      .split('\n')
      .map((l) => JSON.parse(l) as Record<string, unknown>);
    expect(objects).toHaveLength(24);
    objects.forEach((o, i) => {
      expect(Object.keys(o)).toEqual(columns);
      columns.forEach((col, j) => {
        const text = csvField(csv[i + 1]!, j)!;
        const v = o[col];
        if (text === '') expect(v).toBeNull();
        else if (typeof v === 'number') expect(v).toBe(Number(text));
        else expect(v).toBe(text);
      });
    });
    expect(JSON.parse(readFileSync(`${c}.run.json`, 'utf8')).format).toBe('jsonl');
  });

  it('refuses bad flags with one line and exit code 2, and never overwrites a file unasked', async () => {
    const bad = await furrow(['sweep', designPath, ...paramArgs, '--workers', '0']);
    expect(bad.code).toBe(2);
    expect(bad.stdout.trim()).toBe('furrow: --workers: expected a whole number 1…1024, found "0"');
    expect(bad.stderr).not.toMatch(/at .*\.ts:\d+/);
    const before = readFileSync(join(dir, 'one.csv'), 'utf8');
    const again = await furrow(['sweep', designPath, '--param', 'incidence.wavelength=500nm:600nm:2', '--workers', '1', '-o', join(dir, 'one.csv')]);
    expect(again.code).toBe(2);
    expect(again.stdout).toMatch(/one\.csv exists already: add --resume to continue it or --overwrite to replace it/);
    expect(readFileSync(join(dir, 'one.csv'), 'utf8')).toBe(before);
  });
});

describe('resume on this thread', () => {
  const flags = (output: string): SweepFlags => ({ param: ['incidence.wavelength=400nm:800nm:8'], output, workers: '1', quiet: true });
  const run = (output: string, extra: Partial<SweepFlags> = {}) => sweepCommand(designPath, { ...flags(output), ...extra }, ['furrow', 'sweep'], () => {});

  it('a JSON Lines file cut in the middle of a row is completed into the uninterrupted file', async () => {
    const whole = join(dir, 'resume-whole.jsonl');
    const cut = join(dir, 'resume-cut.jsonl');
    await run(whole);
    await run(cut);
    const text = readFileSync(whole, 'utf8');
    const at = text.split('\n').slice(0, 3).join('\n').length + 1 + 25; // three rows and 25 bytes of the fourth
    writeFileSync(cut, text.slice(0, at));
    const r = await run(cut, { resume: true });
    expect(r).toMatchObject({ alreadyDone: 3, written: 5 });
    expect(readFileSync(cut, 'utf8')).toBe(text);
  });

  it('--resume starts a file that does not exist yet, and leaves a complete one as it is', async () => {
    const fresh = join(dir, 'resume-fresh.csv');
    expect(await run(fresh, { resume: true })).toMatchObject({ alreadyDone: 0, written: 8 });
    const before = readFileSync(fresh, 'utf8');
    expect(await run(fresh, { resume: true })).toMatchObject({ alreadyDone: 8, written: 0 });
    expect(readFileSync(fresh, 'utf8')).toBe(before);
  });
});

describe('worker threads that cannot start', () => {
  it('are given up and the main thread evaluates every point, each once; the reason is reported', async () => {
    const d = tempDir();
    const broken = join(d, 'broken-worker.mjs');
    writeFileSync(broken, 'throw new Error("no engine here");\n');
    const plan = planSweep(design, specFromFlags(design, { param: ['incidence.wavelength=400nm:800nm:9'] }));
    const seen: number[] = [];
    const rows = new Map<number, SweepRow>();
    const r = await runPoints({
      plan,
      baseDir: dir,
      first: 0,
      end: plan.count,
      workers: 3,
      workerEntry: broken,
      onRow: (row) => {
        seen.push(row.index);
        rows.set(row.index, row);
      },
    });
    expect(r.threadFault).toBe('no engine here');
    expect(r.interrupted).toBe(false);
    expect([...seen].sort((a, b) => a - b)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8]);
    for (let i = 0; i < plan.count; i++) expect(rows.get(i)).toEqual(evaluatePoint(plan, i, createEvalContext()));
  });
});

const columns = ['point_index', 'x_nm', 'R_0_TE', 'status', 'error'];
const row = (i: number, failed = false): SweepRow =>
  failed ? { index: i, status: 'failed', cells: [i, 400 + i, '', 'failed', 'no, "solution"'], error: 'no, "solution"' } : { index: i, status: 'ok', cells: [i, 400 + i, 0.1 * i, 'ok', ''] };

describe('ordered writing and reading back', () => {
  it('rows arriving in any order leave in point order, each contiguous run as one write', () => {
    const writes: string[] = [];
    const w = new OrderedWriter(10, 16, 'csv', columns, (t) => writes.push(t));
    for (const i of [12, 11, 15]) w.add(row(i));
    expect(writes).toEqual([]);
    expect(w.buffered).toBe(3);
    w.add(row(10));
    expect(writes).toEqual([rowText('csv', columns, row(10).cells) + rowText('csv', columns, row(11).cells) + rowText('csv', columns, row(12).cells)]);
    w.add(row(13, true));
    w.add(row(14));
    expect(w.next).toBe(16);
    expect(w.written).toBe(6);
    expect(w.failed).toBe(1);
    expect(writes.join('').split('\n').slice(0, -1).map((l) => csvField(l, 0))).toEqual(['10', '11', '12', '13', '14', '15']);
    expect(() => w.add(row(12))).toThrow(RangeError);
  });

  it('a write that fails (a full disk) counts nothing as written', () => {
    const w = new OrderedWriter(0, 4, 'csv', columns, () => {
      throw Object.assign(new Error('ENOSPC: no space left on device, write'), { code: 'ENOSPC', syscall: 'write' });
    });
    w.add(row(1));
    expect(() => w.add(row(0))).toThrow(/ENOSPC/);
    expect([w.next, w.written, w.failed]).toEqual([0, 0, 0]);
  });

  it('a cut file is read back up to its last complete row; a row out of place is refused', () => {
    const d = tempDir();
    const text = `${columns.join(',')}\n${rowText('csv', columns, row(3).cells)}${rowText('csv', columns, row(4, true).cells)}`;
    const p = join(d, 'cut.csv');
    writeFileSync(p, `${text}5,405,0.`);
    expect(scanRows(p, 'csv', columns, 3, 9)).toEqual({ next: 5, validBytes: Buffer.byteLength(text), hasHeader: true, failed: 1 });
    writeFileSync(p, `${columns.join(',')}\n${rowText('csv', columns, row(4).cells)}`);
    expect(() => scanRows(p, 'csv', columns, 3, 9)).toThrow(SweepFileError);
    writeFileSync(p, `point_index,other\n`);
    expect(() => scanRows(p, 'csv', columns, 3, 9)).toThrow(/header line is not the columns/);
  });

  it('CSV fields are read back with quotes undone', () => {
    const line = rowText('csv', columns, row(7, true).cells).trimEnd();
    expect(line).toBe('7,407,,failed,"no, ""solution"""');
    expect([0, 1, 2, 3, 4, 5].map((j) => csvField(line, j))).toEqual(['7', '407', '', 'failed', 'no, "solution"', null]);
    expect(csvFields(line)).toEqual(['7', '407', '', 'failed', 'no, "solution"']);
    expect(csvFields('1,"open')).toBeNull();
  });

  it("the demo reads the sweep's CSV with the same field reader: numbers by column, null for a failed row's empty and text cells", () => {
    const header = ['point_index', 'wavelength_nm', 'R_-1_TE', 'status', 'error'];
    const text = [header.join(',') + '\n', rowText('csv', header, [0, 400, 0.5, 'ok', '']), rowText('csv', header, [1, 410, '', 'failed', 'material "Al", out of range, at 410 nm'])].join('');
    const cols = readCsvColumns(text);
    expect(cols.get('wavelength_nm')).toEqual([400, 410]);
    expect(cols.get('R_-1_TE')).toEqual([0.5, null]);
    expect(cols.get('error')).toEqual([null, null]);
  });

  it('rows packed for transfer unpack to the same cells, including −0, text cells and failures', () => {
    const rows: SweepRow[] = [
      { index: 5, status: 'ok', cells: [5, -0, 1e-300, 'ok', ''] },
      { index: 6, status: 'failed', cells: [6, 'TE', '', 'failed', 'why'], error: 'why' },
    ];
    const packed = packRows(5, 5, rows, 1.5);
    expect(packed.numbers).toBeInstanceOf(Float64Array);
    const back = unpackRows(packed);
    expect(back).toEqual(rows);
    expect(Object.is(back[0]!.cells[1], -0)).toBe(true);
    expect(() => packRows(4, 5, rows, 0)).toThrow(RangeError);
  });
});

describe('threads only when they repay their start', () => {
  const plan = planSweep(design, specFromFlags(design, { param: ['incidence.wavelength=400nm:800nm:600'] }));
  const collect = async (opts: { deferThreadsMs?: number }): Promise<{ lanes: number; rows: SweepRow[] }> => {
    const rows: SweepRow[] = [];
    const r = await runPoints({ plan, baseDir: dir, first: 0, end: plan.count, workers: 2, ...opts, onRow: (row) => rows.push(row) });
    rows.sort((a, b) => a.index - b.index);
    return { lanes: r.lanes, rows };
  };

  it('a run shorter than the threshold stays on this thread; a longer one (threshold 0 ms) starts the thread after the warm-up slices; the rows are the same', async () => {
    const short = await collect({ deferThreadsMs: 60_000 }); // 600 small points: far below a minute
    const eager = await collect({ deferThreadsMs: 0 });
    const asked = await collect({});
    expect(short.lanes).toBe(1);
    expect(eager.lanes).toBe(2);
    expect(asked.lanes).toBe(2);
    expect(eager.rows).toEqual(short.rows);
    expect(asked.rows).toEqual(short.rows);
    expect(short.rows.map((r) => r.index)).toEqual([...Array(plan.count).keys()]);
  });
});
