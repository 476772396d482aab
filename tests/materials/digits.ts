/**
 * Tolerance "to the source's digits": half a unit in the last digit written, so "1.45846" allows
 * ±5e-6 and "5.0930e-4" allows ±5e-9. A hair of relative slack (1e-12) absorbs the binary
 * representation of the decimal value itself.
 */
export function halfUlpOfDecimal(text: string): number {
  const m = /^[+-]?(\d+)(?:\.(\d*))?(?:[eE]([+-]?\d+))?$/.exec(text.trim());
  if (!m) throw new Error(`not a decimal number: ${text}`);
  const decimals = (m[2] ?? '').length;
  const exponent = m[3] ? Number(m[3]) : 0;
  return 0.5 * 10 ** (exponent - decimals);
}

/** |actual − value| within half a unit of the value's last written digit. */
export function matchesDigits(actual: number, text: string): boolean {
  const v = Number(text);
  return Math.abs(actual - v) <= halfUlpOfDecimal(text) * (1 + 1e-9) + 1e-12 * Math.abs(v);
}
