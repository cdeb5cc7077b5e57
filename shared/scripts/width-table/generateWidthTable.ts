/**
 * Generate the committed width table y(m, p, ξ) = ln(Γ/ε), e(m, p, ξ) = E/ε
 * with the exact zero-range solver (shared/src/motion/exact).
 *
 *   npm run generate:width-table -w shared            # all missing columns, 2 processes, then assemble
 *   npm run generate:width-table -w shared -- --jobs 1
 *   npm run generate:width-table -w shared -- --assemble   # only rebuild the TS module from the cache
 *   npm run generate:width-table -w shared -- --refine 15:2.8124-2.9/4 --refine 15:3.1,3.2
 *       # compute only these columns (m : p from-to / n nodes strictly inside, or m : p list) and
 *       # merge them into the committed table (the other columns are read from it, not recomputed)
 *   npm run generate:width-table -w shared -- --scan       # jump detector on the committed table
 *   (add --partial to write missing columns as destroyed: development only, never commit that)
 *
 * Resumable: each (m, p) column writes shared/scripts/width-table/.cache/<solver version>/m<m>-p<p>.json
 * (atomically); finished columns are skipped on the next run. The cache is keyed by
 * SOLVER_VERSION, so changing the solver means bumping that version.
 * Columns: the base grid TABLE_P for every m plus the refinement nodes recorded in the committed
 * table (WIDTH_TABLE_REFINEMENTS), so a full regeneration keeps the refinements.
 * Output: shared/src/motion/table/widthTableData.ts (deterministic, no timestamps).
 */
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { dirname, join } from 'node:path';
import { traceState } from '../../src/motion/exact/traceState.js';
import { powerLawKappa } from '../../src/motion/exact/zeroRangeSolver.js';
import { scorePoleSwitches } from './poleSwitches.js';
import { GENERATOR_NAME, GENERATOR_VERSION, RESOLVABLE_LN_WIDTH, SOLVER_VERSION, TABLE_M, TABLE_P, TABLE_XI } from './tableGrid.js';

const here = dirname(fileURLToPath(import.meta.url));
const cacheDir = join(here, '.cache', SOLVER_VERSION);
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

/** One processed table column (what the committed module stores per (m, p)). */
interface Column {
  m: number;
  p: number;
  g: number[];
  e: number[];
  status: number[];
  b: number;
  xi1: number;
  seconds: number;
  /** Largest raise of y by the monotone envelope. */
  raise: number;
}

/** A refinement block as recorded in the committed table. */
interface Refinement {
  m: number;
  pFrom: number;
  pTo: number;
  nodes: number[];
  generatorVersion: string;
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

/** Runs the missing (m, p) columns in `jobs` child processes. */
async function runTasks(tasks: [number, number][], jobs: number): Promise<void> {
  const todo = tasks.filter(([m, p]) => !existsSync(taskFile(m, p)));
  console.log(`${todo.length} columns to compute with ${jobs} processes (${tasks.length - todo.length} cached)`);
  const t0 = performance.now();
  const self = fileURLToPath(import.meta.url);
  let next = 0;
  const worker = async (): Promise<void> => {
    while (next < todo.length) {
      const [m, p] = todo[next++]!;
      await new Promise<void>((resolve, reject) => {
        const child = spawn(process.execPath, ['--import', 'tsx', self, '--task', `${m},${p}`], { stdio: 'inherit' });
        child.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`task m=${m} p=${p} exited with ${code}`))));
      });
    }
  };
  await Promise.all(Array.from({ length: jobs }, worker));
  if (todo.length > 0) console.log(`generation wall time ${((performance.now() - t0) / 1000).toFixed(0)} s`);
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
 * from the large-ξ end. The exact widths show small bumps (≲ 0.4 in ln Γ) where
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

/** Processed column from the cached solver output, rounded as committed. */
function columnFromCache(m: number, p: number): Column {
  const r = JSON.parse(readFileSync(taskFile(m, p), 'utf8')) as TaskResult;
  const c = continueLargeXi(r);
  const raise = monotoneEnvelope(c.g);
  return {
    m,
    p,
    g: c.g.map((v) => round(v, 5)),
    e: c.e.map((v) => round(v, 7)),
    status: c.status,
    b: round(c.b, 5),
    xi1: c.xi1,
    seconds: r.seconds,
    raise,
  };
}

function destroyedColumn(m: number, p: number): Column {
  const nan = TABLE_XI.map(() => NaN);
  return { m, p, g: nan, e: nan, status: TABLE_XI.map(() => 2), b: NaN, xi1: NaN, seconds: 0, raise: 0 };
}

function round(v: number, digits: number): number {
  return Number.isFinite(v) ? Number(v.toFixed(digits)) : NaN;
}

function fmt(v: number): string {
  return Number.isFinite(v) ? String(v) : 'NaN';
}

/** The committed table as columns (generator ≥ 1.1.0 layout), with its refinement record. */
async function readCommitted(): Promise<{ columns: Column[]; refinements: Refinement[]; cpuSeconds: number; worstRaise: number; worstRaiseAt: string }> {
  const t = (await import(`${pathToFileURL(outFile).href}?t=${Date.now()}`)) as Record<string, unknown>;
  const refinements = (t.WIDTH_TABLE_REFINEMENTS as Refinement[] | undefined) ?? [];
  const nodes = t.WIDTH_TABLE_P_NODES as number[] | undefined;
  if (!nodes) throw new Error(`${outFile} predates generator 1.1.0 (no WIDTH_TABLE_P_NODES): run --assemble from the cache first`);
  const starts = t.WIDTH_TABLE_M_START as number[];
  const xi = t.WIDTH_TABLE_XI as number[];
  if (xi.length !== TABLE_XI.length || xi.some((x, i) => x !== TABLE_XI[i])) throw new Error('committed ξ grid differs from tableGrid.ts');
  const G = t.WIDTH_TABLE_G as number[];
  const E = t.WIDTH_TABLE_E as number[];
  const S = t.WIDTH_TABLE_STATUS as number[];
  const B = t.WIDTH_TABLE_B as number[];
  const X1 = t.WIDTH_TABLE_XI1 as number[];
  const NX = xi.length;
  const columns: Column[] = [];
  for (let m = 0; m + 1 < starts.length; m++) {
    for (let c = starts[m]!; c < starts[m + 1]!; c++) {
      columns.push({
        m,
        p: nodes[c]!,
        g: G.slice(c * NX, (c + 1) * NX),
        e: E.slice(c * NX, (c + 1) * NX),
        status: S.slice(c * NX, (c + 1) * NX),
        b: B[c]!,
        xi1: X1[c]!,
        seconds: 0,
        raise: NaN,
      });
    }
  }
  const gen = t.WIDTH_TABLE_GENERATOR as { cpuSeconds: number; monotoneEnvelopeMaxRaise: number };
  const worstRaiseAt = /largest raise of ln Γ:\s*\n?\s*\*?\s*[\d.]+ at ([^)]+)\)/.exec(readFileSync(outFile, 'utf8'))?.[1] ?? '';
  return { columns, refinements, cpuSeconds: gen.cpuSeconds, worstRaise: gen.monotoneEnvelopeMaxRaise, worstRaiseAt };
}

/** Pole-switch scores of one m's columns (ascending p). */
function scoresOf(cols: Column[]) {
  return scorePoleSwitches(
    cols.map((c) => c.p),
    cols.map((c) => c.g.map((g, i) => g - TABLE_XI[i]! ** 2)),
    cols.map((c) => c.e),
    TABLE_XI,
  );
}

/**
 * Widest p interval that gets the switch flag: there the switch is localized by refinement nodes to
 * within this width. Flagged intervals of the coarse base grid (0.5) are listed by --scan and left
 * linear: where in them the pole switches is not known.
 */
const MAX_SWITCH_WIDTH = 0.1;

/**
 * Writes the module. Columns grouped by m, ascending p. An interval gets the switch flag (evaluated
 * at the nearer node, never blended) when the jump detector flags it and it is at most
 * MAX_SWITCH_WIDTH wide.
 */
function writeTable(all: Column[], refinements: Refinement[], cpuSeconds: number, worstRaise: number, worstRaiseAt: string): void {
  const cols = [...all].sort((a, b) => a.m - b.m || a.p - b.p);
  const starts: number[] = [];
  const sw: number[] = [];
  for (const m of TABLE_M) {
    starts.push(cols.findIndex((c) => c.m === m));
    const mine = cols.filter((c) => c.m === m);
    const ps = mine.map((c) => c.p);
    for (const p of TABLE_P) if (!ps.includes(p)) throw new Error(`m=${m}: base column p=${p} missing`);
    const scores = scoresOf(mine);
    for (let c = 0; c < mine.length; c++) {
      const s = scores[c];
      sw.push(s && s.flagged && s.pHi - s.pLo <= MAX_SWITCH_WIDTH + 1e-9 ? 1 : 0);
    }
  }
  starts.push(cols.length);
  const pNodes = cols.map((c) => c.p);
  const src = `// GENERATED by ${GENERATOR_NAME} v${GENERATOR_VERSION} — do not edit.
// Regenerate: npm run generate:width-table -w shared (see the script for --refine / --scan)
/**
 * Width table of the zero-range lowest-Landau-level model (see ../exact/):
 * g = ln(Γ/ε) + ξ² and e = E_r/ε for the state continuing from orbital m, with
 * neighbouring bindings on the local power law ε_j ∝ (2j+1)^(−p).
 * Columns: column c holds orbital m for M_START[m] ≤ c < M_START[m + 1], at shape number
 * P_NODES[c] (ascending within m: the base grid ${TABLE_P[0]}, ${TABLE_P[1]}, …, ${TABLE_P[TABLE_P.length - 1]} plus the refinement
 * nodes of REFINEMENTS). Layout of G, E, STATUS: index c · XI.length + iXi. NaN = destroyed.
 * status: 0 = complex pole, 1 = large-ξ continuation (width below the
 * double-precision resolvable level ln(Γ/ε) < ${RESOLVABLE_LN_WIDTH}), 2 = destroyed.
 * B[c]: slope of g against ln ξ used by the continuation, from the last resolved node XI1[c].
 * SWITCH[c] = 1: columns c and c + 1 follow different poles (jump detector, interval ≤ ${MAX_SWITCH_WIDTH}
 * wide, i.e. localized by refinement nodes); the evaluator takes the nearer node there instead of interpolating.
 * Monotone envelope: y made non-increasing in ξ (largest raise of ln Γ:
 * ${worstRaise.toFixed(3)} at ${worstRaiseAt || '—'}), so that Γ grows with E⊥.
 */
export const WIDTH_TABLE_GENERATOR = {
  name: '${GENERATOR_NAME}',
  version: '${GENERATOR_VERSION}',
  solverVersion: '${SOLVER_VERSION}',
  method: 'zero-range LLL reduction, complex pole by contour continuation through x_t, trapezoidal rule in t (x = x_t ± t²), continuation from F → 0',
  orbitals: 'max(ξ²/2 + 2.5ξ + 10, m + 45)',
  resolvableLnWidth: ${RESOLVABLE_LN_WIDTH},
  monotoneEnvelopeMaxRaise: ${Number(worstRaise.toFixed(4))},
  cpuSeconds: ${Math.round(cpuSeconds)},
} as const;
export const WIDTH_TABLE_M: readonly number[] = ${JSON.stringify(TABLE_M)};
/** The base p grid (every m has these columns). */
export const WIDTH_TABLE_P: readonly number[] = ${JSON.stringify(TABLE_P)};
export const WIDTH_TABLE_REFINEMENTS: readonly { m: number; pFrom: number; pTo: number; nodes: readonly number[]; generatorVersion: string }[] = ${JSON.stringify(refinements)};
export const WIDTH_TABLE_M_START: readonly number[] = ${JSON.stringify(starts)};
export const WIDTH_TABLE_P_NODES: readonly number[] = ${JSON.stringify(pNodes)};
export const WIDTH_TABLE_SWITCH: readonly number[] = ${JSON.stringify(sw)};
export const WIDTH_TABLE_XI: readonly number[] = ${JSON.stringify(TABLE_XI)};
export const WIDTH_TABLE_G: readonly number[] = [${cols.flatMap((c) => c.g.map(fmt)).join(',')}];
export const WIDTH_TABLE_E: readonly number[] = [${cols.flatMap((c) => c.e.map(fmt)).join(',')}];
export const WIDTH_TABLE_STATUS: readonly number[] = [${cols.flatMap((c) => c.status).join(',')}];
export const WIDTH_TABLE_B: readonly number[] = [${cols.map((c) => fmt(c.b)).join(',')}];
export const WIDTH_TABLE_XI1: readonly number[] = [${cols.map((c) => fmt(c.xi1)).join(',')}];
`;
  writeFileSync(outFile, src);
  const nSwitch = sw.reduce((a, b) => a + b, 0);
  console.log(
    `wrote ${outFile}: ${cols.length} columns × ${TABLE_XI.length} ξ nodes (${cols.length - TABLE_M.length * TABLE_P.length} refinement columns, ${nSwitch} switch intervals), solver CPU ${cpuSeconds.toFixed(0)} s, largest monotone-envelope raise ${worstRaise.toFixed(3)} (${worstRaiseAt || '—'})`,
  );
}

/** Assemble everything from the cache: base grid plus the committed refinement nodes. */
async function assembleFromCache(partial: boolean): Promise<void> {
  let refinements: Refinement[] = [];
  try {
    refinements = (await readCommitted()).refinements;
  } catch {
    refinements = [];
  }
  const cols: Column[] = [];
  let seconds = 0;
  let worstRaise = 0;
  let worstRaiseAt = '';
  for (const [m, p] of allTasks(refinements)) {
    if (partial && !existsSync(taskFile(m, p))) {
      cols.push(destroyedColumn(m, p)); // development only
      continue;
    }
    const c = columnFromCache(m, p);
    seconds += c.seconds;
    if (c.raise > worstRaise) {
      worstRaise = c.raise;
      worstRaiseAt = `m=${m} p=${p}`;
    }
    cols.push(c);
  }
  writeTable(cols, refinements, seconds, worstRaise, worstRaiseAt);
}

function allTasks(refinements: Refinement[]): [number, number][] {
  const tasks: [number, number][] = [];
  for (const m of TABLE_M) {
    const ps = new Set<number>(TABLE_P);
    for (const r of refinements) if (r.m === m) for (const p of r.nodes) ps.add(p);
    for (const p of [...ps].sort((a, b) => a - b)) tasks.push([m, p]);
  }
  return tasks;
}

/** `m:pFrom-pTo/n` (n nodes strictly inside, rounded to 1e-4) or `m:p1,p2,…`. */
function parseRefine(spec: string): Refinement {
  const bad = (why: string) => new Error(`--refine ${spec}: ${why} (expected m:pFrom-pTo/n or m:p1,p2,…)`);
  const [mS, rest] = spec.split(':');
  const m = Number(mS);
  if (!Number.isInteger(m) || !TABLE_M.includes(m) || rest === undefined) throw bad('m must be an orbital of the table');
  let nodes: number[];
  const range = /^([\d.]+)-([\d.]+)\/(\d+)$/.exec(rest);
  if (range) {
    const [a, b, n] = [Number(range[1]), Number(range[2]), Number(range[3])];
    if (!(a < b) || n < 1) throw bad('need pFrom < pTo and n ≥ 1');
    nodes = Array.from({ length: n }, (_, k) => Number((a + ((b - a) * (k + 1)) / (n + 1)).toFixed(4)));
  } else {
    nodes = rest.split(',').map(Number);
  }
  const p0 = TABLE_P[0]!;
  const p1 = TABLE_P[TABLE_P.length - 1]!;
  if (nodes.some((p) => !(p > p0 && p < p1))) throw bad(`p must lie inside (${p0}, ${p1})`);
  nodes = nodes.filter((p) => !TABLE_P.includes(p)).sort((x, y) => x - y);
  if (nodes.length === 0) throw bad('no node off the base grid');
  const pFrom = range ? Number(range[1]) : nodes[0]!;
  const pTo = range ? Number(range[2]) : nodes[nodes.length - 1]!;
  return { m, pFrom, pTo, nodes, generatorVersion: GENERATOR_VERSION };
}

/** --refine: compute only the given blocks and merge them into the committed table. */
async function refine(specs: string[], jobs: number): Promise<void> {
  const blocks = specs.map(parseRefine);
  const committed = await readCommitted();
  await runTasks(
    blocks.flatMap((b) => b.nodes.map((p) => [b.m, p] as [number, number])),
    jobs,
  );
  const cols = committed.columns.slice();
  let seconds = committed.cpuSeconds;
  for (const b of blocks) {
    for (const p of b.nodes) {
      const c = columnFromCache(b.m, p);
      const at = cols.findIndex((x) => x.m === b.m && x.p === p);
      if (at >= 0) cols.splice(at, 1);
      else seconds += c.seconds;
      cols.push(c);
    }
  }
  const refinements = [...committed.refinements, ...blocks];
  // the committed envelope record covers the columns read back; new columns can only add to it
  let worstRaise = committed.worstRaise;
  let worstRaiseAt = committed.worstRaiseAt;
  for (const c of cols) {
    if (c.raise > worstRaise) {
      worstRaise = c.raise;
      worstRaiseAt = `m=${c.m} p=${c.p}`;
    }
  }
  writeTable(cols, refinements, seconds, worstRaise, worstRaiseAt);
  for (const b of blocks) report(cols.filter((c) => c.m === b.m).sort((x, y) => x.p - y.p), b.pFrom, b.pTo);
}

function report(mine: Column[], pLo = -Infinity, pHi = Infinity): void {
  for (const s of scoresOf(mine)) {
    if (s.pHi < pLo || s.pLo > pHi) continue;
    console.log(
      `  m=${mine[0]!.m} p ${s.pLo}…${s.pHi}: e score ${s.scoreE.toFixed(3)} (ξ=${s.xiE}), ln Γ score ${s.scoreY.toFixed(3)} (ξ=${s.xiY})${s.flagged ? '  ← pole switch' : ''}`,
    );
  }
}

/** --scan: the jump detector over every m of the committed table. */
async function scan(all: boolean): Promise<void> {
  const { columns } = await readCommitted();
  let flagged = 0;
  for (const m of TABLE_M) {
    const mine = columns.filter((c) => c.m === m).sort((x, y) => x.p - y.p);
    const scores = scoresOf(mine);
    const f = scores.filter((s) => s.flagged);
    flagged += f.length;
    console.log(`m=${m}: ${f.length} flagged of ${scores.length} p intervals${f.length ? ': ' + f.map((s) => `${s.pLo}…${s.pHi} (e ${s.scoreE.toFixed(2)} at ξ=${s.xiE}, ln Γ ${s.scoreY.toFixed(2)} at ξ=${s.xiY})`).join('; ') : ''}`);
    if (all) report(mine);
  }
  console.log(`${flagged} flagged intervals in all`);
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
  const jobsArg = args.indexOf('--jobs');
  const jobs = jobsArg >= 0 ? Number(args[jobsArg + 1]) : 2;
  if (args.includes('--scan')) return scan(args.includes('--all'));
  const specs = args.flatMap((a, i) => (a === '--refine' ? [args[i + 1]!] : []));
  if (specs.length > 0) return refine(specs, jobs);
  if (!args.includes('--assemble')) {
    let refinements: Refinement[] = [];
    try {
      refinements = (await readCommitted()).refinements;
    } catch {
      refinements = [];
    }
    // largest m first: they take longest
    await runTasks(allTasks(refinements).reverse(), jobs);
  }
  await assembleFromCache(args.includes('--partial'));
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
