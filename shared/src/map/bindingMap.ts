import type { MapSetup } from '../setup/mapSetup.js';
import type { BindingMapOptions } from './bindingMapOptions.js';
import { evaluateBindingMapRows, type BindingMapWindowResult } from './evaluateBindingMapRows.js';
import type { BindingMapResult } from './mapTypes.js';
import { prepareBindingMap } from './prepareBindingMap.js';

/** Share of the progress count given to building the models (the rest is filling the cells). */
const BUILD_SHARE = 0.9;

/**
 * Binding energies of every field-induced state over a map of polarizability α × field B
 * (issue 3, item 6): for each cell (α_i, B_j), orbital m = 0…mMax and level ν, the binding
 * ε_{m,ν} in hartree below the lowest-Landau-level threshold, the number of levels above the energy
 * floor and the validity flags (MAP_FLAG), in the layout of mapTypes.ts.
 *
 * Method (docs/physics/maps.md; model.md §2): with r_c fixed, ε = B·f(λ = αB, ρ_c = r_c√B). Per
 * orbital, G = ln(ε/B) − 2 ln(λ − λ_c,ν) is interpolated on tensor Chebyshev–Lobatto grids — the
 * ground state in (ln α, ln B), each excited level in (ln(λ − λ_c,ν(B)), ln B) with its threshold
 * curve λ_c,ν(ln B) interpolated to ~1e-12 — from a few thousand direct solves per orbital; grids
 * are refined (nested doubling) until the Chebyshev tails are below the tolerance, node values are
 * checked by re-solving with halved steps, and every cell whose estimated error exceeds half the
 * tolerance (or whose level count is uncertain near a threshold) is solved directly and flagged
 * DIRECT_SOLVE. Count per cell = #{ν : λ_c,ν < λ} above the floor.
 *
 * Units: setup axes in a₀³ and tesla (as stored), floor in kelvin (converted with CODATA 2018);
 * results in hartree and atomic units of field. Accuracy: every stored value within `tolerance`
 * (default 1e-6) relative of a direct `levels` solve (measured: docs/benchmarks.md).
 * Deterministic: the numbers depend only on the setup, the tolerance and ENGINE_VERSION
 * (elapsedMs is the only clock reading).
 *
 * Bad input: SetupValidationError (invalid setup: grid over 1024², mMax over 64, inverted or
 * non-positive ranges, …) or EngineInputError (options), thrown before any work. Cancel: abort
 * `signal`; the call then throws an Error named 'AbortError' at the next chunk boundary.
 *
 * @example
 * const map = bindingMap(defaultSetup(), { onProgress: (p) => console.log(p.done, '/', p.total) });
 * map.bindingHartree[stateIndex(0, 0, 0, map.levelsPerOrbital, map.cellCount)] // ε_{0,0} at α_min, B_min
 */
export function bindingMap(setup: MapSetup, options: BindingMapOptions = {}): BindingMapResult {
  const t0 = Date.now();
  const model = prepareBindingMap(setup, options, BUILD_SHARE);
  const cellCount = model.alphas.length * model.fieldsAu.length;
  const r = evaluateBindingMapRows(model, 0, model.fieldsAu.length, options, {
    base: Math.floor(cellCount * BUILD_SHARE),
    share: 1 - BUILD_SHARE,
    total: cellCount,
  });
  const { rowStart: _a, rowEnd: _b, ...rest } = r;
  void _a;
  void _b;
  return { ...rest, fieldsAu: model.fieldsAu, elapsedMs: Date.now() - t0 };
}

/**
 * Rows [rowStart, rowEnd) of the map of `setup`, with exactly the numbers of those rows of
 * `bindingMap(setup)` (the interpolation model is built over the whole map in both cases, then only
 * these rows are filled). For splitting a map across workers: the build (most of the work) is
 * repeated per call, so for many blocks call `prepareBindingMap` once and `evaluateBindingMapRows`
 * per block instead.
 *
 * Bad input: as bindingMap, plus EngineInputError for rows outside 0…nField.
 *
 * @example
 * bindingMapWindow(setup, 0, 64).cellCount // 64 · nAlpha
 */
export function bindingMapWindow(setup: MapSetup, rowStart: number, rowEnd: number, options: BindingMapOptions = {}): BindingMapWindowResult {
  const t0 = Date.now();
  const model = prepareBindingMap(setup, options, BUILD_SHARE);
  const cells = (rowEnd - rowStart) * model.alphas.length;
  const r = evaluateBindingMapRows(model, rowStart, rowEnd, options, { base: Math.floor(cells * BUILD_SHARE), share: 1 - BUILD_SHARE, total: cells });
  return { ...r, elapsedMs: Date.now() - t0 };
}
