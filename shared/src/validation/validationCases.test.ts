/**
 * The engine's validation cases (shared with `fieldbound check`): each passes against its source, and
 * the runner reports a failing case as failed (so a broken engine cannot pass the check).
 */
import { describe, expect, it } from 'vitest';
import { VALIDATION_DATA as data } from '../../test/validationData.js';
import { runValidationCase, VALIDATION_CASES } from './validationCases.js';

describe('validation cases', () => {
  for (const c of VALIDATION_CASES) {
    it(`${c.id}: ${c.title} (${c.source})`, () => {
      const r = runValidationCase(c, data);
      expect(r.error).toBeUndefined();
      expect(r.points).toBeGreaterThan(0);
      expect(r.pass, `worst at ${r.worst.inputs}: value ${r.worst.value}, reference ${r.worst.reference}, difference ${r.worst.difference}, tolerance ${JSON.stringify(r.tolerance)}`).toBe(true);
    });
  }

  it('a case whose engine value is off by more than the tolerance fails, and reports that point as the worst', () => {
    const wrong = { ...VALIDATION_CASES[0]!, points: () => [
      { inputs: 'a', value: 1, reference: 1 },
      { inputs: 'b', value: 2 * (1 + 2e-14), reference: 2 },
    ] };
    const r = runValidationCase(wrong, data);
    expect(r.pass).toBe(false);
    expect(r.worst.inputs).toBe('b');
    const throwing = { ...VALIDATION_CASES[0]!, points: () => { throw new Error('boom'); } };
    expect(runValidationCase(throwing, data)).toMatchObject({ pass: false, error: 'boom' });
  });
});
