import { describe, expect, it, vi } from 'vitest';
import { fireEvent, render, screen, waitFor } from '@testing-library/react';
import { base64ToBytes, defaultSetup, ENGINE_VERSION, figureMetadata, insertPngTextChunks, mapJsonText, pngFigureEntries } from '@fieldbound/shared';
import { ImportSetupDialog } from './ImportSetupDialog';

function setup() {
  const onImport = vi.fn();
  render(<ImportSetupDialog open onClose={() => undefined} onImport={onImport} />);
  const area = screen.getByLabelText('Setup JSON');
  const paste = (text: string) => fireEvent.change(area, { target: { value: text } });
  const importButton = () => screen.getByRole('button', { name: 'Import' });
  return { onImport, paste, importButton };
}

const problems = async () => [...(await screen.findByTestId('import-problems')).querySelectorAll('li')].map((li) => li.textContent);

// antd modals render slowly under happy-dom on a loaded machine.
vi.setConfig({ testTimeout: 20_000 });

describe('ImportSetupDialog', () => {
  it('imports a pasted map file and hands over the validated setup once', async () => {
    const { onImport, paste, importButton } = setup();
    const s = { ...defaultSetup(), grid: { nAlpha: 64, nField: 32 } };
    paste(mapJsonText({ setup: s, engineVersion: ENGINE_VERSION, date: '2026-12-02' }));
    fireEvent.click(importButton());
    await waitFor(() => expect(onImport).toHaveBeenCalledTimes(1));
    expect(onImport.mock.calls[0][0]).toEqual(s);
    expect(onImport.mock.calls[0][1].kind).toBe('map-file');
    expect(screen.queryByTestId('import-problems')).toBeNull();
  });

  it('names the line and column of unreadable JSON and creates nothing', async () => {
    const { onImport, paste, importButton } = setup();
    paste('{\n  "schemaVersion": 1,\n  "grid": { "nAlpha": 64 "nField": 32 }\n}');
    fireEvent.click(importButton());
    expect(await problems()).toEqual(['not readable JSON at line 3 column 26: expected "," or "}" after a property value, found "\\""']);
    expect(onImport).not.toHaveBeenCalled();
  });

  it('lists every schema problem with its path', async () => {
    const { onImport, paste, importButton } = setup();
    const bad = { ...defaultSetup(), alphaAxis: { min: 10, max: 1, scale: 'log' }, display: { ...defaultSetup().display, energyUnit: 'erg' }, extra: true };
    paste(JSON.stringify(bad));
    fireEvent.click(importButton());
    const list = await problems();
    expect(list).toContain('alphaAxis.max: polarizability range is inverted or empty: minimum must be below maximum');
    expect(list).toContain('display.energyUnit: energy unit must be "ueV", "meV", "K" or "GHz"');
    expect(list).toContain('extra: unknown field "extra"');
    expect(screen.getByText(`The setup cannot be imported (${list.length} problems):`)).toBeTruthy();
    expect(onImport).not.toHaveBeenCalled();
  });

  it('says so for another format or a newer format version', async () => {
    const { onImport, paste, importButton } = setup();
    paste('{"format": "some-other-tool", "formatVersion": 1}');
    fireEvent.click(importButton());
    expect(await problems()).toEqual(['format: unknown format "some-other-tool": expected "fieldbound-map"']);
    paste(JSON.stringify({ ...JSON.parse(mapJsonText({ setup: defaultSetup(), engineVersion: ENGINE_VERSION })), formatVersion: 3 }));
    fireEvent.click(importButton());
    await waitFor(async () => expect((await problems())[0]).toMatch(/^formatVersion: format version 3 is newer than this Fieldbound reads \(version 1\)/));
    expect(onImport).not.toHaveBeenCalled();
  });

  it('reads a chosen file and validates it the same way', async () => {
    const { onImport } = setup();
    const file = new File([JSON.stringify(defaultSetup())], 'lab-setup.json', { type: 'application/json' });
    fireEvent.change(screen.getByTestId('import-setup-file'), { target: { files: [file] } });
    await waitFor(() => expect(onImport).toHaveBeenCalledTimes(1));
    expect(onImport.mock.calls[0][0]).toEqual(defaultSetup());
    expect(screen.getByText('lab-setup.json')).toBeTruthy();
  });

  it('reopens an exported PNG figure from the setup recorded in it, and refuses a PNG without one', async () => {
    const { onImport } = setup();
    const tiny = base64ToBytes('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==');
    const s = { ...defaultSetup(), orbitals: { mMax: 3 }, display: { ...defaultSetup().display, shown: { kind: 'orbital' as const, m: 1 } } };
    const png = insertPngTextChunks(tiny, pngFigureEntries(figureMetadata(s, { engineVersion: ENGINE_VERSION, date: '2026-12-02', title: 'fig' })));
    fireEvent.change(screen.getByTestId('import-setup-file'), { target: { files: [new File([png as BlobPart], 'figure.png', { type: 'image/png' })] } });
    await waitFor(() => expect(onImport).toHaveBeenCalledTimes(1));
    expect(onImport.mock.calls[0][0]).toEqual(s);
    expect(screen.getByText('figure.png (the setup recorded in the figure)')).toBeTruthy();
    fireEvent.change(screen.getByTestId('import-setup-file'), { target: { files: [new File([tiny as BlobPart], 'photo.png', { type: 'image/png' })] } });
    expect(await problems()).toEqual(['this PNG carries no Fieldbound setup (it was not exported by Fieldbound, or its text chunks were removed)']);
    expect(onImport).toHaveBeenCalledTimes(1);
  });

  it('the Import button stays disabled until there is text', () => {
    const { importButton, paste } = setup();
    expect((importButton() as HTMLButtonElement).disabled).toBe(true);
    paste('   ');
    expect((importButton() as HTMLButtonElement).disabled).toBe(true);
  });
});
