import { describe, expect, it } from 'vitest';
import { encodingProblem, parseSpeciesCsv } from './species-csv';

const HEADER = 'name,polarizability,uncertainty,unit,mass_number,electron_affinity_ev,source';
const csv = (...lines: string[]) => Buffer.from([HEADER, ...lines].join('\n'), 'utf8');

describe('parseSpeciesCsv', () => {
  it('reads rows in three units and converts polarizabilities to a0^3 with the shared CODATA factor', () => {
    const result = parseSpeciesCsv(
      csv('Cs (theory),400.9,0.7,a0^3,133,0.4715983,Schwerdtfeger 2019', 'K in A^3,43.4,,A^3,39,,CRC', '"Rb, cgs",47.39,0.05,1e-24cm^3,85,0.485916,"CRC, 95th ed."'),
    );
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.rows.map((r) => r.line)).toEqual([2, 3, 4]);
    expect(result.rows[0]).toMatchObject({ name: 'Cs (theory)', polarizabilityA0: 400.9, polarizabilityUncertaintyA0: 0.7, enteredUnit: 'a0^3', massNumber: 133, electronAffinityEv: 0.4715983 });
    // 1 a0^3 = 0.1481847113 Å^3 (CODATA 2018), so 43.4 Å^3 = 292.877… a0^3.
    expect(result.rows[1].polarizabilityA0).toBeCloseTo(43.4 / 0.14818471147216282, 9);
    expect(result.rows[1].polarizabilityUncertaintyA0).toBeNull();
    expect(result.rows[1].electronAffinityEv).toBeNull();
    expect(result.rows[2]).toMatchObject({ name: 'Rb, cgs', enteredValue: 47.39, enteredUnit: '1e-24cm^3', source: 'CRC, 95th ed.' });
  });

  it('accepts header spellings with spaces, capitals and a unit in parentheses, in any order', () => {
    const bytes = Buffer.from('Source,Name,Unit,Polarizability,Uncertainty,Mass number,Electron affinity (eV)\r\nmy fit,X,a0^3,12,,20,1.5\r\n');
    const result = parseSpeciesCsv(bytes);
    expect(result).toMatchObject({ ok: true, rows: [{ name: 'X', polarizabilityA0: 12, massNumber: 20, electronAffinityEv: 1.5, source: 'my fit', line: 2 }] });
  });

  it('lists every bad field of every bad line with its line and column, and returns no rows', () => {
    const result = parseSpeciesCsv(
      csv(
        'Good,10,1,a0^3,7,,ok',
        ',-3,x,furlong,7.5,-1,',
        'Good,10,,a0^3,400,,dup',
        'Short,1,2',
        'Comma,1\u002c5,,a0^3,7,,decimal comma',
      ),
    );
    expect(result.ok).toBe(false);
    if (result.ok) return;
    const at = result.issues.map((i) => `${i.line}:${i.column ?? '-'}`);
    expect(at).toEqual([
      '3:name', '3:unit', '3:polarizability', '3:uncertainty', '3:mass_number', '3:electron_affinity_ev', '3:source',
      '4:name', '4:mass_number',
      '5:-',
      '6:-',
    ]);
    expect(result.issues.find((i) => i.line === 4 && i.column === 'name')?.message).toBe('"Good" is listed twice (first on line 2).');
  });

  it('numbers lines as an editor does when a quoted field spans lines', () => {
    const result = parseSpeciesCsv(csv('"Two\nline name",10,,a0^3,7,,s', 'Bad,0,,a0^3,7,,s'));
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.issues).toEqual([{ line: 4, column: 'polarizability', message: 'The polarizability must be greater than zero.' }]);
  });

  it('rejects a header with a missing or unknown column', () => {
    const result = parseSpeciesCsv(Buffer.from('name,polarizability,unit,mass_number,colour,source\nX,1,a0^3,2,red,s\n'));
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.issues.map((i) => i.message)).toEqual([
      'Unknown column "colour" in the header; expected name, polarizability, uncertainty, unit, mass_number, electron_affinity_ev, source.',
      'The header has no "uncertainty" column.',
      'The header has no "electron_affinity_ev" column.',
    ]);
  });

  it('rejects an unclosed quote with the line where parsing stopped', () => {
    const result = parseSpeciesCsv(csv('"Open,1,,a0^3,7,,s'));
    expect(result).toMatchObject({ ok: false, issues: [{ line: 2, column: null }] });
  });

  it('rejects more than 2000 species in one file', () => {
    const rows = Array.from({ length: 2001 }, (_, i) => `S${i},10,,a0^3,7,,s`);
    expect(parseSpeciesCsv(csv(...rows))).toMatchObject({ ok: false, issues: [{ message: 'The file has 2001 species; at most 2000 per list.' }] });
  });
});

describe('encodingProblem', () => {
  it('accepts UTF-8 with a byte-order mark and non-ASCII letters', () => {
    expect(encodingProblem(Buffer.from('\uFEFFname\nÅngström,α\n', 'utf8'))).toBeNull();
  });

  it('names the first line that is not UTF-8 (Latin-1 bytes)', () => {
    expect(encodingProblem(Buffer.concat([Buffer.from('a\nb\n'), Buffer.from([0x41, 0xc5, 0x0a])]))).toEqual({ line: 3, message: expect.stringMatching(/^Line 3 is not valid UTF-8/) });
  });

  it('recognises UTF-16 and binary files', () => {
    expect(encodingProblem(Buffer.from([0xff, 0xfe, 0x6e, 0x00]))?.message).toMatch(/UTF-16/);
    expect(encodingProblem(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x00, 0x01]))?.message).toMatch(/binary/);
  });
});
