// Helpers shared by the user journeys: the demo group (seeded on demand), signing in through the page,
// the computed-map wait, and the guide's screenshots (written only when FIELDBOUND_SCREENSHOTS=1).
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { expect, type APIRequestContext, type Locator, type Page } from '@playwright/test';

/** The checkout: the nearest directory upwards from where Playwright runs that holds e2e/playwright.config.ts. */
function findRepoRoot(): string {
  for (let dir = process.cwd(); ; dir = path.dirname(dir)) {
    if (fs.existsSync(path.join(dir, 'e2e', 'playwright.config.ts'))) return dir;
    if (path.dirname(dir) === dir) throw new Error(`cannot find the repository above ${process.cwd()}`);
  }
}
const repoRoot = findRepoRoot();

/** The invented demo group of backend/src/demo (demo-only passwords, public on purpose). */
export const DEMO = {
  team: 'Solberg group · field-bound anions (demo)',
  owner: { email: 'maren.solberg@demo.fieldbound.test', password: 'demo-owner-2026', name: 'Maren Solberg' },
  editorA: { email: 'kofi.mensah@demo.fieldbound.test', password: 'demo-editor-2026', name: 'Kofi Mensah' },
  editorB: { email: 'ilse.varga@demo.fieldbound.test', password: 'demo-editor-2026', name: 'Ilse Varga' },
  viewer: { email: 'tariq.bello@demo.fieldbound.test', password: 'demo-viewer-2026', name: 'Tariq Bello' },
  lectureToken: 'demo-lecture-link-Solberg-group-anions-2026',
  maps: {
    lab: 'Laboratory scan: shortlist at 1–45 T',
    lab4K: 'Laboratory scan with ion motion at 4 K',
  },
} as const;

/**
 * Seeds the demo group into the end-to-end database as new (`seed --reset`), with the same database settings the
 * server under test got from the environment: specs that save a demo map (explorer) must not change what a later
 * spec reads (guide).
 */
export function ensureDemoData(): void {
  execFileSync(process.execPath, [path.join(repoRoot, 'backend', 'dist', 'database', 'db-cli.js'), 'seed', '--reset'], { env: process.env, stdio: 'pipe' });
}

export async function signIn(page: Page, who: { email: string; password: string }): Promise<void> {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail address').fill(who.email);
  await page.getByLabel('Password', { exact: true }).fill(who.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).toHaveURL(/\/maps$/, { timeout: 30_000 });
}

/** Opens a map of the current team from the maps list by its title. */
export async function openMapByTitle(page: Page, title: string): Promise<void> {
  await page.goto('/maps');
  await page.getByRole('link', { name: title, exact: true }).click();
  await expect(page.getByRole('heading', { name: title })).toBeVisible({ timeout: 60_000 });
}

/** Waits until the full-resolution map is computed (the status line names the time it took). */
/** A short random suffix that keeps accounts, teams and titles of separate runs apart. */
export const unique = () => Math.random().toString(36).slice(2, 10);
export const NEW_ACCOUNT_PASSWORD = 'field-induced anions';

/**
 * Registers a new account through the API (the page's context keeps the refresh cookie, so the app opens signed
 * in) and starts a team; returns the access token.
 */
export async function registerWithTeam(request: APIRequestContext, who: { label: string; displayName: string; team: string }): Promise<string> {
  const res = await request.post('/api/auth/register', { data: { email: `${who.label}-${unique()}@example.test`, password: NEW_ACCOUNT_PASSWORD, displayName: who.displayName } });
  expect(res.status()).toBe(201);
  const { accessToken } = (await res.json()) as { accessToken: string };
  const created = await request.post('/api/teams', { data: { name: who.team }, headers: { Authorization: `Bearer ${accessToken}` } });
  expect(created.status()).toBe(201);
  return accessToken;
}

/** Creates a map from a regime preset through the New map dialog; returns its id once its page is open. */
export async function createMapFromPreset(page: Page, title: string, preset: string): Promise<string> {
  await page.goto('/maps');
  await page.getByRole('button', { name: 'New map' }).first().click();
  const dialog = page.getByRole('dialog', { name: 'New map' });
  await dialog.getByLabel('Title').fill(title);
  await dialog.getByRole('combobox', { name: 'Regime' }).click();
  await page.getByTitle(preset).click();
  await dialog.getByRole('button', { name: 'Create map' }).click();
  await expect(page).toHaveURL(/\/maps\/[0-9a-f-]+/);
  return new URL(page.url()).pathname.split('/').pop()!;
}

export async function waitForComputedMap(page: Page): Promise<void> {
  await expect(page.getByText(/computed in [\d.]+ s/)).toBeVisible({ timeout: 240_000 });
}

/** The map's plot area (the transparent layer that takes clicks) and the figure's coordinates of things drawn on it. */
export function mapOverlay(page: Page): Locator {
  return page.locator('.map-view rect.map-overlay');
}

/** x of a species marker's line in plot coordinates (the overlay and the figure share the plot's origin). */
export async function speciesX(page: Page, name: string): Promise<number> {
  const marker = page.locator('.map-view g.species-marker').filter({ has: page.locator('text', { hasText: new RegExp(`^${name}$`) }) });
  await expect(marker).toHaveCount(1, { timeout: 30_000 });
  return Number(await marker.locator('line').getAttribute('x1'));
}

/** y of the top edge of a field band (its upper field) in plot coordinates. */
export async function bandTopY(page: Page, label: string): Promise<number> {
  const band = page.locator('.map-view g.field-bands g').filter({ has: page.locator('text', { hasText: label }) });
  await expect(band).toHaveCount(1, { timeout: 30_000 });
  return Number(await band.locator('rect').getAttribute('y'));
}

/** The guide's screenshots: 1280 × 800 PNGs in docs/guide/img/, taken only when FIELDBOUND_SCREENSHOTS=1. */
export const screenshotsWanted = process.env.FIELDBOUND_SCREENSHOTS === '1';

export async function guideShot(page: Page, name: string, options: { clip?: Locator } = {}): Promise<void> {
  if (!screenshotsWanted) return;
  const dir = path.join(repoRoot, 'docs', 'guide', 'img');
  fs.mkdirSync(dir, { recursive: true });
  const file = path.join(dir, `${name}.png`);
  // Let fonts and the last frame settle; the screenshot is of what a person sees.
  // (The e2e project has no DOM typings: the page's document is reached through globalThis.)
  await page.evaluate(() => (globalThis as unknown as { document: { fonts: { ready: Promise<unknown> } } }).document.fonts.ready.then(() => true));
  if (options.clip) await options.clip.screenshot({ path: file, animations: 'disabled' });
  else await page.screenshot({ path: file, animations: 'disabled' });
}

/** The viewport of every journey (also the size of the guide's screenshots). */
export const VIEWPORT = { width: 1280, height: 800 };

/** The probe's row of orbital m, level ν: its cells' texts and the table's column headers (once the probe has solved). */
export async function probeRow(page: Page, m: number, nu: number): Promise<{ cells: string[]; headers: string[] }> {
  const probe = page.getByRole('dialog', { name: 'Probe' });
  const row = probe.getByRole('row', { name: new RegExp(`^${m} ${nu} `) });
  await expect(row).toBeVisible({ timeout: 60_000 });
  return { cells: await row.getByRole('cell').allInnerTexts(), headers: await probe.getByRole('columnheader').allInnerTexts() };
}

/**
 * Clicks the map at (x, y), where magnesium meets the 20 T band, and checks the probe's m = 0 binding energy against
 * the engine's figure; returns the probe row for further checks.
 */
export async function probeMagnesiumAt20T(page: Page, x: number, y: number): Promise<{ cells: string[]; headers: string[] }> {
  await mapOverlay(page).click({ position: { x, y } });
  const row = await probeRow(page, 0, 0);
  const energyColumn = row.headers.findIndex((h) => h.startsWith('Binding energy'));
  expect(row.headers[energyColumn]).toContain('µeV');
  // Engine figure at α = 71.2 a₀³ (Mg), 20 T, r_c = 2 a₀: 70.8 µeV (backend/src/demo/demo-answer.spec.ts); a click lands
  // within a pixel of the point, so allow a few per cent.
  const microEv = Number(row.cells[energyColumn].replace(/[^\d.]/g, ''));
  expect(microEv).toBeGreaterThan(60);
  expect(microEv).toBeLessThan(85);
  return row;
}
