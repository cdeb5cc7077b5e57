import { expect, test } from '@playwright/test';
import { createMapFromPreset, registerWithTeam, unique } from './support/journey';

// The engine worker killed while a map computes: the page says so with a Retry, Retry computes the map, and the rest
// of the page (setup, saving, pins) keeps working. The kill goes through the app's `?faults` switch
// (frontend/src/dev/faults.ts): the workers are terminated and fire the `error` event a crashed worker fires.

test.describe.configure({ timeout: 300_000 });


/** What the app adds to `window` when opened with ?faults. */
// (The e2e project has no DOM typings: the page's globals are described here.)
type FaultsWindow = { fieldboundFaults?: { killEngineWorkers(): number }; document: { querySelector(selector: string): unknown } };

test('the engine worker killed mid-computation: an error with Retry, Retry computes the map, the page keeps working', async ({ page }) => {
  const token = await registerWithTeam(page.request, { label: 'faults', displayName: 'Fay Ultman', team: `Fault group ${unique()}` });
  const auth = { Authorization: `Bearer ${token}` };
  const title = `Crash drill ${unique()}`;
  const mapId = await createMapFromPreset(page, title, 'Pulsed-field facilities');

  // A finer grid than the preset's, so the computation lasts long enough to be interrupted.
  const map = (await (await page.request.get(`/api/maps/${mapId}`, { headers: auth })).json()) as { version: number; setup: Record<string, unknown> };
  const saved = await page.request.patch(`/api/maps/${mapId}`, { headers: auth, data: { expectedVersion: map.version, setup: { ...map.setup, grid: { nAlpha: 1024, nField: 1024 } } } });
  expect(saved.status()).toBe(200);

  const pageErrors: Error[] = [];
  page.on('pageerror', (error) => pageErrors.push(error));
  await page.goto(`/maps/${mapId}?faults`);
  await expect(page.getByRole('heading', { name: title })).toBeVisible({ timeout: 60_000 });
  await expect(page.getByTestId('save-state')).toContainText('Saved · version 2');

  // Kill the workers while the map computes (checked in the same task as the kill: the progress is still shown).
  await expect(page.getByRole('status', { name: 'Computation progress' })).toBeVisible({ timeout: 120_000 });
  const killed = await page.evaluate(() => {
    const w = globalThis as unknown as FaultsWindow;
    return w.document.querySelector('[aria-label="Computation progress"]') ? (w.fieldboundFaults?.killEngineWorkers() ?? -1) : -2;
  });
  expect(killed, 'engine workers killed while the progress was shown').toBeGreaterThan(0);

  const alert = page.getByRole('alert').filter({ hasText: 'Could not compute the map' });
  await expect(alert).toBeVisible({ timeout: 30_000 });
  await expect(alert).toContainText('The engine worker stopped unexpectedly');
  await expect(page.getByRole('status', { name: 'Computation progress' })).toHaveCount(0);

  // Nothing else broke: the saved state, the pins drawer, and an edit with a save all still work.
  await expect(page.getByTestId('save-state')).toContainText('Saved · version 2');
  await page.getByRole('button', { name: /^Pins/ }).click();
  await expect(page.getByRole('dialog').filter({ hasText: 'Pins' })).toBeVisible();
  await page.keyboard.press('Escape');
  const observation = page.getByLabel('Observation time', { exact: true });
  await observation.fill('3.5');
  await observation.press('Tab');
  await expect(page.getByTestId('save-state')).toContainText('Unsaved changes');
  await page.getByRole('button', { name: /Save$/ }).click();
  await expect(page.getByTestId('save-state')).toContainText('Saved · version 3');

  // Retry starts fresh workers and the map is computed.
  await alert.getByRole('button', { name: 'Retry' }).click();
  await expect(page.getByText(/computed in [\d.]+ s/)).toBeVisible({ timeout: 240_000 });
  await expect(page.getByRole('alert').filter({ hasText: 'Could not compute the map' })).toHaveCount(0);
  expect(pageErrors.map((e) => e.message)).toEqual([]);
});

test('without the ?faults switch the page offers no way to kill workers', async ({ page }) => {
  await registerWithTeam(page.request, { label: 'nofaults', displayName: 'Fay Ultman', team: `Fault group ${unique()}` });
  const mapId = await createMapFromPreset(page, `Plain ${unique()}`, 'Pulsed-field facilities');
  await page.goto(`/maps/${mapId}`);
  await expect(page.getByTestId('save-state')).toContainText('Saved · version 1', { timeout: 60_000 });
  expect(await page.evaluate(() => typeof (globalThis as unknown as FaultsWindow).fieldboundFaults)).toBe('undefined');
});
