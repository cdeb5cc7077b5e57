/**
 * Continuation of m ≥ 1 states: labelling does not depend on the path step,
 * and the widths are converged in the orbital basis.
 */
import { describe, expect, it } from 'vitest';
import { expectClose } from '../../../test/expectClose.js';
import { traceState } from './traceState.js';
import { powerLawKappa } from './zeroRangeSolver.js';

describe('traceState (m = 3, p = 3)', () => {
  const xs = [6, 4, 3];
  const base = traceState(3, powerLawKappa(3, 3), xs);

  it('finds a resolved, converged pole at ξ = 6, 4, 3', () => {
    for (const s of base) {
      expect(s.destroyed, `ξ = ${s.xi}`).toBe(false);
      expect(s.unresolved, `ξ = ${s.xi}`).toBe(false);
      expect(s.converged, `ξ = ${s.xi}`).toBe(true);
    }
  });

  it('a finer continuation step reaches the same state: ΔE ≤ 1e-8, Δ ln Γ ≤ 1e-6 (exact identity of the labelling)', () => {
    const fine = traceState(3, powerLawKappa(3, 3), xs, { step: 0.1, fineStep: 0.05 });
    base.forEach((s, i) => {
      expectClose(fine[i]!.energy, s.energy, { rel: 0, abs: 1e-8, inputs: { xi: s.xi }, source: 'exact identity (path independence)' });
      expectClose(Math.log(fine[i]!.width), Math.log(s.width), { rel: 0, abs: 1e-6, inputs: { xi: s.xi }, source: 'exact identity (path independence)' });
    });
  });

  it('15 more orbitals change ln Γ by ≤ 1e-2 (basis convergence, common practice)', () => {
    const big = traceState(3, powerLawKappa(3, 3), xs, { extraOrbitals: 15 });
    base.forEach((s, i) => {
      expectClose(Math.log(big[i]!.width), Math.log(s.width), { rel: 0, abs: 1e-2, inputs: { xi: s.xi, orbitals: s.orbitals, more: big[i]!.orbitals }, source: 'basis convergence (common practice)' });
    });
  });
});
