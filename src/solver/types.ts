/**
 * Input and result records of the rigorous solver.
 *
 * Conventions (restated in DEVELOPERS.md): grating periodic along x with period Λ, grooves along
 * y, z the normal; light comes from the cover (z < 0) toward +z; layers listed top to bottom;
 * time dependence exp(−iωt); complex index ñ = n + iκ with κ ≥ 0 absorbing; ε = ñ².
 * Lengths are micrometres (`…Um`), angles degrees (`…Deg`) at this boundary.
 */

/** A complex number as it crosses an API boundary (JSON-friendly). */
export interface Complex {
  readonly re: number;
  readonly im: number;
}

/** One piece of a layer's profile: material `index` over [from, to) in fractions of the period. */
export interface Segment {
  /** start, fraction of the period in [0, 1) */
  readonly from: number;
  /** end, fraction of the period in (from, 1] */
  readonly to: number;
  /** complex refractive index n + iκ */
  readonly index: Complex;
}

/** A layer's permittivity over one period. */
export type Profile =
  /** homogeneous film */
  | { readonly kind: 'uniform'; readonly index: Complex }
  /** piecewise-constant: segments must tile [0, 1) without gaps or overlaps */
  | { readonly kind: 'segments'; readonly segments: ReadonlyArray<Segment> }
  /**
   * continuous ε(x) given by its Fourier coefficients: `permittivity[k + K]` and
   * `inversePermittivity[k + K]` are the k-th coefficients of ε(x) and 1/ε(x), k = −K…K, with
   * ε(x) = Σ c_k·exp(i·k·2πx/Λ). Coefficients beyond K are taken as zero.
   */
  | {
      readonly kind: 'fourier';
      readonly permittivity: ReadonlyArray<Complex>;
      readonly inversePermittivity: ReadonlyArray<Complex>;
    };

export interface Layer {
  readonly thicknessUm: number;
  readonly profile: Profile;
}

export interface Structure {
  readonly periodUm: number;
  /** index of the cover half-space (must be lossless: κ = 0) */
  readonly cover: Complex;
  /** index of the substrate half-space (may absorb) */
  readonly substrate: Complex;
  /** layers from the cover side down */
  readonly layers: ReadonlyArray<Layer>;
}

/** Jones vector (Es, Ep) on the incident wave's s and p unit vectors. */
export interface Jones {
  readonly s: Complex;
  readonly p: Complex;
}

export interface Incidence {
  readonly wavelengthUm: number;
  /** polar angle from the normal, (−90°, 90°) */
  readonly thetaDeg: number;
  /** azimuth of the plane of incidence from the x–z plane; 0 = classical mount */
  readonly phiDeg?: number;
  /**
   * Optional polarization of interest besides the always-reported s (TE) and p (TM) responses:
   * 'TE', 'TM' or a Jones vector (normalized internally to unit power).
   */
  readonly polarization?: 'TE' | 'TM' | Jones;
}

export interface SolveOptions {
  /**
   * Retained orders: a number M means orders −M…M; `{min, max}` any window (a window shifted
   * to m−M…m+M makes reciprocity hold to round-off).
   */
  readonly orders: number | { readonly min: number; readonly max: number };
  /**
   * Factorization of the products of discontinuous functions: 'inverse' (the correct rules —
   * Li 1996; Lalanne & Morris 1996) or 'laurent' (the naive rule, for comparisons only).
   */
  readonly factorization?: 'inverse' | 'laurent';
  /** Use the Hermitian eigen path for lossless layers (default true). */
  readonly hermitian?: boolean;
  /**
   * 'auto' (default): φ = 0 solves TE and TM as two independent N-sized problems; 'conical'
   * forces the coupled 2N-mode formulation even at φ = 0 (for cross-checks).
   */
  readonly formulation?: 'auto' | 'conical';
  /**
   * Accept κ < 0 (gain) in layers and substrate. Off by default: a negative κ is far more often a
   * sign-convention slip than an amplifier. With gain, A = 1 − R − T comes out negative.
   */
  readonly allowGain?: boolean;
}

/** A diffracted order in one incidence case. */
export interface OrderResult {
  readonly m: number;
  /** true when the order carries power away in its medium (real propagation constant) */
  readonly propagating: boolean;
  /** z-flux of the order over the incident z-flux */
  readonly efficiency: number;
  /**
   * Polar angle of the order's wavevector from the normal of its medium (deg), signed like kx so
   * that the classical mount reads as the grating equation (n·sinθm = n_c·sinθ + mλ/Λ); with
   * `phiDeg` the direction is (sinθm·cosφm, sinθm·sinφm, ∓cosθm). Evanescent orders report ±90.
   */
  readonly thetaDeg: number;
  /** azimuth atan(ky/kx) of the wavevector in (−90°, 90°] (deg); 0 in the classical mount */
  readonly phiDeg: number;
  /** complex amplitude on the order's own s unit vector, relative to the incident field */
  readonly amplitudeS: Complex;
  /** complex amplitude on the order's own p unit vector, relative to the incident field */
  readonly amplitudeP: Complex;
  /** complex field vector (Ex, Ey, Ez) of the order at its reference plane */
  readonly field: { readonly x: Complex; readonly y: Complex; readonly z: Complex };
}

/** Response to one incident polarization. */
export interface Response {
  /** propagating reflected orders, ascending m */
  readonly reflected: ReadonlyArray<OrderResult>;
  /** propagating transmitted orders, ascending m */
  readonly transmitted: ReadonlyArray<OrderResult>;
  /** total reflected efficiency */
  readonly R: number;
  /** total flux entering the substrate (all orders) over the incident flux */
  readonly T: number;
  /** absorption 1 − R − T */
  readonly A: number;
}

export interface SolveResult {
  readonly solver: { readonly name: 'furrow'; readonly version: string; readonly method: string };
  /** retained orders, ascending */
  readonly orders: ReadonlyArray<number>;
  /** true when φ = 0 (TE and TM decouple) */
  readonly classical: boolean;
  /** incident s (TE) */
  readonly s: Response;
  /** incident p (TM) */
  readonly p: Response;
  /** incident polarization requested in `Incidence.polarization`, when given */
  readonly requested?: Response;
}
