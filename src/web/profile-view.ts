/**
 * The cross-section drawing: the design's layers over two periods as the solver sees them (the
 * staircase slices of `crossSection`), with the cover above and the substrate below, one colour
 * per material, a legend with each material's index at the design wavelength, the period and the
 * height marked. Thin profiles are drawn with their heights stretched, and the drawing says so.
 */
import { parseIndexLiteral, type DesignModel } from '../design/index.ts';
import { crossSection } from '../structure/index.ts';
import type { Complex } from '../solver/index.ts';

const W = 760;
const H = 300;
const LEFT = 78;
const RIGHT = 200;
const TOP = 30;
const BOTTOM = 30;
const BAND = 34;

const esc = (s: string): string => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/** Index of a material at the design wavelength, or null when it cannot be evaluated there. */
function indexOf(model: DesignModel, name: string): Complex | null {
  const lit = parseIndexLiteral(name);
  if (lit) return lit;
  try {
    return model.library.evaluate(name, model.incidence.wavelengthUm, { allowExtrapolation: true }).index;
  } catch {
    return null;
  }
}

const TRANSPARENT = ['#cfe1ee', '#b5d0e3', '#9bbfd9', '#83aecd', '#6c9dc1'];
const ABSORBING = ['#e3cfae', '#d6bb8c', '#c9a76c'];

/** A fill for a material: near-white for n ≈ 1, blues deepening with the index for transparent media, greys for metals, gold and copper tones where the name says so. */
export function materialColour(name: string, n: Complex | null): string {
  const key = name.toLowerCase();
  if (/^(air|vacuum)$/.test(key)) return '#fbfcfd';
  if (/^au\b|gold/.test(key)) return '#d9ad45';
  if (/^cu\b|copper/.test(key)) return '#c98158';
  if (!n) return '#d9d3e6';
  if (n.im > 1 && n.im > n.re) return /^ag\b|silver/.test(key) ? '#d5dbe0' : '#9aa5b0';
  if (n.re < 1.05 && n.im < 1e-3) return '#fbfcfd';
  if (n.im > 0.05) return ABSORBING[Math.min(ABSORBING.length - 1, Math.floor(n.im))]!;
  return TRANSPARENT[Math.max(0, Math.min(TRANSPARENT.length - 1, Math.floor((n.re - 1.3) / 0.3)))]!;
}

function fmtIndex(n: Complex | null): string {
  if (!n) return 'index not available at λ';
  const re = n.re.toFixed(3);
  return Math.abs(n.im) < 5e-4 ? `n = ${re}` : `ñ = ${re} ${n.im < 0 ? '−' : '+'} ${Math.abs(n.im).toFixed(3)}i`;
}

/** A pleasant number of nanometres or micrometres for a length given in µm. */
export function lengthLabel(um: number): string {
  return um < 1 ? `${Number((um * 1000).toPrecision(4))} nm` : `${Number(um.toPrecision(4))} µm`;
}

/** SVG text of the drawing (its own width and height; scales with its container). */
export function profileSvg(model: DesignModel, periods = 2): string {
  const cs = crossSection(model.geometry, model.periodUm, periods);
  const plotW = W - LEFT - RIGHT;
  const sx = plotW / cs.widthUm;
  const avail = H - TOP - BOTTOM - 2 * BAND;
  const natural = cs.heightUm * sx;
  // stretch thin structures to at least half the space; squeeze tall ones to fit
  let k = 1;
  if (natural > 0 && natural < 0.5 * avail) k = Math.min(200, (0.5 * avail) / natural);
  if (natural > avail) k = avail / natural;
  if (k > 1) k = k >= 10 ? Math.round(k) : Math.round(k * 10) / 10;
  const sz = sx * k;
  const structH = cs.heightUm * sz;
  const top = TOP + BAND;
  const bottom = top + structH;
  const subBottom = H - BOTTOM;
  const X = (x: number): number => LEFT + x * sx;
  const Z = (z: number): number => top + z * sz;

  const materials: string[] = [];
  const see = (m: string): void => {
    if (!materials.includes(m)) materials.push(m);
  };
  see(model.cover);
  for (const p of cs.polygons) see(p.material);
  see(model.substrate);
  const index = new Map(materials.map((m) => [m, indexOf(model, m)] as const));
  const colour = new Map(materials.map((m) => [m, materialColour(m, index.get(m) ?? null)] as const));

  const parts: string[] = [];
  parts.push(`<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${W} ${H}" class="xsec" role="img" aria-label="cross-section of the grating over ${periods} periods">`);
  parts.push('<defs>');
  cs.polygons.forEach((p, i) => {
    if (!p.modulation) return;
    // ε = ε₀ + Δε·cos(2πx/Λ − φ): darker where ε is larger
    const stops: string[] = [];
    for (let s = 0; s <= 16; s++) {
      const c = Math.cos(2 * Math.PI * (s / 16) - p.modulation.phaseRad);
      const o = 0.5 + 0.45 * c * Math.sign(p.modulation.deltaEps || 1);
      stops.push(`<stop offset="${s / 16}" stop-color="#2f5f86" stop-opacity="${o.toFixed(3)}"/>`);
    }
    parts.push(`<linearGradient id="mod${i}" x1="0" x2="1" y1="0" y2="0">${stops.join('')}</linearGradient>`);
  });
  parts.push('</defs>');
  // cover and substrate bands
  parts.push(`<rect x="${LEFT}" y="${TOP}" width="${plotW}" height="${BAND}" fill="${colour.get(model.cover)}" class="band"/>`);
  parts.push(`<rect x="${LEFT}" y="${bottom}" width="${plotW}" height="${Math.max(0, subBottom - bottom)}" fill="${colour.get(model.substrate)}" class="band"/>`);
  // slices
  cs.polygons.forEach((p, i) => {
    const xs = p.points.map((q) => q[0]);
    const zs = p.points.map((q) => q[1]);
    const x0 = X(Math.min(...xs));
    const x1 = X(Math.max(...xs));
    const z0 = Z(Math.min(...zs));
    const z1 = Z(Math.max(...zs));
    const fill = colour.get(p.material)!;
    // an outline in the fill colour closes the hairline seams between neighbours
    parts.push(
      `<rect x="${x0.toFixed(2)}" y="${z0.toFixed(2)}" width="${(x1 - x0).toFixed(2)}" height="${(z1 - z0).toFixed(2)}" fill="${fill}" stroke="${fill}" stroke-width="0.6" data-material="${esc(p.material)}" data-layer="${p.layer}"/>`,
    );
    if (p.modulation) parts.push(`<rect x="${x0.toFixed(2)}" y="${z0.toFixed(2)}" width="${(x1 - x0).toFixed(2)}" height="${(z1 - z0).toFixed(2)}" fill="url(#mod${i})"/>`);
  });
  // frame and period marks
  parts.push(`<rect x="${LEFT}" y="${TOP}" width="${plotW}" height="${subBottom - TOP}" fill="none" class="frame"/>`);
  for (let p = 0; p <= periods; p++) {
    const x = X(p * model.periodUm);
    parts.push(`<line x1="${x}" x2="${x}" y1="${subBottom}" y2="${subBottom + 5}" class="tick"/>`);
    parts.push(`<text x="${x}" y="${subBottom + 18}" class="tick-label" text-anchor="middle">${p === 0 ? '0' : `${p === 1 ? '' : p}Λ`}</text>`);
  }
  const xa = X(0);
  const xb = X(model.periodUm);
  const yd = TOP - 10;
  parts.push(`<line x1="${xa}" x2="${xb}" y1="${yd}" y2="${yd}" class="dim" marker-start="" />`);
  parts.push(`<line x1="${xa}" x2="${xa}" y1="${yd - 5}" y2="${yd + 5}" class="dim"/><line x1="${xb}" x2="${xb}" y1="${yd - 5}" y2="${yd + 5}" class="dim"/>`);
  parts.push(`<text x="${(xa + xb) / 2}" y="${yd - 4}" class="dim-label" text-anchor="middle">Λ = ${esc(lengthLabel(model.periodUm))}</text>`);
  // height bar
  if (cs.heightUm > 0) {
    const xh = LEFT - 14;
    parts.push(`<line x1="${xh}" x2="${xh}" y1="${top}" y2="${bottom}" class="dim"/>`);
    parts.push(`<line x1="${xh - 5}" x2="${xh + 5}" y1="${top}" y2="${top}" class="dim"/><line x1="${xh - 5}" x2="${xh + 5}" y1="${bottom}" y2="${bottom}" class="dim"/>`);
    const ym = (top + bottom) / 2;
    parts.push(`<text x="${xh - 6}" y="${ym}" class="dim-label" text-anchor="end" dominant-baseline="middle" data-height-um="${cs.heightUm}">${esc(lengthLabel(cs.heightUm))}</text>`);
    if (k !== 1) parts.push(`<text x="${xh - 6}" y="${ym + 14}" class="note-label" text-anchor="end" dominant-baseline="middle">heights ×${k < 1 ? k.toFixed(2) : k}</text>`);
  }
  parts.push(`<text x="${LEFT + 6}" y="${TOP + BAND / 2}" class="band-label" dominant-baseline="middle">cover</text>`);
  parts.push(`<text x="${LEFT + 6}" y="${(bottom + subBottom) / 2}" class="band-label" dominant-baseline="middle">substrate</text>`);
  // legend
  const lx = W - RIGHT + 16;
  materials.forEach((m, i) => {
    const y = TOP + i * 36;
    parts.push(`<rect x="${lx}" y="${y}" width="16" height="16" fill="${colour.get(m)}" class="swatch"/>`);
    parts.push(`<text x="${lx + 24}" y="${y + 8}" class="legend-name" dominant-baseline="middle">${esc(m)}</text>`);
    parts.push(`<text x="${lx + 24}" y="${y + 24}" class="legend-index" dominant-baseline="middle">${esc(fmtIndex(index.get(m) ?? null))}</text>`);
  });
  parts.push('</svg>');
  return parts.join('');
}
