/**
 * Convergence table of the metallic lamellar grating used throughout the factorization
 * literature (Li & Haggans, J. Opt. Soc. Am. A 10, 1184 (1993); Lalanne & Morris and Li, both
 * J. Opt. Soc. Am. A 13 (1996)): period = wavelength = 1 µm, groove depth 1 µm, fill factor 0.5,
 * ridge and substrate index 0.22 + 6.71i, air cover, θ = 30°, TM (parameters as commonly quoted,
 * from memory). Prints the −1st reflected order's efficiency against M for the inverse and the
 * Laurent rule, and writes reference/metal-lamellar-convergence.json.
 *
 * Run: npx tsx scripts/convergence-metal.ts [--max 160]
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { solve } from '../src/solver/index.ts';
import type { Structure } from '../src/solver/index.ts';

export const metalLamellar: Structure = {
  periodUm: 1,
  cover: { re: 1, im: 0 },
  substrate: { re: 0.22, im: 6.71 },
  layers: [
    {
      thicknessUm: 1,
      profile: {
        kind: 'segments',
        segments: [
          { from: 0, to: 0.5, index: { re: 0.22, im: 6.71 } },
          { from: 0.5, to: 1, index: { re: 1, im: 0 } },
        ],
      },
    },
  ],
};

export function minusFirstTM(M: number, factorization: 'inverse' | 'laurent'): number {
  const r = solve(metalLamellar, { wavelengthUm: 1, thetaDeg: 30 }, { orders: M, factorization });
  return r.p.reflected.find((o) => o.m === -1)!.efficiency;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const maxArg = process.argv.indexOf('--max');
  const max = maxArg > 0 ? Number(process.argv[maxArg + 1]) : 160;
  const Ms = [5, 10, 15, 20, 30, 40, 60, 80, 100, 120, 160].filter((m) => m <= max);
  const rows: Array<{ M: number; inverse: number; laurent: number }> = [];
  console.log('   M   inverse rule   Laurent rule');
  for (const M of Ms) {
    const row = { M, inverse: minusFirstTM(M, 'inverse'), laurent: minusFirstTM(M, 'laurent') };
    rows.push(row);
    console.log(`${String(M).padStart(4)}   ${row.inverse.toFixed(8)}     ${row.laurent.toFixed(8)}`);
  }
  const out = {
    source:
      'computed by Furrow (scripts/convergence-metal.ts) for the benchmark of Li & Haggans, J. Opt. Soc. Am. A 10, 1184 (1993); parameters as commonly quoted, from memory. A record of behaviour, not an outside truth: the tests check settling and the common limit, not these digits.',
    structure: 'period 1 µm, depth 1 µm, fill 0.5, ridge and substrate 0.22+6.71i, air cover',
    incidence: { wavelengthUm: 1, thetaDeg: 30, polarization: 'TM' },
    quantity: 'efficiency of reflected order -1',
    rows,
  };
  writeFileSync(new URL('../reference/metal-lamellar-convergence.json', import.meta.url), JSON.stringify(out, null, 2) + '\n');
}
