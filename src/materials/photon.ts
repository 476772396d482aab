/** Photon energy and vacuum wavelength. */

/**
 * hc/e in eV·µm as the Lorentz–Drude fits of the built-in library use it: ħω [eV] = 1.239842 / λ [µm]
 * (CODATA hc/e = 1.239841984… eV·µm, rounded to 7 digits).
 */
export const HC_EV_UM = 1.239842;

/**
 * Photon energy ħω in eV for a vacuum wavelength in µm.
 * @example
 * photonEnergyEv(1.239842); // 1
 */
export function photonEnergyEv(wavelengthUm: number): number {
  return HC_EV_UM / wavelengthUm;
}
