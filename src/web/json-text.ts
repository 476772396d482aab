/**
 * Design JSON as people write it: two-space indentation, with small objects and arrays kept on
 * one line (`"incidence": { "wavelength": "500 nm", "angleDeg": 8.63 }`).
 */

const WIDTH = 88;

function inline(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(inline).join(', ')}]`;
  if (v !== null && typeof v === 'object') {
    const parts = Object.entries(v as Record<string, unknown>)
      .filter(([, x]) => x !== undefined)
      .map(([k, x]) => `${JSON.stringify(k)}: ${inline(x)}`);
    return parts.length ? `{ ${parts.join(', ')} }` : '{}';
  }
  return JSON.stringify(v) ?? 'null';
}

function block(v: unknown, indent: string, lead: number): string {
  const one = inline(v);
  if (v === null || typeof v !== 'object' || indent.length + lead + one.length <= WIDTH) return one;
  const inner = `${indent}  `;
  if (Array.isArray(v)) return `[\n${v.map((x) => inner + block(x, inner, 0)).join(',\n')}\n${indent}]`;
  const entries = Object.entries(v as Record<string, unknown>).filter(([, x]) => x !== undefined);
  return `{\n${entries.map(([k, x]) => `${inner}${JSON.stringify(k)}: ${block(x, inner, JSON.stringify(k).length + 2)}`).join(',\n')}\n${indent}}`;
}

/** Format a design object; the top level always spans lines. */
export function designText(d: unknown): string {
  if (d === null || typeof d !== 'object' || Array.isArray(d)) return JSON.stringify(d, null, 2);
  const entries = Object.entries(d as Record<string, unknown>).filter(([, x]) => x !== undefined);
  return `{\n${entries.map(([k, x]) => `  ${JSON.stringify(k)}: ${block(x, '  ', JSON.stringify(k).length + 2)}`).join(',\n')}\n}\n`;
}
