/**
 * Kept workspaces: the eigen-solvers reuse scratch per order between calls. Reuse must change no
 * bit of any result, whatever order the calls come in.
 */
import { describe, expect, it } from 'vitest';
import { WorkspaceStore, KEEP } from '../../src/linalg/workspaces.ts';
import { zgeev, ZgeevWorkspace } from '../../src/linalg/zgeev.ts';
import { zheev, ZheevWorkspace } from '../../src/linalg/zheev.ts';
import { randomComplex, randomHermitian } from './util.ts';

const same = (a: Float64Array, b: Float64Array): boolean => a.length === b.length && a.every((v, i) => Object.is(v, b[i]));

describe('kept eigen-solver workspaces', () => {
  it('zgeev and zheev give the same bits with the kept workspace as with a fresh one, calls interleaved over more orders than are kept', () => {
    const orders = [5, 17, 31, 9, 31, 17, 64, 5, 9, 64, 31];
    expect(new Set(orders).size).toBeGreaterThan(KEEP);
    orders.forEach((n, k) => {
      const a = randomComplex(n, n, 100 + k);
      const kept = zgeev(a);
      const fresh = zgeev(a, {}, new ZgeevWorkspace(n));
      expect(same(kept.values, fresh.values)).toBe(true);
      expect(same(kept.vectors!.data, fresh.vectors!.data)).toBe(true);
      const h = randomHermitian(n, 200 + k);
      const kh = zheev(h);
      const fh = zheev(h, undefined, new ZheevWorkspace(n));
      expect(same(kh.values, fh.values)).toBe(true);
      expect(same(kh.vectors!.data, fh.vectors!.data)).toBe(true);
    });
  });

  it('a store keeps one workspace per order, the least recently used dropped beyond KEEP', () => {
    let made = 0;
    const store = new WorkspaceStore((n) => ({ n, id: made++ }));
    const first = store.get(3);
    expect(store.get(3)).toBe(first);
    for (const n of [4, 5, 6]) store.get(n);
    store.get(3); // most recent again
    store.get(7); // drops 4
    expect(store.orders()).toEqual([5, 6, 3, 7]);
    expect(store.get(3)).toBe(first);
    expect(made).toBe(5);
  });
});
