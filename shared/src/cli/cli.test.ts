/**
 * The command line, run as a separate process through tsx (the TypeScript source, so no build is
 * needed), compared with the engine's `levels` called directly in this process.
 */
import { describe, expect, it } from 'vitest';
import { levels } from '../levels/levels.js';
import { ENGINE_VERSION } from '../version.js';
import type { LevelsJson } from './levelsCommand.js';
import { captureCli, runCli } from '../../test/cliRunner.js';

const run = runCli;
const capture = captureCli;

describe('fieldbound levels (spawned process)', () => {
  it('--json prints exactly one JSON object whose states equal levels() called directly (consistency with the direct solver)', () => {
    const r = run(['levels', '--alpha', '1000', '--field', '0.1', '--field-unit', 'au', '--cutoff', '2', '--m-max', '2', '--json']);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const doc = JSON.parse(r.stdout) as LevelsJson;
    expect(doc.engine).toBe(ENGINE_VERSION);
    expect(doc.input).toMatchObject({ alphaBohr3: 1000, field: 0.1, fieldUnit: 'au', fieldAu: 0.1, cutoffBohr: 2, mMax: 2 });
    const direct = levels({ alpha: 1000, fieldAu: 0.1, cutoffBohr: 2, mMax: 2 });
    expect(doc.states.length).toBe(direct.length);
    // sorted by m, then ν
    for (let k = 1; k < doc.states.length; k++) {
      const p = doc.states[k - 1];
      const q = doc.states[k];
      expect(p.m < q.m || (p.m === q.m && p.nu < q.nu)).toBe(true);
    }
    for (const s of doc.states) {
      const d = direct.find((x) => x.m === s.m && x.nu === s.nu)!;
      // same code, same input: bit-identical numbers
      expect(s.bindingHartree).toBe(d.bindingHartree);
      expect(s.bindingOverB).toBe(d.bindingOverB);
      expect(s.relError).toBe(d.relError);
      expect(s.flags).toEqual(d.flags);
      expect(Object.keys(s)).toEqual(['m', 'nu', 'bindingHartree', 'bindingOverB', 'relError', 'flags']);
    }
  });

  it('--field-unit tesla converts with B0 = 2.350517567581e5 T (CODATA 2018) and gives the same states as the field in a.u.', () => {
    const r = run(['levels', '--alpha', '400', '--field', '23505.17567581', '--field-unit', 'tesla', '--cutoff', '2', '--m-max', '1', '--json']);
    expect(r.status).toBe(0);
    const doc = JSON.parse(r.stdout) as LevelsJson;
    expect(doc.input.fieldAu).toBeCloseTo(0.1, 15);
    const direct = levels({ alpha: 400, fieldAu: doc.input.fieldAu, cutoffBohr: 2, mMax: 1 });
    expect(doc.states.map((s) => s.bindingHartree)).toEqual(direct.map((s) => s.bindingHartree));
  });

  it('bad arguments: one line naming the argument on stderr, exit code 2', async () => {
    const cases: [string[], string][] = [
      [['levels', '--alpha', '-1', '--field', '1', '--field-unit', 'au', '--cutoff', '2', '--m-max', '1'], '--alpha'],
      [['levels', '--alpha', '10', '--field', 'abc', '--field-unit', 'au', '--cutoff', '2', '--m-max', '1'], '--field'],
      [['levels', '--alpha', '10', '--field', '1', '--field-unit', 'gauss', '--cutoff', '2', '--m-max', '1'], '--field-unit'],
      [['levels', '--alpha', '10', '--field', '1', '--field-unit', 'au', '--cutoff', '0', '--m-max', '1'], '--cutoff'],
      [['levels', '--alpha', '10', '--field', '1', '--field-unit', 'au', '--cutoff', '2', '--m-max', '65'], '--m-max'],
      [['levels', '--alpha', '10', '--field', '1', '--field-unit', 'au', '--cutoff', '2'], '--m-max'],
      [['levels', '--alpa', '10'], '--alpa'],
      [['level'], 'command'],
    ];
    for (const [args, name] of cases) {
      const c = await capture(args);
      expect(c.code, args.join(' ')).toBe(2);
      expect(c.out).toBe('');
      expect(c.err.trimEnd().split('\n').length, c.err).toBe(1);
      expect(c.err, args.join(' ')).toContain(name);
    }
    // and once through a real process
    const r = run(['levels', '--alpha', 'x']);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim()).toBe("fieldbound: --alpha: must be a positive finite number, got 'x'");
  });

  it('the table lists every state with binding energies in hartree, µeV and kelvin', async () => {
    const c = await capture(['levels', '--alpha', '10', '--field', '0.1', '--field-unit', 'au', '--cutoff', '2', '--m-max', '2']);
    expect(c.code).toBe(0);
    expect(c.out).toContain('binding (hartree)');
    expect(c.out).toContain('binding (ueV)');
    expect(c.out).toContain('binding (K)');
    expect(c.out).toContain('3 states');
    // m = 0 at alpha/rc^2 = 2.5 is flagged (model.md §3)
    expect(c.out).toMatch(/cutoff-dominated/);
  });

  it('--help prints the usage and exits 0', async () => {
    const c = await capture(['--help']);
    expect(c.code).toBe(0);
    expect(c.out).toContain('fieldbound levels --alpha <a0^3> --field <value> --field-unit <tesla|au>');
    expect((await capture(['levels', '--help'])).code).toBe(0);
    expect((await capture(['map', '--help'])).code).toBe(0);
    expect((await capture(['check', '--help'])).code).toBe(0);
  });
});
