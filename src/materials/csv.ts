/**
 * Users' measured tables as CSV TEXT (the engine never reads files: callers pass the file's
 * contents). Format:
 *
 *   # comments start with '#', anywhere on a line; blank lines are skipped
 *   wavelength_nm, n, k          ← header: a wavelength column naming its unit, n, and optionally k
 *   400, 1.47, 0.001
 *   500, 1.46, 0
 *
 * The wavelength header may read `wavelength_nm`, `wavelength (um)`, `wavelength [µm]`,
 * `lambda/nm`, `wl_A` …; units nm, µm (um, micron), mm, Å (A, angstrom). Columns may come in any
 * order; without a k column κ = 0. Fields are separated by commas, or else tabs, semicolons or
 * spaces. Without a header the columns are wavelength, n[, k] and the unit must be given as an
 * argument. Rows must have strictly increasing wavelengths, n ≥ 0 and κ ≥ 0; at least 2 rows.
 */
import { MaterialError } from './errors.ts';
import { parseLengthUnit, requireLengthUnit, toUm, type LengthUnit } from './length-unit.ts';
import { tableMaterial, type TableMaterial } from './table.ts';

/** Options of {@link parseMaterialCsv}. */
export interface CsvOptions {
  /** the material's name (no ':'); user materials override built-ins of the same name */
  readonly name: string;
  /** wavelength unit when the header names none (or there is no header): 'nm', 'um', 'µm', 'mm', 'Å' */
  readonly unit?: string;
  /** where the data come from; default "user table (no citation given)" */
  readonly citation?: string;
  readonly notes?: readonly string[];
}

type Column = 'wavelength' | 'n' | 'k';
const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const WAVELENGTH_HEADER = /^(?:wavelengths?|lambda|λ|wl|wvl)(.*)$/i;

function splitFields(line: string): string[] {
  const sep = line.includes(',') ? ',' : line.includes('\t') ? '\t' : line.includes(';') ? ';' : /\s+/;
  return line.split(sep).map((f) => f.trim());
}

/**
 * Parse a measured n, k table from CSV text into a tabulated material (linear interpolation in λ,
 * valid over the table's span).
 * @param text the CSV file's contents
 * @param options name, unit (when the header names none), citation, notes
 * @returns the material, with its rows in µm under `table`
 * @throws {MaterialError} 'invalid-data' naming the line (1-based) and what is wrong: a value that
 *   is not a number, a wrong number of columns, wavelengths not strictly increasing or ≤ 0, a
 *   negative n or k, an unknown header column, a header without a unit (and no unit given), a
 *   header unit that contradicts the given unit, or fewer than 2 data rows
 * @example
 * const m = parseMaterialCsv('wavelength_nm,n,k\n400,1.47,0.001\n500,1.46,0\n', { name: 'my-film' });
 * m.index(0.45); // {re: 1.465, im: 0.0005}
 */
export function parseMaterialCsv(text: string, options: CsvOptions): TableMaterial {
  const name = options.name;
  const fail = (line: number, msg: string): never => {
    throw new MaterialError('invalid-data', `CSV line ${line}: ${msg}`, name, { line });
  };
  const given: LengthUnit | undefined = options.unit === undefined ? undefined : requireLengthUnit(options.unit, name);
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/);

  let columns: Column[] | undefined;
  let unit: LengthUnit | undefined;
  const x: number[] = [];
  const n: number[] = [];
  const k: number[] = [];
  let previous: { value: number; line: number } | undefined;

  for (let i = 0; i < lines.length; i++) {
    const lineNo = i + 1;
    const hash = lines[i]!.indexOf('#');
    const content = (hash >= 0 ? lines[i]!.slice(0, hash) : lines[i]!).trim();
    if (content === '') continue;
    const fields = splitFields(content);

    if (columns === undefined) {
      if (!NUMBER.test(fields[0]!)) {
        // header line
        const cols: Column[] = [];
        for (const [j, raw] of fields.entries()) {
          const f = raw.trim();
          const w = WAVELENGTH_HEADER.exec(f);
          let col: Column;
          if (w) {
            col = 'wavelength';
            const spec = w[1]!.replace(/^[\s_\-/([]+/, '').replace(/[)\]\s]+$/, '').replace(/^in\s+/i, '');
            if (spec !== '') {
              const u = parseLengthUnit(spec);
              if (!u) fail(lineNo, `unknown wavelength unit '${spec}' in header column '${f}'; use nm, µm (um), mm or Å`);
              if (given && u!.symbol !== given.symbol) fail(lineNo, `the header says the wavelengths are in ${u!.symbol} but the unit given is ${given.symbol}`);
              unit = u;
            }
          } else if (/^n$|^index$|^refractive[ _-]?index$/i.test(f)) col = 'n';
          else if (/^k$|^kappa$|^κ$|^extinction$/i.test(f)) col = 'k';
          else return fail(lineNo, `header column ${j + 1} '${f}' is not one of: wavelength (with its unit), n, k`);
          if (cols.includes(col)) fail(lineNo, `header names the ${col} column twice`);
          cols.push(col);
        }
        if (!cols.includes('wavelength') || !cols.includes('n')) fail(lineNo, `the header must name a wavelength column and an n column (found '${content}')`);
        unit ??= given;
        if (!unit) fail(lineNo, `the header does not name the wavelength unit; write e.g. 'wavelength_nm' or 'wavelength (um)', or give the unit`);
        columns = cols;
        continue;
      }
      // no header: wavelength, n[, k]
      if (!given) fail(lineNo, `no header line naming the wavelength unit (e.g. 'wavelength_nm,n,k') and no unit given`);
      unit = given;
      columns = fields.length === 2 ? ['wavelength', 'n'] : ['wavelength', 'n', 'k'];
    }

    if (fields.length !== columns.length) {
      fail(lineNo, `expected ${columns.length} columns (${columns.join(', ')}), found ${fields.length}`);
    }
    const row: Record<Column, number> = { wavelength: NaN, n: NaN, k: 0 };
    for (const [j, col] of columns.entries()) {
      const f = fields[j]!;
      if (!NUMBER.test(f)) fail(lineNo, `${f === '' ? 'empty field' : `'${f}'`} in column ${j + 1} (${col}) is not a number`);
      row[col] = Number(f);
    }
    const u = unit!;
    if (!(row.wavelength > 0 && Number.isFinite(row.wavelength))) fail(lineNo, `wavelength must be > 0, found ${row.wavelength} ${u.symbol}`);
    if (previous && !(row.wavelength > previous.value)) {
      fail(lineNo, `wavelength ${row.wavelength} ${u.symbol} is not greater than ${previous.value} ${u.symbol} on line ${previous.line} (wavelengths must increase strictly)`);
    }
    if (!Number.isFinite(row.n) || row.n < 0) fail(lineNo, `n = ${row.n} is negative`);
    if (!Number.isFinite(row.k) || row.k < 0) fail(lineNo, `k = ${row.k} is negative (κ ≥ 0 is absorbing; gain is not supported)`);
    previous = { value: row.wavelength, line: lineNo };
    x.push(toUm(row.wavelength, u));
    n.push(row.n);
    k.push(row.k);
  }
  if (x.length < 2) {
    throw new MaterialError('invalid-data', `CSV has ${x.length} data row${x.length === 1 ? '' : 's'}; a table needs at least 2`, name);
  }
  return tableMaterial(
    { wavelengthUm: x, n, k },
    { id: name, citation: options.citation ?? 'user table (no citation given)', notes: options.notes ?? [], user: true },
  );
}
