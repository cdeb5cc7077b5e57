/// <reference types="node" />
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { ENGINE_VERSION } from '../version.js';
import { runValidation, type Exact1dOracle, type SpecialOracle, type ValidationData, type ValidationResult } from '../validation/validationCases.js';
import { CliInputError, CliUsageError } from './cliUsageError.js';
import type { CliIo } from './main.js';

export interface CheckArgs {
  json: boolean;
}

/** Parses `fieldbound check [--json]`; null for --help. */
export function parseCheckArgs(argv: string[]): CheckArgs | null {
  let parsed;
  try {
    parsed = parseArgs({ args: argv, options: { json: { type: 'boolean', default: false }, help: { type: 'boolean', short: 'h', default: false } }, strict: true, allowPositionals: false });
  } catch (e) {
    const msg = (e as Error).message;
    const opt = /'(-{1,2}[\w-]+)/.exec(msg)?.[1] ?? 'arguments';
    throw new CliUsageError(opt, msg.split('\n')[0]!.replace(/\s+/g, ' '));
  }
  if (parsed.values.help) return null;
  return { json: parsed.values.json };
}

/** The committed oracle files (shared/test/fixtures), two directories above src/cli and dist/cli alike. */
export function loadValidationData(): ValidationData {
  const read = <T>(name: string): T => {
    const path = fileURLToPath(new URL(`../../test/fixtures/${name}`, import.meta.url));
    let text: string;
    try {
      text = readFileSync(path, 'utf8');
    } catch (e) {
      throw new CliInputError(`the committed reference values ${path} cannot be read (${(e as NodeJS.ErrnoException).code ?? (e as Error).message}); fieldbound check runs from the repository checkout`);
    }
    return JSON.parse(text) as T;
  };
  return { special: read<SpecialOracle>('special-oracle.json'), exact1d: read<Exact1dOracle>('exact-1d-oracle.json') };
}

const g = (x: number): string => (Number.isFinite(x) ? x.toPrecision(12).replace(/\.?0+(e|$)/, '$1') : String(x));
const e2 = (x: number): string => (Number.isFinite(x) ? x.toExponential(1) : String(x));

/** The readable report of one case (several lines). */
export function formatResult(r: ValidationResult): string {
  const tol = [r.tolerance.rel > 0 ? `rel ${e2(r.tolerance.rel)}` : '', r.tolerance.abs > 0 ? `abs ${e2(r.tolerance.abs)}` : ''].filter(Boolean).join(', ') || 'exact';
  const lines = [`${r.pass ? 'pass' : 'FAIL'}  ${r.id}: ${r.title}`, `      source: ${r.source}`];
  if (r.error) lines.push(`      could not run: ${r.error}`);
  else
    lines.push(
      `      ${r.points} point${r.points === 1 ? '' : 's'}; worst at ${r.worst.inputs}: value ${g(r.worst.value)}, reference ${g(r.worst.reference)}, |difference| ${e2(r.worst.difference)}, tolerance ${tol}`,
    );
  return lines.join('\n');
}

/** `fieldbound check`: runs every validation case; exit code 1 if any fails. */
export function checkCommand(a: CheckArgs, io: CliIo): number {
  const t0 = Date.now();
  const results = runValidation(loadValidationData());
  const failed = results.filter((r) => !r.pass).length;
  if (a.json) {
    io.out(JSON.stringify({ engine: ENGINE_VERSION, passed: results.length - failed, failed, results }));
  } else {
    io.out(`Fieldbound engine ${ENGINE_VERSION}: validation cases (each against its published source)\n`);
    for (const r of results) io.out(formatResult(r) + '\n');
    io.out(`${results.length - failed} of ${results.length} cases pass${failed ? `; ${failed} FAIL` : ''} (${((Date.now() - t0) / 1000).toFixed(1)} s)`);
  }
  return failed > 0 ? 1 : 0;
}
