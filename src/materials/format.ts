/** Number formatting shared by messages and listings of the materials layer (internal). */

/** A length in µm with up to 7 significant digits and no trailing zeros: 0.2066403, 12.39842, 15. */
export function formatUm(x: number): string {
  if (x === Infinity) return '∞';
  if (!Number.isFinite(x)) return String(x);
  return String(Number(x.toPrecision(7)));
}

/** A valid range as text: "0.21–3.71 µm", or "all wavelengths" for [0, ∞). */
export function formatRangeUm(r: readonly [number, number]): string {
  if (r[0] === 0 && r[1] === Infinity) return 'all wavelengths';
  return `${formatUm(r[0])}–${formatUm(r[1])} µm`;
}

const LABELS: Record<string, string> = {
  constant: 'constant',
  sellmeier: 'Sellmeier',
  cauchy: 'Cauchy',
  drude: 'Drude',
  'lorentz-drude': 'Lorentz–Drude',
  table: 'table',
};

/** The model's name as prose: 'Sellmeier', 'Lorentz–Drude', 'table', … */
export function modelLabel(kind: string): string {
  return LABELS[kind] ?? kind;
}
