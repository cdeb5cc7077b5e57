/// <reference types="node" />
import { closeSync, openSync, readFileSync, renameSync, rmSync, writeSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { basename, extname } from 'node:path';
import { parseArgs } from 'node:util';
import { estimateMapCsv, mapCsvChunks } from '../export/mapCsv.js';
import { estimateMapJson, MAP_FILE_FORMAT, mapJsonChunks } from '../export/mapJson.js';
import { formatBytes, type ExportSizeCheck } from '../export/exportLimits.js';
import { jsonSyntaxError } from '../export/jsonSyntaxError.js';
import type { BindingMapResult, PhaseMapResult } from '../map/mapTypes.js';
import { validateSetup, type MapSetup, type SetupIssue } from '../setup/mapSetup.js';
import { ENGINE_VERSION } from '../version.js';
import { CliInputError, CliUsageError } from './cliUsageError.js';
import type { CliIo } from './main.js';
import { computeClassifiedMap } from './mapPool.js';
import { ProgressReporter } from './progressBar.js';

/** Parsed arguments of `fieldbound map`. */
export interface MapArgs {
  setupPath: string;
  out: string;
  format: 'csv' | 'json';
  threads: number;
  /** Date written into the file (default: now, ISO 8601). */
  date: string | null;
  quiet: boolean;
}

const OPTIONS = {
  out: { type: 'string', short: 'o' },
  threads: { type: 'string' },
  date: { type: 'string' },
  quiet: { type: 'boolean', default: false },
  help: { type: 'boolean', short: 'h', default: false },
} as const;

export { CliInputError };

/**
 * Parses `fieldbound map SETUP.json --out FILE.{csv,json} [--threads N] [--date TEXT] [--quiet]`.
 * Returns null for --help. Bad input: CliUsageError naming the argument.
 *
 * @example parseMapArgs(['s.json', '--out', 'm.csv']) // { setupPath: 's.json', out: 'm.csv', format: 'csv', threads: <cores>, date: null, quiet: false }
 */
export function parseMapArgs(argv: string[], cores = availableParallelism()): MapArgs | null {
  let parsed;
  try {
    parsed = parseArgs({ args: argv, options: OPTIONS, strict: true, allowPositionals: true });
  } catch (e) {
    const msg = (e as Error).message;
    const opt = /'(-{1,2}[\w-]+)/.exec(msg)?.[1] ?? 'arguments';
    throw new CliUsageError(opt, msg.split('\n')[0]!.replace(/\s+/g, ' '));
  }
  const v = parsed.values;
  if (v.help) return null;
  const [setupPath, ...extra] = parsed.positionals;
  if (setupPath === undefined) throw new CliUsageError('SETUP.json', 'the setup file is required (fieldbound map SETUP.json --out FILE.csv|FILE.json)');
  if (extra.length > 0) throw new CliUsageError(extra[0]!, 'unexpected argument (one setup file per run)');
  if (v.out === undefined) throw new CliUsageError('--out', 'is required: the file to write, ending in .csv or .json');
  const ext = extname(v.out).toLowerCase();
  if (ext !== '.csv' && ext !== '.json') throw new CliUsageError('--out', `must end in .csv or .json, got '${v.out}'`);
  let threads = cores;
  if (v.threads !== undefined) {
    threads = Number(v.threads);
    if (v.threads.trim() === '' || !Number.isInteger(threads) || threads < 1 || threads > 256) {
      throw new CliUsageError('--threads', `must be a whole number in 1…256, got '${v.threads}'`);
    }
  }
  if (v.date !== undefined && v.date.trim() === '') throw new CliUsageError('--date', 'must not be empty');
  return { setupPath, out: v.out, format: ext === '.csv' ? 'csv' : 'json', threads, date: v.date ?? null, quiet: v.quiet };
}

/**
 * Reads and validates a setup file with the server's rules (`validateSetup`). The file may be a bare
 * setup or a map file written by the JSON export (its `setup` is used). Bad input: CliInputError whose
 * message names the file and, for a schema problem, lists every field path on its own line.
 */
export function readSetupFile(path: string): MapSetup {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a directory' : code === 'EACCES' ? 'permission denied' : (e as Error).message;
    throw new CliInputError(`${path}: cannot read the setup file: ${why}`);
  }
  const syntax = jsonSyntaxError(text);
  if (syntax) throw new CliInputError(`${path}: not valid JSON at line ${syntax.line}, column ${syntax.column}: ${syntax.message}`);
  let value = JSON.parse(text) as unknown;
  let prefix = '';
  if (value !== null && typeof value === 'object' && (value as Record<string, unknown>).format === MAP_FILE_FORMAT && 'setup' in value) {
    value = (value as Record<string, unknown>).setup;
    prefix = 'setup.';
  }
  const r = validateSetup(value);
  if (!r.ok) throw new CliInputError(formatIssues(path, r.issues, prefix));
  return r.setup;
}

/** "FILE: the setup is not valid (N problems):" and one "  path: message" line per problem. */
export function formatIssues(path: string, issues: readonly SetupIssue[], prefix = ''): string {
  const head = `${path}: the setup is not valid (${issues.length} problem${issues.length === 1 ? '' : 's'}):`;
  return [head, ...issues.map((i) => `  ${prefix}${i.path}: ${i.message}`)].join('\n');
}

/** Size check of the chosen export (the same limits as the browser's export). */
export function checkOutputSize(format: 'csv' | 'json', input: { setup: MapSetup; binding: BindingMapResult; phase: PhaseMapResult; date: string }, maxBytes?: number): ExportSizeCheck {
  return format === 'csv'
    ? estimateMapCsv(input, { maxBytes })
    : estimateMapJson({ ...input, engineVersion: ENGINE_VERSION }, { maxBytes });
}

/**
 * Writes the export to a temporary file next to `out` and renames it at the end, so a cancelled or
 * failed run leaves no half-written file. Yields to the event loop every few chunks so that Ctrl-C
 * (an aborted `signal`) is seen while writing: the temporary file is then removed and the call
 * resolves to null. Resolves to the number of bytes written otherwise.
 */
export async function writeExport(out: string, chunks: Iterable<string>, signal?: AbortSignal): Promise<number | null> {
  const tmp = `${out}.partial-${process.pid}`;
  let bytes = 0;
  const fd = openSync(tmp, 'w');
  let ok = false;
  try {
    let n = 0;
    for (const c of chunks) {
      const b = Buffer.from(c, 'utf8');
      let off = 0;
      while (off < b.length) off += writeSync(fd, b, off);
      bytes += b.length;
      if (++n % 32 === 0) await new Promise((r) => setImmediate(r));
      if (signal?.aborted) return null;
    }
    ok = true;
  } finally {
    closeSync(fd);
    if (!ok) rmSync(tmp, { force: true });
  }
  renameSync(tmp, out);
  return bytes;
}

/**
 * `fieldbound map`: validates the setup, computes the whole classified map on worker threads
 * (progress on stderr), then writes the CSV or JSON export (the browser's export module). Ctrl-C stops
 * the workers and exits with 130 without writing anything. Returns the exit code.
 */
export async function mapCommand(a: MapArgs, io: CliIo): Promise<number> {
  const setup = readSetupFile(a.setupPath);
  const controller = new AbortController();
  const onSigint = (): void => controller.abort();
  process.on('SIGINT', onSigint);
  try {
    const progress = a.quiet ? null : new ProgressReporter(process.stderr);
    let result: { binding: BindingMapResult; phase: PhaseMapResult };
    const t0 = Date.now();
    try {
      result = await computeClassifiedMap(setup, { threads: a.threads, signal: controller.signal, onProgress: (p) => progress?.update(p) });
    } catch (e) {
      progress?.finish();
      if ((e as Error).name === 'AbortError') {
        io.err('fieldbound map: cancelled; the workers are stopped and nothing was written');
        return 130;
      }
      throw e;
    }
    progress?.finish();
    const date = a.date ?? new Date().toISOString();
    const input = { setup, ...result, date };
    const size = checkOutputSize(a.format, input);
    if (!size.ok) throw new CliInputError(`--out ${basename(a.out)}: ${size.message}`);
    const chunks = a.format === 'csv' ? mapCsvChunks(input) : mapJsonChunks({ ...input, engineVersion: ENGINE_VERSION });
    const bytes = await writeExport(a.out, chunks, controller.signal);
    if (bytes === null) {
      io.err('fieldbound map: cancelled while writing; nothing was written');
      return 130;
    }
    return report(a, setup, result, bytes, t0, io);
  } finally {
    process.removeListener('SIGINT', onSigint);
  }
}

function report(a: MapArgs, setup: MapSetup, result: { binding: BindingMapResult; phase: PhaseMapResult }, bytes: number, t0: number, io: CliIo): number {
  const cells = result.binding.cellCount;
  let survivors = 0;
  for (let c = 0; c < cells; c++) if (result.phase.survivors[c]! > 0) survivors++;
  io.out(
    `wrote ${a.out} (${formatBytes(bytes)}): ${result.binding.nAlpha} x ${result.binding.nField} cells, m = 0…${result.binding.mMax}, ` +
      `${survivors} cells with a surviving state, in ${((Date.now() - t0) / 1000).toFixed(1)} s on ${Math.min(a.threads, setup.grid.nField)} threads`,
  );
  return 0;
}
