/**
 * Prüfer-type matching function of the bound-state problem
 *   −½ g'' + λ w(x) g = −ε g,  x ≥ 0,  even (g'(0) = 0) or odd (g(0) = 0) parity.
 *
 * The solution regular at the origin is carried outward to the matching node
 * x_m (the end of the last mesh step where λ|w| ≥ ε, i.e. the outer turning
 * point), the decaying solution inward from x_far = x_m + L/κ (κ = √(2ε)),
 * started from the WKB log-derivative y = −√(κ² + 2λw(x_far)). With
 * y = g'/g and the Prüfer angle θ = arccot(y/κ) ∈ (0, π),
 *   F(ε) = (N_out + N_in)·π + θ_out(x_m) − θ_in(x_m),
 * where N_out, N_in count the sign changes of g on each side. F decreases
 * monotonically with ε, equals j·π exactly at the j-th level of the parity
 * (j = 0, 1, …) and the number of levels bound more deeply than ε is
 * ⌈F/π⌉ for F > 0 (0 for F ≤ 0) — the Sturm count. The angle form stays well
 * conditioned when y/κ is huge or tiny (κ down to 1e-13).
 *
 * Internal to the solver.
 */
import { magnusSweep } from './magnusStep.js';
import { MESH_STRIDE, type SinhMesh } from './sinhMesh.js';

/** Decay lengths 1/κ between the turning point and the inward start: e^(−2L) ≈ 4e-18. */
export const DECAY_LENGTHS = 20;

function pruferAngle(g: number, gp: number, kappa: number): number {
  // arccot(g'/(κ g)) in (0, π): sin θ ∝ κ g, cos θ ∝ g'; fold the sign of g in.
  return g >= 0 ? Math.atan2(kappa * g, gp) : Math.atan2(-kappa * g, -gp);
}

/** (g, g') scratch of the sweeps (module-level: no allocation per evaluation; the engine is single-threaded per worker). */
const SCRATCH = new Float64Array(2);

/**
 * F(ε) for coupling `lambda` on `mesh` (extended on demand).
 * @param odd false for even parity (g'(0) = 0), true for odd (g(0) = 0)
 */
export function pruferMismatch(mesh: SinhMesh, lambda: number, eps: number, odd: boolean): number {
  const kappa = Math.sqrt(2 * eps);
  const S = MESH_STRIDE;
  // Matching node: end of the last step where λ·max|w| ≥ ε.
  let km = 0;
  const n0 = mesh.n;
  const st0 = mesh.step;
  for (let k = n0 - 1; k >= 0; k--) {
    if (lambda * st0[k * S + 6] >= eps) {
      km = k + 1;
      break;
    }
  }
  if (km === n0 && lambda * Math.abs(mesh.wNode[n0]) >= eps) {
    // The well reaches past the built mesh: extend until it ends.
    while (mesh.t[mesh.n] < mesh.tMax && lambda * Math.abs(mesh.wNode[mesh.n]) >= eps) {
      mesh.ensure(mesh.x[mesh.n] * 2 + mesh.a);
    }
    const st1 = mesh.step;
    for (let k = mesh.n - 1; k >= 0; k--) {
      if (lambda * st1[k * S + 6] >= eps) {
        km = k + 1;
        break;
      }
    }
  }
  const xFar = mesh.x[km] + DECAY_LENGTHS / kappa;
  mesh.ensure(xFar);
  const kFar = mesh.nodeAtOrBeyond(xFar);
  const st = mesh.step;
  const y = SCRATCH;
  const twoL = 2 * lambda;
  const twoE = 2 * eps;

  // Outward.
  y[0] = odd ? 0 : 1;
  y[1] = odd ? 1 : 0;
  const nOut = magnusSweep(st, S, 0, km, 1, twoL, twoE, y);
  const thOut = pruferAngle(y[0], y[1], kappa);

  // Inward.
  const q = kappa * kappa + twoL * mesh.wNode[kFar];
  y[0] = 1;
  y[1] = -Math.sqrt(q > 0 ? q : kappa * kappa);
  const nIn = magnusSweep(st, S, km, kFar, -1, twoL, twoE, y);
  const h = y[0];
  const hp = y[1];
  const thIn = pruferAngle(h, hp, kappa);
  return (nOut + nIn) * Math.PI + thOut - thIn;
}
