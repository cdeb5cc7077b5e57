/**
 * `fieldbound levels` with an ion motion: the command line (a spawned process and in-process) against
 * the engine called directly (levels → motionStates with motionSettingsFromSetup), and its argument errors.
 */
import { describe, expect, it } from 'vitest';
import { levels } from '../levels/levels.js';
import { motionStates } from '../motion/motionStates.js';
import { motionSettingsFromSetup } from '../motion/phaseMap.js';
import { CODATA2018 } from '../units/codata2018.js';
import type { LevelsJson } from './levelsCommand.js';
import { captureCli, runCli } from '../../test/cliRunner.js';

const run = runCli;
const capture = captureCli;

const POINT = ['levels', '--alpha', '1000', '--field', '30', '--field-unit', 'tesla', '--cutoff', '2', '--m-max', '4'];
const FIELD_AU = 30 / CODATA2018.atomicFieldInTesla;

/** The engine called directly, the way the server's setup describes the motion. */
function direct(motion: Parameters<typeof motionSettingsFromSetup>[0]['motion'], massNumber: number, tau = 1) {
  const states = levels({ alpha: 1000, fieldAu: FIELD_AU, cutoffBohr: 2, mMax: 4 }).sort((p, q) => p.m - q.m || p.nu - q.nu);
  const settings = motionSettingsFromSetup({ motion, ion: { massNumber }, observationTimeSeconds: tau })!;
  return { states, moving: motionStates({ fieldAu: FIELD_AU, states, motion: settings }) };
}

/** JSON has no infinity: the CLI writes null for an infinite width or lifetime and a missing shift. */
const asJson = (x: number): number | null => (Number.isFinite(x) ? x : null);

describe('fieldbound levels with an ion motion', () => {
  it('temperature (spawned process): every state carries width, lifetime, shift, class and fractions equal to motionStates called directly', () => {
    const r = run([...POINT, '--mass-number', '133', '--temperature', '0.3', '--tau', '0.01', '--json']);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const doc = JSON.parse(r.stdout) as LevelsJson;
    const d = direct({ kind: 'temperature', kelvin: 0.3 }, 133, 0.01);
    expect(doc.states.length).toBe(d.states.length);
    expect(doc.input.motion).toMatchObject({ massNumber: 133, mode: 'temperature', temperatureKelvin: 0.3, tauSeconds: 0.01 });
    expect(doc.input.motion!.boundWidthHartree).toBe(CODATA2018.atomicTimeInSecond / 0.01);
    const classes = new Set<string>();
    doc.states.forEach((s, k) => {
      const e = d.moving[k]!;
      expect([s.m, s.nu]).toEqual([e.m, e.nu]);
      expect(s.bindingHartree).toBe(d.states[k]!.bindingHartree);
      expect(s.widthHartree).toBe(asJson(e.widthHartree));
      expect(s.lifetimeSeconds).toBe(asJson(e.lifetimeSeconds));
      expect(s.shiftHartree).toBe(asJson(e.shiftHartree));
      expect(s.class).toBe(e.class);
      expect(s.motionFlags).toEqual(e.flags);
      expect(s.fractions).toEqual(e.fractions);
      const f = s.fractions!;
      expect(Math.abs(f.bound + f.resonance + f.unbound - 1)).toBeLessThan(1e-12);
      classes.add(s.class!);
    });
    // the point is chosen so that the answer is not trivial: more than one class occurs
    expect(classes.size).toBeGreaterThan(1);
  });

  it('kinetic energy in eV, hartree and K and an ion Landau level (in-process) equal the direct engine; no fractions without a temperature', async () => {
    const cases: [string[], Parameters<typeof direct>[0]][] = [
      [['--kinetic-energy', '2e-5', '--energy-unit', 'eV'], { kind: 'kinetic-energy', energyKelvin: (2e-5 / CODATA2018.hartreeInEV) * CODATA2018.hartreeInKelvin }],
      [['--kinetic-energy', '3e-6', '--energy-unit', 'hartree'], { kind: 'kinetic-energy', energyKelvin: 3e-6 * CODATA2018.hartreeInKelvin }],
      [['--kinetic-energy', '0.2', '--energy-unit', 'K'], { kind: 'kinetic-energy', energyKelvin: 0.2 }],
      [['--ion-level', '5'], { kind: 'ion-level', level: 5 }],
    ];
    for (const [opts, motion] of cases) {
      const c = await capture([...POINT, '--mass-number', '40', ...opts, '--json']);
      expect(c.code, c.err).toBe(0);
      const doc = JSON.parse(c.out) as LevelsJson;
      const d = direct(motion, 40);
      doc.states.forEach((s, k) => {
        const e = d.moving[k]!;
        // kelvin ↔ hartree conversions may differ in the last bit from the typed value: 1e-12 relative
        if (e.widthHartree > 0 && Number.isFinite(e.widthHartree)) expect(Math.abs(s.widthHartree! / e.widthHartree - 1), opts.join(' ')).toBeLessThan(1e-9);
        else expect(s.widthHartree).toBe(asJson(e.widthHartree));
        expect(s.class, opts.join(' ')).toBe(e.class);
        expect(s.fractions).toBeUndefined();
      });
    }
  });

  it('the readable table shows width (hartree), lifetime (s), shift (hartree), class and, with a temperature, the fractions', async () => {
    const c = await capture([...POINT, '--mass-number', '133', '--temperature', '0.3']);
    expect(c.code).toBe(0);
    for (const h of ['width (hartree)', 'lifetime (s)', 'shift (hartree)', 'class', 'f bound', 'f resonance', 'f unbound', 'V/m', 'mass number 133']) expect(c.out).toContain(h);
    const e = await capture([...POINT, '--mass-number', '133', '--ion-level', '0']);
    expect(e.out).toContain('width (hartree)');
    expect(e.out).not.toContain('f bound');
  });

  it('bad motion arguments: one line naming the argument, exit code 2 (the server setup rules)', async () => {
    const cases: [string[], string][] = [
      [['--mass-number', '133', '--temperature', '-1'], '--temperature'],
      [['--mass-number', '133', '--temperature', '0'], '--temperature'],
      [['--mass-number', '133', '--kinetic-energy', '-2', '--energy-unit', 'K'], '--kinetic-energy'],
      [['--mass-number', '0', '--temperature', '1'], '--mass-number'],
      [['--mass-number', '301', '--temperature', '1'], '--mass-number'],
      [['--mass-number', '40.5', '--temperature', '1'], '--mass-number'],
      [['--mass-number', '40', '--temperature', '1', '--tau', '0'], '--tau'],
      [['--mass-number', '40', '--temperature', '1', '--tau', '-3'], '--tau'],
      [['--mass-number', '40', '--kinetic-energy', '1', '--energy-unit', 'erg'], '--energy-unit'],
      [['--mass-number', '40', '--kinetic-energy', '1'], '--energy-unit'],
      [['--mass-number', '40', '--temperature', '1', '--energy-unit', 'K'], '--energy-unit'],
      // conflicting modes: the message names both (the later one of kinetic energy, level, temperature first)
      [['--mass-number', '40', '--temperature', '1', '--ion-level', '2'], '--temperature: conflicts with --ion-level'],
      [['--mass-number', '40', '--kinetic-energy', '1', '--energy-unit', 'K', '--temperature', '1'], '--temperature: conflicts with --kinetic-energy'],
      [['--mass-number', '40', '--ion-level', '1.5'], '--ion-level'],
      [['--temperature', '1'], '--mass-number'],
      [['--mass-number', '40'], '--mass-number'],
      [['--tau', '2'], '--tau'],
      [['--mass-number', 'x', '--temperature', '1'], '--mass-number'],
    ];
    for (const [opts, name] of cases) {
      const c = await capture([...POINT, ...opts]);
      expect(c.code, opts.join(' ')).toBe(2);
      expect(c.out).toBe('');
      expect(c.err.trimEnd().split('\n').length, c.err).toBe(1);
      expect(c.err, opts.join(' ')).toContain(`fieldbound: ${name}`);
    }
    const r = run([...POINT, '--mass-number', '500', '--temperature', '1']);
    expect(r.status).toBe(2);
    expect(r.stderr.trim()).toBe('fieldbound: --mass-number: mass number must be at most 300');
  });
});
