/** Plain-text tables for the terminal. Presentation only: no physics here. */
import type { OrderResult, Response, SolveResult } from '../solver/index.ts';
import type { Problem } from '../design/index.ts';

const f = (x: number, d = 6): string => (Number.isFinite(x) ? (Math.abs(x) < 0.5 * 10 ** -d ? 0 : x).toFixed(d) : String(x));
const pad = (s: string, w: number): string => s.padStart(w);

/** Header lines describing the problem. */
export function describeProblem(p: Problem): string[] {
  const { structure: s, incidence: i } = p;
  const orders = typeof p.options.orders === 'number' ? `−${p.options.orders}…${p.options.orders}` : `${p.options.orders.min}…${p.options.orders.max}`;
  const idx = (n: { re: number; im: number }): string => (n.im ? `${+n.re.toFixed(6)}+${+n.im.toFixed(6)}i` : `${+n.re.toFixed(6)}`);
  return [
    `design      ${p.title}`,
    `period      ${f(s.periodUm * 1000, 3)} nm (${f(1000 / s.periodUm, 2)} lines/mm)`,
    `cover       n = ${idx(s.cover)}    substrate n = ${idx(s.substrate)}    layers ${s.layers.length}`,
    `incidence   λ = ${f(i.wavelengthUm * 1000, 3)} nm, θ = ${i.thetaDeg}°, φ = ${i.phiDeg ?? 0}°`,
    `orders      ${orders} retained, ${p.options.factorization ?? 'inverse'}-rule factorization`,
  ];
}

/** Order table: TE and TM efficiencies side by side for each propagating order. */
export function orderTable(r: SolveResult): string[] {
  const lines: string[] = [];
  const section = (title: string, pick: (x: Response) => ReadonlyArray<OrderResult>): void => {
    const ms = new Set<number>();
    for (const x of [r.s, r.p]) for (const o of pick(x)) ms.add(o.m);
    if (ms.size === 0) {
      lines.push(`${title}: no propagating orders`);
      return;
    }
    lines.push(title);
    lines.push(`${pad('order', 6)} ${pad('angle °', 9)} ${pad('TE (s)', 10)} ${pad('TM (p)', 10)} ${pad('unpol.', 10)}`);
    for (const m of [...ms].sort((a, b) => a - b)) {
      const s = pick(r.s).find((o) => o.m === m);
      const p = pick(r.p).find((o) => o.m === m);
      const angle = (s ?? p)!.thetaDeg;
      const es = s?.efficiency ?? 0;
      const ep = p?.efficiency ?? 0;
      lines.push(`${pad(String(m), 6)} ${pad(f(angle, 3), 9)} ${pad(f(es), 10)} ${pad(f(ep), 10)} ${pad(f((es + ep) / 2), 10)}`);
    }
  };
  section('reflected', (x) => x.reflected);
  section('transmitted', (x) => x.transmitted);
  lines.push('totals');
  for (const [k, name] of [['R', 'R (reflected)'], ['T', 'T (transmitted)'], ['A', 'A = 1 − R − T']] as const) {
    lines.push(`${pad(name, 16)} ${pad(f(r.s[k], 9), 13)} ${pad(f(r.p[k], 9), 13)}`);
  }
  return lines;
}
