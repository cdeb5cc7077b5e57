/** `fieldbound check`: every validation case passes, each printed with its source, value, reference and tolerance. */
import { describe, expect, it } from 'vitest';
import { VALIDATION_CASES } from '../validation/validationCases.js';
import { main } from './main.js';

async function capture(argv: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await main(argv, { out: (t) => (out += t + '\n'), err: (t) => (err += t + '\n') });
  return { code, out, err };
}

describe('fieldbound check', () => {
  it('exits 0 and prints every case with its source, worst value, reference and tolerance', async () => {
    const c = await capture(['check']);
    expect(c.err).toBe('');
    expect(c.code).toBe(0);
    for (const v of VALIDATION_CASES) {
      expect(c.out).toContain(`pass  ${v.id}: ${v.title}`);
      expect(c.out).toContain(`source: ${v.source}`);
    }
    expect(c.out).toMatch(/worst at .*: value .*, reference .*, \|difference\| .*, tolerance /);
    expect(c.out).toContain(`${VALIDATION_CASES.length} of ${VALIDATION_CASES.length} cases pass`);
  });

  it('--json gives the same results as one object; an unknown option is exit code 2', async () => {
    const c = await capture(['check', '--json']);
    expect(c.code).toBe(0);
    const doc = JSON.parse(c.out) as { failed: number; results: { id: string; pass: boolean; points: number }[] };
    expect(doc.failed).toBe(0);
    expect(doc.results.map((r) => r.id)).toEqual(VALIDATION_CASES.map((v) => v.id));
    for (const r of doc.results) expect(r.points).toBeGreaterThan(0);
    const bad = await capture(['check', '--fast']);
    expect(bad.code).toBe(2);
    expect(bad.err).toContain('--fast');
  });
});
