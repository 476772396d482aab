/**
 * Output columns of a sweep and their values at a point. Internal to src/sweep.
 *
 * Names (units in the names): efficiencies `R_-1_TE`, `T_0_unpol`; totals `R_TM`, `T_TM`,
 * `A_TM`; phases `phase_R_-1_TE_deg`; relative efficiencies `Rrel_-1_TE`; polarization-dependent
 * loss `PDL_R_-1_dB`. Polarization tags: TE, TM, unpol (mean of TE and TM), req (the design's
 * polarization).
 *
 * Values: an order that does not propagate at the point carries no power, so its efficiency is
 * 0; a value that cannot exist there — the phase, relative efficiency or PDL of an order that
 * does not propagate, a ratio whose denominator is 0, an order outside the retained window — is
 * '' (empty).
 */
import type { OrderResult, Response, SolveResult } from '../solver/index.ts';
import type { OutputSpec } from './types.ts';

type Side = 'R' | 'T';
type Pol = OutputSpec['polarizations'][number];

/** One output column. */
export type OutputCell =
  | { readonly kind: 'eff'; readonly side: Side; readonly m: number; readonly pol: Pol }
  | { readonly kind: 'total'; readonly what: 'R' | 'T' | 'A'; readonly pol: Pol }
  | { readonly kind: 'phase'; readonly side: Side; readonly m: number; readonly pol: 'TE' | 'TM' }
  | { readonly kind: 'rel'; readonly m: number; readonly pol: Pol }
  | { readonly kind: 'pdl'; readonly side: Side; readonly m: number };

const TAG: Readonly<Record<Pol, string>> = { TE: 'TE', TM: 'TM', unpolarized: 'unpol', requested: 'req' };

/** The output columns in CSV order: efficiencies, totals, phases, relative, PDL. */
export function outputCells(o: OutputSpec, orders: ReadonlyArray<number>): OutputCell[] {
  const out: OutputCell[] = [];
  for (const side of o.sides) for (const m of orders) for (const pol of o.polarizations) out.push({ kind: 'eff', side, m, pol });
  if (o.totals) {
    for (const pol of o.polarizations) {
      for (const what of ['R', 'T'] as const) if (o.sides.includes(what)) out.push({ kind: 'total', what, pol });
      out.push({ kind: 'total', what: 'A', pol });
    }
  }
  if (o.phases) {
    const pols = o.polarizations.filter((p): p is 'TE' | 'TM' => p === 'TE' || p === 'TM');
    for (const side of o.sides) for (const m of orders) for (const pol of pols) out.push({ kind: 'phase', side, m, pol });
  }
  if (o.relative) for (const m of orders) for (const pol of o.polarizations) out.push({ kind: 'rel', m, pol });
  if (o.pdl) for (const side of o.sides) for (const m of orders) out.push({ kind: 'pdl', side, m });
  return out;
}

/** CSV column name of an output. */
export function cellName(c: OutputCell): string {
  switch (c.kind) {
    case 'eff':
      return `${c.side}_${c.m}_${TAG[c.pol]}`;
    case 'total':
      return `${c.what}_${TAG[c.pol]}`;
    case 'phase':
      return `phase_${c.side}_${c.m}_${TAG[c.pol]}_deg`;
    case 'rel':
      return `Rrel_${c.m}_${TAG[c.pol]}`;
    case 'pdl':
      return `PDL_${c.side}_${c.m}_dB`;
  }
}

/** Lookup of a point's results. */
export class PointResults {
  readonly #byResp = new Map<Response, { R: Map<number, OrderResult>; T: Map<number, OrderResult> }>();
  readonly #min: number;
  readonly #max: number;
  /**
   * @param result the point's solve
   * @param flat the solve of the flat reference surface (for relative efficiencies)
   */
  constructor(
    readonly result: SolveResult,
    readonly flat?: SolveResult,
  ) {
    this.#min = result.orders[0]!;
    this.#max = result.orders[result.orders.length - 1]!;
  }

  #response(pol: 'TE' | 'TM' | 'requested', r: SolveResult = this.result): Response {
    const resp = pol === 'TE' ? r.s : pol === 'TM' ? r.p : r.requested;
    if (!resp) throw new Error('sweep: the requested polarization was not solved (the plan should have required one)');
    return resp;
  }

  /** the propagating order m of a response and side, or undefined */
  #order(resp: Response, side: Side, m: number): OrderResult | undefined {
    let maps = this.#byResp.get(resp);
    if (!maps) {
      maps = { R: new Map(resp.reflected.map((o) => [o.m, o])), T: new Map(resp.transmitted.map((o) => [o.m, o])) };
      this.#byResp.set(resp, maps);
    }
    return maps[side].get(m);
  }

  /** efficiency of order m: its value when it propagates, 0 when it is retained but does not, '' when not retained */
  efficiency(side: Side, m: number, pol: Pol): number | '' {
    if (pol === 'unpolarized') {
      const a = this.efficiency(side, m, 'TE');
      const b = this.efficiency(side, m, 'TM');
      return a === '' || b === '' ? '' : 0.5 * (a + b);
    }
    const o = this.#order(this.#response(pol), side, m);
    if (o) return o.efficiency;
    return m >= this.#min && m <= this.#max ? 0 : '';
  }

  #flatR(pol: Pol): number {
    if (!this.flat) throw new Error('sweep: relative efficiency without the flat reference solve');
    if (pol === 'unpolarized') return this.flat.s.R + this.flat.p.R;
    return this.#response(pol, this.flat).R;
  }

  value(c: OutputCell): number | '' {
    switch (c.kind) {
      case 'eff':
        return this.efficiency(c.side, c.m, c.pol);
      case 'total': {
        if (c.pol === 'unpolarized') return 0.5 * (this.result.s[c.what] + this.result.p[c.what]);
        return this.#response(c.pol)[c.what];
      }
      case 'phase': {
        const o = this.#order(this.#response(c.pol), c.side, c.m);
        if (!o) return '';
        const a = c.pol === 'TE' ? o.amplitudeS : o.amplitudeP;
        return (Math.atan2(a.im, a.re) * 180) / Math.PI;
      }
      case 'rel': {
        if (!this.#order(this.result.s, 'R', c.m)) return '';
        const eta = c.pol === 'unpolarized' ? sum(this.efficiency('R', c.m, 'TE'), this.efficiency('R', c.m, 'TM')) : this.efficiency('R', c.m, c.pol);
        const ref = this.#flatR(c.pol);
        return eta === '' || !(ref > 0) ? '' : eta / ref;
      }
      case 'pdl': {
        const a = this.#order(this.result.s, c.side, c.m);
        const b = this.#order(this.result.p, c.side, c.m);
        if (!a || !b) return '';
        const lo = Math.min(a.efficiency, b.efficiency);
        const hi = Math.max(a.efficiency, b.efficiency);
        return lo > 0 ? 10 * Math.log10(hi / lo) : '';
      }
    }
  }
}

function sum(a: number | '', b: number | ''): number | '' {
  return a === '' || b === '' ? '' : a + b;
}
