import { parse } from 'csv-parse/sync';
import { type AlphaUnit, type CsvIssue, SETUP_LIMITS, SPECIES_CSV_COLUMNS, SPECIES_UPLOAD_LIMITS, type SpeciesCsvColumn, toAtomicPolarizability } from '@fieldbound/shared';
import type { TeamSpeciesInit } from './team-species.entity';

export type SpeciesCsvResult = { ok: true; rows: TeamSpeciesInit[] } | { ok: false; issues: CsvIssue[] };

/** Header spellings we accept, after lower-casing and dropping spaces, `_`, `-`, `.` and a unit in parentheses. */
const HEADER_ALIASES: Record<string, SpeciesCsvColumn> = {
  name: 'name',
  species: 'name',
  polarizability: 'polarizability',
  alpha: 'polarizability',
  uncertainty: 'uncertainty',
  polarizabilityuncertainty: 'uncertainty',
  unit: 'unit',
  polarizabilityunit: 'unit',
  massnumber: 'mass_number',
  mass: 'mass_number',
  electronaffinityev: 'electron_affinity_ev',
  electronaffinity: 'electron_affinity_ev',
  ea: 'electron_affinity_ev',
  eaev: 'electron_affinity_ev',
  source: 'source',
  reference: 'source',
};

/** Unit spellings we accept for each polarizability unit. */
const UNIT_ALIASES: Record<string, AlphaUnit> = {
  'a0^3': 'a0^3',
  'a0³': 'a0^3',
  au: 'a0^3',
  'a.u.': 'a0^3',
  'bohr^3': 'a0^3',
  'A^3': 'A^3',
  'Å^3': 'A^3',
  'Å³': 'A^3',
  'angstrom^3': 'A^3',
  '1e-24cm^3': '1e-24cm^3',
  '1e-24 cm^3': '1e-24cm^3',
  '10^-24cm^3': '1e-24cm^3',
  '10^-24 cm^3': '1e-24cm^3',
  '1e-24cm³': '1e-24cm^3',
};

const DECIMAL = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

function normaliseHeader(cell: string): string {
  return cell
    .toLowerCase()
    .replace(/\(([^)]*)\)/g, '$1')
    .replace(/[\s_\-.]/g, '');
}

/**
 * Finds why bytes are not UTF-8 text, or returns null. Reports binary files (NUL bytes), UTF-16 and
 * the first line holding an invalid UTF-8 sequence.
 */
export function encodingProblem(bytes: Buffer): { line: number | null; message: string } | null {
  if (bytes.length >= 2 && ((bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff))) {
    return { line: null, message: 'The file is saved as UTF-16. Save it as UTF-8 (in a spreadsheet: "CSV UTF-8") and upload it again.' };
  }
  if (bytes.includes(0)) {
    return { line: null, message: 'The file contains binary data (NUL bytes); upload a CSV text file saved as UTF-8.' };
  }
  const decoder = new TextDecoder('utf-8', { fatal: true });
  let start = 0;
  let line = 1;
  while (start <= bytes.length) {
    let end = bytes.indexOf(0x0a, start);
    if (end < 0) end = bytes.length;
    try {
      decoder.decode(bytes.subarray(start, end));
    } catch {
      return { line, message: `Line ${line} is not valid UTF-8 text (the file may be in Latin-1 or Windows-1252). Save it as UTF-8 and upload it again.` };
    }
    start = end + 1;
    line += 1;
  }
  return null;
}

function parseNumber(raw: string): number | null {
  if (!DECIMAL.test(raw)) return null;
  const value = Number(raw);
  return Number.isFinite(value) ? value : null;
}

/**
 * Reads a team species list from CSV bytes: UTF-8, a header row naming the seven columns
 * (name, polarizability, uncertainty, unit, mass_number, electron_affinity_ev, source; any order),
 * then one species per line. Every problem is collected (line, column, message); the rows are
 * returned only when there is none, so the caller imports all or nothing.
 */
export function parseSpeciesCsv(bytes: Buffer): SpeciesCsvResult {
  if (bytes.length === 0) return { ok: false, issues: [{ line: null, column: null, message: 'The file is empty.' }] };
  if (bytes.length > SPECIES_UPLOAD_LIMITS.maxBytes) {
    return { ok: false, issues: [{ line: null, column: null, message: `The file is larger than ${SPECIES_UPLOAD_LIMITS.maxBytes / 1024} KB.` }] };
  }
  const encoding = encodingProblem(bytes);
  if (encoding) return { ok: false, issues: [{ line: encoding.line, column: null, message: encoding.message }] };

  // One line ending everywhere, so csv-parse's line numbers match what an editor shows.
  const text = bytes.toString('utf8').replace(/^\uFEFF/, '').replace(/\r\n?/g, '\n');
  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = parse(text, { relax_column_count: true, skip_empty_lines: true, trim: true, info: true }) as unknown as typeof records;
  } catch (error) {
    const e = error as Error & { lines?: number };
    return { ok: false, issues: [{ line: e.lines ?? null, column: null, message: `The file is not valid CSV: ${e.message.replace(/^[^:]*: /, '')}` }] };
  }
  const withLines = records
    .map(({ record, info }) => ({ cells: record, line: info.lines - record.reduce((n, cell) => n + (cell.match(/\n/g)?.length ?? 0), 0) }))
    .filter((r) => r.cells.some((cell) => cell !== ''));
  if (withLines.length === 0) return { ok: false, issues: [{ line: null, column: null, message: 'The file is empty.' }] };

  const issues: CsvIssue[] = [];
  const [header, ...body] = withLines;

  // Header: every column once, nothing unknown.
  const positions = new Map<SpeciesCsvColumn, number>();
  header.cells.forEach((cell, index) => {
    const column = HEADER_ALIASES[normaliseHeader(cell)];
    if (!column) {
      issues.push({ line: header.line, column: null, message: `Unknown column "${cell}" in the header; expected ${SPECIES_CSV_COLUMNS.join(', ')}.` });
    } else if (positions.has(column)) {
      issues.push({ line: header.line, column, message: `Column "${column}" appears twice in the header.` });
    } else {
      positions.set(column, index);
    }
  });
  for (const column of SPECIES_CSV_COLUMNS) {
    if (!positions.has(column)) issues.push({ line: header.line, column, message: `The header has no "${column}" column.` });
  }
  if (issues.length > 0) return { ok: false, issues };

  if (body.length === 0) return { ok: false, issues: [{ line: null, column: null, message: 'The file has a header but no species.' }] };
  if (body.length > SPECIES_UPLOAD_LIMITS.maxRows) {
    return { ok: false, issues: [{ line: null, column: null, message: `The file has ${body.length} species; at most ${SPECIES_UPLOAD_LIMITS.maxRows} per list.` }] };
  }

  const rows: TeamSpeciesInit[] = [];
  const firstLineOfName = new Map<string, number>();
  for (const { cells, line } of body) {
    const at = (column: SpeciesCsvColumn) => (cells[positions.get(column)!] ?? '').trim();
    const problem = (column: SpeciesCsvColumn | null, message: string) => issues.push({ line, column, message });
    const before = issues.length;

    if (cells.length !== header.cells.length) {
      problem(null, `This line has ${cells.length} fields; the header has ${header.cells.length}.`);
      continue;
    }

    const name = at('name');
    if (name === '') problem('name', 'The name is empty.');
    else if (name.length > SPECIES_UPLOAD_LIMITS.maxNameLength) problem('name', `The name has more than ${SPECIES_UPLOAD_LIMITS.maxNameLength} characters.`);
    else {
      const key = name.toLowerCase();
      const first = firstLineOfName.get(key);
      if (first !== undefined) problem('name', `"${name}" is listed twice (first on line ${first}).`);
      else firstLineOfName.set(key, line);
    }

    const unitRaw = at('unit');
    const unit = UNIT_ALIASES[unitRaw] ?? UNIT_ALIASES[unitRaw.toLowerCase()];
    if (!unit) problem('unit', unitRaw === '' ? 'The unit is empty; use a0^3, A^3 or 1e-24cm^3.' : `Unknown unit "${unitRaw}"; use a0^3, A^3 or 1e-24cm^3.`);

    const valueRaw = at('polarizability');
    const value = parseNumber(valueRaw);
    let valueA0: number | null = null;
    if (valueRaw === '') problem('polarizability', 'The polarizability is empty.');
    else if (value === null) problem('polarizability', `"${valueRaw}" is not a number (use a point as the decimal separator, e.g. 401.0 or 4.01e2).`);
    else if (value <= 0) problem('polarizability', 'The polarizability must be greater than zero.');
    else if (unit) {
      valueA0 = toAtomicPolarizability(unit, value);
      const { min, max } = SETUP_LIMITS.alpha;
      if (valueA0 < min || valueA0 > max) problem('polarizability', `The polarizability is ${valueA0.toPrecision(4)} a0^3; it must lie between ${min} and ${max} a0^3.`);
    }

    const uncertaintyRaw = at('uncertainty');
    let uncertainty: number | null = null;
    if (uncertaintyRaw !== '') {
      uncertainty = parseNumber(uncertaintyRaw);
      if (uncertainty === null) problem('uncertainty', `"${uncertaintyRaw}" is not a number; leave the field empty when there is no uncertainty.`);
      else if (uncertainty < 0) problem('uncertainty', 'The uncertainty must not be negative.');
    }

    const massRaw = at('mass_number');
    const mass = parseNumber(massRaw);
    const massLimits = SETUP_LIMITS.massNumber;
    if (massRaw === '') problem('mass_number', 'The mass number is empty.');
    else if (mass === null || !Number.isInteger(mass)) problem('mass_number', `"${massRaw}" is not a whole number.`);
    else if (mass < massLimits.min || mass > massLimits.max) problem('mass_number', `The mass number must be between ${massLimits.min} and ${massLimits.max}.`);

    const eaRaw = at('electron_affinity_ev');
    let ea: number | null = null;
    if (eaRaw !== '') {
      ea = parseNumber(eaRaw);
      if (ea === null) problem('electron_affinity_ev', `"${eaRaw}" is not a number; leave the field empty when there is no stable anion.`);
      else if (ea <= 0) problem('electron_affinity_ev', 'The electron affinity must be greater than zero; leave the field empty when there is no stable anion.');
      else if (ea > 10) problem('electron_affinity_ev', 'The electron affinity is over 10 eV; give it in eV.');
    }

    const source = at('source');
    if (source === '') problem('source', 'The source is empty; name the publication or data set the numbers come from.');
    else if (source.length > SPECIES_UPLOAD_LIMITS.maxSourceLength) problem('source', `The source has more than ${SPECIES_UPLOAD_LIMITS.maxSourceLength} characters.`);

    if (issues.length === before && unit && value !== null && valueA0 !== null && mass !== null) {
      rows.push({
        line,
        name,
        polarizabilityA0: valueA0,
        polarizabilityUncertaintyA0: uncertainty === null ? null : toAtomicPolarizability(unit, uncertainty),
        enteredValue: value,
        enteredUncertainty: uncertainty,
        enteredUnit: unit,
        massNumber: mass,
        electronAffinityEv: ea,
        source,
      });
    }
  }
  return issues.length > 0 ? { ok: false, issues } : { ok: true, rows };
}
