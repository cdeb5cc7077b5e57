/**
 * Exact solver values at held-out points (off every table node) for the
 * accuracy test of the fast table (src/motion/widthTable.test.ts).
 *
 *   node --import tsx shared/scripts/width-table/generateHeldOut.ts
 *   node --import tsx shared/scripts/width-table/generateHeldOut.ts --append 4 --seed 7 --xi-max 8
 *
 * 12 seeded random (m, p) pairs (p off the 0.5 grid) × 4 seeded ξ (off the ξ
 * grid) in 1.3 … 11; writes src/motion/table/heldOutReference.json. `--append N`
 * adds N more pairs (another seed, ξ in 1.3 … xi-max) to the existing file.
 */
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { traceState } from '../../src/motion/exact/traceState.js';
import { powerLawKappa } from '../../src/motion/exact/zeroRangeSolver.js';
import { RESOLVABLE_LN_WIDTH, SOLVER_VERSION } from './tableGrid.js';

const args = process.argv.slice(2);
const opt = (name: string, def: number): number => (args.includes(name) ? Number(args[args.indexOf(name) + 1]) : def);
const append = opt('--append', 0);
const pairs = append > 0 ? append : 12;
const xiMax = opt('--xi-max', 11);
let seed = opt('--seed', 20261202);
const rnd = (): number => {
  seed = (seed * 1103515245 + 12345) % 2147483648;
  return seed / 2147483648;
};
const offGrid = (x: number, step: number, lo: number): number => {
  const k = (x - lo) / step;
  const f = k - Math.floor(k);
  return f < 0.2 || f > 0.8 ? lo + (Math.floor(k) + 0.3 + 0.4 * rnd()) * step : x;
};

type Point = { m: number; p: number; xi: number; y: number | null; e: number | null; unresolved: boolean };
const out = fileURLToPath(new URL('../../src/motion/table/heldOutReference.json', import.meta.url));
const points: Point[] = append > 0 && existsSync(out) ? (JSON.parse(readFileSync(out, 'utf8')) as { points: Point[] }).points : [];
const t0 = performance.now();
for (let k = 0; k < pairs; k++) {
  const m = Math.floor(rnd() * 17);
  const p = Number(offGrid(2 + 7 * rnd(), 0.5, 2).toFixed(4));
  const xs = Array.from({ length: 4 }, (_, i) => {
    const x = 1.3 + ((xiMax - 1.3) * (i + rnd())) / 4;
    return Number((x < 3 ? offGrid(x, 0.125, 1) : offGrid(x, 0.25, 3)).toFixed(4));
  });
  const st = traceState(m, powerLawKappa(m, p), xs, { resolvableLnWidth: RESOLVABLE_LN_WIDTH });
  st.forEach((s, i) => {
    points.push({ m, p, xi: xs[i]!, y: s.destroyed ? null : Math.log(s.width), e: s.destroyed ? null : s.energy, unresolved: s.unresolved });
  });
  console.log(`m=${m} p=${p} ξ=${xs.join(',')}: ${st.map((s) => (s.destroyed ? 'destroyed' : Math.log(s.width).toFixed(3))).join(' ')}`);
}
writeFileSync(out, JSON.stringify({ generator: 'shared/scripts/width-table/generateHeldOut.ts', solverVersion: SOLVER_VERSION, points }, null, 1) + '\n');
console.log(`wrote ${points.length} points in ${((performance.now() - t0) / 1000).toFixed(0)} s`);
