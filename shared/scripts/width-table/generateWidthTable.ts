/**
 * Generate the committed width table y(m, p, ξ) = ln(Γ/ε), e(m, p, ξ) = E/ε
 * with the exact zero-range solver (shared/src/motion/exact).
 *
 *   npm run generate:width-table -w shared            # all missing tasks, 2 processes
 *   npm run generate:width-table -w shared -- --jobs 1
 *   npm run generate:width-table -w shared -- --assemble   # only rebuild the TS module
 *   (add --partial to write missing tasks as destroyed: development only, never commit that)
 *
 * Resumable: each (m, p) task writes shared/scripts/width-table/.cache/m<m>-p<p>.json
 * (atomically); finished tasks are skipped on the next run. The cache is keyed by
 * GENERATOR_VERSION, so changing the solver means bumping the version.
 * Output: shared/src/motion/table/widthTableData.ts (deterministic, no timestamps).
 */
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { dirname, join } from 'node:path';
import { traceState } from '../../src/motion/exact/traceState.js';
import { powerLawKappa } from '../../src/motion/exact/zeroRangeSolver.js';
import { GENERATOR_NAME, GENERATOR_VERSION, RESOLVABLE_LN_WIDTH, TABLE_M, TABLE_P, TABLE_XI } from './tableGrid.js';

const here = dirname(fileURLToPath(import.meta.url));
const cacheDir = join(here, '.cache', GENERATOR_VERSION);
const outFile = join(here, '..', '..', 'src', 'motion', 'table', 'widthTableData.ts');

interface TaskResult {
  m: number;
  p: number;
  xi: number[];
  y: (number | null)[];
  e: (number | null)[];
  /** 0 exact pole, 1 unresolved (tiny width), 2 destroyed */
  status: number[];
  seconds: number;
}

const taskFile = (m: number, p: number) => join(cacheDir, `m${m}-p${p}.json`);

function runTask(m: number, p: number): void {
  const t0 = performance.now();
  const states = traceState(m, powerLawKappa(m, p), TABLE_XI, { resolvableLnWidth: RESOLVABLE_LN_WIDTH });
  const res: TaskResult = {
    m,
    p,
    xi: TABLE_XI,
    y: states.map((s) => (s.destroyed ? null : Math.log(s.width))),
    e: states.map((s) => (s.destroyed ? null : s.energy)),
    status: states.map((s) => (s.destroyed ? 2 : s.unresolved ? 1 : 0)),
    seconds: (performance.now() - t0) / 1000,
  };
  const f = taskFile(m, p);
  writeFileSync(`${f}.tmp`, JSON.stringify(res));
  renameSync(`${f}.tmp`, f);
  console.log(`m=${m} p=${p}: ${res.seconds.toFixed(1)} s`);
}

/**
 * Replace unresolved (tiny-width) nodes by the large-ξ continuation
 * y = y₁ − (ξ² − ξ₁²) + b ln(ξ/ξ₁), b fitted by least squares to g = y + ξ²
 * against ln ξ over the last 1.5 units of resolved ξ.
 */
function continueLargeXi(r: TaskResult): { g: number[]; e: number[]; status: number[]; b: number; xi1: number } {
  const xi = r.xi;
  const n = xi.length;
  let i1 = -1;
  for (let i = 0; i < n; i++) if (r.status[i] === 0) i1 = i;
  if (i1 < 0) throw new Error(`m=${r.m} p=${r.p}: no resolved node`);
  const xi1 = xi[i1]!;
  const g = xi.map((x, i) => (r.y[i] === null ? NaN : r.y[i]! + x * x));
  let sx = 0;
  let sy = 0;
  let sxx = 0;
  let sxy = 0;
  let k = 0;
  for (let i = 0; i <= i1; i++) {
    if (xi[i]! < xi1 - 1.5 - 1e-9 || r.status[i] !== 0) continue;
    const lx = Math.log(xi[i]! / xi1);
    sx += lx;
    sy += g[i]!;
    sxx += lx * lx;
    sxy += lx * g[i]!;
    k++;
  }
  const b = (k * sxy - sx * sy) / (k * sxx - sx * sx);
  const status = r.status.slice();
  for (let i = i1 + 1; i < n; i++) {
    g[i] = g[i1]! + b * Math.log(xi[i]! / xi1);
    status[i] = 1;
  }
  const e = r.e.map((v) => (v === null ? NaN : v));
  return { g, e, status, b, xi1 };
}

/**
 * Monotone envelope: y = g − ξ² made non-increasing in ξ by y_i ← max(y_i, y_{i+1})
 * from the large-ξ end. The exact widths show small bumps (≲ 0.2 in ln Γ) where
 * Stark states of neighbouring orbitals cross; the envelope never lowers a width
 * and makes Γ(E⊥) monotone, as the thermal inversion assumes. Returns the
 * largest raise of y.
 */
function monotoneEnvelope(g: number[]): number {
  let raise = 0;
  for (let i = g.length - 2; i >= 0; i--) {
    if (!Number.isFinite(g[i]!) || !Number.isFinite(g[i + 1]!)) continue;
    const yi = g[i]! - TABLE_XI[i]! ** 2;
    const yn = g[i + 1]! - TABLE_XI[i + 1]! ** 2;
    if (yn > yi) {
      raise = Math.max(raise, yn - yi);
      g[i] = yn + TABLE_XI[i]! ** 2;
    }
  }
  return raise;
}

function fmt(v: number, digits: number): string {
  return Number.isFinite(v) ? String(Number(v.toFixed(digits))) : 'NaN';
}

function assemble(partial: boolean): void {
  const g: string[] = [];
  const e: string[] = [];
  const st: number[] = [];
  const b: string[] = [];
  const xi1: number[] = [];
  let seconds = 0;
  let worstUnconverged = 0;
  let worstRaise = 0;
  let worstRaiseAt = '';
  for (const m of TABLE_M) {
    for (const p of TABLE_P) {
      if (partial && !existsSync(taskFile(m, p))) {
        // development only: a missing task is written as destroyed everywhere
        for (let i = 0; i < TABLE_XI.length; i++) {
          g.push('NaN');
          e.push('NaN');
          st.push(2);
        }
        b.push('NaN');
        xi1.push(NaN);
        continue;
      }
      const r = JSON.parse(readFileSync(taskFile(m, p), 'utf8')) as TaskResult;
      seconds += r.seconds;
      const c = continueLargeXi(r);
      const raise = monotoneEnvelope(c.g);
      if (raise > worstRaise) {
        worstRaise = raise;
        worstRaiseAt = `m=${m} p=${p}`;
      }
      for (let i = 0; i < TABLE_XI.length; i++) {
        g.push(fmt(c.g[i]!, 5));
        e.push(fmt(c.e[i]!, 7));
        st.push(c.status[i]!);
      }
      b.push(fmt(c.b, 5));
      xi1.push(c.xi1);
      worstUnconverged = Math.max(worstUnconverged, c.status.filter((s) => s === 1).length);
    }
  }
  const src = `// GENERATED by ${GENERATOR_NAME} v${GENERATOR_VERSION} — do not edit.
// Regenerate: npm run generate:width-table -w shared
/**
 * Width table of the zero-range lowest-Landau-level model (see ../exact/):
 * g = ln(Γ/ε) + ξ² and e = E_r/ε for the state continuing from orbital m, with
 * neighbouring bindings on the local power law ε_j ∝ (2j+1)^(−p).
 * Layout: index ((iM · P.length) + iP) · XI.length + iXi. NaN = destroyed.
 * status: 0 = complex pole, 1 = large-ξ continuation (width below the
 * double-precision resolvable level ln(Γ/ε) < ${RESOLVABLE_LN_WIDTH}), 2 = destroyed.
 * b[iM·P.length + iP]: slope of g against ln ξ used by the continuation, from
 * the last resolved node XI1[...].
 * Monotone envelope: y made non-increasing in ξ (largest raise of ln Γ:
 * ${worstRaise.toFixed(3)} at ${worstRaiseAt || '—'}), so that Γ grows with E⊥.
 */
export const WIDTH_TABLE_GENERATOR = {
  name: '${GENERATOR_NAME}',
  version: '${GENERATOR_VERSION}',
  method: 'zero-range LLL reduction, complex pole by contour continuation through x_t, trapezoidal rule in t (x = x_t ± t²), continuation from F → 0',
  orbitals: 'max(ξ²/2 + 2.5ξ + 10, m + 45)',
  resolvableLnWidth: ${RESOLVABLE_LN_WIDTH},
  monotoneEnvelopeMaxRaise: ${Number(worstRaise.toFixed(4))},
  cpuSeconds: ${Math.round(seconds)},
} as const;
export const WIDTH_TABLE_M: readonly number[] = ${JSON.stringify(TABLE_M)};
export const WIDTH_TABLE_P: readonly number[] = ${JSON.stringify(TABLE_P)};
export const WIDTH_TABLE_XI: readonly number[] = ${JSON.stringify(TABLE_XI)};
export const WIDTH_TABLE_G: readonly number[] = [${g.join(',')}];
export const WIDTH_TABLE_E: readonly number[] = [${e.join(',')}];
export const WIDTH_TABLE_STATUS: readonly number[] = [${st.join(',')}];
export const WIDTH_TABLE_B: readonly number[] = [${b.join(',')}];
export const WIDTH_TABLE_XI1: readonly number[] = [${xi1.join(',')}];
`;
  writeFileSync(outFile, src);
  console.log(`wrote ${outFile}: ${TABLE_M.length}×${TABLE_P.length}×${TABLE_XI.length} nodes, solver CPU ${seconds.toFixed(0)} s, most continued nodes per (m,p): ${worstUnconverged}, largest monotone-envelope raise ${worstRaise.toFixed(3)} (${worstRaiseAt})`);
}

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  const taskArg = args.indexOf('--task');
  mkdirSync(cacheDir, { recursive: true });
  if (taskArg >= 0) {
    const [m, p] = args[taskArg + 1]!.split(',').map(Number);
    runTask(m!, p!);
    return;
  }
  if (!args.includes('--assemble')) {
    const jobsArg = args.indexOf('--jobs');
    const jobs = jobsArg >= 0 ? Number(args[jobsArg + 1]) : 2;
    // largest m first: they take longest
    const tasks: [number, number][] = [];
    for (const m of [...TABLE_M].reverse()) for (const p of TABLE_P) if (!existsSync(taskFile(m, p))) tasks.push([m, p]);
    console.log(`${tasks.length} tasks to run with ${jobs} processes`);
    const t0 = performance.now();
    const self = fileURLToPath(import.meta.url);
    let next = 0;
    const worker = async (): Promise<void> => {
      while (next < tasks.length) {
        const [m, p] = tasks[next++]!;
        await new Promise<void>((resolve, reject) => {
          const child = spawn(process.execPath, ['--import', 'tsx', self, '--task', `${m},${p}`], { stdio: 'inherit' });
          child.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`task m=${m} p=${p} exited with ${code}`))));
        });
      }
    };
    await Promise.all(Array.from({ length: jobs }, worker));
    console.log(`generation wall time ${((performance.now() - t0) / 1000).toFixed(0)} s`);
  }
  assemble(args.includes('--partial'));
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
