import fs from 'node:fs';
import { expect, test } from '@playwright/test';
import { bandTopY, guideShot, mapOverlay, NEW_ACCOUNT_PASSWORD, probeMagnesiumAt20T, signIn, speciesX, unique, VIEWPORT, waitForComputedMap } from './support/journey';

// The theorist's journey: sign in, create a map from the laboratory preset, let it compute, mark candidate species
// and the group's 20 T magnet, probe magnesium at 20 T (a bound region of orbital m = 0), save, and export the
// figure (SVG) and the data (CSV) from the map page — then read both files back (issue #9's export check).

test.use({ viewport: VIEWPORT, acceptDownloads: true });
// A 256 × 256 map computed in the browser's workers on a possibly busy 2-core machine, plus two exports.
test.describe.configure({ timeout: 420_000 });


test('a theorist computes a laboratory map, finds magnesium bound at 20 T with the probe, saves and exports the figure and the data', async ({ page, request }) => {
  const id = unique();
  const email = `theorist-${id}@example.test`;
  const title = `Shortlist at 20 T ${id}`;
  // An account with a team of its own (through the API), then signing in through the page as a person would.
  const registered = await request.post('/api/auth/register', { data: { email, password: NEW_ACCOUNT_PASSWORD, displayName: 'Noor Theorist' } });
  expect(registered.status()).toBe(201);
  const { accessToken } = (await registered.json()) as { accessToken: string };
  expect((await request.post('/api/teams', { data: { name: `Theory group ${id}` }, headers: { Authorization: `Bearer ${accessToken}` } })).status()).toBe(201);
  await signIn(page, { email, password: NEW_ACCOUNT_PASSWORD });

  // A new map from the laboratory preset; the safety note stands beside the preset.
  await page.getByRole('button', { name: 'New map' }).first().click();
  const dialog = page.getByRole('dialog', { name: 'New map' });
  await dialog.getByLabel('Title').fill(title);
  await dialog.getByRole('combobox', { name: 'Regime' }).click();
  await page.locator('.ant-select-item-option[title="Laboratory magnets"]').click();
  await expect(dialog.getByRole('note', { name: 'Safety near strong magnets' })).toBeVisible();
  await guideShot(page, 'new-map');
  await dialog.getByRole('button', { name: 'Create map' }).click();
  await expect(page).toHaveURL(/\/maps\/[0-9a-f-]+/);
  await expect(page.getByRole('heading', { name: title })).toBeVisible({ timeout: 60_000 });
  await waitForComputedMap(page);

  // Candidate species on the map, and the group's magnet as a field band from 1 to 20 T (neither recomputes).
  const species = page.getByRole('combobox', { name: 'Species on the map' });
  for (const name of ['Mg', 'Cd', 'Kr']) {
    await species.click();
    await species.fill(`(${name})`);
    await page.locator('.ant-select-item-option').filter({ hasText: `(${name})` }).first().click();
  }
  await page.keyboard.press('Escape');
  await page.getByRole('button', { name: /Add field band/ }).click();
  await page.getByLabel('Field band 1 label').fill('Our 20 T magnet');
  await page.getByLabel('Field band 1 from').fill('1');
  await page.getByLabel('Field band 1 to').fill('20');
  await page.getByLabel('Field band 1 to').press('Tab');
  await expect(page.getByRole('note', { name: 'Safety near strong magnets' })).toBeVisible();
  await expect(page.getByRole('button', { name: 'Compute' })).toBeDisabled();

  // Probe magnesium at the top of the band: 20 T. Orbital m = 0 is bound there by tens of µeV.
  const x = await speciesX(page, 'Mg');
  const y = await bandTopY(page, 'Our 20 T magnet');
  await mapOverlay(page).hover({ position: { x, y } });
  await expect(page.locator('.map-readout')).toContainText(/m = 0: ε = [\d.]+ µeV/);
  await probeMagnesiumAt20T(page, x, y);
  await guideShot(page, 'probe');

  // Close the probe, then save: species and the band are part of the setup.
  await page.getByRole('dialog', { name: 'Probe' }).getByRole('button', { name: 'Close' }).click();
  await expect(page.getByRole('dialog', { name: 'Probe' })).toHaveCount(0);
  await expect(page.getByTestId('save-state')).toContainText('Unsaved changes');
  await page.getByRole('button', { name: /Save$/ }).click();
  await expect(page.getByTestId('save-state')).toContainText('Saved · version 2');

  // Export the figure as SVG and read its metadata.
  await page.getByRole('button', { name: 'Export' }).click();
  await page.getByRole('menuitem', { name: 'Figure (SVG, PNG, PDF)…' }).click();
  const figureDialog = page.getByRole('dialog', { name: 'Export figure' });
  await guideShot(page, 'export-figure');
  const [svgDownload] = await Promise.all([page.waitForEvent('download'), figureDialog.getByRole('button', { name: 'Export SVG' }).click()]);
  expect(svgDownload.suggestedFilename()).toMatch(/\.svg$/);
  const svg = fs.readFileSync(await svgDownload.path(), 'utf8');
  const meta = /<metadata><fb:figure xmlns:fb="urn:fieldbound:figure:1"([^>]*)><fb:setup>([\s\S]*?)<\/fb:setup>/.exec(svg);
  expect(meta, 'the SVG carries a <metadata> record').not.toBeNull();
  expect(meta![1]).toMatch(/engine-version="\d+\.\d+\.\d+"/);
  expect(meta![1]).toMatch(/setup-fingerprint="[0-9a-f]{8,}"/);
  const setupJson = JSON.parse(meta![2].replace(/&quot;/g, '"').replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&apos;/g, "'").replace(/&amp;/g, '&')) as {
    species: string[];
    fieldBands: { label: string; maxTesla: number }[];
    fieldAxis: { min: number; max: number };
  };
  expect(setupJson.species).toEqual(['Mg', 'Cd', 'Kr']);
  expect(setupJson.fieldBands).toMatchObject([{ label: 'Our 20 T magnet' }]);
  expect(setupJson.fieldBands[0].maxTesla).toBeCloseTo(20, 9);
  expect(setupJson.fieldAxis).toMatchObject({ min: 1, max: 45 });
  expect(svg).toContain('Mg');
  await page.keyboard.press('Escape');
  await expect(figureDialog).toHaveCount(0);

  // Export the data as CSV: a commented header block, then a row per cell, orbital and level.
  await page.getByRole('button', { name: 'Export' }).click();
  const [csvDownload] = await Promise.all([page.waitForEvent('download', { timeout: 120_000 }), page.getByRole('menuitem', { name: 'Data as CSV' }).click()]);
  expect(csvDownload.suggestedFilename()).toMatch(/\.csv$/);
  const csv = fs.readFileSync(await csvDownload.path(), 'utf8');
  const lines = csv.split('\n').filter((l) => l !== '');
  const header = lines.filter((l) => l.startsWith('# '));
  expect(header[0]).toBe('# Fieldbound map export (CSV, comma-separated, UTF-8)');
  expect(header.find((l) => l.startsWith('# engine version: '))).toMatch(/^# engine version: \d+\.\d+\.\d+$/);
  expect(header.find((l) => l.startsWith('# caveat: '))).toContain('model estimates');
  expect(header.find((l) => l.startsWith('# setup: '))).toContain('"Our 20 T magnet"');
  const columnsAt = lines.findIndex((l) => !l.startsWith('#'));
  const columns = lines[columnsAt].split(',');
  expect(columns.slice(0, 6)).toEqual(['alpha_a0^3', 'field_T', 'field_au', 'm', 'nu', 'binding_hartree']);
  const rows = lines.slice(columnsAt + 1).map((l) => l.split(','));
  expect(rows.length).toBeGreaterThan(1000);
  const at = (name: string) => columns.indexOf(name);
  for (const row of rows.slice(0, 200)) {
    expect(Number(row[at('alpha_a0^3')])).toBeGreaterThanOrEqual(1);
    expect(Number(row[at('field_T')])).toBeLessThanOrEqual(45 * (1 + 1e-9));
    expect(Number(row[at('binding_hartree')])).toBeGreaterThan(0);
    expect(row[at('class')]).toBe('bound');
  }
});
