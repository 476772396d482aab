/**
 * The Drude free-electron model, photon energies in eV:
 *
 *   ε(ω) = ε∞ − ωp² / (ω·(ω + iγ)),   ω = 1.239842 / λ[µm],
 *
 * written for the exp(−iωt) convention, so Im ε ≥ 0 (absorbing) for γ ≥ 0.
 */
import { MaterialError } from './errors.ts';
import { checkInfo, type MaterialInfoInput } from './info.ts';
import type { Material } from './material.ts';
import { indexFromPermittivity } from './permittivity.ts';
import { photonEnergyEv } from './photon.ts';

/** Drude parameters. */
export interface DrudeParams {
  /** background permittivity ε∞ (default 1) */
  readonly epsInf?: number;
  /** plasma energy ħωp, eV (> 0) */
  readonly plasmaEv: number;
  /** damping ħγ, eV (≥ 0) */
  readonly dampingEv: number;
}

/** A material described by the Drude model. */
export interface DrudeMaterial extends Material {
  readonly kind: 'drude';
  readonly params: Required<DrudeParams>;
}

/**
 * Build a Drude material.
 * @param params epsInf (default 1), plasmaEv (eV, > 0), dampingEv (eV, ≥ 0)
 * @param info id, citation and valid range (µm)
 * @throws {MaterialError} 'invalid-data' for non-finite or out-of-domain parameters, or bad info
 * @example
 * const m = drudeMaterial({ plasmaEv: 9, dampingEv: 0.1 }, { id: 'free-electron', citation: 'model', validRangeUm: [0.5, 10] });
 * m.index(1.239842); // √(1 − 81/(1 + 0.1i)) = √(−79.19802 + 8.019802i)
 */
export function drudeMaterial(params: DrudeParams, info: MaterialInfoInput): DrudeMaterial {
  const base = checkInfo(info);
  const epsInf = params.epsInf ?? 1;
  const { plasmaEv: wp, dampingEv: g } = params;
  if (!Number.isFinite(epsInf)) throw new MaterialError('invalid-data', `epsInf must be finite, found ${epsInf}`, base.id, { path: 'epsInf' });
  if (!(Number.isFinite(wp) && wp > 0)) throw new MaterialError('invalid-data', `plasmaEv must be a finite number > 0 (eV), found ${wp}`, base.id, { path: 'plasmaEv' });
  if (!(Number.isFinite(g) && g >= 0)) throw new MaterialError('invalid-data', `dampingEv must be a finite number ≥ 0 (eV), found ${g}`, base.id, { path: 'dampingEv' });
  const wp2 = wp * wp;
  return Object.freeze({
    ...base,
    kind: 'drude' as const,
    params: Object.freeze({ epsInf, plasmaEv: wp, dampingEv: g }),
    index(wavelengthUm: number) {
      const w = photonEnergyEv(wavelengthUm);
      // −ωp²/(ω² + iωγ) = −ωp²·(ω² − iωγ)/(ω⁴ + ω²γ²) = −ωp²·(ω − iγ)/(ω·(ω² + γ²))
      const d = w * (w * w + g * g);
      return indexFromPermittivity(epsInf - (wp2 * w) / d, (wp2 * g) / d);
    },
  });
}
