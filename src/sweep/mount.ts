/**
 * Incidence angle of a point under the sweep's mount: the design's own (fixed), Littrow for an
 * order, or a constant-deviation mount. Internal to src/sweep.
 */
import { type DesignModel, InputError, parseIndexLiteral } from '../design/index.ts';
import type { Complex } from '../solver/index.ts';
import { constantDeviation, littrowAngle } from '../solver/grating-equation.ts';
import type { Mount } from './types.ts';

const DEG = Math.PI / 180;

/**
 * Index of the design's cover at λ, as `problemAt` resolves it (a literal, else the library).
 * @throws {MaterialError} outside the material's range unless extrapolation is allowed
 */
export function coverIndex(model: DesignModel, wavelengthUm: number): Complex {
  return parseIndexLiteral(model.cover) ?? model.library.evaluate(model.cover, wavelengthUm, { allowExtrapolation: model.allowExtrapolation }).index;
}

/**
 * θ (degrees) of a Littrow or constant-deviation mount at λ. Littrow for order m:
 * 2·n_c·Λ·sinθ = −m·λ (order −1 at positive θ); constant deviation δ = θ + θm (see
 * grating-equation.ts).
 * @throws {InputError} at 'sweep.mount' when the mount has no solution at this point
 */
export function mountThetaDeg(mount: Exclude<Mount, { kind: 'fixed' }>, wavelengthUm: number, periodUm: number, nCover: number): number {
  const s = (mount.order * wavelengthUm) / (2 * periodUm * nCover);
  const where = `λ = ${wavelengthUm} µm, Λ = ${periodUm} µm, n_cover = ${nCover}`;
  if (mount.kind === 'littrow') {
    if (!(Math.abs(s) < 1)) {
      throw new InputError('sweep.mount', `no Littrow incidence for order ${mount.order} at ${where}: |m·λ/(2·Λ·n_cover)| = ${Math.abs(s).toPrecision(6)} is not below 1`);
    }
    return littrowAngle(mount.order, wavelengthUm, periodUm, nCover) / DEG;
  }
  try {
    return constantDeviation(mount.order, wavelengthUm, periodUm, mount.deviationDeg * DEG, nCover).incidenceRad / DEG;
  } catch (e) {
    if (!(e instanceof RangeError)) throw e;
    const c = Math.abs(s / Math.cos((mount.deviationDeg * DEG) / 2));
    const why = c > 1 ? `|m·λ/(2·Λ·n_cover·cos(δ/2))| = ${c.toPrecision(6)} exceeds 1` : 'the incidence or the diffracted order would be beyond grazing';
    throw new InputError('sweep.mount', `no constant-deviation incidence for order ${mount.order}, δ = ${mount.deviationDeg}° at ${where}: ${why}`);
  }
}
