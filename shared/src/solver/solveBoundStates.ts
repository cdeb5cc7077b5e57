import { EngineInputError } from '../errors.js';
import { refineLevel, searchLevel } from './levelSearch.js';
import { SinhMesh } from './sinhMesh.js';
import { stepParameters } from './stepParameters.js';
import type { BoundState, BoundStateOptions, BoundStateSpectrum, EvenPotential } from './types.js';
import { zeroEnergyPhase } from './zeroEnergyPhase.js';

/** Validate options shared by the solver entry points; throws EngineInputError. */
export function validateSolverOptions(v: unknown, opts: BoundStateOptions): void {
  if (typeof v !== 'function') throw new EngineInputError('v', 'must be a function x => v(x)');
  const pos = (name: keyof BoundStateOptions): void => {
    const val = opts[name];
    if (val !== undefined && !(typeof val === 'number' && Number.isFinite(val) && val > 0)) {
      throw new EngineInputError(name, `must be a positive finite number, got ${String(val)}`);
    }
  };
  pos('coupling');
  pos('scale');
  pos('tol');
  pos('hMax');
  pos('cOsc');
  pos('c4');
  pos('xMax');
  pos('epsMin');
  if (opts.nuMax !== undefined && !(Number.isInteger(opts.nuMax) && opts.nuMax >= 0)) {
    throw new EngineInputError('nuMax', `must be a non-negative integer, got ${String(opts.nuMax)}`);
  }
  if (opts.breakpoints !== undefined && !opts.breakpoints.every((b) => Number.isFinite(b) && b > 0)) {
    throw new EngineInputError('breakpoints', 'must be positive finite positions');
  }
}

/** Build the solver's mesh for λ·v (internal, shared with the counting and threshold functions). */
export function buildMesh(v: EvenPotential, opts: BoundStateOptions, refine = 1, lambdaRef?: number): SinhMesh {
  const { hMax, cOsc } = stepParameters(opts);
  const a = opts.scale ?? 1;
  const mesh = new SinhMesh({
    w: v,
    a,
    hMax: hMax / refine,
    cOsc: cOsc / refine,
    lambdaRef: lambdaRef ?? opts.coupling ?? 1,
    breakpoints: opts.breakpoints ?? [],
    xMax: opts.xMax ?? 1e15,
  });
  mesh.ensure(8 * a);
  return mesh;
}

/**
 * Number of bound states of −½ g'' + λ v(x) g = −ε g (v even, v ≤ 0, v → 0)
 * per parity, from the zeros of the zero-energy solution (Sturm oscillation
 * theorem), with the exact x·sin(k/x + φ) continuation beyond the mesh when
 * `c4` is given (v ≈ −c4/x⁴). A state exactly at threshold is not counted.
 *
 * Bad input: throws EngineInputError (non-function v, non-positive options).
 *
 * @example
 * // Pöschl–Teller −λ(λ+1)/(2cosh²x) with λ = 2.5 binds ⌈λ⌉ = 3 states:
 * countBoundStates((x) => -4.375 / Math.cosh(x) ** 2) // { even: 2, odd: 1, total: 3 }
 */
export function countBoundStates(
  v: EvenPotential,
  opts: BoundStateOptions = {},
): { even: number; odd: number; total: number } {
  validateSolverOptions(v, opts);
  const mesh = buildMesh(v, opts);
  return countOnMesh(mesh, opts.coupling ?? 1, opts.c4);
}

/** Count on an existing mesh (internal). */
export function countOnMesh(
  mesh: SinhMesh,
  lambda: number,
  c4: number | undefined,
): { even: number; odd: number; total: number } {
  const even = Math.floor(zeroEnergyPhase(mesh, lambda, false, c4) / Math.PI);
  const odd = Math.floor(zeroEnergyPhase(mesh, lambda, true, c4) / Math.PI);
  return { even, odd, total: even + odd };
}

/** Per-call options of a reusable solver (see createBoundStateSolver). */
export interface SolveCallOptions {
  nuMax?: number;
  errorEstimate?: boolean;
  epsMin?: number;
  /**
   * Warm start: approximate ε of level ν at index ν (e.g. from a neighbouring
   * map cell). Only the speed depends on it; a wrong guess costs a few extra
   * evaluations. Entries that are missing, non-finite or ≤ 0 are ignored.
   */
  guess?: readonly number[];
}

/** A bound-state solver for the family λ·w(x) that keeps its sampled mesh between calls. */
export interface BoundStateSolver {
  /** All levels of λ·w (see solveBoundStates). */
  solve(lambda: number, call?: SolveCallOptions): BoundStateSpectrum;
  /** State count of λ·w per parity (see countBoundStates). */
  count(lambda: number): { even: number; odd: number; total: number };
}

/**
 * A reusable solver for the family λ·w(x), 0 < λ ≤ lambdaMax: the potential
 * is sampled once on a mesh whose step density suits lambdaMax (finer than
 * needed for smaller λ) and the mesh is shared by every later call, which then
 * costs only the Magnus arithmetic (≈10–20 µs per matching evaluation instead
 * of new potential evaluations). A call with λ > lambdaMax rebuilds the mesh
 * for that λ. Same results as solveBoundStates to within the error estimate.
 * This is the fast path for maps, where one row of constant B (hence constant
 * ρ_c and w) spans many α (λ = αB).
 *
 * Bad input: throws EngineInputError (non-function w, bad options, λ not
 * positive and finite).
 *
 * @example
 * const s = createBoundStateSolver((x) => -1 / Math.cosh(x) ** 2, { scale: 0.5, lambdaMax: 10 });
 * s.solve(4.375).states.map((x) => x.epsilon) // [3.12499999999998, 1.12499999999994, 0.12499999999992]
 * // (Pöschl–Teller λ′ = 2.5: (λ′ − n)²/2)
 */
export function createBoundStateSolver(
  w: EvenPotential,
  opts: BoundStateOptions & { lambdaMax?: number } = {},
): BoundStateSolver {
  validateSolverOptions(w, opts);
  if (opts.lambdaMax !== undefined && !(opts.lambdaMax > 0 && Number.isFinite(opts.lambdaMax))) {
    throw new EngineInputError('lambdaMax', `must be a positive finite number, got ${String(opts.lambdaMax)}`);
  }
  let lambdaRef = opts.lambdaMax ?? opts.coupling ?? 1;
  let mesh: SinhMesh | undefined;
  let fine: SinhMesh | undefined;
  let discarded = 0; // potential evaluations of meshes dropped after a λ > lambdaMax call
  const evaluationsSoFar = (): number => discarded + (mesh?.evaluations ?? 0) + (fine?.evaluations ?? 0);
  const coarseFor = (lambda: number): SinhMesh => {
    if (lambda > lambdaRef) {
      lambdaRef = lambda;
      discarded += (mesh?.evaluations ?? 0) + (fine?.evaluations ?? 0);
      mesh = undefined;
      fine = undefined;
    }
    mesh ??= buildMesh(w, opts, 1, lambdaRef);
    return mesh;
  };
  const fineFor = (): SinhMesh => {
    fine ??= buildMesh(w, opts, 2, lambdaRef);
    return fine;
  };
  const checkLambda = (lambda: number): void => {
    if (!(lambda > 0 && Number.isFinite(lambda))) {
      throw new EngineInputError('lambda', `must be a positive finite number, got ${String(lambda)}`);
    }
  };
  return {
    count(lambda: number) {
      checkLambda(lambda);
      return countOnMesh(coarseFor(lambda), lambda, opts.c4);
    },
    solve(lambda: number, call: SolveCallOptions = {}) {
      checkLambda(lambda);
      if (call.nuMax !== undefined && !(Number.isInteger(call.nuMax) && call.nuMax >= 0)) {
        throw new EngineInputError('nuMax', `must be a non-negative integer, got ${String(call.nuMax)}`);
      }
      if (call.epsMin !== undefined && !(call.epsMin > 0 && Number.isFinite(call.epsMin))) {
        throw new EngineInputError('epsMin', `must be a positive finite number, got ${String(call.epsMin)}`);
      }
      const ev0 = evaluationsSoFar();
      const r = solveOnMeshes(coarseFor(lambda), fineFor, lambda, opts.c4, call);
      r.potentialEvaluations = evaluationsSoFar() - ev0;
      return r;
    },
  };
}

/** The level search on a coarse mesh and, for the error estimate, a halved-step mesh. Internal. */
function solveOnMeshes(
  mesh: SinhMesh,
  fineMesh: () => SinhMesh,
  lambda: number,
  c4: number | undefined,
  call: SolveCallOptions,
): BoundStateSpectrum {
  const depth = lambda * mesh.maxAbsW;
  if (!(depth > 0)) {
    return { states: [], countEven: 0, countOdd: 0, count: 0, depth: 0, potentialEvaluations: 0, mismatchEvaluations: 0 };
  }
  const epsMin = call.epsMin ?? depth * 1e-26;
  const sMin = Math.log(epsMin);
  const nuMax = call.nuMax;
  let countEven = NaN;
  let countOdd = NaN;
  let count = NaN;
  let nLevels: number;
  if (nuMax === 0) {
    nLevels = 1; // the ground state always exists (even, Simon 1976); no count needed
  } else {
    const c = countOnMesh(mesh, lambda, c4);
    countEven = c.even;
    countOdd = c.odd;
    count = c.total;
    nLevels = nuMax === undefined ? count : Math.min(count, nuMax + 1);
  }
  const states: BoundState[] = [];
  let evals = 0;
  let sUpper = Math.log(depth * 1.0001);
  for (let nu = 0; nu < nLevels; nu++) {
    const odd = nu % 2 === 1;
    const j = nu >> 1;
    const g = call.guess?.[nu];
    const sGuess = g !== undefined && g > 0 && Number.isFinite(g) ? Math.log(g) : undefined;
    const r = searchLevel(mesh, lambda, odd, j, sUpper, sMin, sGuess);
    evals += r.evaluations;
    states.push({ nu, parity: odd ? 'odd' : 'even', epsilon: r.eps, relError: NaN, resolved: r.resolved });
    if (r.resolved) sUpper = Math.log(r.eps);
  }
  if (call.errorEstimate ?? true) {
    const fine = fineMesh();
    for (const st of states) {
      if (!st.resolved) continue;
      const r = refineLevel(fine, lambda, st.parity === 'odd', st.nu >> 1, Math.log(st.epsilon));
      evals += r.evaluations;
      if (r.resolved) {
        st.relError = Math.abs(st.epsilon - r.eps) / r.eps;
        st.epsilon = r.eps;
      }
    }
  }
  return { states, countEven, countOdd, count, depth, potentialEvaluations: 0, mismatchEvaluations: evals };
}

/**
 * All bound states of the even 1D potential λ·v:
 *   −½ g''(x) + λ v(x) g(x) = −ε g(x),  ε > 0,
 * in the units of v (x in the units of `scale`). Method: sinh-mapped
 * coordinate x = a·sinh t, sixth-order Magnus integration of (g, g')
 * (Blanes, Casas, Oteo, Ros, Phys. Rep. 470, 151 (2009)), Prüfer-type
 * matching at the outer turning point (monotone in ε, gives the Sturm count),
 * Brent root search in ln ε per level, counting from the zero-energy solution
 * with the exact 1/x⁴ tail. Levels are ordered ν = 0, 1, … by decreasing ε
 * and alternate in parity (even ν even). With errorEstimate (default) each
 * level is re-solved on a mesh with every step halved; the refined value is
 * returned and relError = |ε_h − ε_{h/2}|/ε_{h/2} (a conservative estimate of
 * the error of the refined value for a sixth-order scheme).
 *
 * Domain: v finite, even, v → 0 at infinity, not confining. Bad input throws
 * EngineInputError. Levels bound more weakly than epsMin are returned with
 * resolved = false and epsilon = epsMin.
 *
 * @example
 * // Pöschl–Teller λ = 2.5: ε_n = (λ − n)²/2 = 3.125, 1.125, 0.125
 * solveBoundStates((x) => -4.375 / Math.cosh(x) ** 2, { scale: 0.5 }).states.map((s) => s.epsilon)
 * // [3.125000000000…, 1.12500000000…, 0.1250000000…]
 */
export function solveBoundStates(v: EvenPotential, opts: BoundStateOptions = {}): BoundStateSpectrum {
  validateSolverOptions(v, opts);
  const lambda = opts.coupling ?? 1;
  return createBoundStateSolver(v, { ...opts, lambdaMax: lambda }).solve(lambda, {
    nuMax: opts.nuMax,
    errorEstimate: opts.errorEstimate,
    epsMin: opts.epsMin,
  });
}
