/**
 * The demo behind `npm start`: sweep the example blazed grating over its band in Littrow for
 * TE and TM on every core, write the CSV, and summarize it the way a spectrometer engineer reads
 * a grating's efficiency curve. The design is an invented example, not a product.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import example from '../design/examples/blazed-aluminium-spectrometer.json' with { type: 'json' };
import { sweepCommand } from './sweep-command.ts';
import { csvFields } from './sweep-output.ts';

export const DEMO_DESIGN_PATH = fileURLToPath(new URL('../design/examples/blazed-aluminium-spectrometer.json', import.meta.url));

/** Parse the sweep's CSV by column name: numbers, null for empty or text cells (a failed row's). */
export function readCsvColumns(text: string): Map<string, Array<number | null>> {
  const lines = text.trim().split('\n');
  const header = csvFields(lines[0]!) ?? [];
  const cols = new Map<string, Array<number | null>>(header.map((h) => [h, []]));
  for (const line of lines.slice(1)) {
    const cells = csvFields(line) ?? [];
    header.forEach((h, i) => {
      const c = cells[i] ?? '';
      cols.get(h)!.push(c === '' || Number.isNaN(Number(c)) ? null : Number(c));
    });
  }
  return cols;
}

/**
 * The summary of a Littrow sweep of order −1: peak efficiency and where, the blaze wavelength
 * λB = 2Λ·sinθB (common practice), the band where the efficiency exceeds 50 %, and the energy
 * balance (R + T ≤ 1, absorption range).
 */
export function summarizeBlazeSweep(cols: Map<string, Array<number | null>>, periodUm: number, blazeDeg: number): string[] {
  const wl = cols.get('wavelength_nm')!.map((v) => v!);
  const lines: string[] = [];
  const lambdaB = 2 * periodUm * Math.sin((blazeDeg * Math.PI) / 180) * 1000;
  lines.push(`blaze wavelength λB = 2Λ·sinθB = ${lambdaB.toFixed(1)} nm (first order, Littrow)`);
  for (const [tag, name] of [['TE', 'TE'], ['TM', 'TM'], ['unpol', 'unpolarized']] as const) {
    const eta = cols.get(`R_-1_${tag}`);
    if (!eta) continue;
    let best = -1;
    for (let i = 0; i < eta.length; i++) if (eta[i] !== null && (best < 0 || eta[i]! > eta[best]!)) best = i;
    const above = wl.filter((_, i) => (eta[i] ?? 0) > 0.5);
    const band = above.length ? `${Math.min(...above).toFixed(0)}–${Math.max(...above).toFixed(0)} nm` : 'nowhere';
    lines.push(`order −1, ${name.padEnd(11)}: peak ${(100 * eta[best]!).toFixed(1)} % at ${wl[best]!.toFixed(1)} nm; above 50 % over ${band}`);
  }
  let worst = -Infinity;
  let aMin = Infinity;
  let aMax = -Infinity;
  for (const pol of ['TE', 'TM']) {
    const R = cols.get(`R_${pol}`);
    const T = cols.get(`T_${pol}`);
    const A = cols.get(`A_${pol}`);
    if (!R || !T || !A) continue;
    for (let i = 0; i < R.length; i++) {
      worst = Math.max(worst, R[i]! + T[i]! - 1);
      aMin = Math.min(aMin, A[i]!);
      aMax = Math.max(aMax, A[i]!);
    }
  }
  const sound = worst <= 1e-12 && aMin >= -1e-12;
  lines.push(
    sound
      ? `energy balance: R + T ≤ 1 at every point (closest: R + T = ${(1 + worst).toFixed(4)}); absorption A = 1 − R − T from ${(100 * aMin).toFixed(1)} to ${(100 * aMax).toFixed(1)} %`
      : `energy balance VIOLATED: R + T − 1 reaches ${worst.toExponential(2)} — report this design`,
  );
  return lines;
}

/** Run the demo sweep and print its summary; returns the CSV path. */
export async function runDemo(out: (s: string) => void, output = 'furrow-demo.csv', quiet = false): Promise<string> {
  const design = example as { grooveDensityPerMm: number; grating: { blazeDeg: number } };
  out('Furrow demo: a blazed, aluminium-coated reflection grating for a visible spectrometer (an invented example),');
  out('swept over 400–700 nm in Littrow for order −1, TE and TM, on every core.');
  out('');
  const r = await sweepCommand(
    DEMO_DESIGN_PATH,
    { output, overwrite: true, quiet, param: ['incidence.wavelength=400nm:700nm:31'], littrow: '-1', ordersOut: '-1,0', sides: 'R,T', pol: 'TE,TM,unpolarized' },
    ['furrow', 'demo'],
    out,
  );
  out('');
  for (const l of summarizeBlazeSweep(readCsvColumns(readFileSync(output, 'utf8')), 1000 / design.grooveDensityPerMm, design.grating.blazeDeg)) out(l);
  out('');
  out(`${r.written} points in ${r.seconds.toFixed(1)} s; every point's row is in ${output} (columns: wavelength_nm, theta_deg, R_-1_TE, …)`);
  out('next: npx furrow solve src/design/examples/blazed-aluminium-spectrometer.json   (one point, converged)');
  return output;
}
