/**
 * Shards: a sweep split into N deterministic parts run on different machines, then merged.
 *
 * Shard K of N (1-based) holds the contiguous block of points
 *   first = floor((K−1)·count/N) … end−1, end = floor(K·count/N),
 * so the blocks tile 0 … count−1 in order, differ in size by at most one point, and merging is
 * concatenation. Contiguous blocks keep neighbouring points (which share cached layer modes) on
 * one machine; when the cost of a point grows along the sweep (an `orders` axis, say), use more
 * shards than machines to even out the finish times.
 *
 * `--shard auto/N` (or `--shards N`) takes K from the environment:
 *   JOB_COMPLETION_INDEX (Kubernetes indexed Job, 0-based)        → K = JOB_COMPLETION_INDEX + 1
 *   SLURM_ARRAY_TASK_ID  (Slurm job array, ids from the script)   → K = SLURM_ARRAY_TASK_ID − SLURM_ARRAY_TASK_MIN + 1
 * so `--array=0-7` and `--array=1-8` both give K = 1…8. The array must have step 1 (no `:2`),
 * and when Slurm says how many tasks it has (SLURM_ARRAY_TASK_COUNT) that must equal N.
 */
import { InputError } from '../design/index.ts';
import type { ShardInfo } from './sweep-output.ts';

export interface ShardChoice {
  readonly index: number;
  readonly count: number;
}

/** Points of shard K of N. */
export function shardBlock(points: number, index: number, count: number): ShardInfo {
  return { index, count, first: Math.floor(((index - 1) * points) / count), end: Math.floor((index * points) / count) };
}

function positiveInt(text: string, what: string, flag: string): number {
  if (!/^\d+$/.test(text.trim())) throw new InputError(flag, `${what} must be a whole number, found "${text}"`);
  const n = Number(text);
  if (!(n >= 1 && n <= 1_000_000)) throw new InputError(flag, `${what} must be 1…1000000, found ${text}`);
  return n;
}

function fromEnvironment(count: number, env: NodeJS.ProcessEnv, flag: string): number {
  const k8s = env.JOB_COMPLETION_INDEX;
  if (k8s !== undefined && k8s !== '') {
    if (!/^\d+$/.test(k8s)) throw new InputError(flag, `JOB_COMPLETION_INDEX must be a whole number, found "${k8s}"`);
    return Number(k8s) + 1;
  }
  const id = env.SLURM_ARRAY_TASK_ID;
  if (id !== undefined && id !== '') {
    const min = env.SLURM_ARRAY_TASK_MIN;
    if (!/^\d+$/.test(id) || min === undefined || !/^\d+$/.test(min)) {
      throw new InputError(flag, `SLURM_ARRAY_TASK_ID and SLURM_ARRAY_TASK_MIN must be whole numbers, found "${id}" and "${min ?? ''}"`);
    }
    const n = env.SLURM_ARRAY_TASK_COUNT;
    if (n !== undefined && n !== '' && Number(n) !== count) {
      throw new InputError(flag, `the Slurm array has ${n} tasks but the sweep is split into ${count} shards`);
    }
    return Number(id) - Number(min) + 1;
  }
  throw new InputError(flag, 'the shard number comes from JOB_COMPLETION_INDEX (Kubernetes indexed Job) or SLURM_ARRAY_TASK_ID (Slurm array), and neither is set');
}

/**
 * The shard asked for by `--shard K/N`, `--shard auto/N` or `--shards N` (null: no sharding).
 * Throws InputError for malformed or out-of-range values.
 */
export function chooseShard(shard: string | undefined, shards: string | undefined, env: NodeJS.ProcessEnv = process.env): ShardChoice | null {
  if (shard !== undefined && shards !== undefined) throw new InputError('--shards', 'give --shard K/N or --shards N, not both');
  let count: number;
  let index: number;
  if (shards !== undefined) {
    count = positiveInt(shards, 'the number of shards', '--shards');
    index = fromEnvironment(count, env, '--shards');
  } else if (shard !== undefined) {
    const m = /^\s*(\w+)\s*\/\s*(\w+)\s*$/.exec(shard);
    if (!m) throw new InputError('--shard', `expected K/N (e.g. 3/16) or auto/N, found "${shard}"`);
    count = positiveInt(m[2]!, 'N', '--shard');
    if (m[1] !== 'auto' && !/^\d+$/.test(m[1]!)) throw new InputError('--shard', `K must be a whole number or auto, found "${m[1]}"`);
    index = m[1] === 'auto' ? fromEnvironment(count, env, '--shard') : Number(m[1]);
  } else return null;
  if (index < 1 || index > count) throw new InputError(shards !== undefined ? '--shards' : '--shard', `shard ${index} does not exist: shards are numbered 1…${count}`);
  return { index, count };
}

/** Output path with `{shard}` replaced by K (zero-padded to the width of N) and `{shards}` by N. */
export function shardPath(path: string, choice: ShardChoice | null): string {
  if (choice === null) {
    if (/\{shards?\}/.test(path)) throw new InputError('--output', '{shard} in the output name needs --shard or --shards');
    return path;
  }
  const width = String(choice.count).length;
  return path.replaceAll('{shard}', String(choice.index).padStart(width, '0')).replaceAll('{shards}', String(choice.count));
}
