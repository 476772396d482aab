/**
 * `furrow materials` — the library listing and one material's n, k over a wavelength range.
 * Pure functions returning lines of text; main.ts prints them. Errors are MaterialError (unknown
 * name with suggestions, wavelength outside the valid range, invalid arguments).
 */
import { formatUm, MaterialError, type MaterialLibrary, type MaterialListing, modelLabel } from '../materials/index.ts';

const range = (r: readonly [number, number]): string => (r[0] === 0 && r[1] === Infinity ? 'any' : `${formatUm(r[0])}–${formatUm(r[1])}`);

/**
 * The library as a table: name, model, valid range (µm) and source, with each entry's notes
 * ('from memory', 'ordinary index …', 'coarse table …') on the lines below it. User materials
 * come first; built-ins hidden by a user entry of the same name say so.
 * @param lib the material library
 * @returns lines of text
 * @example
 * materialsList(new MaterialLibrary()).forEach((l) => console.log(l));
 */
export function materialsList(lib: MaterialLibrary): string[] {
  const rows = lib.list();
  const idW = Math.max(4, ...rows.map((r) => r.id.length));
  const modelW = Math.max(5, ...rows.map((r) => modelLabel(r.kind).length));
  const rangeW = Math.max(10, ...rows.map((r) => range(r.validRangeUm).length));
  const indent = ' '.repeat(idW + modelW + rangeW + 6);
  const line = (a: string, b: string, c: string, d: string): string => `${a.padEnd(idW)}  ${b.padEnd(modelW)}  ${c.padEnd(rangeW)}  ${d}`.trimEnd();
  const out: string[] = [];
  const section = (title: string, list: MaterialListing[]): void => {
    if (list.length === 0) return;
    if (out.length) out.push('');
    out.push(title);
    out.push(line('name', 'model', 'range (µm)', 'source'));
    for (const r of list) {
      out.push(line(r.id, modelLabel(r.kind), range(r.validRangeUm), r.citation));
      const notes = [...r.notes.map((n) => (n === 'from memory' ? 'FROM MEMORY: not re-read in the cited source' : n))];
      if (r.overridden) notes.unshift('overridden by the user material of the same name');
      for (const n of notes) out.push(`${indent}note: ${n}`);
    }
  };
  section('user materials (they override built-ins of the same name)', rows.filter((r) => r.origin === 'user'));
  section('built-in materials', rows.filter((r) => r.origin === 'built-in'));
  out.push('');
  out.push("Names are case-insensitive; 'name:o' / 'name:e' pick the ordinary / extraordinary index of a uniaxial crystal.");
  return out;
}

/** Options of {@link materialsShow}. */
export interface MaterialsShowOptions {
  /** evaluate outside the valid range, with warnings below the table */
  readonly allowExtrapolation?: boolean;
}

const fmtK = (k: number): string => (k === 0 ? '0' : k < 0.01 ? k.toExponential(4) : k.toFixed(6));

/**
 * One material's n and k from `fromUm` to `toUm` in `steps` equal intervals (steps + 1 rows; one
 * row when fromUm = toUm), with its source, range and notes above and any warnings below.
 * @param lib the material library
 * @param name material name (case-insensitive)
 * @param fromUm first vacuum wavelength, µm (> 0)
 * @param toUm last vacuum wavelength, µm (≥ fromUm)
 * @param steps number of intervals, an integer 1…10000
 * @param options `{ allowExtrapolation: true }` to go beyond the valid range with warnings
 * @returns lines of text
 * @throws {MaterialError} 'unknown-material' (with suggestions); 'out-of-range' for a wavelength
 *   outside the valid range unless allowed; 'invalid-argument' for bad from/to/steps
 * @example
 * materialsShow(lib, 'Au-LD', 0.4, 0.8, 8); // header lines, then 9 rows of λ, n, k
 */
export function materialsShow(lib: MaterialLibrary, name: string, fromUm: number, toUm: number, steps: number, options: MaterialsShowOptions = {}): string[] {
  const m = lib.resolve(name);
  if (!(Number.isFinite(fromUm) && fromUm > 0 && Number.isFinite(toUm) && toUm > 0)) {
    throw new MaterialError('invalid-argument', `--from and --to must be positive lengths, found ${fromUm} µm and ${toUm} µm`, m.id);
  }
  if (toUm < fromUm) throw new MaterialError('invalid-argument', `--to (${formatUm(toUm)} µm) is below --from (${formatUm(fromUm)} µm)`, m.id);
  if (!(Number.isInteger(steps) && steps >= 1 && steps <= 10000)) {
    throw new MaterialError('invalid-argument', `steps must be an integer from 1 to 10000, found ${steps}`, m.id);
  }
  const count = toUm === fromUm ? 1 : steps + 1;
  const out: string[] = [
    `material  ${m.id} (${modelLabel(m.kind)}${m.user ? ', user' : ''})`,
    `source    ${m.citation}`,
    `range     ${range(m.validRangeUm)}${m.validRangeUm[1] === Infinity && m.validRangeUm[0] === 0 ? '' : ' µm'}`,
    ...m.notes.map((n) => `note      ${n === 'from memory' ? 'FROM MEMORY: not re-read in the cited source' : n}`),
    '',
    `${'λ (nm)'.padStart(11)}  ${'λ (µm)'.padStart(10)}  ${'n'.padStart(10)}  ${'k'.padStart(11)}`,
  ];
  const warnings: string[] = [];
  for (let i = 0; i < count; i++) {
    const x = i === count - 1 ? toUm : fromUm + ((toUm - fromUm) * i) / steps;
    const e = lib.evaluate(name, x, options);
    for (const w of e.warnings) warnings.push(w);
    out.push(`${(x * 1000).toFixed(3).padStart(11)}  ${x.toFixed(6).padStart(10)}  ${e.index.re.toFixed(6).padStart(10)}  ${fmtK(e.index.im).padStart(11)}`);
  }
  if (warnings.length) {
    out.push('');
    out.push(`warning: ${warnings.length} of ${count} wavelengths are outside the valid range and were extrapolated:`);
    out.push(`  ${warnings[0]}`);
    if (warnings.length > 1) out.push(`  ${warnings[warnings.length - 1]}`);
  }
  return out;
}
