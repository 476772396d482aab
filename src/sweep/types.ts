/**
 * Records of a sweep: what is varied, how points are formed, which outputs become columns, and
 * the rows that come back. Everything here is plain JSON (structured-clonable) so a plan can be
 * sent to worker threads, Web Workers or another machine unchanged.
 */

/** One swept parameter. */
export interface SweepAxis {
  /**
   * Path of the design field it sets, dotted, with [i] for list items:
   * 'incidence.wavelength', 'incidence.angleDeg', 'grating.depth', 'grating.duty',
   * 'grating.coating.thickness', 'period', 'layers[2].thickness', 'orders', 'slices',
   * 'incidence.polarization' (values 'TE', 'TM' or Jones), …
   */
  readonly path: string;
  /** the values, in the unit of `unit` for lengths (numbers), or raw values (strings, numbers) */
  readonly values: ReadonlyArray<number | string>;
  /** unit of numeric length values ('nm', 'um', 'mm'), angle unit 'deg', or null for unitless */
  readonly unit: string | null;
  /** CSV column name, with the unit (e.g. 'wavelength_nm', 'angle_deg', 'depth_nm', 'duty') */
  readonly column: string;
}

/** How the incidence angle is set at each point. */
export type Mount =
  | { readonly kind: 'fixed' }
  /** Littrow for order m: θ follows λ, 2·n_c·Λ·sinθ = −m·λ */
  | { readonly kind: 'littrow'; readonly order: number }
  /** constant deviation 2K between incident and diffracted beams, order m (monochromator) */
  | { readonly kind: 'deviation'; readonly order: number; readonly deviationDeg: number };

/** Which numbers each point reports (each becomes one or more CSV columns). */
export interface OutputSpec {
  /** orders by index, or 'all' for every order propagating at any corner of the sweep (see planSweep) */
  readonly orders: ReadonlyArray<number> | 'all';
  /** reflected (R) and/or transmitted (T) */
  readonly sides: ReadonlyArray<'R' | 'T'>;
  /** 'TE', 'TM', 'unpolarized' (mean of TE and TM), 'requested' (the design's polarization) */
  readonly polarizations: ReadonlyArray<'TE' | 'TM' | 'unpolarized' | 'requested'>;
  /** R, T and A totals per polarization */
  readonly totals: boolean;
  /** phases (deg) of the orders' amplitudes on their own s (TE) and p (TM) */
  readonly phases: boolean;
  /** efficiency over the reflectance of a flat surface of the coating (or ridge) material */
  readonly relative: boolean;
  /** polarization-dependent loss 10·log10(max(ηTE, ηTM)/min(ηTE, ηTM)) in dB, per order */
  readonly pdl: boolean;
}

/** A validated, fully resolved sweep. */
export interface SweepPlan {
  /** the design file's object (raw JSON), with the sweep section removed */
  readonly design: unknown;
  readonly axes: ReadonlyArray<SweepAxis>;
  /** 'grid': every combination (first axis slowest); 'zip': the i-th values together */
  readonly combine: 'grid' | 'zip';
  readonly mount: Mount;
  readonly outputs: OutputSpec;
  /** number of points */
  readonly count: number;
  /** CSV header: point_index, the axes' columns, [theta_deg for non-fixed mounts], outputs…, status, error */
  readonly columns: ReadonlyArray<string>;
  /** orders actually reported (resolved when outputs.orders is 'all') */
  readonly orders: ReadonlyArray<number>;
}

/** One point of the sweep, by its index in the plan's order. */
export interface SweepPoint {
  readonly index: number;
  /** the value of each axis at this point, aligned with plan.axes */
  readonly values: ReadonlyArray<number | string>;
}

/** The result of one point, aligned with plan.columns. */
export interface SweepRow {
  readonly index: number;
  readonly status: 'ok' | 'failed';
  /** one cell per column (numbers, or '' for a value that does not exist, e.g. an evanescent order) */
  readonly cells: ReadonlyArray<number | string>;
  /** the reason, when failed */
  readonly error?: string;
}
