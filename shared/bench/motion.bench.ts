/**
 * Micro benchmark of the moving-ion motion step (classifyCells) on a synthetic
 * 512 × 512 map with m = 0…7 (8 states per cell), single-threaded.
 *
 *   cd shared && npx tsx bench/motion.bench.ts [--size 512] [--thermal-size 64]
 *
 * Exports runMotionBench() so that bench/run.ts can include it.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { traceState } from '../src/motion/exact/traceState.js';
import { powerLawKappa, ZeroRangeSolver } from '../src/motion/exact/zeroRangeSolver.js';
import { widthTableInto } from '../src/motion/widthTable.js';
import { allocateCellMotionOutput, classifyCells, type CellBindings } from '../src/motion/classifyCells.js';
import { validateMotionSettings } from '../src/motion/motionSettings.js';

/** Synthetic map: B log-spaced 1e-5…1e-3 a.u. (2.4…235 T), ε_m = ε₀(αB)²B (2m+1)^(−3) across α. */
export function syntheticMap(n: number, mMax = 7): CellBindings {
  const cellCount = n * n;
  const fieldsAu = Float64Array.from({ length: n }, (_, j) => 1e-5 * 100 ** (j / (n - 1)));
  const bindingHartree = new Float64Array((mMax + 1) * cellCount);
  for (let j = 0; j < n; j++) {
    const B = fieldsAu[j]!;
    for (let i = 0; i < n; i++) {
      const alpha = 10 * 100 ** (i / (n - 1)); // 10 … 1000 a₀³
      const lam = alpha * B;
      for (let m = 0; m <= mMax; m++) {
        bindingHartree[m * cellCount + j * n + i] = 0.05 * lam * lam * B * (2 * m + 1) ** -3 * (m === 0 ? 20 : 1);
      }
    }
  }
  return { bindingHartree, cellCount, nAlpha: n, mMax, levelsPerOrbital: 1, fieldsAu };
}

export interface MotionBenchResult {
  /** Worst |Δ ln Γ| of the fast table vs the exact solver over the held-out laboratory points. */
  heldOutWorstLnWidth: number;
  heldOutPoints: number;
  cells: number;
  states: number;
  msEnergy: number;
  nsPerCellEnergy: number;
  nsPerCellThermal: number;
  thermalCells: number;
}

/**
 * Best of `repeats` runs after one warm-up, in milliseconds of this process's CPU time
 * (user + system): on a shared machine the wall time also counts other processes' work.
 */
function timeIt(fn: () => void, repeats: number): number {
  fn(); // warm-up (JIT)
  let best = Infinity;
  for (let r = 0; r < repeats; r++) {
    const c = process.cpuUsage();
    fn();
    const d = process.cpuUsage(c);
    best = Math.min(best, (d.user + d.system) / 1000);
  }
  return best;
}

export function runMotionBench(size = 512, thermalSize = 64): MotionBenchResult {
  const map = syntheticMap(size);
  const settings = validateMotionSettings({ massNumber: 133, transverseEnergyHartree: 1 / 3.1577502480407e5 }); // E⊥ = 1 K
  const out = allocateCellMotionOutput(map, settings);
  const ms = timeIt(() => classifyCells(map, settings, out), 5);
  const small = syntheticMap(thermalSize);
  const th = validateMotionSettings({ massNumber: 133, temperatureKelvin: 1 });
  const outT = allocateCellMotionOutput(small, th);
  const msT = timeIt(() => classifyCells(small, th, outT), 2);
  const h = heldOutAccuracy();
  return {
    heldOutWorstLnWidth: h.worst,
    heldOutPoints: h.points,
    cells: map.cellCount,
    states: map.bindingHartree.length,
    msEnergy: ms,
    nsPerCellEnergy: (ms * 1e6) / map.cellCount,
    nsPerCellThermal: (msT * 1e6) / small.cellCount,
    thermalCells: small.cellCount,
  };
}

/** Worst |Δ ln Γ| of the fast table against the committed held-out exact values (laboratory regime). */
export function heldOutAccuracy(): { points: number; worst: number; where: string } {
  const file = fileURLToPath(new URL('../src/motion/table/heldOutReference.json', import.meta.url));
  const ref = JSON.parse(readFileSync(file, 'utf8')) as { points: { m: number; p: number; xi: number; y: number | null; unresolved: boolean }[] };
  const out = new Float64Array(2);
  let worst = 0;
  let where = '';
  let n = 0;
  for (const q of ref.points) {
    if (q.y === null || q.unresolved || q.y < -45 || q.y > -0.5) continue;
    widthTableInto(q.m, q.p, q.xi, out);
    n++;
    const d = Math.abs(out[0]! - q.y);
    if (d > worst) {
      worst = d;
      where = `m=${q.m} p=${q.p} ξ=${q.xi}`;
    }
  }
  return { points: n, worst, where };
}

/** Time of exact solves: one m = 0 pole at ξ = 4, and one traced m = 3 state (labelling included). */
export function exactTiming(): { poleMs: number; traceMs: number } {
  let t = performance.now();
  const s = new ZeroRangeSolver(0, powerLawKappa(0, 5));
  const fo = s.solveFirstOrder(4, -1);
  s.solvePole(4, fo.energy, -fo.width / 2);
  const poleMs = performance.now() - t;
  t = performance.now();
  traceState(3, powerLawKappa(3, 3), [4]);
  return { poleMs, traceMs: performance.now() - t };
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const arg = (name: string, def: number): number => {
    const i = process.argv.indexOf(name);
    return i >= 0 ? Number(process.argv[i + 1]) : def;
  };
  const r = runMotionBench(arg('--size', 512), arg('--thermal-size', 64));
  console.log(
    `motion step (fixed E⊥): ${r.cells} cells × 8 states in ${r.msEnergy.toFixed(1)} ms CPU = ${r.nsPerCellEnergy.toFixed(0)} ns/cell` +
      `\nthermal (fractions, ${r.thermalCells} cells): ${r.nsPerCellThermal.toFixed(0)} ns/cell`,
  );
  console.log(`width table vs exact solver: worst |Δ ln Γ| = ${r.heldOutWorstLnWidth.toFixed(4)} over ${r.heldOutPoints} held-out laboratory points`);
  if (process.argv.includes('--exact')) {
    const e = exactTiming();
    console.log(`exact solver: m = 0 pole at ξ = 4 in ${e.poleMs.toFixed(0)} ms; m = 3 state traced from F → 0 to ξ = 4 in ${e.traceMs.toFixed(0)} ms`);
  }
}
