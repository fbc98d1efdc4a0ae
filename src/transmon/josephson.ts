/**
 * Josephson energy of an asymmetric SQUID against external flux (Koch et al., Phys. Rev. A 76,
 * 042319 (2007), Eq. 2.17):
 *
 *     E_J(Phi) = E_JS sqrt( cos^2(pi Phi) + d^2 sin^2(pi Phi) ),   d = |E_J1 - E_J2| / (E_J1 + E_J2)
 *
 * Flux in units of Phi0, energies in GHz. E_J is even and 1-periodic in Phi; fluxlane works on
 * the branch 0 <= Phi <= 1/2 (E_J falls from E_JS at the upper sweet spot to d E_JS).
 */

/**
 * cos(pi x) and sin(pi x), exact (0, +-1) at multiples of 1/2, so that slopes vanish exactly at
 * the sweet spots Phi = 0 and Phi = 1/2 (Math.cos(Math.PI / 2) is 6e-17, not 0).
 */
function cosPi(x: number): number {
  const twice = 2 * x;
  if (Number.isInteger(twice)) {
    const k = ((twice % 4) + 4) % 4;
    return k === 0 ? 1 : k === 2 ? -1 : 0;
  }
  return Math.cos(Math.PI * x);
}

function sinPi(x: number): number {
  const twice = 2 * x;
  if (Number.isInteger(twice)) {
    const k = ((twice % 4) + 4) % 4;
    return k === 1 ? 1 : k === 3 ? -1 : 0;
  }
  return Math.sin(Math.PI * x);
}

/** E_J(Phi) for SQUID energy `ejsGHz` and asymmetry `d`. */
export function josephsonEnergy(ejsGHz: number, d: number, flux: number): number {
  const c = cosPi(flux);
  const s = sinPi(flux);
  return ejsGHz * Math.sqrt(c * c + d * d * s * s);
}

/**
 * dE_J/dPhi = -pi E_JS (1 - d^2) sin(pi Phi) cos(pi Phi) / sqrt(cos^2 + d^2 sin^2)   (GHz per Phi0).
 * At d = 0 and Phi = 1/2 the derivative is not defined (E_J has a cusp); we return the one-sided
 * limit from below, -pi E_JS, there.
 */
export function josephsonEnergySlope(ejsGHz: number, d: number, flux: number): number {
  const c = cosPi(flux);
  const s = sinPi(flux);
  const root = Math.sqrt(c * c + d * d * s * s);
  if (root === 0) return -Math.PI * ejsGHz * Math.sign(s) * Math.sign(c || 1);
  return (-Math.PI * ejsGHz * (1 - d * d) * s * c) / root;
}

/**
 * Inverse on the working branch: the flux 0 <= Phi <= 1/2 with E_J(Phi) = ejGHz, for
 * d E_JS <= ejGHz <= E_JS. From cos^2(pi Phi) = (x^2 - d^2) / (1 - d^2) with x = E_J / E_JS.
 * Returns NaN when ejGHz is outside [d E_JS, E_JS].
 */
export function fluxForJosephsonEnergy(ejsGHz: number, d: number, ejGHz: number): number {
  const x = ejGHz / ejsGHz;
  if (x > 1 + 1e-15 || x < d - 1e-15) return NaN;
  const c2 = Math.min(1, Math.max(0, (x * x - d * d) / (1 - d * d)));
  return Math.acos(Math.sqrt(c2)) / Math.PI;
}
