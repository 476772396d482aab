/**
 * `furrow fields`: near fields of a design under one polarization — the peak |E|² per material
 * (the figure laser-damage design minimizes in high-power gratings) and, with --output, the
 * whole x–z grid as CSV. Presentation only; the physics is nearField() in the solver.
 */
import { createWriteStream } from 'node:fs';
import type { Command } from 'commander';
import type { Problem } from '../design/index.ts';
import { type NearField, nearField } from '../solver/index.ts';

export const LASER_CAUTION =
  'caution: field-enhancement figures are design estimates, not laser-damage thresholds; damage depends on pulse length, ' +
  'material quality and contamination. Follow laser-safety rules, local regulations and licensed practice.';

export interface FieldsOptions {
  pol: 'TE' | 'TM';
  periods: number;
  nx: number;
  output?: string;
}

/** Lines of the peak report. */
export function fieldsReport(p: Problem, f: NearField, pol: string): string[] {
  const name = (idx: { re: number; im: number }): string => {
    const m = p.materials.find((x) => x.index.re === idx.re && x.index.im === idx.im);
    return m ? m.name : `n = ${idx.re}${idx.im ? `+${idx.im}i` : ''}`;
  };
  const lines = [
    `near field, ${pol}, λ = ${(p.incidence.wavelengthUm * 1000).toFixed(3)} nm, θ = ${p.incidence.thetaDeg}°: |E|² relative to the incident wave`,
    `${'material'.padEnd(20)} ${'peak |E|²'.padStart(10)} ${'at x (nm)'.padStart(10)} ${'at z (nm)'.padStart(10)}  region`,
  ];
  const L = p.structure.layers.length;
  for (const k of f.peaks) {
    const region = k.region < 0 ? 'cover' : k.region >= L ? 'substrate' : `layer ${k.region + 1}`;
    lines.push(`${name(k.index).padEnd(20)} ${k.peak.toFixed(4).padStart(10)} ${(k.xUm * 1000).toFixed(1).padStart(10)} ${(k.zUm * 1000).toFixed(1).padStart(10)}  ${region}`);
  }
  lines.push('', LASER_CAUTION);
  return lines;
}

/** Write the grid as CSV: x_nm, z_nm, region, |E|², then re/im of every component. */
export async function writeFieldsCsv(path: string, f: NearField): Promise<void> {
  const out = createWriteStream(path);
  const nx = f.xUm.length;
  out.write('x_nm,z_nm,region,E2,Ex_re,Ex_im,Ey_re,Ey_im,Ez_re,Ez_im,Hx_re,Hx_im,Hy_re,Hy_im,Hz_re,Hz_im\n');
  for (let iz = 0; iz < f.zUm.length; iz++) {
    let chunk = '';
    for (let i = 0; i < nx; i++) {
      const p = iz * nx + i;
      const c = (a: Float64Array): string => `${a[2 * p]},${a[2 * p + 1]}`;
      chunk += `${f.xUm[i]! * 1000},${f.zUm[iz]! * 1000},${f.region[iz]},${f.intensity[p]},${c(f.E.x)},${c(f.E.y)},${c(f.E.z)},${c(f.H.x)},${c(f.H.y)},${c(f.H.z)}\n`;
    }
    if (!out.write(chunk)) await new Promise<void>((r) => out.once('drain', () => r()));
  }
  await new Promise<void>((resolve, reject) => out.end((e?: Error | null) => (e ? reject(e) : resolve())));
}

/** Add `furrow fields` to the program. */
export function registerFieldsCommand(program: Command, out: (s: string) => void, load: (path: string) => Problem, fail: (msg: string) => never): void {
  program
    .command('fields')
    .description('near fields: peak |E|² per material, and the x–z grid as CSV')
    .argument('<design>', 'design file (JSON)')
    .option('--pol <TE|TM>', 'incident polarization', 'TE')
    .option('--periods <n>', 'periods across x', '2')
    .option('--nx <n>', 'samples across x', '128')
    .option('--output <file.csv>', 'write the whole grid (x, z, |E|², E and H components)')
    .option('--json', 'print the peaks as JSON')
    .action(async (design: string, o: { pol: string; periods: string; nx: string; output?: string; json?: boolean }) => {
      if (o.pol !== 'TE' && o.pol !== 'TM') fail(`--pol: expected TE or TM, found "${o.pol}"`);
      const periods = Number(o.periods);
      const nx = Number(o.nx);
      if (!(Number.isInteger(periods) && periods >= 1 && periods <= 20)) fail(`--periods: expected an integer 1…20, found "${o.periods}"`);
      if (!(Number.isInteger(nx) && nx >= 2 && nx <= 4096)) fail(`--nx: expected an integer 2…4096, found "${o.nx}"`);
      const p = load(design);
      const f = nearField(p.structure, p.incidence, p.options, o.pol as 'TE' | 'TM', { periods, nx });
      if (o.output) await writeFieldsCsv(o.output, f);
      if (o.json) {
        out(JSON.stringify({ polarization: o.pol, wavelengthUm: p.incidence.wavelengthUm, peaks: f.peaks, caution: LASER_CAUTION }, null, 2));
        return;
      }
      for (const l of fieldsReport(p, f, o.pol)) out(l);
      if (o.output) out(`grid of ${f.zUm.length} × ${f.xUm.length} points written to ${o.output}`);
    });
}
