/** Suggestions for a mistyped or informal material name (internal to the materials layer). */

/** Informal names and the built-in ids they usually mean (lower-case keys). */
const SYNONYMS: Record<string, readonly string[]> = {
  gold: ['Au-LD', 'Au-JC'],
  au: ['Au-LD', 'Au-JC'],
  silver: ['Ag-LD', 'Ag-JC'],
  ag: ['Ag-LD', 'Ag-JC'],
  copper: ['Cu-LD'],
  cu: ['Cu-LD'],
  aluminium: ['Al-LD', 'Al-Rakic1995'],
  aluminum: ['Al-LD', 'Al-Rakic1995'],
  al: ['Al-LD', 'Al-Rakic1995'],
  chromium: ['Cr-LD'],
  cr: ['Cr-LD'],
  silicon: ['Si-Green2008', 'Si-Li1980'],
  si: ['Si-Green2008', 'Si-Li1980'],
  'c-si': ['Si-Green2008', 'Si-Li1980'],
  silica: ['fused-silica'],
  'fused silica': ['fused-silica'],
  fusedsilica: ['fused-silica'],
  sio2: ['fused-silica'],
  al2o3: ['sapphire'],
  'silicon nitride': ['Si3N4'],
  sin: ['Si3N4'],
  sinx: ['Si3N4'],
  nitride: ['Si3N4'],
  tio2: ['TiO2-rutile'],
  rutile: ['TiO2-rutile'],
  titania: ['TiO2-rutile'],
  'magnesium fluoride': ['MgF2'],
};

/** Edit distance with adjacent transpositions (optimal string alignment). */
function distance(a: string, b: string): number {
  const d: number[][] = Array.from({ length: a.length + 1 }, (_, i) => [i, ...Array<number>(b.length).fill(0)]);
  for (let j = 1; j <= b.length; j++) d[0]![j] = j;
  for (let i = 1; i <= a.length; i++) {
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let v = Math.min(d[i - 1]![j]! + 1, d[i]![j - 1]! + 1, d[i - 1]![j - 1]! + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) v = Math.min(v, d[i - 2]![j - 2]! + 1);
      d[i]![j] = v;
    }
  }
  return d[a.length]![b.length]!;
}

/**
 * Up to three known names close to `query`, compared case-insensitively: the ids an informal
 * name usually means (gold → Au-LD, Au-JC); else the names starting with the query; else the
 * nearest names by edit distance (at most ⌈length/3⌉ edits, ties kept).
 * @example
 * suggestNames('au-lb', ['Au-LD', 'Ag-LD', 'air']); // ['Au-LD']
 */
export function suggestNames(query: string, known: readonly string[]): string[] {
  const q = query.trim().toLowerCase();
  const byLower = new Map(known.map((k) => [k.toLowerCase(), k] as const));
  const out: string[] = [];
  const push = (k: string | undefined): void => {
    if (k !== undefined && !out.includes(k) && out.length < 3) out.push(k);
  };
  for (const s of SYNONYMS[q] ?? []) push(byLower.get(s.toLowerCase()));
  if (out.length) return out;
  if (q.length >= 2) for (const k of known) if (k.toLowerCase().startsWith(q) && !k.includes(':')) push(k);
  if (out.length) return out;
  const limit = Math.max(1, Math.ceil(q.length / 3));
  const near = known.map((k) => ({ k, d: distance(q, k.toLowerCase()) })).filter((x) => x.d <= limit);
  const best = Math.min(...near.map((x) => x.d));
  for (const x of near) if (x.d === best) push(x.k);
  return out;
}
