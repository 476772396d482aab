/**
 * `furrow merge`: shard outputs of one sweep into one file, byte for byte the file a single run
 * would have written. The run headers must agree (same sweep hash, solver version, format and
 * columns), the blocks must tile the sweep with no overlap, and every file must hold its whole
 * block; otherwise nothing is written and the missing points are named.
 */
import { closeSync, existsSync, openSync, readSync, realpathSync, renameSync, rmSync, writeSync } from 'node:fs';
import { headerText, readRunHeader, scanRows, SweepFileError, writeRunHeader, type RunHeader, type ShardInfo } from './sweep-output.ts';

export interface MergeOptions {
  readonly overwrite?: boolean;
  /** the command line, recorded in the merged run header */
  readonly command?: ReadonlyArray<string>;
}

export interface MergeReport {
  readonly output: string;
  readonly points: number;
  readonly failed: number;
  readonly files: number;
}

interface Part {
  readonly path: string;
  readonly header: RunHeader;
  readonly block: { readonly first: number; readonly end: number };
  /** byte range of the rows in the file */
  readonly from: number;
  readonly to: number;
}

function describeBlock(h: RunHeader): string {
  return h.shard ? `shard ${h.shard.index}/${h.shard.count}` : 'the whole sweep';
}

function ranges(list: ReadonlyArray<readonly [number, number, string]>): string {
  const shown = list.slice(0, 8).map(([a, b, why]) => `${a === b - 1 ? `${a}` : `${a}–${b - 1}`} (${why})`);
  return shown.join(', ') + (list.length > 8 ? `, and ${list.length - 8} more ranges` : '');
}

function copyRange(fdOut: number, path: string, from: number, to: number): void {
  const fd = openSync(path, 'r');
  try {
    const buf = Buffer.alloc(1 << 20);
    let pos = from;
    while (pos < to) {
      const n = readSync(fd, buf, 0, Math.min(buf.length, to - pos), pos);
      if (n === 0) throw new SweepFileError(path, 'the file became shorter while it was merged');
      let off = 0;
      while (off < n) off += writeSync(fdOut, buf, off, n - off);
      pos += n;
    }
  } finally {
    closeSync(fd);
  }
}

export function mergeShards(output: string, inputs: ReadonlyArray<string>, opts: MergeOptions = {}): MergeReport {
  if (inputs.length === 0) throw new SweepFileError('merge', 'name the shard files to merge after the output file');
  if (output === '-') throw new SweepFileError('merge', 'the merged output must be a file (its run header is written beside it)');
  const seen = new Set<string>();
  for (const p of inputs) {
    if (!existsSync(p)) throw new SweepFileError(p, 'no such file');
    const real = realpathSync(p);
    if (seen.has(real)) throw new SweepFileError(p, 'named twice');
    seen.add(real);
  }
  if (existsSync(output)) {
    if (seen.has(realpathSync(output))) throw new SweepFileError(output, 'the merged output cannot be one of the inputs');
    if (!opts.overwrite) throw new SweepFileError(output, 'exists already (add --overwrite to replace it)');
  }

  const headers = inputs.map((p) => ({ path: p, header: readRunHeader(p) }));
  const ref = headers[0]!;
  for (const { path, header: h } of headers.slice(1)) {
    const differs =
      h.designHash !== ref.header.designHash
        ? `a different design or sweep (${h.designHash.slice(0, 19)}… vs ${ref.header.designHash.slice(0, 19)}…)`
        : h.solverVersion !== ref.header.solverVersion
          ? `a different solver version (${h.solverVersion} vs ${ref.header.solverVersion})`
          : h.format !== ref.header.format
            ? `a different format (${h.format} vs ${ref.header.format})`
            : h.points !== ref.header.points || h.columns.join('\u0000') !== ref.header.columns.join('\u0000')
              ? 'different columns or point count'
              : null;
    if (differs) throw new SweepFileError(path, `was written for ${differs} than ${ref.path}: these files are not parts of one sweep`);
  }
  const { format, columns, points } = ref.header;

  const parts: Part[] = [];
  const missing: [number, number, string][] = [];
  let failed = 0;
  for (const { path, header } of headers) {
    const block: ShardInfo | { first: number; end: number } = header.shard ?? { first: 0, end: points };
    const scan = scanRows(path, format, columns, block.first, block.end);
    if (!scan.hasHeader && format === 'csv') throw new SweepFileError(path, 'has no header line');
    if (scan.next < block.end) missing.push([scan.next, block.end, `${path}, ${describeBlock(header)}, stopped early: run it again with --resume`]);
    failed += scan.failed;
    parts.push({ path, header, block, from: Buffer.byteLength(headerText(format, columns)), to: scan.validBytes });
  }
  parts.sort((a, b) => a.block.first - b.block.first || a.block.end - b.block.end);
  let covered = 0;
  for (let i = 0; i < parts.length; i++) {
    const p = parts[i]!;
    if (p.block.first < covered) {
      const other = parts.find((q, j) => j < i && q.block.end > p.block.first)!;
      throw new SweepFileError(p.path, `holds points ${p.block.first}–${p.block.end - 1}, which overlap ${other.path} (${describeBlock(other.header)}): give each shard once`);
    }
    if (p.block.first > covered) missing.push([covered, p.block.first, 'no file given for them']);
    covered = p.block.end;
  }
  if (covered < points) missing.push([covered, points, 'no file given for them']);
  if (missing.length) {
    missing.sort((a, b) => a[0] - b[0]);
    const n = missing.reduce((s, [a, b]) => s + (b - a), 0);
    throw new SweepFileError('merge', `${n} of ${points} points are missing: ${ranges(missing)}`);
  }

  const tmp = `${output}.merging`;
  const fd = openSync(tmp, 'w');
  try {
    const head = headerText(format, columns);
    if (head) writeSync(fd, head);
    for (const p of parts) copyRange(fd, p.path, p.from, p.to);
    closeSync(fd);
  } catch (e) {
    closeSync(fd);
    rmSync(tmp, { force: true });
    throw e;
  }
  renameSync(tmp, output);
  const now = new Date().toISOString();
  const merged: RunHeader = {
    ...ref.header,
    shard: null,
    command: opts.command ?? [],
    started: parts.map((p) => p.header.started).sort()[0] ?? now,
    finished: now,
    complete: true,
    written: points,
    failed,
    mergedFrom: parts.map((p) => p.path),
  };
  writeRunHeader(output, merged);
  return { output, points, failed, files: parts.length };
}
