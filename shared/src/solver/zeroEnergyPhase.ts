/**
 * Zero-energy phase Ψ(λ) of −½ g'' + λ w(x) g = 0 on x ≥ 0 (even: g'(0) = 0,
 * odd: g(0) = 0). The number of bound states of that parity is ⌊Ψ/π⌋
 * (Sturm oscillation theorem: the count equals the number of zeros of the
 * zero-energy solution on (0, ∞)), and the coupling where level j of the
 * parity appears is the root of Ψ(λ) = (j + 1)π.
 *
 * The solution is integrated on the mesh out to a node x_e where the tail
 * form holds, counting its N sign changes; beyond x_e it is continued
 * exactly:
 *  - 1/x⁴ tail, λw ≈ −λC4/x⁴: the zero-energy solutions are x·sin(k/x + φ),
 *    k = √(2λC4). With u_e = k/x_e and θ_e ∈ (0, π) fixed by
 *    cot θ_e = (g − x_e g')/(u_e g), the remaining zeros are those of
 *    θ ↦ sin θ as θ runs from θ_e down to φ = θ_e − u_e, so
 *      Ψ = (N + 1)π + u_e − θ_e.
 *    A level sits at threshold exactly when φ ≡ 0 (mod π) — tan φ = 0.
 *  - faster-decaying tails (no C4): g is linear beyond x_e, with one more
 *    zero iff g g' < 0; Ψ = Nπ + π/2 + θ, θ = atan2(|g|, x_e g' sgn g) ∈ (0, π).
 * x_e is the first of four consecutive nodes where |w x⁴/C4 + 1| < 1e-9
 * (with C4) or x²λ|w| < 1e-16 (without), else the end of the mesh (xMax).
 *
 * Internal to the solver.
 */
import { magnusSweep } from './magnusStep.js';
import { MESH_STRIDE, type SinhMesh } from './sinhMesh.js';

const TAIL_REL = 1e-9;
const TAIL_ABS = 1e-16;

/** (g, g') scratch of the sweep (module-level: no allocation per evaluation; the engine is single-threaded per worker). */
const SCRATCH = new Float64Array(2);

/** Ψ(λ) and the node count on the numerical range, for one parity. */
export function zeroEnergyPhase(mesh: SinhMesh, lambda: number, odd: boolean, c4: number | undefined): number {
  // x_e does not depend on the solution: find it first (extending the mesh as needed) …
  const withC4 = c4 !== undefined && c4 > 0;
  let good = 0;
  let k = 0;
  for (;;) {
    if (k >= mesh.n) {
      if (mesh.t[mesh.n] >= mesh.tMax) break;
      mesh.ensure(mesh.x[mesh.n] * 4 + mesh.a);
      if (k >= mesh.n) break;
    }
    k++;
    const x = mesh.x[k];
    const w = mesh.wNode[k];
    const inTail = withC4 ? Math.abs((w * x * x * x * x) / c4 + 1) < TAIL_REL : x * x * lambda * Math.abs(w) < TAIL_ABS;
    good = inTail ? good + 1 : 0;
    if (good >= 4) break;
  }
  // … then integrate the steps 0 … k − 1 in one sweep
  const y = SCRATCH;
  y[0] = odd ? 0 : 1;
  y[1] = odd ? 1 : 0;
  const nodes = magnusSweep(mesh.step, MESH_STRIDE, 0, k, 1, 2 * lambda, 0, y);
  const g = y[0];
  const gp = y[1];
  const xe = mesh.x[k];
  const sg = g >= 0 ? 1 : -1;
  if (c4 !== undefined && c4 > 0) {
    const ue = Math.sqrt(2 * lambda * c4) / xe;
    const thE = Math.atan2(ue * g * sg, (g - xe * gp) * sg);
    return (nodes + 1) * Math.PI + ue - thE;
  }
  const th = Math.atan2(Math.abs(g), xe * gp * sg);
  return nodes * Math.PI + Math.PI / 2 + th;
}
