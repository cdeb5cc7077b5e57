/**
 * Test helpers for numerical comparisons (tests only; may use Node APIs).
 *
 * `expectClose` checks |actual − expected| ≤ tol·max(|expected|, floor) and, on
 * failure, throws with the inputs, expected, actual, absolute and relative
 * difference and the tolerance, so a failing check can be read without a debugger.
 */

export interface CloseOptions {
  /** Relative tolerance, e.g. 1e-13. */
  rel: number;
  /** Absolute floor: differences below `abs` always pass (default 0). */
  abs?: number;
  /** Human-readable description of the inputs (printed on failure). */
  inputs?: Record<string, unknown> | string;
  /** Source of the expected value (printed on failure). */
  source?: string;
}

/** Relative difference |a − e| / |e| (absolute difference if e = 0). */
export function relDiff(actual: number, expected: number): number {
  if (actual === expected) return 0;
  const d = Math.abs(actual - expected);
  return expected === 0 ? d : d / Math.abs(expected);
}

function fmtInputs(inputs: CloseOptions['inputs']): string {
  if (inputs === undefined) return '(none)';
  if (typeof inputs === 'string') return inputs;
  return Object.entries(inputs)
    .map(([k, v]) => `${k}=${typeof v === 'number' ? v.toPrecision(17) : String(v)}`)
    .join(', ');
}

/**
 * Assert that `actual` is within a relative tolerance of `expected`.
 * Throws an Error with a full report on failure; returns the relative difference.
 *
 * @example
 * expectClose(Math.sqrt(2), 1.4142135623730951, { rel: 1e-15, inputs: { x: 2 } });
 */
export function expectClose(actual: number, expected: number, opts: CloseOptions): number {
  const rd = relDiff(actual, expected);
  const ad = Math.abs(actual - expected);
  const ok =
    Number.isFinite(actual) === Number.isFinite(expected) &&
    (actual === expected || ad <= (opts.abs ?? 0) || rd <= opts.rel);
  if (!ok) {
    throw new Error(
      [
        'expectClose failed',
        `  inputs:     ${fmtInputs(opts.inputs)}`,
        `  expected:   ${expected.toPrecision(17)}${opts.source ? `  (${opts.source})` : ''}`,
        `  actual:     ${actual.toPrecision(17)}`,
        `  difference: ${ad.toExponential(3)} (relative ${rd.toExponential(3)})`,
        `  tolerance:  rel ${opts.rel.toExponential(1)}${opts.abs ? `, abs ${opts.abs.toExponential(1)}` : ''}`,
      ].join('\n'),
    );
  }
  return rd;
}

/** Tracks the worst relative error over a set of checks (for reporting accuracy). */
export class WorstError {
  worst = 0;
  where = '';
  record(rd: number, where: string): void {
    if (rd > this.worst) {
      this.worst = rd;
      this.where = where;
    }
  }
}
