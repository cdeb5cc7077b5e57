import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, render, screen, waitFor } from '@testing-library/react';
import { bindingMap, checkBibtex, defaultSetup, ENGINE_VERSION, importMapJson, readMapCsv, setupFingerprint, type MapSetup } from '@fieldbound/shared';
import { ExportMenu } from './ExportMenu';
import { mapViewSvg } from './testFixtures';

const setup: MapSetup = {
  ...defaultSetup(),
  grid: { nAlpha: 3, nField: 2 },
  orbitals: { mMax: 1 },
  energyFloorKelvin: 0,
  contours: { levelsKelvin: [] },
  display: { ...defaultSetup().display, shown: { kind: 'orbital', m: 0 } },
  species: ['Cs'],
};
const map = bindingMap(setup);
const NOW = new Date('2026-12-02T01:40:00.000Z');

let saved: { blob: Blob; name: string }[] = [];
beforeEach(() => {
  saved = [];
  let lastBlob: Blob | null = null;
  vi.stubGlobal('URL', Object.assign(Object.create(URL), URL, {
    createObjectURL: (b: Blob) => {
      lastBlob = b;
      return 'blob:test';
    },
    revokeObjectURL: () => undefined,
  }));
  vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
    saved.push({ blob: lastBlob!, name: this.download });
  });
});
afterEach(() => {
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
});

async function choose(label: string) {
  fireEvent.click(screen.getByRole('button', { name: /Export/ }));
  fireEvent.click(await screen.findByText(label));
}

// antd modals and menus render slowly under happy-dom on a loaded machine.
vi.setConfig({ testTimeout: 20_000 });

describe('ExportMenu', () => {
  it('saves the CSV of the map with the header block and one row per cell and state', async () => {
    render(<ExportMenu setup={setup} bindingMap={map} getFigureSvg={() => null} title="Cs lab map" now={() => NOW} />);
    await choose('Data as CSV');
    await waitFor(() => expect(saved.length).toBe(1));
    expect(saved[0].name).toBe('Cs-lab-map.csv');
    const table = readMapCsv(await saved[0].blob.text());
    expect(table.comments).toContain(`setup fingerprint: ${setupFingerprint(setup)}`);
    expect(table.comments).toContain('date: 2026-12-02T01:40:00.000Z');
    expect(table.columns.slice(0, 6)).toEqual(['alpha_a0^3', 'field_T', 'field_au', 'm', 'nu', 'binding_hartree']);
    let states = 0;
    for (let k = 0; k < map.counts.length; k++) states += map.counts[k];
    expect(table.rows.length).toBe(states);
  });

  it('saves the JSON map file, which imports back to the same setup and bit-identical numbers', async () => {
    render(<ExportMenu setup={setup} bindingMap={map} getFigureSvg={() => null} title="Cs lab map" now={() => NOW} />);
    await choose('Map as JSON (setup and results)');
    await waitFor(() => expect(saved.length).toBe(1));
    const r = importMapJson(await saved[0].blob.text(), { currentEngineVersion: ENGINE_VERSION });
    if (!r.ok) throw new Error(JSON.stringify(r.problems));
    expect(r.value.setup).toEqual(setup);
    expect(r.value.date).toBe('2026-12-02T01:40:00.000Z');
    expect([...r.value.binding!.bindingHartree]).toEqual([...map.bindingHartree]);
  });

  it('saves the setup alone when there is no map yet, and the data items are disabled', async () => {
    render(<ExportMenu setup={setup} getFigureSvg={() => null} title="Draft" now={() => NOW} />);
    await choose('Setup as JSON');
    await waitFor(() => expect(saved.length).toBe(1));
    expect(saved[0].name).toBe('Draft-setup.json');
    const r = importMapJson(await saved[0].blob.text());
    expect(r.ok && r.value.binding === null && r.value.setup.species[0] === 'Cs').toBe(true);
    const csvItem = screen.getByText('Data as CSV').closest('li')!;
    expect(csvItem.getAttribute('aria-disabled')).toBe('true');
  });

  it('refuses a CSV above the size limit with a message naming the size and the way out, and saves nothing', async () => {
    render(<ExportMenu setup={setup} bindingMap={map} getFigureSvg={() => null} title="Big" now={() => NOW} maxBytes={{ csv: 500 }} />);
    await choose('Data as CSV');
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toMatch(/The CSV export of this map would be about [\d.]+ kB, above the limit of 500 B\. Use a coarser grid, fewer orbitals, or a higher energy floor\./);
    expect(saved).toEqual([]);
  });

  it('shows the methods note and its BibTeX, both ready to copy', async () => {
    const writeText = vi.fn(async () => undefined);
    vi.stubGlobal('navigator', { ...navigator, clipboard: { writeText } });
    render(<ExportMenu setup={setup} bindingMap={map} getFigureSvg={() => null} title="Cs" now={() => NOW} />);
    await choose('Methods note…');
    const note = (await screen.findByLabelText('Methods note text')) as HTMLTextAreaElement;
    expect(note.value).toContain(`setup fingerprint ${setupFingerprint(setup)}`);
    expect(note.value).toContain('cutoff radius r_c = 2 a₀');
    const bib = screen.getByLabelText('Methods note BibTeX') as HTMLTextAreaElement;
    expect(checkBibtex(bib.value).problems).toEqual([]);
    expect(bib.value).toContain('@article{schwerdtfeger2019table,'); // species are marked, so the polarizability table is cited
    fireEvent.click(screen.getByRole('button', { name: /Copy BibTeX/ }));
    await waitFor(() => expect(writeText).toHaveBeenCalledWith(bib.value));
    expect(await screen.findByRole('button', { name: /Copied/ })).toBeTruthy();
  });

  it('opens the figure dialog and hands the map view\'s SVG and the chosen options to the exporter', async () => {
    const exporter = vi.fn(async () => null);
    const svg = mapViewSvg();
    render(<ExportMenu setup={setup} bindingMap={map} getFigureSvg={() => svg} title="Cs" now={() => NOW} figureExporter={exporter} />);
    await choose('Figure (SVG, PNG, PDF)…');
    fireEvent.click(await screen.findByText('PNG'));
    fireEvent.click(screen.getByText('Species labels'));
    expect(await screen.findByText(/= 2008 × \d+ pixels/)).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Export PNG' }));
    await waitFor(() => expect(exporter).toHaveBeenCalledTimes(1));
    expect(exporter).toHaveBeenCalledWith(svg, setup, { format: 'png', title: 'Cs', widthMm: 170, dpi: 300, pins: true, species: false, caption: true }, NOW);
    expect(await screen.findByText('Saved the PNG figure.')).toBeTruthy();
  }, 30_000);

  it('the figure dialog says the map must be drawn first when there is no SVG', async () => {
    render(<ExportMenu setup={setup} getFigureSvg={() => null} title="Cs" now={() => NOW} />);
    await choose('Figure (SVG, PNG, PDF)…');
    expect(await screen.findByText('The map is not drawn yet: compute it first, then export the figure.')).toBeTruthy();
    expect((screen.getByRole('button', { name: 'Export SVG' }) as HTMLButtonElement).disabled).toBe(true);
  });
});
