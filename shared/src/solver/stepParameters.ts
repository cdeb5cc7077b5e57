import type { BoundStateOptions } from './types.js';

/**
 * Step parameters of the sixth-order scheme from the accuracy knob `tol`:
 * local error ∝ h⁷, global ∝ h⁶, so h = h₀·(tol/tol₀)^(1/6) with the
 * calibration point h₀ = 0.07, cOsc = 0.14 ↔ tol₀ = 1e-8 (the worst relative
 * level error of Pöschl–Teller λ = 2.5 at these steps is 8e-9; the adiabatic
 * potentials w_m come out 10–1000× better). Explicit hMax / cOsc override. Internal.
 */
export function stepParameters(opts: BoundStateOptions): { hMax: number; cOsc: number } {
  const tol = opts.tol ?? 1e-10;
  const f = Math.pow(tol / 1e-8, 1 / 6);
  const h = Math.min(0.25, Math.max(0.004, 0.07 * f));
  return { hMax: opts.hMax ?? h, cOsc: opts.cOsc ?? 2 * h };
}
