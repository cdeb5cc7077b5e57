/**
 * Speed of the solver's hot path `makeScaledPotential(m, rhoC)(zeta)`, in ns per call,
 * on three ζ samples (sinh grid like the solver's, the core |ζ| < 20, the far field).
 * Prints two calibration loops (Math.log, a 24-term Horner sum) so numbers taken on a
 * loaded machine can be judged. Run: cd shared && npx tsx scripts/oracle/benchScaledPotential.ts
 */
import { makeScaledPotential } from '../../src/potential/index.js';

const N = 1 << 16;
const zs = new Float64Array(N);
function time(fn: (z: number) => number): number {
  let acc = 0;
  for (let r = 0; r < 20; r++) for (let i = 0; i < N; i++) acc += fn(zs[i]!);
  const reps = 100;
  const t0 = performance.now();
  for (let r = 0; r < reps; r++) for (let i = 0; i < N; i++) acc += fn(zs[i]!);
  const ns = ((performance.now() - t0) * 1e6) / (reps * N);
  if (acc === 42) console.log('');
  return ns;
}
for (let i = 0; i < N; i++) zs[i] = 1 + i;
console.log(`calibration: Math.log ${time((x) => Math.log(x)).toFixed(1)} ns, 24-term Horner ${time((x) => {
  let s = 1;
  const y = 1 / x;
  for (let k = 0; k < 24; k++) s = s * y + 1;
  return s;
}).toFixed(1)} ns`);
const samples: [string, (i: number) => number][] = [
  ['sinh grid 0.005·sinh(t), |t| ≤ 30', (i) => 0.005 * Math.sinh(-30 + (60 * i) / (N - 1))],
  ['core 0 ≤ ζ < 20', (i) => (20 * i) / N],
  ['far ζ > 1e3', (i) => 1e3 + i],
];
for (const [m, rhoC] of [[0, 0.01], [1, 1], [5, 0.3], [20, 0.1], [64, 0.01]] as const) {
  const w = makeScaledPotential(m, rhoC);
  const row: string[] = [];
  for (const [label, gen] of samples) {
    for (let i = 0; i < N; i++) zs[i] = gen(i);
    row.push(`${label}: ${time(w).toFixed(0)} ns`);
  }
  console.log(`m=${m} rhoC=${rhoC}: ${row.join(' | ')}`);
}
