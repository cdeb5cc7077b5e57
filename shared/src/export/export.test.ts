import { describe, expect, it } from 'vitest';
import { bindingMap } from '../map/bindingMap.js';
import { mapTestSetup } from '../map/testSetups.js';
import { STATE_CLASS, type BindingMapResult, type PhaseMapResult } from '../map/mapTypes.js';
import { defaultSetup } from '../setup/presets.js';
import { setupFingerprint } from '../setup/fingerprint.js';
import { CODATA2018 } from '../units/codata2018.js';
import { ENGINE_VERSION } from '../version.js';
import { base64ToBytes, bytesToBase64 } from './base64.js';
import { checkExportSize, EXPORT_LIMITS } from './exportLimits.js';
import { importMapJson } from './importMapJson.js';
import { jsonSyntaxError } from './jsonSyntaxError.js';
import { estimateMapCsv, flagNames, mapCsvChunks, mapCsvColumns, mapCsvRowCount } from './mapCsv.js';
import { estimateMapJson, mapJsonChunks, mapJsonText } from './mapJson.js';
import { readMapCsv } from './readMapCsv.js';
import { utf8Decode, utf8Encode } from './utf8.js';

const DATE = '2026-12-02T01:00:00Z';

// A small map computed by the engine (α = 1…1000 a₀³, B = 1…45 T, 4 × 3 cells, m = 0…2).
const setup = mapTestSetup({ alpha: [1, 1000, 'log'], fieldTesla: [1, 45, 'log'], grid: [4, 3], mMax: 2, cutoffBohr: 2, floorKelvin: 0 });
const binding = bindingMap(setup);

/** A hand-made phase map on the same layout: alternating classes, widths 1e-12·(s + 1), thermal fractions. */
function fakePhase(b: BindingMapResult, withFractions: boolean): PhaseMapResult {
  const n = b.bindingHartree.length;
  const stateClass = new Uint8Array(n);
  const widthHartree = new Float64Array(n);
  const fractions = withFractions ? new Float32Array(3 * n) : null;
  for (let s = 0; s < n; s++) {
    if (b.bindingHartree[s] > 0) {
      stateClass[s] = 1 + (s % 3);
      widthHartree[s] = 1e-12 * (s + 1);
      if (fractions) fractions.set([0.5, 0.25, 0.25], 3 * s);
    }
  }
  return { engineVersion: ENGINE_VERSION, stateClass, widthHartree, widthFlags: stateClass.map((c) => (c === 3 ? 8 : 0)), survivors: new Uint16Array(b.cellCount).fill(1), fractions, elapsedMs: 3 };
}

function sameBits(a: ArrayLike<number>, b: ArrayLike<number>): boolean {
  if (a.length !== b.length) return false;
  for (let k = 0; k < a.length; k++) if (!Object.is(a[k], b[k])) return false;
  return true;
}

describe('base64 and UTF-8 codecs', () => {
  it('base64 matches the RFC 4648 §10 test vectors and round-trips random bytes', () => {
    const vectors: [string, string][] = [['', ''], ['f', 'Zg=='], ['fo', 'Zm8='], ['foo', 'Zm9v'], ['foob', 'Zm9vYg=='], ['fooba', 'Zm9vYmE='], ['foobar', 'Zm9vYmFy']];
    for (const [plain, coded] of vectors) {
      expect(bytesToBase64(utf8Encode(plain))).toBe(coded);
      expect(utf8Decode(base64ToBytes(coded))).toBe(plain);
    }
    const bytes = new Uint8Array(100_003);
    let x = 12345;
    for (let i = 0; i < bytes.length; i++) bytes[i] = (x = (x * 1103515245 + 12345) >>> 0) >>> 24;
    expect(base64ToBytes(bytesToBase64(bytes))).toEqual(bytes);
  });

  it('base64 decoding names the first bad character', () => {
    expect(() => base64ToBytes('Zm9v!A==')).toThrow(/unexpected character "!" at position 4/);
  });

  it('UTF-8 encodes µ, α, ⁻ and an astral character as the standard byte sequences and back', () => {
    expect([...utf8Encode('µ')]).toEqual([0xc2, 0xb5]);
    expect([...utf8Encode('α')]).toEqual([0xce, 0xb1]);
    expect([...utf8Encode('⁻')]).toEqual([0xe2, 0x81, 0xbb]);
    expect([...utf8Encode('𝛼')]).toEqual([0xf0, 0x9d, 0x9b, 0xbc]);
    expect(utf8Decode(utf8Encode('a₀³ × 10⁻⁹ µeV 𝛼'))).toBe('a₀³ × 10⁻⁹ µeV 𝛼');
    expect(utf8Decode(new Uint8Array([0x61, 0xff, 0x62]))).toBe('a\ufffdb');
  });
});

describe('CSV export of a map', () => {
  const text = [...mapCsvChunks({ setup, binding, date: DATE })].join('');
  const table = readMapCsv(text);

  it('has a header block with the engine version, the fingerprint, the caller\'s date, the units and the model caveat', () => {
    const header = table.comments.join('\n');
    expect(header).toContain(`engine version: ${ENGINE_VERSION}`);
    expect(header).toContain(`setup fingerprint: ${setupFingerprint(setup)}`);
    expect(header).toContain(`date: ${DATE}`);
    expect(header).toContain('caveat: model estimates; adiabatic single-orbital approximation; see methods note');
    expect(header).toContain('binding_hartree binding energy in hartree');
    expect(header).toContain('CODATA 2018');
    expect(table.columns).toEqual(['alpha_a0^3', 'field_T', 'field_au', 'm', 'nu', 'binding_hartree', 'binding_K', 'binding_ueV', 'width_hartree', 'class', 'flags']);
  });

  it('has one row per cell, orbital and bound level, and binding_hartree reads back bit for bit', () => {
    expect(table.rows.length).toBe(mapCsvRowCount(binding));
    expect(table.rows.length).toBeGreaterThan(binding.cellCount); // every cell has at least the m = 0…2 ground states
    const col = (name: string) => table.columns.indexOf(name);
    let checked = 0;
    for (const row of table.rows) {
      const alpha = Number(row[col('alpha_a0^3')]);
      const fieldAu = Number(row[col('field_au')]);
      const i = binding.alphas.indexOf(alpha);
      const j = binding.fieldsAu.indexOf(fieldAu);
      expect(i).toBeGreaterThanOrEqual(0);
      expect(j).toBeGreaterThanOrEqual(0);
      const m = Number(row[col('m')]);
      const nu = Number(row[col('nu')]);
      const s = (m * binding.levelsPerOrbital + nu) * binding.cellCount + j * binding.nAlpha + i;
      expect(Object.is(Number(row[col('binding_hartree')]), binding.bindingHartree[s])).toBe(true);
      expect(Number(row[col('binding_K')])).toBeCloseTo(binding.bindingHartree[s] * CODATA2018.hartreeInKelvin, 12);
      expect(Number(row[col('binding_ueV')]) / (binding.bindingHartree[s] * CODATA2018.hartreeInEV * 1e6)).toBeCloseTo(1, 14);
      expect(Number(row[col('field_T')]) / (fieldAu * CODATA2018.atomicFieldInTesla)).toBeCloseTo(1, 14);
      expect(row[col('class')]).toBe('bound');
      expect(row[col('width_hartree')]).toBe('');
      checked++;
    }
    expect(checked).toBe(table.rows.length);
    // field_T is the setup's own axis: exactly 1 T and 45 T at the ends.
    expect(table.rows[0][col('field_T')]).toBe('1');
    expect(table.rows.at(-1)![col('field_T')]).toBe('45');
  });

  it('writes widths, classes and thermal fractions from a phase map', () => {
    const phase = fakePhase(binding, true);
    const t = readMapCsv([...mapCsvChunks({ setup, binding, phase, date: DATE }, { energyUnits: ['GHz'] })].join(''));
    expect(t.columns).toEqual(['alpha_a0^3', 'field_T', 'field_au', 'm', 'nu', 'binding_hartree', 'binding_GHz', 'width_hartree', 'class', 'flags', 'fraction_bound', 'fraction_resonance', 'fraction_unbound']);
    const classes = new Set(t.rows.map((r) => r[8]));
    expect([...classes].sort()).toEqual(['bound', 'resonance', 'unbound']);
    const first = t.rows[0];
    const s = Number(first[3]) * binding.levelsPerOrbital * binding.cellCount; // m = 0, ν = 0, cell 0 → s = 0 when m = 0
    expect(Number(first[7])).toBe(phase.widthHartree[s]);
    expect(first.slice(10)).toEqual(['0.5', '0.25', '0.25']);
  });

  it('names the cutoff-dominated flag on m = 0 rows where α/r_c² ≥ 1', () => {
    const rows = table.rows.filter((r) => r[3] === '0' && Number(r[0]) / 4 >= 1);
    expect(rows.length).toBeGreaterThan(0);
    for (const r of rows) expect(r[10].split('|')).toContain('cutoff-dominated');
    expect(flagNames(0)).toBe('');
    expect(flagNames(1 | 8)).toBe('cutoff-dominated|direct-solve');
  });

  it('streams in chunks of about the requested size, which join to the same text', () => {
    const chunks = [...mapCsvChunks({ setup, binding, date: DATE }, { chunkChars: 512 })];
    expect(chunks.length).toBeGreaterThan(3);
    expect(chunks.join('')).toBe(text);
    expect(chunks[0].startsWith('# Fieldbound map export')).toBe(true);
    expect(chunks[0].endsWith('class,flags\n')).toBe(true);
    for (const c of chunks.slice(1, -1)) expect(c.length).toBeLessThan(512 + 1000);
  });

  it('refuses an unknown energy unit and results of another setup before writing anything', () => {
    expect(() => mapCsvChunks({ setup, binding, date: DATE }, { energyUnits: ['erg' as 'K'] }).next()).toThrow(/unknown energy unit 'erg'/);
    const other = { ...setup, grid: { nAlpha: 5, nField: 3 } };
    expect(() => mapCsvChunks({ setup: other, binding, date: DATE }).next()).toThrow(/does not belong to this setup/);
    expect(() => mapCsvColumns(false, false, ['K', 'K'])).toThrow(/listed twice/);
  });

  it('estimates the size within 10 % of the real file and refuses a grid above the limit with a clear message', () => {
    const est = estimateMapCsv({ setup, binding, date: DATE });
    expect(est.ok).toBe(true);
    expect(est.rows).toBe(table.rows.length);
    expect(Math.abs(est.bytes - utf8Encode(text).length) / utf8Encode(text).length).toBeLessThan(0.1);
    const refused = estimateMapCsv({ setup, binding, date: DATE }, { maxBytes: 1000 });
    expect(refused.ok).toBe(false);
    if (!refused.ok) expect(refused.message).toMatch(/^The CSV export of this map would be about [\d.]+ kB, above the limit of 1\.0 kB\./);
    const big = checkExportSize('csv', EXPORT_LIMITS.csvMaxBytes * 1.5, 'a 1024 × 1024 map with 65 orbitals');
    expect(big.ok).toBe(false);
    if (!big.ok) expect(big.message).toMatch(/^The CSV export of a 1024 × 1024 map with 65 orbitals would be about 1\.6 GB, above the limit of 1\.1 GB\. Use a coarser grid/);
  });
});

describe('JSON export and import of a map', () => {
  it('round-trips setup and results bit for bit (binding and phase with fractions)', () => {
    const phase = fakePhase(binding, true);
    const text = mapJsonText({ setup, binding, phase, engineVersion: ENGINE_VERSION, date: DATE });
    const head = JSON.parse(text);
    expect(head.format).toBe('fieldbound-map');
    expect(head.formatVersion).toBe(1);
    expect(head.engineVersion).toBe(ENGINE_VERSION);
    expect(head.setupFingerprint).toBe(setupFingerprint(setup));
    expect(head.date).toBe(DATE);
    const r = importMapJson(text, { currentEngineVersion: ENGINE_VERSION });
    if (!r.ok) throw new Error(JSON.stringify(r.problems));
    expect(r.value.kind).toBe('map-file');
    expect(r.value.setup).toEqual(setup);
    expect(r.value.warnings).toEqual([]);
    const b = r.value.binding!;
    for (const k of ['alphas', 'fieldsAu', 'bindingHartree', 'counts', 'flags'] as const) expect(sameBits(b[k], binding[k])).toBe(true);
    expect(b.levelsPerOrbital).toBe(binding.levelsPerOrbital);
    expect(b.maxRelError).toBe(binding.maxRelError);
    const p = r.value.phase!;
    expect(sameBits(p.widthHartree, phase.widthHartree)).toBe(true);
    expect(sameBits(p.widthFlags, phase.widthFlags)).toBe(true);
    expect(sameBits(p.stateClass, phase.stateClass)).toBe(true);
    expect(sameBits(p.fractions!, phase.fractions!)).toBe(true);
    expect(sameBits(p.survivors, phase.survivors)).toBe(true);
  });

  it('reproducibility: recomputing the map from the imported setup with this engine gives identical numbers', () => {
    const r = importMapJson(mapJsonText({ setup, binding, engineVersion: ENGINE_VERSION }));
    if (!r.ok) throw new Error(JSON.stringify(r.problems));
    const again = bindingMap(r.value.setup);
    expect(again.engineVersion).toBe(r.value.engineVersion);
    expect(sameBits(again.bindingHartree, r.value.binding!.bindingHartree)).toBe(true);
    expect(sameBits(again.counts, r.value.binding!.counts)).toBe(true);
    expect(sameBits(again.flags, r.value.binding!.flags)).toBe(true);
  });

  it('a setup-only file (results null) and a bare setup object both import', () => {
    const only = importMapJson(mapJsonText({ setup, engineVersion: ENGINE_VERSION }));
    expect(only.ok && only.value.binding === null && only.value.setup.grid.nAlpha === 4).toBe(true);
    const bare = importMapJson(JSON.stringify(defaultSetup()));
    expect(bare.ok && bare.value.kind === 'setup').toBe(true);
  });

  it('the chunks join to the same text as mapJsonText and the size estimate is within 1 %', () => {
    const input = { setup, binding, phase: fakePhase(binding, false), engineVersion: ENGINE_VERSION };
    const text = mapJsonText(input);
    expect([...mapJsonChunks(input)].join('')).toBe(text);
    const est = estimateMapJson(input);
    expect(est.ok).toBe(true);
    expect(est.bytes).toBeGreaterThanOrEqual(text.length);
    expect(est.bytes).toBeLessThan(text.length + 20_000);
  });
});

describe('JSON import: bad input gets a clear message and nothing else', () => {
  const valid = () => JSON.parse(mapJsonText({ setup, binding, engineVersion: ENGINE_VERSION }));
  const problems = (text: string) => {
    const r = importMapJson(text);
    expect(r.ok).toBe(false);
    return r.ok ? [] : r.problems;
  };

  it('unreadable JSON names the line and column', () => {
    expect(problems('{\n  "format": "fieldbound-map",\n  "formatVersion": 1,\n}')).toEqual([
      { path: '(file)', message: 'not readable JSON at line 4 column 1: expected a property name in double quotes, found "}"' },
    ]);
    expect(problems('{"a": tru}')[0].message).toBe('not readable JSON at line 1 column 7: expected a value (object, array, string, number, true, false or null), found "t"');
    expect(problems('{"a": "x')[0].message).toMatch(/^not readable JSON at line 1 column 9: unterminated string/);
    expect(problems('')[0].message).toMatch(/empty/);
    expect(problems('[1, 2]')[0].message).toBe('expected a JSON object (a Fieldbound map file or a setup), found a list');
  });

  it('the syntax locator agrees with JSON.parse on which texts are valid', () => {
    const texts = ['{}', '[]', '0', '-0.5e-3', '"\\u00b5"', '{"a":[1,{"b":null}]}', ' true ', '01', '1.', '.5', '{"a":1,}', '[1,]', '"\\x"', '"a\nb"', 'nul', '{"a" 1}', '1 2', '\ufeff{}'];
    for (const t of texts) {
      let parses = true;
      try {
        JSON.parse(t.replace(/^\ufeff/, ''));
      } catch {
        parses = false;
      }
      expect({ t, valid: jsonSyntaxError(t) === null }).toEqual({ t, valid: parses });
    }
  });

  it('an unknown format or a newer format version is refused with a message saying so', () => {
    expect(problems(JSON.stringify({ ...valid(), format: 'other-map' }))).toEqual([{ path: 'format', message: 'unknown format "other-map": expected "fieldbound-map"' }]);
    expect(problems(JSON.stringify({ ...valid(), formatVersion: 2 }))[0].message).toMatch(/^format version 2 is newer than this Fieldbound reads \(version 1\)/);
    expect(problems(JSON.stringify({ ...valid(), formatVersion: 0 }))[0].message).toBe('unknown format version 0 (this Fieldbound reads version 1)');
    expect(problems(JSON.stringify({ ...valid(), formatVersion: '1' }))[0].message).toBe('formatVersion must be a whole number, found string "1"');
    expect(problems('{"hello": 1}')[0].message).toMatch(/neither "format" nor "schemaVersion"/);
  });

  it('a wrong setup lists every issue with its path', () => {
    const f = valid();
    f.setup.alphaAxis.min = -1;
    f.setup.grid.nAlpha = 5000;
    f.setup.display.energyUnit = 'erg';
    f.setup.colour = 'red';
    const p = problems(JSON.stringify(f));
    const paths = p.map((x) => x.path);
    expect(paths).toContain('setup.alphaAxis.min');
    expect(paths).toContain('setup.grid.nAlpha');
    expect(paths).toContain('setup.display.energyUnit');
    expect(paths).toContain('setup.colour');
    expect(p.find((x) => x.path === 'setup.display.energyUnit')!.message).toBe('energy unit must be "ueV", "meV", "K" or "GHz"');
    expect(p.find((x) => x.path === 'setup.colour')!.message).toBe('unknown field "colour"');
  });

  it('results that do not fit the setup are refused: array lengths, types, fingerprint', () => {
    const f = valid();
    f.results.binding.counts.length = 7;
    expect(problems(JSON.stringify(f))).toEqual([{ path: 'results.binding.counts', message: `has 7 elements, expected ${(setup.orbitals.mMax + 1) * 12}` }]);
    const g = valid();
    g.results.binding.bindingHartree.dtype = 'float32';
    expect(problems(JSON.stringify(g))[0]).toEqual({ path: 'results.binding.bindingHartree', message: 'dtype must be "float64", got "float32"' });
    const h = valid();
    h.setup.shortRange.cutoffBohr = 3;
    expect(problems(JSON.stringify(h))[0].message).toMatch(/^the setup was changed after export/);
    h.results = null;
    const ok = importMapJson(JSON.stringify(h));
    expect(ok.ok && ok.value.warnings[0]).toMatch(/changed after export/);
    const k = valid();
    k.results.binding.alphas.base64 = '!!!!';
    expect(problems(JSON.stringify(k))[0].path).toBe('results.binding.alphas');
  });

  it('warns when the results come from another engine version', () => {
    const f = valid();
    f.results.binding.engineVersion = '0.0.9';
    const r = importMapJson(JSON.stringify(f), { currentEngineVersion: ENGINE_VERSION });
    expect(r.ok && r.value.warnings).toEqual([`the results were computed by engine 0.0.9; this is engine ${ENGINE_VERSION}, so recomputing may give different numbers`]);
  });

  it('a phase map with an impossible class is refused', () => {
    const phase = fakePhase(binding, false);
    phase.stateClass[0] = 9;
    expect(STATE_CLASS.UNBOUND).toBe(3);
    const p = problems(mapJsonText({ setup, binding, phase, engineVersion: ENGINE_VERSION }));
    expect(p[0]).toEqual({ path: 'results.phase.stateClass', message: 'value 0 is 9; classes are 0 to 3' });
  });
});

describe('result fingerprint', () => {
  it('changes with the setup or the engine version and not with display choices', async () => {
    const { resultFingerprint } = await import('./resultFingerprint.js');
    const a = resultFingerprint(setup, '0.1.0');
    expect(a.short).toMatch(/^[0-9a-f]{8}$/);
    expect(a.full.startsWith(a.short)).toBe(true);
    expect(resultFingerprint(setup, '0.1.1').full).not.toBe(a.full);
    expect(resultFingerprint({ ...setup, shortRange: { model: 'regularized-polarization', cutoffBohr: 2.5 } }, '0.1.0').full).not.toBe(a.full);
    expect(resultFingerprint({ ...setup, display: { ...setup.display, energyUnit: 'GHz' } }, '0.1.0').full).toBe(a.full);
  });
});
