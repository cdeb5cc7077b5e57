/**
 * `fieldbound map` run as a separate process on small setups, compared with the engine and the export
 * module called in this process (bindingMap → phaseMap → mapCsvChunks / mapJsonText), and its input
 * errors; the row-block stitching on its own.
 */
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { mapCsvChunks } from '../export/mapCsv.js';
import { mapJsonText } from '../export/mapJson.js';
import { bindingMap } from '../map/bindingMap.js';
import { evaluateBindingMapRows } from '../map/evaluateBindingMapRows.js';
import { prepareBindingMap } from '../map/prepareBindingMap.js';
import { phaseMap } from '../motion/phaseMap.js';
import { defaultSetup } from '../setup/presets.js';
import type { MapSetup } from '../setup/mapSetup.js';
import { ENGINE_VERSION } from '../version.js';
import { assembleBlocks, rowBlocks, shapeOfModel } from './assembleBlocks.js';
import { captureCli, runCli, spawnCli } from '../../test/cliRunner.js';
import { checkOutputSize, parseMapArgs, writeExport } from './mapCommand.js';

const dir = mkdtempSync(join(tmpdir(), 'fieldbound-map-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const run = runCli;
const capture = captureCli;

function smallSetup(motion: MapSetup['motion']): MapSetup {
  return { ...defaultSetup(), grid: { nAlpha: 14, nField: 11 }, orbitals: { mMax: 3 }, motion, ion: { massNumber: 133 } };
}

function writeSetup(name: string, value: unknown): string {
  const p = join(dir, name);
  writeFileSync(p, typeof value === 'string' ? value : JSON.stringify(value));
  return p;
}

describe('fieldbound map (spawned process, worker threads)', () => {
  it('CSV: the file equals the in-process export of bindingMap + phaseMap of the same setup, byte for byte (temperature, fractions)', () => {
    const setup = smallSetup({ kind: 'temperature', kelvin: 0.5 });
    const out = join(dir, 'thermal.csv');
    const r = run(['map', writeSetup('thermal.json', setup), '--out', out, '--threads', '3', '--date', '2026-12-02T00:00:00Z']);
    expect(r.stderr).toContain('cells');
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toContain(`wrote ${out}`);
    // not a TTY here: progress comes as plain lines, the last one at 100 %
    expect(r.stderr.trim().split('\n').at(-1)).toMatch(/100%\s+154\/154 cells/);
    const binding = bindingMap(setup);
    const phase = phaseMap(setup, binding);
    const expected = [...mapCsvChunks({ setup, binding, phase, date: '2026-12-02T00:00:00Z' })].join('');
    expect(readFileSync(out, 'utf8')).toBe(expected);
    expect(expected).toContain('fraction_bound');
    expect(expected).toMatch(/,resonance,/);
    expect(readdirSync(dir).filter((f) => f.includes('.partial-'))).toEqual([]);
  }, 180_000);

  it('JSON: the file equals the in-process JSON export (elapsed times taken from the file), and a map file is accepted as the setup', () => {
    const setup = smallSetup({ kind: 'kinetic-energy', energyKelvin: 0.2 });
    const binding = bindingMap(setup);
    const phase = phaseMap(setup, binding);
    // the input is itself a map file (the app's JSON export without results): its setup is used
    const input = writeSetup('energy.json', mapJsonText({ setup, engineVersion: ENGINE_VERSION }));
    const out = join(dir, 'energy.json.out.json');
    const r = run(['map', input, '--out', out, '--threads', '2', '--date', '2026-12-02', '--quiet']);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toBe('');
    const text = readFileSync(out, 'utf8');
    const doc = JSON.parse(text) as { results: { binding: { elapsedMs: number }; phase: { elapsedMs: number } } };
    binding.elapsedMs = doc.results.binding.elapsedMs;
    phase.elapsedMs = doc.results.phase.elapsedMs;
    expect(text).toBe(mapJsonText({ setup, engineVersion: ENGINE_VERSION, binding, phase, date: '2026-12-02' }));
  }, 180_000);
});

describe('fieldbound map: Ctrl-C', () => {
  it('SIGINT while the workers run: they are stopped, nothing is written, exit code 130', async () => {
    const setup = { ...smallSetup({ kind: 'temperature', kelvin: 1 }), grid: { nAlpha: 400, nField: 400 }, orbitals: { mMax: 12 } };
    const out = join(dir, 'cancelled.csv');
    const child = spawnCli(['map', writeSetup('big.json', setup), '--out', out, '--threads', '2']);
    let stderr = '';
    const done = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) => child.on('exit', (code, signal) => resolve({ code, signal })));
    await new Promise<void>((resolve) => {
      child.stderr.on('data', (b: Buffer) => {
        stderr += b.toString();
        // the first progress line: the SIGINT handler is installed and the workers are busy
        if (/models \[/.test(stderr)) resolve();
      });
    });
    child.kill('SIGINT');
    const { code, signal } = await done;
    expect(signal).toBeNull();
    expect(code).toBe(130);
    expect(stderr).toContain('fieldbound map: cancelled; the workers are stopped and nothing was written');
    expect(existsSync(out)).toBe(false);
    expect(readdirSync(dir).filter((f) => f.startsWith('cancelled'))).toEqual([]);
  }, 180_000);
});

describe('fieldbound map: bad arguments and input (exit code 2, nothing written)', () => {
  it('names the argument: missing setup, missing or wrong --out, bad --threads, unknown option', async () => {
    const good = writeSetup('good.json', smallSetup({ kind: 'none' }));
    const cases: [string[], string][] = [
      [['map', '--out', 'x.csv'], 'SETUP.json'],
      [['map', good], '--out'],
      [['map', good, '--out', join(dir, 'x.txt')], '--out'],
      [['map', good, '--out', join(dir, 'x.csv'), '--threads', '0'], '--threads'],
      [['map', good, '--out', join(dir, 'x.csv'), '--threads', 'many'], '--threads'],
      [['map', good, '--out', join(dir, 'x.csv'), '--colour'], '--colour'],
      [['map', good, good, '--out', join(dir, 'x.csv')], good],
    ];
    for (const [args, name] of cases) {
      const c = await capture(args);
      expect(c.code, args.join(' ')).toBe(2);
      expect(c.err.trimEnd().split('\n').length, c.err).toBe(1);
      expect(c.err, args.join(' ')).toContain(`fieldbound: ${name}`);
    }
    expect(existsSync(join(dir, 'x.csv'))).toBe(false);
  });

  it('an unreadable file, broken JSON (line and column) and a setup the server would refuse (every field path listed)', async () => {
    const missing = await capture(['map', join(dir, 'nope.json'), '--out', join(dir, 'y.csv')]);
    expect(missing.code).toBe(2);
    expect(missing.err).toContain('nope.json: cannot read the setup file: no such file');

    const broken = await capture(['map', writeSetup('broken.json', '{\n  "schemaVersion": 1,\n}'), '--out', join(dir, 'y.csv')]);
    expect(broken.code).toBe(2);
    expect(broken.err).toMatch(/broken\.json: not valid JSON at line 3, column 1/);

    const bad = { ...smallSetup({ kind: 'temperature', kelvin: -1 }), grid: { nAlpha: 2000, nField: 11 }, ion: { massNumber: 400 }, colour: 'red' };
    const schema = await capture(['map', writeSetup('bad.json', bad), '--out', join(dir, 'y.csv')]);
    expect(schema.code).toBe(2);
    const lines = schema.err.trimEnd().split('\n');
    expect(lines[0]).toMatch(/bad\.json: the setup is not valid \(4 problems\):/);
    for (const path of ['grid.nAlpha', 'motion.kelvin', 'ion.massNumber', 'colour']) expect(schema.err).toContain(`  ${path}: `);
    expect(existsSync(join(dir, 'y.csv'))).toBe(false);
  });

  it('an export too large for the limit is refused with a message naming the size, the limit and the way out', () => {
    const setup = smallSetup({ kind: 'ion-level', level: 0 });
    const binding = bindingMap(setup);
    const phase = phaseMap(setup, binding);
    const csv = checkOutputSize('csv', { setup, binding, phase, date: 'd' }, 1000);
    expect(csv.ok).toBe(false);
    if (!csv.ok) expect(csv.message).toMatch(/CSV export of this map would be about .* above the limit of 1\.0 kB\. Use a coarser grid/);
    expect(checkOutputSize('json', { setup, binding, phase, date: 'd' }).ok).toBe(true);
  });

  it('writing: the file appears only when complete; an abort while writing (Ctrl-C) leaves neither the file nor its temporary', async () => {
    const out = join(dir, 'w.csv');
    const many = function* (): Generator<string> {
      for (let k = 0; k < 200; k++) yield `line ${k}\n`;
    };
    expect(await writeExport(out, many())).toBe([...many()].join('').length);
    expect(readFileSync(out, 'utf8')).toBe([...many()].join(''));
    const stopped = join(dir, 'stopped.csv');
    const controller = new AbortController();
    let n = 0;
    const aborting = function* (): Generator<string> {
      for (let k = 0; k < 200; k++) {
        if (++n === 50) controller.abort();
        yield `line ${k}\n`;
      }
    };
    expect(await writeExport(stopped, aborting(), controller.signal)).toBeNull();
    expect(readdirSync(dir).filter((f) => f.startsWith('stopped'))).toEqual([]);
  });

  it('--threads defaults to the cores given and --date is optional', () => {
    expect(parseMapArgs(['s.json', '--out', 'm.CSV'], 6)).toEqual({ setupPath: 's.json', out: 'm.CSV', format: 'csv', threads: 6, date: null, quiet: false });
  });
});

describe('row blocks stitched into the whole map (assembleBlocks)', () => {
  it('any split of the rows gives exactly the arrays of bindingMap + phaseMap (temperature: fractions too)', () => {
    const setup = { ...smallSetup({ kind: 'temperature', kelvin: 2 }), grid: { nAlpha: 9, nField: 7 } };
    const whole = bindingMap(setup);
    const wholePhase = phaseMap(setup, whole);
    const model = prepareBindingMap(setup);
    for (const threads of [1, 2, 7]) {
      const blocks = rowBlocks(7, threads).map(([a, b]) => {
        const binding = evaluateBindingMapRows(model, a, b);
        return { binding, phase: phaseMap(setup, binding) };
      });
      const { binding, phase } = assembleBlocks(shapeOfModel(model), blocks.reverse(), 0);
      for (const k of ['bindingHartree', 'counts', 'flags', 'alphas', 'fieldsAu'] as const) expect(binding[k], k).toEqual(whole[k]);
      expect(binding.maxRelError).toBe(whole.maxRelError);
      for (const k of ['stateClass', 'widthHartree', 'widthFlags', 'survivors', 'fractions'] as const) expect(phase[k], k).toEqual(wholePhase[k]);
    }
    expect(() => assembleBlocks(shapeOfModel(model), [], 0)).toThrow(/row blocks end at row 0/);
  });
});
