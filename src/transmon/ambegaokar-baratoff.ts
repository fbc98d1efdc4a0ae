/**
 * Josephson energy of a tunnel junction from its normal-state resistance by the
 * Ambegaokar-Baratoff relation (V. Ambegaokar and A. Baratoff, Phys. Rev. Lett. 10, 486 (1963))
 * at zero temperature:
 *
 *     I_c R_n = pi Delta / (2 e),   E_J = hbar I_c / (2 e)   =>   E_J = h Delta / (8 e^2 R_n).
 *
 * Delta is the superconducting gap; 180 ueV for thin-film aluminium is common practice, giving
 * E_J / h = Delta / (8 e^2 R_n) ~ 140.4 GHz kOhm / R_n. Constants: CODATA 2018 exact values of
 * e and h (SI redefinition of 2019).
 */

/** Elementary charge (C), CODATA 2018, exact. */
export const ELEMENTARY_CHARGE = 1.602176634e-19;
/** Planck constant (J s), CODATA 2018, exact. */
export const PLANCK_CONSTANT = 6.62607015e-34;

export const AMBEGAOKAR_BARATOFF_DEFAULTS = Object.freeze({
  /** Superconducting gap of aluminium (micro-eV), common practice. */
  gapUeV: 180,
});

/** E_J / h in GHz for a junction of normal-state resistance `rnKOhm` and gap `gapUeV`. */
export function josephsonEnergyFromResistance(rnKOhm: number, gapUeV: number = AMBEGAOKAR_BARATOFF_DEFAULTS.gapUeV): number {
  const deltaJoule = gapUeV * 1e-6 * ELEMENTARY_CHARGE;
  const rOhm = rnKOhm * 1e3;
  const ejJoule = (PLANCK_CONSTANT * deltaJoule) / (8 * ELEMENTARY_CHARGE * ELEMENTARY_CHARGE * rOhm);
  return ejJoule / PLANCK_CONSTANT / 1e9;
}

/** The product E_J R_n in GHz kOhm (about 140.4 for 180 ueV). */
export function ambegaokarBaratoffConstant(gapUeV: number = AMBEGAOKAR_BARATOFF_DEFAULTS.gapUeV): number {
  return josephsonEnergyFromResistance(1, gapUeV);
}
