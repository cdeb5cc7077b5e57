import type { AtomicField, AtomicPolarizability, Bohr, HartreeBohr } from '../units/brand.js';
import { gamma } from '../special/gamma.js';
import { tricomiU32 } from '../special/tricomiU32.js';
import { checkM, checkNonNegative, checkPositive } from './validate.js';

const PI_OVER_8_SQRT2 = Math.PI / (8 * Math.SQRT2);

/**
 * Integral of the scaled potential over the whole line (units l = B^(−1/2), energy B, λ = 1):
 *
 *   W1_m(ρ_c) = ∫ w_m(ζ; ρ_c) dζ = −(π / (8√2)) · U(3/2, 3/2−m, ρ_c²/2).
 *
 * The first weak-coupling order of the scaled 1D problem is κ ≈ −λ·W1 (B. Simon,
 * Ann. Phys. 97, 279 (1976)). Limits: ρ_c → 0, m ≥ 1: −πΓ(m−½)/(8√2 m!)
 * (`scaledPotentialIntegralZeroCutoff`); m = 0: −π/(4ρ_c) + (π^(3/2)/(4√2)) e^s erfc(√s), s = ρ_c²/2,
 * which diverges as ρ_c → 0 (returns −Infinity at ρ_c = 0).
 *
 * Domain: integer m ≥ 0, finite ρ_c ≥ 0; throws `DomainError` otherwise.
 * Accuracy: that of `tricomiU32`, ≤ 1e-14 relative.
 *
 * Source: model.md §1; DLMF 13.4.4 (F. W. J. Olver et al., 2010–).
 *
 * @example
 * scaledPotentialIntegral(1, 0); // -0.4921753108038257  (= −π·√π/(8√2))
 */
export function scaledPotentialIntegral(m: number, rhoC: number): number {
  checkM(m);
  checkNonNegative('rhoC', rhoC);
  return -PI_OVER_8_SQRT2 * tricomiU32(m, 0.5 * rhoC * rhoC);
}

/**
 * ∫V_m dz over the whole line, in hartree·bohr:
 *
 *   ∫V_m dz = −(α π B^(3/2) / (8√2)) · U(3/2, 3/2−m, s),   s = r_c² B / 2.
 *
 * Units: α in a₀³, B in atomic units, r_c in bohr. m = 0 equals
 * −απB/(4r_c) + (απ^(3/2)B^(3/2)/(4√2)) e^s erfc(√s) and diverges as r_c → 0 (−Infinity at r_c = 0).
 *
 * Domain: integer m ≥ 0, finite α ≥ 0, finite B > 0, finite r_c ≥ 0; throws `DomainError`.
 *
 * Source: model.md §1; DLMF 13.4.4.
 *
 * @example
 * potentialIntegral(1, atomicPolarizability(400), atomicField(1e-4), bohr(0)); // -1.9689748…e-4
 */
export function potentialIntegral(
  m: number,
  alpha: AtomicPolarizability,
  fieldAu: AtomicField,
  cutoffBohr: Bohr,
): HartreeBohr {
  checkM(m);
  checkNonNegative('alpha', alpha);
  checkPositive('fieldAu', fieldAu);
  checkNonNegative('cutoffBohr', cutoffBohr);
  const s = 0.5 * cutoffBohr * cutoffBohr * fieldAu;
  return (-alpha * PI_OVER_8_SQRT2 * fieldAu * Math.sqrt(fieldAu) * tricomiU32(m, s)) as HartreeBohr;
}

/**
 * Zero-cutoff limit of `scaledPotentialIntegral` for m ≥ 1: −π Γ(m − ½) / (8√2 m!).
 * Domain: integer m ≥ 1 (m = 0 diverges); throws `DomainError` otherwise.
 * Source: model.md §1; U(a, b, 0) = Γ(1−b)/Γ(a−b+1) for b < 1 (DLMF 13.2.16–13.2.18).
 * @example scaledPotentialIntegralZeroCutoff(1); // -0.4921753108038257
 */
export function scaledPotentialIntegralZeroCutoff(m: number): number {
  checkM(m);
  checkPositive('m', m);
  return (-PI_OVER_8_SQRT2 * gamma(m - 0.5)) / gamma(m + 1);
}
