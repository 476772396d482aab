/** `furrow orders`: the grating-equation picture of a design, before any rigorous solve. */
import type { Problem } from '../design/index.ts';
import { littrowAngle, orderDirections, rayleighWavelengths } from '../solver/grating-equation.ts';

const DEG = 180 / Math.PI;

export function ordersReport(p: Problem): string[] {
  const { structure: s, incidence: i } = p;
  const lines: string[] = [];
  const nC = s.cover.re;
  const nS = s.substrate.re;
  const dirs = orderDirections({
    wavelength: i.wavelengthUm,
    period: s.periodUm,
    thetaRad: i.thetaDeg / DEG,
    phiRad: (i.phiDeg ?? 0) / DEG,
    nCover: nC,
    nSubstrate: nS,
    mMin: -Math.ceil((2 * Math.max(nC, nS) * s.periodUm) / i.wavelengthUm) - 1,
    mMax: Math.ceil((2 * Math.max(nC, nS) * s.periodUm) / i.wavelengthUm) + 1,
  });
  lines.push(`λ = ${(i.wavelengthUm * 1000).toFixed(3)} nm, period ${(s.periodUm * 1000).toFixed(3)} nm, θ = ${i.thetaDeg}°, φ = ${i.phiDeg ?? 0}°, n cover ${nC}, n substrate ${nS}`);
  lines.push(`${'order'.padStart(6)} ${'reflected θm °'.padStart(16)} ${'transmitted θm °'.padStart(18)}`);
  for (const d of dirs) {
    if (!d.reflected.propagating && !d.transmitted.propagating) continue;
    const r = d.reflected.propagating ? (d.reflected.thetaRad * DEG).toFixed(3) : 'evanescent';
    const t = d.transmitted.propagating ? (d.transmitted.thetaRad * DEG).toFixed(3) : 'evanescent';
    lines.push(`${String(d.m).padStart(6)} ${r.padStart(16)} ${t.padStart(18)}`);
  }
  lines.push('');
  lines.push('Rayleigh anomalies (an order grazes), wavelengths in nm at this angle:');
  for (const m of [-2, -1, 1, 2]) {
    try {
      const w = rayleighWavelengths(m, s.periodUm, i.thetaDeg / DEG, (i.phiDeg ?? 0) / DEG, nC, nS);
      const fmt = (xs: ReadonlyArray<{ wavelength: number }>): string => (xs.length ? xs.map((x) => (x.wavelength * 1000).toFixed(3)).join(', ') : '—');
      lines.push(`  order ${String(m).padStart(2)}: cover ${fmt(w.cover)}; substrate ${fmt(w.substrate)}`);
    } catch {
      // no anomaly for this order at this angle
    }
  }
  lines.push('');
  lines.push('Littrow angles at this wavelength (order returns along the incident beam):');
  for (const m of [-1, -2, -3]) {
    try {
      lines.push(`  order ${m}: θ = ${(littrowAngle(m, i.wavelengthUm, s.periodUm, nC) * DEG).toFixed(4)}°`);
    } catch {
      lines.push(`  order ${m}: none (|mλ/(2Λ)| > n)`);
    }
  }
  return lines;
}
