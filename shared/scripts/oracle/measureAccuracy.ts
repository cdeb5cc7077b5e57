/**
 * Prints the worst relative error of each special function and potential route against
 * the mpmath fixture (test/fixtures/special-oracle.json), grouped by argument range.
 * Run: cd shared && npx tsx scripts/oracle/measureAccuracy.ts
 */
import { loadSpecialOracle } from '../../test/oracle.js';
import { erfc, erfcx, expn, expnScaled, gamma, lnGamma, tricomiU2, tricomiU32 } from '../../src/special/index.js';
import { makeScaledPotential, scaledPotential } from '../../src/potential/index.js';

const o = loadSpecialOracle();
const worst = new Map<string, { rel: number; at: string }>();
function rec(group: string, actual: number, expected: number, at: string): void {
  const rel = actual === expected ? 0 : Math.abs(actual - expected) / Math.abs(expected);
  const w = worst.get(group);
  if (!w || rel > w.rel) worst.set(group, { rel, at });
}
const decade = (x: number): string => (x <= 0 ? '0' : x < 1e-3 ? '<1e-3' : x <= 1 ? '[1e-3,1]' : x <= 100 ? '(1,100]' : '>100');

for (const [x, v] of o.gamma) rec('gamma', gamma(x), Number(v), `x=${x}`);
for (const [x, v] of o.lnGamma) rec('lnGamma', lnGamma(x), Number(v), `x=${x}`);
for (const [x, v] of o.erfc) rec(`erfc ${x < 1 ? 'x<1 (series)' : 'x>=1 (CF)'}`, erfc(x), Number(v), `x=${x}`);
for (const [x, v] of o.erfcx) rec(`erfcx ${x < 1 ? 'x<1 (series)' : 'x>=1 (CF/asym)'}`, erfcx(x), Number(v), `x=${x}`);
for (const [n, x, v] of o.expnScaled) rec(`expnScaled x ${x <= 1 ? '<=1 (series)' : '>1 (CF)'}`, expnScaled(n, x), Number(v), `n=${n} x=${x}`);
for (const [n, x, v] of o.expn) rec('expn', expn(n, x), Number(v), `n=${n} x=${x}`);
for (const [m, x, v] of o.tricomiU2['rows [m, x, value]']) {
  const route = x <= 1 ? 'series x<=1' : x > 30 + 2 * m ? 'asymptotic/CF x>30+2m' : 'CF 1<x<=30+2m';
  rec(`tricomiU2 ${route}`, tricomiU2(m, x), Number(v), `m=${m} x=${x}`);
  rec(`makeScaledPotential b ${decade(x)}`, makeScaledPotential(m, 0)(Math.sqrt(2 * x)), -Number(v) / 8, `m=${m} b=${x}`);
}
for (const [m, s, v] of o.tricomiU32['rows [m, s, value]']) {
  const route = s <= 0.05 ? (m === 0 ? 'erfcx closed form s<=0.05' : 'connection series s<=0.05') : s > 30 + 2 * m ? 'asymptotic/trapezoid s>30+2m' : 'trapezoid 0.05<s<=30+2m';
  rec(`tricomiU32 ${route}`, tricomiU32(m, s), Number(v), `m=${m} s=${s}`);
}
for (const [m, z, r, v] of o.scaledPotentialDirect['rows [m, zeta, rhoC, value]']) rec('scaledPotential vs direct average', scaledPotential(m, z, r), Number(v), `m=${m} zeta=${z} rhoC=${r}`);
for (const [g, w] of [...worst.entries()].sort()) console.log(`${g.padEnd(44)} ${w.rel.toExponential(2)}  (${w.at})`);
