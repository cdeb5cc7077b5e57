import { EngineInputError } from '../errors.js';

/** The moments of an even potential w that enter the 1D weak-coupling series. */
export interface WeakCouplingCoefficients {
  /** W1 = ∫ w dx */
  W1: number;
  /** M2 = ∫ x² w dx */
  M2: number;
  /** D2 = ∫∫ w(x) |x − y| w(y) dx dy = ∫ w φ, φ(y) = ∫ |x − y| w(x) dx */
  D2: number;
  /** D3 = ∫ w φ² dy */
  D3: number;
}

/**
 * Coefficients of the weak-coupling expansion of the single bound state of
 * −½ g'' + λ w(x) g = −ε g (w even, ∫w < 0), κ = √(2ε):
 *   κ = −λ W1 − λ² D2 − λ³ (W1² M2 + D3) + …
 * (B. Simon, "The bound state of weakly coupled Schrödinger operators in one
 * and two dimensions", Ann. Phys. 97, 279 (1976); for a 1/x⁴ tail the next
 * term is O(λ⁴ ln λ)).
 *
 * Computed by quadrature on x = a·sinh t, t ∈ [0, asinh(1e17/a)], as the
 * ODE system C0' = w, ψ' = 2C0, A' = wψ, Bq' = wψ², T1' = xw, M' = x²w
 * (primes d/dx, all from 0), integrated with classical RK4 at steps h and h/2
 * in t and Richardson-extrapolated (≈1e-12 relative for smooth w). With
 * W = C0(∞), φ(y) = 2T1 + ψ(y) for y ≥ 0:
 *   W1 = 2W, M2 = 2M, D2 = 4 T1 W + 2A, D3 = 2(4 T1² W + 4 T1 A + Bq).
 * Assumes w decays at least like 1/x⁴ (M2 and D3 must converge); w must be
 * smooth (no discontinuities) for the stated accuracy.
 *
 * Bad input: throws EngineInputError if scale is not positive and finite.
 *
 * @example
 * weakCouplingCoefficients((x) => -1 / Math.cosh(x) ** 2, 0.5)
 * // { W1: -2, M2: -1.6449340668… (−π²/6), D2: 4, D3: -9.4202637… (−16 + 2π²/3) }
 */
export function weakCouplingCoefficients(w: (x: number) => number, scale: number, h = 0.01): WeakCouplingCoefficients {
  if (!(scale > 0) || !Number.isFinite(scale)) throw new EngineInputError('scale', `must be positive and finite, got ${scale}`);
  const c1 = rk4Moments(w, scale, h);
  const c2 = rk4Moments(w, scale, h / 2);
  const out = new Float64Array(6);
  for (let i = 0; i < 6; i++) out[i] = (16 * c2[i] - c1[i]) / 15;
  const [W, , A, Bq, T1, M] = out as unknown as number[];
  return {
    W1: 2 * W,
    M2: 2 * M,
    D2: 4 * T1 * W + 2 * A,
    D3: 2 * (4 * T1 * T1 * W + 4 * T1 * A + Bq),
  };
}

/** RK4 for (C0, ψ, A, Bq, T1, M) in t; returns the values at the end. Internal. */
function rk4Moments(w: (x: number) => number, a: number, h: number): Float64Array {
  const tEnd = Math.asinh(1e17 / a);
  const n = Math.ceil(tEnd / h);
  h = tEnd / n;
  let c0 = 0, psi = 0, A = 0, Bq = 0, T1 = 0, M = 0;
  let t = 0;
  let x0 = 0;
  let d0 = a;
  let w0 = w(0);
  for (let i = 0; i < n; i++) {
    const tm = t + 0.5 * h;
    const xm = a * Math.sinh(tm);
    const dm = a * Math.cosh(tm);
    const wm = w(xm);
    const t1 = t + h;
    const x1 = a * Math.sinh(t1);
    const d1 = a * Math.cosh(t1);
    const w1 = w(x1);
    // stage derivatives of (c0, psi, A, Bq); T1 and M are plain quadratures (Simpson).
    const k1c = w0 * d0;
    const k1p = 2 * c0 * d0;
    const k1A = w0 * psi * d0;
    const k1B = w0 * psi * psi * d0;
    const c2 = c0 + 0.5 * h * k1c;
    const p2 = psi + 0.5 * h * k1p;
    const k2c = wm * dm;
    const k2p = 2 * c2 * dm;
    const k2A = wm * p2 * dm;
    const k2B = wm * p2 * p2 * dm;
    const c3 = c0 + 0.5 * h * k2c;
    const p3 = psi + 0.5 * h * k2p;
    const k3c = wm * dm;
    const k3p = 2 * c3 * dm;
    const k3A = wm * p3 * dm;
    const k3B = wm * p3 * p3 * dm;
    const c4 = c0 + h * k3c;
    const p4 = psi + h * k3p;
    const k4c = w1 * d1;
    const k4p = 2 * c4 * d1;
    const k4A = w1 * p4 * d1;
    const k4B = w1 * p4 * p4 * d1;
    c0 += (h / 6) * (k1c + 2 * k2c + 2 * k3c + k4c);
    psi += (h / 6) * (k1p + 2 * k2p + 2 * k3p + k4p);
    A += (h / 6) * (k1A + 2 * k2A + 2 * k3A + k4A);
    Bq += (h / 6) * (k1B + 2 * k2B + 2 * k3B + k4B);
    T1 += (h / 6) * (x0 * w0 * d0 + 4 * xm * wm * dm + x1 * w1 * d1);
    M += (h / 6) * (x0 * x0 * w0 * d0 + 4 * xm * xm * wm * dm + x1 * x1 * w1 * d1);
    t = t1;
    x0 = x1;
    d0 = d1;
    w0 = w1;
  }
  return Float64Array.of(c0, psi, A, Bq, T1, M);
}

/**
 * The weak-coupling series for κ = √(2ε) to first, second or third order in λ,
 *   κ₁ = −λW1,  κ₂ = κ₁ − λ²D2,  κ₃ = κ₂ − λ³(W1²M2 + D3),
 * and ε = κ²/2 (B. Simon, Ann. Phys. 97, 279 (1976)). Units those of w (ε)
 * and 1/length (κ). `terms` are the three separate contributions; the last
 * one is a rough size of the truncation error of the order below.
 *
 * @example
 * weakCouplingKappa({ W1: -2, D2: 4, M2: -Math.PI ** 2 / 6, D3: -16 + (2 * Math.PI ** 2) / 3 }, 1e-3)
 * // { kappa: 0.001996016, epsilon: 1.99203…e-6, terms: [0.002, -4e-6, 1.6e-8] }
 */
export function weakCouplingKappa(
  c: WeakCouplingCoefficients,
  lambda: number,
  order: 1 | 2 | 3 = 3,
): { kappa: number; epsilon: number; terms: [number, number, number] } {
  const t1 = -lambda * c.W1;
  const t2 = -lambda * lambda * c.D2;
  const t3 = -lambda * lambda * lambda * (c.W1 * c.W1 * c.M2 + c.D3);
  const kappa = t1 + (order >= 2 ? t2 : 0) + (order >= 3 ? t3 : 0);
  return { kappa, epsilon: (kappa * kappa) / 2, terms: [t1, t2, t3] };
}
