/**
 * The Lorentz–Drude model in the form of A. D. Rakić et al., Appl. Opt. 37, 5271 (1998), photon
 * energies in eV and ω = 1.239842 / λ[µm]:
 *
 *   ε(ω) = 1 − f0·ωp² / (ω·(ω + iΓ0)) + Σⱼ fⱼ·ωp² / (ωⱼ² − ω² − iωΓⱼ),
 *
 * written for the exp(−iωt) convention, so Im ε ≥ 0 for non-negative strengths and dampings.
 */
import { MaterialError } from './errors.ts';
import { checkInfo, type MaterialInfoInput } from './info.ts';
import type { Material } from './material.ts';
import { indexFromPermittivity } from './permittivity.ts';
import { photonEnergyEv } from './photon.ts';

/** One Lorentz oscillator: strength fⱼ, damping Γⱼ (eV), resonance ωⱼ (eV). */
export interface LorentzOscillator {
  readonly f: number;
  readonly gammaEv: number;
  readonly omegaEv: number;
}

/** Lorentz–Drude parameters. */
export interface LorentzDrudeParams {
  /** plasma energy ħωp, eV (> 0) */
  readonly plasmaEv: number;
  /** strength of the free-electron (Drude) term, ≥ 0 (0 for a pure Lorentz medium) */
  readonly f0: number;
  /** damping of the free-electron term Γ0, eV (≥ 0) */
  readonly gamma0Ev: number;
  /** bound-electron oscillators (may be empty) */
  readonly oscillators: readonly LorentzOscillator[];
}

/** A material described by the Lorentz–Drude model. */
export interface LorentzDrudeMaterial extends Material {
  readonly kind: 'lorentz-drude';
  readonly params: LorentzDrudeParams;
}

/**
 * Build a Lorentz–Drude material.
 * @param params plasmaEv, f0, gamma0Ev and oscillators {f, gammaEv, omegaEv} (energies in eV)
 * @param info id, citation and valid range (µm)
 * @throws {MaterialError} 'invalid-data' for non-finite or negative parameters, or bad info
 * @example
 * const au = lorentzDrudeMaterial({ plasmaEv: 9.03, f0: 0.76, gamma0Ev: 0.053, oscillators: [] },
 *   { id: 'au-free', citation: 'Drude part only', validRangeUm: [0.5, 10] });
 */
export function lorentzDrudeMaterial(params: LorentzDrudeParams, info: MaterialInfoInput): LorentzDrudeMaterial {
  const base = checkInfo(info);
  const bad = (path: string, what: string, v: number): never => {
    throw new MaterialError('invalid-data', `${path} must be ${what}, found ${v}`, base.id, { path });
  };
  const { plasmaEv: wp, f0, gamma0Ev: g0 } = params;
  if (!(Number.isFinite(wp) && wp > 0)) bad('plasmaEv', 'a finite number > 0 (eV)', wp);
  if (!(Number.isFinite(f0) && f0 >= 0)) bad('f0', 'a finite number ≥ 0', f0);
  if (!(Number.isFinite(g0) && g0 >= 0)) bad('gamma0Ev', 'a finite number ≥ 0 (eV)', g0);
  const osc = params.oscillators.map((o, j) => {
    if (!(Number.isFinite(o.f) && o.f >= 0)) bad(`oscillators[${j}].f`, 'a finite number ≥ 0', o.f);
    if (!(Number.isFinite(o.gammaEv) && o.gammaEv >= 0)) bad(`oscillators[${j}].gammaEv`, 'a finite number ≥ 0 (eV)', o.gammaEv);
    if (!(Number.isFinite(o.omegaEv) && o.omegaEv >= 0)) bad(`oscillators[${j}].omegaEv`, 'a finite number ≥ 0 (eV)', o.omegaEv);
    return Object.freeze({ f: o.f, gammaEv: o.gammaEv, omegaEv: o.omegaEv });
  });
  const wp2 = wp * wp;
  return Object.freeze({
    ...base,
    kind: 'lorentz-drude' as const,
    params: Object.freeze({ plasmaEv: wp, f0, gamma0Ev: g0, oscillators: Object.freeze(osc) }),
    index(wavelengthUm: number) {
      const w = photonEnergyEv(wavelengthUm);
      // free electrons: −f0·ωp²/(ω² + iωΓ0) = −f0·ωp²·(ω − iΓ0)/(ω·(ω² + Γ0²))
      const d0 = w * (w * w + g0 * g0);
      let re = 1 - (f0 * wp2 * w) / d0;
      let im = (f0 * wp2 * g0) / d0;
      // bound electrons: fⱼωp²/(a − ib) = fⱼωp²·(a + ib)/(a² + b²), a = ωⱼ² − ω², b = ωΓⱼ
      for (const o of osc) {
        const a = o.omegaEv * o.omegaEv - w * w;
        const b = w * o.gammaEv;
        const s = (o.f * wp2) / (a * a + b * b);
        re += s * a;
        im += s * b;
      }
      return indexFromPermittivity(re, im);
    },
  });
}
