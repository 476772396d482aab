/**
 * A sweep's rows as file text, shared by the CLI's writer and the browser view so both produce the
 * same bytes: CSV (header = the plan's columns, cells by `formatCell`) or JSON Lines (one object
 * per point, numbers with the CSV's digits, '' as null). A text cell never spans lines.
 */
import { formatCell } from './evaluate.ts';

/** The two row formats. */
export type SweepFormat = 'csv' | 'jsonl';

/** A string cell never spans lines in the output (line breaks inside become spaces). */
function oneLine(v: number | string): number | string {
  return typeof v === 'string' && /[\r\n]/.test(v) ? v.replace(/\s*[\r\n]+\s*/g, ' ') : v;
}

const JSON_NUMBER = /^-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?$/;

/** The JSON value of a cell: numbers as written in the CSV (same digits), '' as null, text as strings. */
function jsonCell(v: number | string): string {
  if (typeof v === 'number') {
    const t = formatCell(v);
    if (JSON_NUMBER.test(t)) return t;
    return t === '' ? 'null' : JSON.stringify(t);
  }
  return v === '' ? 'null' : JSON.stringify(v);
}

/** The text of the file's first line(s) before any row: the column names for CSV, nothing for JSON Lines. */
export function headerText(format: SweepFormat, columns: ReadonlyArray<string>): string {
  return format === 'csv' ? `${columns.map((c) => formatCell(c)).join(',')}\n` : '';
}

/** One row as one line, newline included. */
export function rowText(format: SweepFormat, columns: ReadonlyArray<string>, cells: ReadonlyArray<number | string>): string {
  if (format === 'csv') return `${cells.map((c) => formatCell(oneLine(c))).join(',')}\n`;
  const parts = columns.map((c, i) => `${JSON.stringify(c)}:${jsonCell(oneLine(cells[i] ?? ''))}`);
  return `{${parts.join(',')}}\n`;
}
