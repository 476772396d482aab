/** Write a table of n, k as CSV text in the format {@link parseMaterialCsv} reads. */
import { fromUm, requireLengthUnit } from './length-unit.ts';
import type { TableData } from './table.ts';

/** Options of {@link tableToCsv}. */
export interface CsvWriteOptions {
  /** wavelength unit of the file: 'nm' (default), 'um'/'µm', 'mm', 'Å' */
  readonly unit?: string;
  /** comment lines written first, each prefixed with '# ' */
  readonly comments?: readonly string[];
}

/**
 * Format a table as CSV text with a header naming the unit (`wavelength_nm,n,k`). Wavelengths are
 * written with 15 significant digits (so 0.4959 µm reads "495.9", not "495.90000000000003"); n and
 * k with the shortest text that reads back to the same double.
 * @param table wavelengthUm (µm), n and optional k (zeros when omitted)
 * @param options unit and comment lines
 * @returns the CSV text, newline-terminated
 * @throws {MaterialError} 'invalid-argument' for an unknown unit
 * @example
 * tableToCsv({ wavelengthUm: [0.4, 0.5], n: [1.47, 1.46] }); // "wavelength_nm,n,k\n400,1.47,0\n500,1.46,0\n"
 */
export function tableToCsv(table: TableData, options: CsvWriteOptions = {}): string {
  const unit = requireLengthUnit(options.unit ?? 'nm', undefined);
  const head = { nm: 'wavelength_nm', 'µm': 'wavelength_um', mm: 'wavelength_mm', 'Å': 'wavelength (Å)' }[unit.symbol];
  const out: string[] = [];
  for (const c of options.comments ?? []) for (const line of c.split(/\r\n|\n|\r/)) out.push(`# ${line}`);
  out.push(`${head},n,k`);
  table.wavelengthUm.forEach((x, i) => {
    const w = String(Number(fromUm(x, unit).toPrecision(15)));
    out.push(`${w},${String(table.n[i])},${String(table.k?.[i] ?? 0)}`);
  });
  return out.join('\n') + '\n';
}
