import type { AtomicField, AtomicPolarizability, Bohr, Hartree } from '../units/brand.js';
import { tricomiU2Unchecked } from '../special/tricomiU2.js';
import { checkFinite, checkM, checkNonNegative, checkPositive } from './validate.js';

/**
 * Adiabatic (transverse-averaged) polarization potential of the m-th lowest-Landau-level
 * orbital, in hartree:
 *
 *   V_m(z) = −(α B² / 8) · U(2, 2−m, b),   b = (z² + r_c²) B / 2,
 *
 * the average of V(r) = −α / (2(r² + r_c²)²) over |φ_m(ρ)|² = u^m e^(−u)/(2π l² m!),
 * u = ρ²/(2l²), l = B^(−1/2). Equivalently V_m = e^b[E_m(b) − E_{m+1}(b)]·(−αB²/8).
 *
 * Units: z and r_c in bohr, α in a₀³, B in atomic units (B₀ = 2.350517567581e5 T); result
 * in hartree. Limits: far tail −α/(2D²)[1 − 4(m+1)l²/D + …], D = z² + r_c²;
 * m = 0 near the atom −(αB/4)/(z² + r_c²); m ≥ 2, z = r_c = 0: −αB²/(8m(m−1)).
 *
 * Domain: integer m ≥ 0; finite z; finite α ≥ 0; finite B > 0; finite r_c ≥ 0;
 * throws `DomainError` naming the parameter otherwise. −Infinity at z = r_c = 0 for m ≤ 1.
 *
 * Source: model.md §1; DLMF 13.4.4, 8.19 (F. W. J. Olver et al., 2010–).
 *
 * @example
 * adiabaticPotential(2, bohr(0), atomicPolarizability(400), atomicField(1e-4), bohr(0));
 * // -2.5e-7  (= −400·1e-8/16)
 */
export function adiabaticPotential(
  m: number,
  zBohr: Bohr,
  alpha: AtomicPolarizability,
  fieldAu: AtomicField,
  cutoffBohr: Bohr,
): Hartree {
  checkM(m);
  checkFinite('zBohr', zBohr);
  checkNonNegative('alpha', alpha);
  checkPositive('fieldAu', fieldAu);
  checkNonNegative('cutoffBohr', cutoffBohr);
  const b = 0.5 * (zBohr * zBohr + cutoffBohr * cutoffBohr) * fieldAu;
  return (-(alpha * fieldAu * fieldAu) / 8) * tricomiU2Unchecked(m, b) as Hartree;
}
