/**
 * `furrow merge` (mergeShards): shard files in any order become the single-run file; anything
 * that would give a wrong file — a missing shard, a shard cut short, a shard of another sweep,
 * the same points twice — is refused with the points or files named, and nothing is written.
 * The shard files are made by the sweep command on this thread (one worker).
 */
import { copyFileSync, existsSync, readFileSync, truncateSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { mergeShards } from '../../src/cli/merge.ts';
import { sweepCommand, type SweepFlags } from '../../src/cli/sweep-command.ts';
import { SweepFileError } from '../../src/cli/sweep-output.ts';
import { smallDesign, tempDir, writeJson } from './run-helpers.ts';

const dir = tempDir('furrow-merge-');
const designPath = writeJson(dir, 'design.json', smallDesign());
const params = ['incidence.wavelength=400nm:800nm:10'];

async function sweep(output: string, extra: Partial<SweepFlags> = {}, design = designPath): Promise<void> {
  await sweepCommand(design, { param: params, output, workers: '1', quiet: true, ...extra }, ['furrow', 'sweep', '(test)'], () => {});
}
const part = (k: number, ext = 'csv'): string => join(dir, `part-${k}.${ext}`);

beforeAll(async () => {
  await sweep(join(dir, 'whole.csv'));
  await sweep(join(dir, 'whole.jsonl'));
  for (let k = 1; k <= 4; k++) {
    await sweep(join(dir, 'part-{shard}.csv'), { shard: `${k}/4` });
    await sweep(join(dir, 'part-{shard}.jsonl'), { shard: `${k}/4` });
  }
});

describe('furrow merge', () => {
  it('shards given in any order make the single-run file byte for byte (CSV and JSON Lines), with a run header for the whole sweep', () => {
    const out = join(dir, 'merged.csv');
    const r = mergeShards(out, [part(4), part(2), part(1), part(3)], { command: ['furrow', 'merge'] });
    expect(r).toEqual({ output: out, points: 10, failed: 0, files: 4 });
    expect(readFileSync(out, 'utf8')).toBe(readFileSync(join(dir, 'whole.csv'), 'utf8'));
    const h = JSON.parse(readFileSync(`${out}.run.json`, 'utf8'));
    const single = JSON.parse(readFileSync(join(dir, 'whole.csv.run.json'), 'utf8'));
    expect(h).toMatchObject({ shard: null, complete: true, written: 10, designHash: single.designHash, columns: single.columns, command: ['furrow', 'merge'] });
    expect(h.mergedFrom).toEqual([part(1), part(2), part(3), part(4)]);

    const outJ = join(dir, 'merged.jsonl');
    mergeShards(outJ, [1, 2, 3, 4].map((k) => part(k, 'jsonl')));
    expect(readFileSync(outJ, 'utf8')).toBe(readFileSync(join(dir, 'whole.jsonl'), 'utf8'));
  });

  it('a missing shard: refused, naming the missing points; nothing written', () => {
    const out = join(dir, 'gap.csv');
    expect(() => mergeShards(out, [part(1), part(2), part(4)])).toThrow('merge: 2 of 10 points are missing: 5–6 (no file given for them)');
    expect(existsSync(out)).toBe(false);
  });

  it('a shard cut short (a killed run): refused, naming its missing points and saying to resume it', () => {
    const cut = join(dir, 'cut-3.csv');
    copyFileSync(part(3), cut);
    copyFileSync(`${part(3)}.run.json`, `${cut}.run.json`);
    const text = readFileSync(cut, 'utf8');
    truncateSync(cut, text.lastIndexOf('\n', text.length - 2) + 1); // drop the last row (point 6; shard 3 of 4 holds points 5 and 6)
    expect(() => mergeShards(join(dir, 'cut.csv'), [part(1), part(2), cut, part(4)])).toThrow(
      `merge: 1 of 10 points are missing: 6 (${cut}, shard 3/4, stopped early: run it again with --resume)`,
    );
  });

  it('a shard of another sweep, or the same points twice: refused, naming the files', async () => {
    const other = writeJson(dir, 'other.json', smallDesign(280));
    await sweep(join(dir, 'other-{shard}.csv'), { shard: '2/4' }, other);
    expect(() => mergeShards(join(dir, 'x.csv'), [part(1), join(dir, 'other-2.csv'), part(3), part(4)])).toThrow(
      /other-2\.csv: was written for a different design or sweep .* these files are not parts of one sweep/,
    );
    const twin = join(dir, 'twin-2.csv');
    copyFileSync(part(2), twin);
    copyFileSync(`${part(2)}.run.json`, `${twin}.run.json`);
    expect(() => mergeShards(join(dir, 'x.csv'), [part(1), part(2), twin, part(3), part(4)])).toThrow(/holds points 2–4, which overlap .*part-2\.csv \(shard 2\/4\): give each shard once/);
    expect(() => mergeShards(join(dir, 'x.csv'), [part(1), part(1)])).toThrow(/named twice/);
    expect(() => mergeShards(join(dir, 'x.csv'), [part(1), part(2, 'jsonl')])).toThrow(/different format \(jsonl vs csv\)/);
  });

  it('needs the run headers, and will not overwrite an existing file unasked (nor merge into an input)', () => {
    const bare = join(dir, 'bare.csv');
    writeFileSync(bare, readFileSync(part(1)));
    expect(() => mergeShards(join(dir, 'y.csv'), [bare])).toThrow(SweepFileError);
    expect(() => mergeShards(join(dir, 'y.csv'), [bare])).toThrow(/bare\.csv\.run\.json: cannot read the run header of .*bare\.csv: ENOENT/);
    const out = join(dir, 'merged.csv');
    expect(() => mergeShards(out, [part(1), part(2), part(3), part(4)])).toThrow(/merged\.csv: exists already \(add --overwrite to replace it\)/);
    expect(mergeShards(out, [part(1), part(2), part(3), part(4)], { overwrite: true }).points).toBe(10);
    expect(() => mergeShards(part(1), [part(1), part(2)], { overwrite: true })).toThrow(/cannot be one of the inputs/);
  });
});
