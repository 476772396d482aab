/**
 * Material tables a design names (CSV files beside it): the page has no file access, so it keeps
 * the texts it was given (by `furrow view`, or picked with the design) and reads them from here,
 * with the same outcome as the CLI for a file that is missing.
 */

export type Tables = Record<string, { readonly text: string } | { readonly error: string }>;

/** A `ReadText` over the given texts; a file not given fails with ENOENT, as a missing file does in the CLI. */
export function readerOf(tables: Tables): (file: string) => string {
  return (file) => {
    const t = Object.prototype.hasOwnProperty.call(tables, file) ? tables[file] : undefined;
    if (t && 'text' in t) return t.text;
    const code = t && 'error' in t ? t.error : 'ENOENT';
    throw Object.assign(new Error(code), { code });
  };
}
