import { describe, expect, it } from 'vitest';
import { bindingMap } from '../map/bindingMap.js';
import { mapTestSetup } from '../map/testSetups.js';
import { defaultSetup } from '../setup/presets.js';
import { setupFingerprint } from '../setup/fingerprint.js';
import type { MapSetup } from '../setup/mapSetup.js';
import { ENGINE_VERSION } from '../version.js';
import { checkBibtex } from './checkBibtex.js';
import { approxText, exactText } from './formatForText.js';
import { methodsBibtex } from './methodsBibtex.js';
import { citedReferences, methodsNote } from './methodsNote.js';
import { REFERENCES } from './references.js';

const base: MapSetup = {
  ...defaultSetup(),
  alphaAxis: { min: 2.5, max: 750, scale: 'log' },
  fieldAxis: { min: 1.5, max: 45, scale: 'linear' },
  grid: { nAlpha: 300, nField: 200 },
  orbitals: { mMax: 5 },
  shortRange: { model: 'regularized-polarization', cutoffBohr: 3.25 },
  energyFloorKelvin: 2e-4,
  motion: { kind: 'none' },
  species: [],
};
const withMotion: MapSetup = { ...base, motion: { kind: 'temperature', kelvin: 0.004 }, ion: { massNumber: 133 }, observationTimeSeconds: 0.25, species: ['Cs', 'Rb'] };

describe('methods note', () => {
  const note = methodsNote(base, { engineVersion: ENGINE_VERSION });

  it('states the setup\'s exact parameter values with their units', () => {
    expect(note).toContain('Polarizability α from 2.5 to 750 a₀³');
    expect(note).toContain('at 300 points evenly spaced in ln α');
    expect(note).toContain('field B from 1.5 to 45 T');
    expect(note).toContain('at 200 points evenly spaced in B');
    expect(note).toContain('orbitals m = 0 to 5');
    expect(note).toContain('cutoff radius r_c = 3.25 a₀');
    expect(note).toContain('energy floor 0.0002 K');
    expect(note).toContain('the atom held fixed (no ion motion)');
    expect(note).toContain(`setup fingerprint ${setupFingerprint(base)}`);
    expect(note).toContain(`Fieldbound engine ${ENGINE_VERSION}`);
    expect(note).toContain('relative map tolerance 10⁻⁶');
  });

  it('describes the model, validity limits with the flag thresholds, numerics and constants with their source', () => {
    for (const phrase of [
      'regularized polarization potential V(r) = −α/[2(r² + r_c²)²]',
      'lowest Landau level',
      'adiabatic single-orbital approximation',
      'V_m(z) = −(αB²/8) U(2, 2 − m, (z² + r_c²)B/2)',
      'ε/B > 0.1 is flagged non-adiabatic',
      'α/r_c² ≥ 1 are flagged cutoff-dominated',
      'the part of the map with α ≥ r_c² = 10.56 a₀³', // r_c² = 3.25² = 10.5625
      'field-free negative ion',
      'here ρ_c runs from 0.00821 to 0.045', // 3.25 · √(1.5 / 235051.76) … 3.25 · √(45 / 235051.76)
      'sinh-mapped coordinate',
      'sixth-order Magnus integrator',
      'Prüfer-type matching function',
      'Chebyshev–Lobatto grids',
      'CODATA 2018 recommended values',
      'E_h = 27.211386245988 eV',
    ]) {
      expect(note).toContain(phrase);
    }
  });

  it('mentions the moving ion only when the setup has ion motion', () => {
    expect(note).not.toMatch(/Moving ion\./);
    expect(note).not.toMatch(/observation time τ/);
    const moving = methodsNote(withMotion, { engineVersion: ENGINE_VERSION });
    expect(moving).toContain('Moving ion.');
    expect(moving).toContain('T = 0.004 K');
    expect(moving).toContain('mass number A = 133');
    expect(moving).toContain('τ = 0.25 s');
    expect(moving).toContain('ion mass number 133, observation time 0.25 s, temperature 0.004 K');
    const level = methodsNote({ ...base, motion: { kind: 'ion-level', level: 3 } }, { engineVersion: ENGINE_VERSION });
    expect(level).toContain('Landau level N = 3');
  });

  it('says when no m = 0 value, or every one, is cutoff-dominated', () => {
    const small = methodsNote({ ...base, alphaAxis: { min: 1, max: 5, scale: 'log' } }, { engineVersion: ENGINE_VERSION });
    expect(small).toContain('so no m = 0 value is flagged');
    const large = methodsNote({ ...base, alphaAxis: { min: 20, max: 500, scale: 'log' } }, { engineVersion: ENGINE_VERSION });
    expect(large).toContain('every m = 0 value is cutoff-dominated');
  });

  it('numbers the citations in order of first appearance and lists exactly the cited references', () => {
    const cited = citedReferences(base);
    expect(cited[0]).toBe('dlmf');
    expect(cited).not.toContain('schwerdtfeger2019');
    const refs = note.slice(note.indexOf('\nReferences\n'));
    cited.forEach((id, k) => expect(refs).toContain(`[${k + 1}] ${REFERENCES[id].text}`));
    const body = note.slice(0, note.indexOf('\nReferences\n'));
    const used = new Set([...body.matchAll(/\[(\d+(?:, \d+)*)\]/g)].flatMap((m) => m[1].split(', ').map(Number)));
    expect([...used].sort((x, y) => x - y)).toEqual(cited.map((_, k) => k + 1));
    expect(citedReferences(withMotion)).toContain('schwerdtfeger2019');
  });

  it('reports how a computed map\'s cells were obtained when the map is given', () => {
    const setup = mapTestSetup({ alpha: [1, 100, 'log'], fieldTesla: [1, 45, 'log'], grid: [3, 3], mMax: 1, cutoffBohr: 2, floorKelvin: 0 });
    const map = bindingMap(setup);
    const text = methodsNote(setup, { engineVersion: ENGINE_VERSION, binding: map });
    expect(text).toMatch(/In this map (every \(orbital, cell\) pair was solved directly|[\d.]+ % of the \(orbital, cell\) pairs were solved directly)/);
  });
});

describe('BibTeX of the cited references', () => {
  it('parses: balanced braces, unique keys, required fields per entry type; one entry per cited reference', () => {
    for (const setup of [base, withMotion]) {
      const bib = methodsBibtex(setup);
      const { entries, problems } = checkBibtex(bib);
      expect(problems).toEqual([]);
      expect(entries.map((e) => e.key)).toEqual(citedReferences(setup).map((id) => REFERENCES[id].key));
    }
  });

  it('every known reference is well formed and carries a DOI where the text gives one', () => {
    const { entries, problems } = checkBibtex(Object.values(REFERENCES).map((r) => r.bibtex).join('\n'));
    expect(problems).toEqual([]);
    for (const r of Object.values(REFERENCES)) {
      const doi = /doi:(\S+?)\.?$/.exec(r.text)?.[1];
      const entry = entries.find((e) => e.key === r.key)!;
      expect(entry.fields.get('doi')).toBe(doi);
    }
  });

  it('the checker reports unbalanced braces, duplicate keys and missing fields', () => {
    expect(checkBibtex('@article{a, title = {x}').problems).toEqual(['@article at character 0: unbalanced braces']);
    expect(checkBibtex('@misc{a, title={x}}\n@misc{a, title={y}}').problems).toEqual(['a: duplicate key']);
    expect(checkBibtex('@article{b, author={A}, title={T}, year=2000}').problems).toEqual(['b: article lacks journal']);
    expect(checkBibtex('@book{c, editor={E}, title={T}, publisher={P}, year={1}}').problems).toEqual([]);
    expect(checkBibtex('@weird{d, title={T}}').problems).toEqual(['d: unknown entry type @weird']);
  });
});

describe('numbers in the note', () => {
  it('exact values keep every digit; derived values are rounded', () => {
    expect(exactText(45)).toBe('45');
    expect(exactText(0.2350517567581)).toBe('0.2350517567581');
    expect(exactText(2.5e-7)).toBe('2.5 × 10⁻⁷');
    expect(exactText(1e9)).toBe('10⁹');
    expect(exactText(1234567)).toBe('1.234567 × 10⁶');
    expect(approxText(235051.7567581, 4)).toBe('2.351 × 10⁵');
    expect(approxText(0.14818471147, 4)).toBe('0.1482');
    expect(approxText(12, 4)).toBe('12');
  });
});
