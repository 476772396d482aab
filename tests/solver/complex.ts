/** Minimal complex arithmetic for writing reference formulas in tests (independent of src/). */
export type C = readonly [number, number];
export const c = (re: number, im = 0): C => [re, im];
export const add = (a: C, b: C): C => [a[0] + b[0], a[1] + b[1]];
export const sub = (a: C, b: C): C => [a[0] - b[0], a[1] - b[1]];
export const mul = (a: C, b: C): C => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
export const div = (a: C, b: C): C => {
  const d = b[0] * b[0] + b[1] * b[1];
  return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d];
};
export const abs2 = (a: C): number => a[0] * a[0] + a[1] * a[1];
export const conj = (a: C): C => [a[0], -a[1]];
export const exp = (a: C): C => [Math.exp(a[0]) * Math.cos(a[1]), Math.exp(a[0]) * Math.sin(a[1])];
/** √z on the branch Im ≥ 0 (decaying under exp(−iωt)), Re ≥ 0 on the real axis. */
export const sqrtUp = (a: C): C => {
  const m = Math.hypot(a[0], a[1]);
  let r = Math.sqrt(Math.max(0, (m + a[0]) / 2));
  const i = Math.sqrt(Math.max(0, (m - a[0]) / 2));
  if (a[1] < 0) r = -r;
  return [r, i];
};
