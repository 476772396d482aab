/**
 * Grating-equation utilities: diffraction-order directions, propagating-order ranges, Rayleigh
 * (Wood) anomalies, Littrow and constant-deviation mounts, dispersion, resolving power, free
 * spectral range, sawtooth blaze and groove-density conversions.
 *
 * Conventions (the project's, used everywhere in Furrow):
 * - The grating is periodic along x with period Λ, grooves run along y, z is the normal.
 *   Light arrives from the cover (z < 0) travelling toward +z; the substrate is below (z > 0).
 * - Time dependence exp(−iωt); a plane wave is exp(i(kx·x + ky·y + kz·z)).
 * - Incidence: polar angle θ ∈ (−π/2, π/2) from the normal, azimuth φ between the plane of
 *   incidence and the x–z plane (φ = 0 classical mount, φ ≠ 0 conical). The incident wavevector
 *   is k0·nCover·(sinθ·cosφ, sinθ·sinφ, cosθ) with k0 = 2π/λ and λ the vacuum wavelength.
 * - Order m has kx,m = kx,inc + m·2π/Λ and the same ky. Normalised by k0:
 *   αm = nCover·sinθ·cosφ + m·λ/Λ, β = nCover·sinθ·sinφ.
 *   An order propagates in a medium of index n when αm² + β² ≤ n², and is evanescent otherwise.
 * - Angles of a diffracted order use the incident parametrisation: the direction is
 *   (sinθm·cosφm, sinθm·sinφm, ±cosθm) with '−' for reflection (back into the cover) and '+' for
 *   transmission. θm is signed like αm, φm ∈ (−π/2, π/2]. In the classical mount (φ = 0) this
 *   gives φm = 0 and the familiar equations
 *     reflection:    nCover·sinθm     = nCover·sinθ + m·λ/Λ
 *     transmission:  nSubstrate·sinθm = nCover·sinθ + m·λ/Λ
 *   so the specular order has θ0 = θ and the Littrow order returns at θm = −θ.
 *
 * Units: angles are radians (use {@link degToRad}/{@link radToDeg} at the edges). Lengths are in
 * any single unit of the caller's choosing — wavelength, period, widths and focal lengths must
 * all use the same one. Refractive indices are real: for an absorbing medium pass the real part
 * n of ñ = n + iκ; the propagating/evanescent classification is then that of the lossless
 * medium with the same n.
 *
 * Every function validates its inputs and throws a RangeError naming the function, the
 * argument, what was expected and what was found.
 */

// ---------------------------------------------------------------------------------------------
// Input validation
// ---------------------------------------------------------------------------------------------

const HALF_PI = Math.PI / 2;

/** Largest number of orders {@link orderDirections} will list in one call. */
export const MAX_LISTED_ORDERS = 1_000_000;

function show(value: unknown): string {
  if (typeof value === 'number') return Object.is(value, -0) ? '-0' : String(value);
  if (typeof value === 'string') return JSON.stringify(value);
  return `${String(value)} (${typeof value})`;
}

function fail(fn: string, name: string, expected: string, found: unknown): never {
  throw new RangeError(`${fn}: ${name} must be ${expected}; found ${show(found)}`);
}

function isNum(x: unknown): x is number {
  return typeof x === 'number';
}

/** Finite and strictly positive. */
function positive(fn: string, name: string, x: unknown): number {
  if (!(isNum(x) && x > 0 && x < Infinity)) fail(fn, name, 'a finite number > 0', x);
  return x;
}

/** Any finite number. */
function finite(fn: string, name: string, x: unknown): number {
  if (!(isNum(x) && Number.isFinite(x))) fail(fn, name, 'a finite number', x);
  return x;
}

/** An incidence angle strictly inside (−π/2, π/2). */
function incidenceAngle(fn: string, name: string, x: unknown): number {
  if (!(isNum(x) && Math.abs(x) < HALF_PI)) {
    fail(fn, name, 'a finite angle in radians with |angle| < π/2', x);
  }
  return x;
}

/** A diffraction order: a safe integer. */
function order(fn: string, name: string, x: unknown): number {
  if (!(isNum(x) && Number.isSafeInteger(x))) fail(fn, name, 'an integer', x);
  return x;
}

/** A nonzero diffraction order. */
function nonzeroOrder(fn: string, name: string, x: unknown): number {
  if (!(isNum(x) && Number.isSafeInteger(x) && x !== 0)) fail(fn, name, 'a nonzero integer', x);
  return x;
}

// ---------------------------------------------------------------------------------------------
// Degree / radian and groove-density helpers
// ---------------------------------------------------------------------------------------------

/**
 * Degrees to radians.
 * @example degToRad(180) // → Math.PI
 */
export function degToRad(degrees: number): number {
  return (finite('degToRad', 'degrees', degrees) * Math.PI) / 180;
}

/**
 * Radians to degrees.
 * @example radToDeg(Math.PI / 6) // → 30 (to rounding)
 */
export function radToDeg(radians: number): number {
  return (finite('radToDeg', 'radians', radians) * 180) / Math.PI;
}

/**
 * Grating period in nanometres from a groove density in lines per millimetre.
 * @example periodNmFromLinesPerMm(1200) // → 833.333… nm
 */
export function periodNmFromLinesPerMm(linesPerMm: number): number {
  return 1e6 / positive('periodNmFromLinesPerMm', 'linesPerMm', linesPerMm);
}

/**
 * Grating period in micrometres from a groove density in lines per millimetre.
 * @example periodUmFromLinesPerMm(600) // → 1.6666… µm
 */
export function periodUmFromLinesPerMm(linesPerMm: number): number {
  return 1e3 / positive('periodUmFromLinesPerMm', 'linesPerMm', linesPerMm);
}

/**
 * Groove density in lines per millimetre from a period in nanometres.
 * @example linesPerMmFromPeriodNm(500) // → 2000 lines/mm
 */
export function linesPerMmFromPeriodNm(periodNm: number): number {
  return 1e6 / positive('linesPerMmFromPeriodNm', 'periodNm', periodNm);
}

/**
 * Groove density in lines per millimetre from a period in micrometres.
 * @example linesPerMmFromPeriodUm(2) // → 500 lines/mm
 */
export function linesPerMmFromPeriodUm(periodUm: number): number {
  return 1e3 / positive('linesPerMmFromPeriodUm', 'periodUm', periodUm);
}

// ---------------------------------------------------------------------------------------------
// Directions of the diffraction orders
// ---------------------------------------------------------------------------------------------

/** Illumination of the grating: everything the order directions depend on. */
export interface Incidence {
  /** Vacuum wavelength λ (same length unit as `period`). */
  readonly wavelength: number;
  /** Grating period Λ along x (same length unit as `wavelength`). */
  readonly period: number;
  /** Polar angle of incidence θ, radians, |θ| < π/2. */
  readonly thetaRad: number;
  /** Azimuth φ of the plane of incidence from the x–z plane, radians. Default 0 (classical). */
  readonly phiRad?: number;
  /** Real refractive index of the cover (incidence side), > 0. Default 1. */
  readonly nCover?: number;
  /** Real refractive index (real part) of the substrate, > 0. */
  readonly nSubstrate: number;
}

/** Incidence plus the inclusive list of orders wanted. */
export interface OrderDirectionsInput extends Incidence {
  /** Lowest order listed (integer). */
  readonly mMin: number;
  /** Highest order listed (integer, ≥ mMin). */
  readonly mMax: number;
}

/** Unit direction vector of a propagating order. */
export interface DirectionCosines {
  readonly x: number;
  readonly y: number;
  readonly z: number;
}

/** A propagating order in one medium. */
export interface PropagatingOrder {
  readonly propagating: true;
  /** Signed polar angle θm, radians, in [−π/2, π/2]; sign of kx,m. */
  readonly thetaRad: number;
  /** Azimuth φm of the order's wavevector, radians, in (−π/2, π/2]; 0 in the classical mount. */
  readonly phiRad: number;
  /** Unit vector along the wavevector; z < 0 for reflection, z > 0 for transmission. */
  readonly cosines: DirectionCosines;
  /** kz/k0 of the order: −√(n² − αm² − β²) in reflection, +√(…) in transmission. */
  readonly kzOverK0: number;
}

/** An evanescent order in one medium. */
export interface EvanescentOrder {
  readonly propagating: false;
  /**
   * √(αm² + β² − n²) > 0: the field decays as exp(−decayOverK0·k0·|z|) away from the grating
   * (kz = +i·decay·k0 in the substrate, −i·decay·k0 in the cover).
   */
  readonly decayOverK0: number;
}

/** An order in one medium: propagating or evanescent (discriminated by `propagating`). */
export type OrderInMedium = PropagatingOrder | EvanescentOrder;

/** One diffraction order, in reflection (cover) and in transmission (substrate). */
export interface OrderDirection {
  /** Order number m. */
  readonly m: number;
  /** αm = kx,m/k0 = nCover·sinθ·cosφ + m·λ/Λ. */
  readonly kxOverK0: number;
  /** β = ky/k0 = nCover·sinθ·sinφ (the same for every order). */
  readonly kyOverK0: number;
  /** The order back in the cover. */
  readonly reflected: OrderInMedium;
  /** The order in the substrate. */
  readonly transmitted: OrderInMedium;
}

/** Validated incidence with the normalised in-plane wavevector of the incident wave. */
interface Normalised {
  /** λ/Λ. */
  readonly q: number;
  /** kx,inc/k0. */
  readonly alpha0: number;
  /** ky/k0. */
  readonly beta: number;
  readonly nCover: number;
  readonly nSubstrate: number;
}

const GRAZING_INCIDENCE = 'an angle with |angle| < π/2 whose incident wave is not numerically grazing';

/**
 * (α0, β) of the incident wave. Rejects incidences so close to grazing (within ~1e-8 rad) that
 * rounding would make the incident wave itself look evanescent.
 */
function inPlane(
  fn: string,
  thetaRad: number,
  phiRad: number,
  nCover: number,
): { alpha0: number; beta: number } {
  const s = nCover * Math.sin(thetaRad);
  const alpha0 = s * Math.cos(phiRad);
  const beta = s * Math.sin(phiRad) + 0; // +0, not −0, in the classical mount
  if (!(kz2(alpha0, beta, nCover) > 0)) fail(fn, 'thetaRad', GRAZING_INCIDENCE, thetaRad);
  return { alpha0, beta };
}

function normalise(fn: string, inc: Incidence): Normalised {
  if (typeof inc !== 'object' || inc === null) fail(fn, 'input', 'an object', inc);
  const wavelength = positive(fn, 'wavelength', inc.wavelength);
  const period = positive(fn, 'period', inc.period);
  const theta = incidenceAngle(fn, 'thetaRad', inc.thetaRad);
  const phi = finite(fn, 'phiRad', inc.phiRad ?? 0);
  const nCover = positive(fn, 'nCover', inc.nCover ?? 1);
  const nSubstrate = positive(fn, 'nSubstrate', inc.nSubstrate);
  const { alpha0, beta } = inPlane(fn, theta, phi, nCover);
  return { q: wavelength / period, alpha0, beta, nCover, nSubstrate };
}

/** αm: one expression shared by every routine so their classifications agree exactly. */
function alphaOf(alpha0: number, m: number, q: number): number {
  return alpha0 + m * q;
}

/**
 * (kz/k0)² of an order in a medium of index n. Floating-point subtraction keeps the exact sign,
 * so `≥ 0` here is exactly the test αm² + β² ≤ n² used for classification.
 */
function kz2(alpha: number, beta: number, n: number): number {
  return n * n - (alpha * alpha + beta * beta);
}

function propagatesIn(alpha: number, beta: number, n: number): boolean {
  return kz2(alpha, beta, n) >= 0;
}

/**
 * Signed polar angle and azimuth (this module's parametrisation) of an in-plane wavevector
 * (a, b) = (kx, ky)/(n·k0) with transverse size ρ = √(a² + b²) ≤ 1 and |kz|/(n·k0) = c.
 */
function anglesOf(a: number, b: number, c: number): { thetaRad: number; phiRad: number } {
  const rho = Math.hypot(a, b);
  if (rho === 0) return { thetaRad: 0, phiRad: 0 };
  const polar = Math.atan2(rho, c);
  if (a === 0) return { thetaRad: polar, phiRad: b > 0 ? HALF_PI : -HALF_PI };
  // `+ 0` turns −0 into +0 so the classical mount reports φm = 0 exactly.
  return { thetaRad: a > 0 ? polar : -polar, phiRad: Math.atan(b / a) + 0 };
}

/**
 * Polar angle and azimuth, in this module's parametrisation, of a propagating plane wave with
 * unit direction (x, y, ±z): the signed θ ∈ [−π/2, π/2] and φ ∈ (−π/2, π/2] with
 * (x, y) = (sinθ·cosφ, sinθ·sinφ). The sign of z is not encoded (it tells reflection from
 * transmission). Useful to turn a reversed diffracted beam back into an incidence.
 *
 * @param x direction cosine along x (grating vector)
 * @param y direction cosine along y (grooves)
 * @example directionAngles(-0.5, 0) // → { thetaRad: −π/6, phiRad: 0 }
 */
export function directionAngles(x: number, y: number): { thetaRad: number; phiRad: number } {
  const fn = 'directionAngles';
  finite(fn, 'x', x);
  finite(fn, 'y', y);
  const rho2 = x * x + y * y;
  if (!(rho2 <= 1 + 1e-12)) fail(fn, 'x² + y²', 'at most 1 (a unit direction)', rho2);
  return anglesOf(x, y, Math.sqrt(Math.max(0, 1 - rho2)));
}

function inMedium(alpha: number, beta: number, n: number, side: 1 | -1): OrderInMedium {
  const g2 = kz2(alpha, beta, n);
  if (!(g2 >= 0)) return { propagating: false, decayOverK0: Math.sqrt(-g2) };
  const gamma = Math.sqrt(g2);
  const { thetaRad, phiRad } = anglesOf(alpha, beta, gamma);
  return {
    propagating: true,
    thetaRad,
    phiRad,
    cosines: { x: alpha / n, y: beta / n, z: (side * gamma) / n },
    kzOverK0: side * gamma,
  };
}

/**
 * Directions of diffraction orders mMin…mMax in reflection (cover) and transmission (substrate).
 *
 * For each order: αm = nCover·sinθ·cosφ + m·λ/Λ and β = nCover·sinθ·sinφ (wavevector over k0);
 * in each medium of index n the order propagates when αm² + β² ≤ n², with direction
 * (αm, β, ∓√(n² − αm² − β²))/n (− reflection, + transmission), and is evanescent otherwise.
 *
 * @throws RangeError for invalid inputs or more than {@link MAX_LISTED_ORDERS} orders.
 * @example
 * // λ = 0.5, Λ = 1 (same unit), normal incidence from air onto n = 1.5
 * const [mMinus1, m0, mPlus1] = orderDirections({
 *   wavelength: 0.5, period: 1, thetaRad: 0, nSubstrate: 1.5, mMin: -1, mMax: 1 });
 * // mPlus1.reflected   → propagating, θm = π/6 (30°), φm = 0
 * // mPlus1.transmitted → propagating, θm = asin(1/3) ≈ 0.3398 rad (19.47°)
 */
export function orderDirections(input: OrderDirectionsInput): OrderDirection[] {
  const fn = 'orderDirections';
  const { q, alpha0, beta, nCover, nSubstrate } = normalise(fn, input);
  const mMin = order(fn, 'mMin', input.mMin);
  const mMax = order(fn, 'mMax', input.mMax);
  if (!(mMax >= mMin)) fail(fn, 'mMax', `an integer ≥ mMin (${mMin})`, mMax);
  if (!(mMax - mMin < MAX_LISTED_ORDERS)) {
    fail(fn, 'mMax − mMin + 1', `at most ${MAX_LISTED_ORDERS} orders`, mMax - mMin + 1);
  }
  const out: OrderDirection[] = [];
  for (let m = mMin; m <= mMax; m++) {
    const alpha = alphaOf(alpha0, m, q);
    out.push({
      m,
      kxOverK0: alpha,
      kyOverK0: beta,
      reflected: inMedium(alpha, beta, nCover, -1),
      transmitted: inMedium(alpha, beta, nSubstrate, 1),
    });
  }
  return out;
}

/** An inclusive range of order numbers. */
export interface OrderRange {
  readonly mMin: number;
  readonly mMax: number;
}

/** Which orders propagate on each side of the grating. */
export interface PropagatingOrders {
  /** Orders propagating back into the cover (always contains 0). */
  readonly reflected: OrderRange;
  /** Orders propagating in the substrate, or null if none does. */
  readonly transmitted: OrderRange | null;
}

function rangeIn(
  fn: string,
  alpha0: number,
  beta: number,
  q: number,
  n: number,
): OrderRange | null {
  const r2 = n * n - beta * beta;
  if (!(r2 >= 0)) return null;
  const r = Math.sqrt(r2);
  let lo = Math.ceil((-r - alpha0) / q);
  let hi = Math.floor((r - alpha0) / q);
  // Keep m where m ± 2 are still exact integers, so the edge search below is well defined.
  const limit = Number.MAX_SAFE_INTEGER / 4;
  if (!(Math.abs(lo) <= limit && Math.abs(hi) <= limit)) {
    fail(fn, 'wavelength/period', `large enough that order numbers stay below ${limit}`, q);
  }
  // The estimate is off by at most one near the edges through rounding; settle it with the
  // exact predicate of orderDirections. The set is contiguous ((α0 + m·q)² is convex in m).
  const ok = (m: number): boolean => propagatesIn(alphaOf(alpha0, m, q), beta, n);
  for (let k = 0; k < 2; k++) {
    if (ok(lo - 1)) lo--;
    if (ok(hi + 1)) hi++;
  }
  for (let k = 0; k < 2 && lo <= hi; k++) {
    if (!ok(lo)) lo++;
    if (lo <= hi && !ok(hi)) hi--;
  }
  return lo <= hi ? { mMin: lo, mMax: hi } : null;
}

/**
 * The orders that propagate in the cover (reflection) and in the substrate (transmission).
 * The set is always a contiguous range because αm is linear in m. Agrees exactly with the
 * `propagating` flags of {@link orderDirections}.
 *
 * @example
 * propagatingOrders({ wavelength: 0.5, period: 1, thetaRad: 0, nSubstrate: 1.5 })
 * // → { reflected: { mMin: -2, mMax: 2 }, transmitted: { mMin: -3, mMax: 3 } }
 */
export function propagatingOrders(input: Incidence): PropagatingOrders {
  const fn = 'propagatingOrders';
  const { q, alpha0, beta, nCover, nSubstrate } = normalise(fn, input);
  const reflected = rangeIn(fn, alpha0, beta, q, nCover);
  // normalise() has checked that the specular order (m = 0) propagates, so this is not null.
  if (reflected === null) fail(fn, 'thetaRad', GRAZING_INCIDENCE, input.thetaRad);
  return { reflected, transmitted: rangeIn(fn, alpha0, beta, q, nSubstrate) };
}

// ---------------------------------------------------------------------------------------------
// Rayleigh (Wood) anomalies
// ---------------------------------------------------------------------------------------------

/** A wavelength at which an order grazes the grating surface. */
export interface RayleighWavelength {
  /** Vacuum wavelength, in the unit of the period. */
  readonly wavelength: number;
  /**
   * kx,m/k0 of the grazing order: ±√(n² − β²). Its sign tells the side it skims toward
   * (θm = +π/2 for > 0, −π/2 for < 0 in the classical mount).
   */
  readonly kxOverK0: number;
}

/** Rayleigh wavelengths of one order in the cover and in the substrate, ascending. */
export interface RayleighWavelengths {
  readonly cover: RayleighWavelength[];
  readonly substrate: RayleighWavelength[];
}

function grazingWavelengths(
  m: number,
  period: number,
  alpha0: number,
  beta: number,
  n: number,
): RayleighWavelength[] {
  const r2 = n * n - beta * beta;
  if (m === 0 || !(r2 >= 0)) return [];
  const r = Math.sqrt(r2);
  const out: RayleighWavelength[] = [];
  for (const kx of r === 0 ? [0] : [r, -r]) {
    const wavelength = (period * (kx - alpha0)) / m;
    if (wavelength > 0 && Number.isFinite(wavelength)) out.push({ wavelength, kxOverK0: kx });
  }
  return out.sort((a, b) => a.wavelength - b.wavelength);
}

function checkAngles(fn: string, thetaRad: number, phiRad: number): void {
  incidenceAngle(fn, 'thetaRad', thetaRad);
  finite(fn, 'phiRad', phiRad);
}

/**
 * Wavelengths at which order m grazes (Rayleigh/Wood anomaly) in the cover and in the
 * substrate, for a fixed incidence: the solutions λ > 0 of (α0 + m·λ/Λ)² + β² = n², i.e.
 * λ = Λ·(±√(n² − β²) − α0)/m. Classical mount: nCover·sinθ + m·λ/Λ = ±n.
 * Order 0 does not depend on λ and gives empty lists.
 *
 * @param m order (integer)
 * @param period grating period Λ (result is in the same unit)
 * @param thetaRad incidence polar angle, |θ| < π/2
 * @param phiRad incidence azimuth (0 = classical mount)
 * @param nCover cover index (> 0)
 * @param nSubstrate substrate index, real part (> 0)
 * @example
 * rayleighWavelengths(-1, 1, Math.PI / 6, 0, 1, 1.5)
 * // → { cover: [{ wavelength: 1.5, kxOverK0: -1 }], substrate: [{ wavelength: 2, kxOverK0: -1.5 }] }
 */
export function rayleighWavelengths(
  m: number,
  period: number,
  thetaRad: number,
  phiRad: number,
  nCover: number,
  nSubstrate: number,
): RayleighWavelengths {
  const { alpha0, beta } = checkedInPlane('rayleighWavelengths', m, period, thetaRad, phiRad, nCover, nSubstrate);
  return {
    cover: grazingWavelengths(m, period, alpha0, beta, nCover),
    substrate: grazingWavelengths(m, period, alpha0, beta, nSubstrate),
  };
}

/** The checks shared by the wavelength functions of one order, then the incidence's in-plane components. */
function checkedInPlane(fn: string, m: number, period: number, thetaRad: number, phiRad: number, nCover: number, nSubstrate: number): { alpha0: number; beta: number } {
  order(fn, 'm', m);
  positive(fn, 'period', period);
  checkAngles(fn, thetaRad, phiRad);
  positive(fn, 'nCover', nCover);
  positive(fn, 'nSubstrate', nSubstrate);
  return inPlane(fn, thetaRad, phiRad, nCover);
}

/** Longest propagating wavelength of an order on each side of the grating. */
export interface CutoffWavelengths {
  /** In the cover; Infinity for order 0, which always propagates there. */
  readonly cover: number;
  /** In the substrate; Infinity if the order propagates at every λ, null if at none. */
  readonly substrate: number | null;
}

function cutoffIn(m: number, period: number, alpha0: number, beta: number, n: number): number | null {
  if (m === 0) return propagatesIn(alpha0, beta, n) ? Infinity : null;
  // Order m propagates iff −r ≤ α0 + m·λ/Λ ≤ r (r = √(n² − β²)): a window in λ whose long end
  // is a grazing wavelength, and the longest positive one. No positive root: never propagates.
  const roots = grazingWavelengths(m, period, alpha0, beta, n);
  const last = roots[roots.length - 1];
  return last === undefined ? null : last.wavelength;
}

/**
 * Cutoff wavelength of order m: the longest vacuum wavelength at which it still propagates in
 * the cover and in the substrate (beyond it the order is evanescent). It is the largest of the
 * {@link rayleighWavelengths} of that order in that medium.
 *
 * @example
 * cutoffWavelength(1, 1, Math.PI / 6, 0, 1, 1.5) // → { cover: 0.5, substrate: 1 } (to rounding)
 */
export function cutoffWavelength(
  m: number,
  period: number,
  thetaRad: number,
  phiRad: number,
  nCover: number,
  nSubstrate: number,
): CutoffWavelengths {
  const fn = 'cutoffWavelength';
  const { alpha0, beta } = checkedInPlane(fn, m, period, thetaRad, phiRad, nCover, nSubstrate);
  const cover = cutoffIn(m, period, alpha0, beta, nCover);
  // In the cover |α0| < √(nCover² − β²) (checked by inPlane), so the window reaches some λ > 0;
  // only an incidence at the edge of rounding could spoil that.
  if (cover === null) fail(fn, 'thetaRad', GRAZING_INCIDENCE, thetaRad);
  return { cover, substrate: cutoffIn(m, period, alpha0, beta, nSubstrate) };
}

/** An incidence angle at which an order grazes. */
export interface RayleighAngle {
  /** Incidence polar angle θ, radians, |θ| < π/2. */
  readonly thetaRad: number;
  /** kx,m/k0 of the grazing order (sign = side it skims toward). */
  readonly kxOverK0: number;
}

/** Rayleigh incidence angles of one order in the cover and in the substrate, ascending. */
export interface RayleighAngles {
  readonly cover: RayleighAngle[];
  readonly substrate: RayleighAngle[];
}

function grazingAngles(
  m: number,
  q: number,
  phi: number,
  nCover: number,
  n: number,
): RayleighAngle[] {
  // (nCover·s·cosφ + m·q)² + (nCover·s·sinφ)² = n²  with s = sinθ:
  // nCover·s = −m·q·cosφ ± √(n² − m²q²·sin²φ)
  const mq = m * q;
  const c = Math.cos(phi);
  const sn = Math.sin(phi);
  const d2 = n * n - mq * mq * sn * sn;
  if (!(d2 >= 0)) return [];
  const d = Math.sqrt(d2);
  const out: RayleighAngle[] = [];
  for (const root of d === 0 ? [0] : [d, -d]) {
    const s = (-mq * c + root) / nCover;
    if (Math.abs(s) < 1) {
      const thetaRad = Math.asin(s);
      out.push({ thetaRad, kxOverK0: alphaOf(nCover * s * c, m, q) });
    }
  }
  return out.sort((a, b) => a.thetaRad - b.thetaRad);
}

/**
 * Incidence angles θ (|θ| < π/2, at fixed azimuth φ) at which order m grazes the grating in the
 * cover and in the substrate. Classical mount: sinθ = (±n − m·λ/Λ)/nCover. For m = 0 the
 * substrate entry is the critical angle of total internal reflection when nSubstrate < nCover.
 *
 * @param m order (integer)
 * @param wavelength vacuum wavelength (unit of `period`)
 * @param period grating period
 * @param nCover cover index (> 0)
 * @param nSubstrate substrate index, real part (> 0)
 * @param phiRad incidence azimuth, default 0 (classical)
 * @example
 * rayleighAngles(1, 0.5, 1, 1, 1).cover // → [{ thetaRad: π/6 (30°), kxOverK0: 1 }]
 */
export function rayleighAngles(
  m: number,
  wavelength: number,
  period: number,
  nCover: number,
  nSubstrate: number,
  phiRad = 0,
): RayleighAngles {
  const fn = 'rayleighAngles';
  order(fn, 'm', m);
  positive(fn, 'wavelength', wavelength);
  positive(fn, 'period', period);
  positive(fn, 'nCover', nCover);
  positive(fn, 'nSubstrate', nSubstrate);
  finite(fn, 'phiRad', phiRad);
  const q = wavelength / period;
  return {
    cover: grazingAngles(m, q, phiRad, nCover, nCover),
    substrate: grazingAngles(m, q, phiRad, nCover, nSubstrate),
  };
}

// ---------------------------------------------------------------------------------------------
// Mounts
// ---------------------------------------------------------------------------------------------

/**
 * Littrow angle of order m (classical mount): the incidence θ at which reflected order m
 * returns along the incident beam, θm = −θ, i.e. 2·nCover·Λ·sinθ = −m·λ.
 * With this project's signs, order −1 is in Littrow at positive θ.
 *
 * @param m order (integer)
 * @param wavelength vacuum wavelength (unit of `period`)
 * @param period grating period
 * @param nCover cover index (> 0), default 1
 * @returns θ in radians
 * @throws RangeError when |m·λ/(2·Λ·nCover)| ≥ 1 (no Littrow incidence below grazing)
 * @example
 * // 1200 lines/mm, 632.8 nm, order −1
 * littrowAngle(-1, 632.8, periodNmFromLinesPerMm(1200)) // → 0.38945 rad = 22.3139°
 */
export function littrowAngle(m: number, wavelength: number, period: number, nCover = 1): number {
  const fn = 'littrowAngle';
  order(fn, 'm', m);
  positive(fn, 'wavelength', wavelength);
  positive(fn, 'period', period);
  positive(fn, 'nCover', nCover);
  const s = (-m * wavelength) / (2 * period * nCover);
  if (!(Math.abs(s) < 1)) {
    fail(fn, '|m·wavelength/(2·period·nCover)|', 'below 1 for a Littrow mount to exist', Math.abs(s));
  }
  return Math.asin(s) + 0; // +0 rather than −0 for m = 0
}

/** Angles of a constant-deviation (fixed-arm) mount. */
export interface ConstantDeviation {
  /** Incidence polar angle θ, radians. */
  readonly incidenceRad: number;
  /** Polar angle θm of the reflected order, radians (signed as in {@link orderDirections}). */
  readonly diffractionRad: number;
  /**
   * Grating rotation ψ = (θm − θ)/2, radians: the angle between the grating normal and the
   * bisector of the two fixed arms. sinψ = m·λ/(2·nCover·Λ·cos(δ/2)).
   */
  readonly rotationRad: number;
}

/**
 * Constant-deviation mount in reflection (classical): the incident and diffracted arms are fixed
 * at an angle δ and the grating turns to select the wavelength.
 *
 * Relations, in this project's signs (direction of incidence (sinθ, 0, cosθ), of reflected order
 * m (sinθm, 0, −cosθm), nCover·sinθm = nCover·sinθ + m·λ/Λ):
 * - the angle between the reversed incident beam (−sinθ, 0, −cosθ) and the diffracted beam has
 *   cosine cos(θ + θm), so the deviation is δ = θ + θm (0 in Littrow, 2θ for the specular order);
 * - sinθm − sinθ = 2·cos(δ/2)·sinψ with ψ = (θm − θ)/2, hence
 *   sinψ = m·λ/(2·nCover·Λ·cos(δ/2)), θ = δ/2 − ψ, θm = δ/2 + ψ.
 * The solution is unique when it exists.
 *
 * @param m order (integer)
 * @param wavelength vacuum wavelength (unit of `period`)
 * @param period grating period
 * @param deviationRad δ = θ + θm, radians, |δ| < π (signed: positive when the diffracted arm
 *   lies on the +x side of the reversed incident arm)
 * @param nCover cover index (> 0), default 1
 * @throws RangeError when no incidence with |θ| < π/2 and |θm| ≤ π/2 exists
 * @example
 * constantDeviation(1, 0.5, 1, Math.PI / 3)
 * // → { incidenceRad: 0.23076 (13.2213°), diffractionRad: 0.81644 (46.7787°), rotationRad: 0.29284 }
 */
export function constantDeviation(
  m: number,
  wavelength: number,
  period: number,
  deviationRad: number,
  nCover = 1,
): ConstantDeviation {
  const fn = 'constantDeviation';
  order(fn, 'm', m);
  positive(fn, 'wavelength', wavelength);
  positive(fn, 'period', period);
  if (!(isNum(deviationRad) && Math.abs(deviationRad) < Math.PI)) {
    fail(fn, 'deviationRad', 'a finite angle in radians with |angle| < π', deviationRad);
  }
  positive(fn, 'nCover', nCover);
  const half = deviationRad / 2;
  const s = (m * wavelength) / (2 * nCover * period * Math.cos(half));
  if (!(Math.abs(s) <= 1)) {
    fail(fn, '|m·λ/(2·nCover·Λ·cos(δ/2))|', 'at most 1 for the mount to exist', Math.abs(s));
  }
  const rotationRad = Math.asin(s);
  const incidenceRad = half - rotationRad;
  const diffractionRad = half + rotationRad;
  if (!(Math.abs(incidenceRad) < HALF_PI && Math.abs(diffractionRad) <= HALF_PI)) {
    fail(
      fn,
      'the resulting incidence angle',
      'inside (−π/2, π/2) with the diffracted order not beyond grazing',
      incidenceRad,
    );
  }
  return { incidenceRad, diffractionRad, rotationRad };
}

// ---------------------------------------------------------------------------------------------
// Dispersion, resolution, free spectral range, blaze
// ---------------------------------------------------------------------------------------------

/**
 * Angular dispersion dθm/dλ of order m at fixed incidence: m/(n·Λ·cosθm), in radians per unit
 * length (the unit of `period`). Follows from differentiating n·sinθm = nCover·sinθ + m·λ/Λ;
 * n is the index of the medium the order travels in (default 1). It does not depend on λ except
 * through θm.
 *
 * @param m order (integer)
 * @param period grating period
 * @param diffractionRad θm, |θm| < π/2
 * @param nMedium index of the medium of the diffracted order, default 1
 * @example angularDispersion(1, 1, Math.PI / 3) // → 2 rad per unit length
 */
export function angularDispersion(
  m: number,
  period: number,
  diffractionRad: number,
  nMedium = 1,
): number {
  const fn = 'angularDispersion';
  order(fn, 'm', m);
  positive(fn, 'period', period);
  incidenceAngle(fn, 'diffractionRad', diffractionRad);
  positive(fn, 'nMedium', nMedium);
  return m / (nMedium * period * Math.cos(diffractionRad));
}

/**
 * Linear dispersion at the focal plane of a camera of focal length f: f·dθm/dλ (length on the
 * detector per unit wavelength, dimensionless when both are in the same unit).
 *
 * @example linearDispersion(1, 1, Math.PI / 3, 1000) // → 2000
 */
export function linearDispersion(
  m: number,
  period: number,
  diffractionRad: number,
  focalLength: number,
  nMedium = 1,
): number {
  positive('linearDispersion', 'focalLength', focalLength);
  return focalLength * angularDispersion(m, period, diffractionRad, nMedium);
}

/**
 * Chromatic resolving power λ/Δλ = |m|·N with N = illuminatedWidth/period grooves illuminated.
 *
 * @param m order (integer)
 * @param illuminatedWidth illuminated width of the grating along x (unit of `period`)
 * @param period grating period
 * @example resolvingPower(2, 50e6, periodNmFromLinesPerMm(1200)) // 50 mm at 1200 l/mm → 120000
 */
export function resolvingPower(m: number, illuminatedWidth: number, period: number): number {
  const fn = 'resolvingPower';
  order(fn, 'm', m);
  positive(fn, 'illuminatedWidth', illuminatedWidth);
  positive(fn, 'period', period);
  return (Math.abs(m) * illuminatedWidth) / period;
}

/**
 * Free spectral range of order m: λ/|m|, the wavelength interval above λ that order m covers
 * before order m + sign(m) at λ lands on the same angle.
 *
 * @param m nonzero order (integer)
 * @param wavelength the short end of the range (any length unit; result in the same unit)
 * @example freeSpectralRange(2, 500) // → 250
 */
export function freeSpectralRange(m: number, wavelength: number): number {
  const fn = 'freeSpectralRange';
  nonzeroOrder(fn, 'm', m);
  positive(fn, 'wavelength', wavelength);
  return wavelength / Math.abs(m);
}

function blazeAngle(fn: string, x: unknown): number {
  if (!(isNum(x) && x > 0 && x < HALF_PI)) fail(fn, 'blazeAngleRad', 'an angle in (0, π/2) radians', x);
  return x;
}

/**
 * Littrow blaze wavelength of a sawtooth grating of blaze (facet) angle θB in order m:
 * λB = 2·Λ·sinθB/|m|. The facet angle is geometric (positive); which sign of m is blazed depends
 * on the side the facets face (in this project's signs, incidence at +θB is Littrow for m = −1).
 *
 * @param blazeAngleRad facet angle θB, radians, in (0, π/2)
 * @param period grating period (result in the same unit)
 * @param m nonzero order, default 1
 * @example blazeWavelength(Math.PI / 6, 1) // → 1 (to rounding)
 */
export function blazeWavelength(blazeAngleRad: number, period: number, m = 1): number {
  const fn = 'blazeWavelength';
  blazeAngle(fn, blazeAngleRad);
  positive(fn, 'period', period);
  nonzeroOrder(fn, 'm', m);
  return (2 * period * Math.sin(blazeAngleRad)) / Math.abs(m);
}

/**
 * Facet angle that blazes order m at `wavelength` in Littrow: θB = asin(|m|·λ/(2Λ)).
 *
 * @param wavelength vacuum wavelength (unit of `period`)
 * @param period grating period
 * @param m nonzero order, default 1
 * @throws RangeError when |m|·λ/(2Λ) ≥ 1
 * @example blazeAngleFor(1, 1) // → π/6 (30°)
 */
export function blazeAngleFor(wavelength: number, period: number, m = 1): number {
  const fn = 'blazeAngleFor';
  positive(fn, 'wavelength', wavelength);
  positive(fn, 'period', period);
  nonzeroOrder(fn, 'm', m);
  const s = (Math.abs(m) * wavelength) / (2 * period);
  if (!(s < 1)) fail(fn, '|m|·wavelength/(2·period)', 'below 1 for a blaze angle to exist', s);
  return Math.asin(s);
}
