import { expect, test, type Page } from '@playwright/test';
import { registerWithTeam, unique } from './support/journey';

// HTML and script in a map title, a pin's title and body and a reply are stored as text and shown as text: on the
// member's map page and on the read-only shared view the markup appears literally, and none of it runs.

test.describe.configure({ timeout: 300_000 });


/** Each payload, if it ever ran, would set a flag on window or open a dialog. */
const MAP_TITLE = `<script>window.__fieldboundPwned = 'map'</script><img src=x onerror="window.__fieldboundPwned='map-img'"> scan`;
const PIN_TITLE = `<img src=x onerror="window.__fieldboundPwned='pin-title'">Check <b>this</b>`;
const PIN_BODY = `<script>alert('pin body')</script>\n<svg onload="window.__fieldboundPwned='pin-svg'"></svg><a href="javascript:alert(1)">click</a>`;
const REPLY = `<img src=x onerror="alert('reply')"> &lt;not an entity&gt;`;

/** Fails the test on any dialog and records script errors; answers a check that nothing ran. */
function watch(page: Page) {
  const dialogs: string[] = [];
  page.on('dialog', async (dialog) => {
    dialogs.push(dialog.message());
    await dialog.dismiss();
  });
  return async () => {
    expect(dialogs).toEqual([]);
    expect(await page.evaluate(() => (globalThis as { __fieldboundPwned?: string }).__fieldboundPwned ?? null)).toBeNull();
    // No element the payloads would have created exists in the document.
    expect(await page.locator('img[src="x"], svg[onload], a[href^="javascript:"]').count()).toBe(0);
  };
}

/** The pin on the map (its accessible name is its title, as text), and its panel with the body as typed. */
async function expectPinShownAsText(page: Page, panel: 'Thread' | 'Pin') {
  await expect(page.getByText(/computed in [\d.]+ s/)).toBeVisible({ timeout: 240_000 });
  const marker = page.getByRole('button', { name: PIN_TITLE, exact: true });
  await expect(marker).toBeVisible({ timeout: 30_000 });
  await marker.click();
  const article = page.getByRole('article', { name: `${panel}: ${PIN_TITLE}` });
  await expect(article).toBeVisible();
  await expect(article.getByRole('heading', { name: PIN_TITLE, exact: true })).toBeVisible();
  // The body: every line as typed, tags included, as text.
  await expect(article.getByText(`<script>alert('pin body')</script>`, { exact: false })).toBeVisible();
  await expect(article.getByText(`<svg onload="window.__fieldboundPwned='pin-svg'"></svg><a href="javascript:alert(1)">click</a>`, { exact: false })).toBeVisible();
  return article;
}

test('markup in a map title, pin title, pin body and reply shows as literal text on the map page and the shared view, and never runs', async ({ page, browser }) => {
  const token = await registerWithTeam(page.request, { label: 'hostile', displayName: 'Mallory Tester', team: `Escaping group ${unique()}` });
  const auth = { Authorization: `Bearer ${token}` };
  const nothingRan = watch(page);

  // The title typed into the new-map dialog, as a person would.
  await page.goto('/maps');
  await page.getByRole('button', { name: 'New map' }).first().click();
  const dialog = page.getByRole('dialog', { name: 'New map' });
  await dialog.getByLabel('Title').fill(MAP_TITLE);
  await dialog.getByRole('combobox', { name: 'Regime' }).click();
  await page.getByTitle('Pulsed-field facilities').click();
  await dialog.getByRole('button', { name: 'Create map' }).click();
  await expect(page).toHaveURL(/\/maps\/[0-9a-f-]+/);
  const mapId = new URL(page.url()).pathname.split('/').pop()!;
  await expect(page.getByRole('heading', { name: MAP_TITLE })).toBeVisible({ timeout: 60_000 });

  // Stored exactly as typed (text, not sanitised or entity-encoded).
  const stored = (await (await page.request.get(`/api/maps/${mapId}`, { headers: auth })).json()) as { title: string };
  expect(stored.title).toBe(MAP_TITLE);

  const pin = await page.request.post(`/api/maps/${mapId}/pins`, {
    headers: auth,
    data: { geometry: { kind: 'point', at: { alpha: 200, fieldTesla: 30 } }, title: PIN_TITLE, body: PIN_BODY },
  });
  expect(pin.status()).toBe(201);
  const pinId = ((await pin.json()) as { id: string }).id;
  expect((await page.request.post(`/api/pins/${pinId}/replies`, { headers: auth, data: { body: REPLY } })).status()).toBe(201);

  // The member's map page.
  await page.reload();
  await expect(page.getByRole('heading', { name: MAP_TITLE })).toBeVisible({ timeout: 60_000 });
  const thread = await expectPinShownAsText(page, 'Thread');
  await expect(thread.getByText(REPLY, { exact: true })).toBeVisible();
  // The maps list shows the title as text too.
  await page.goto('/maps');
  await expect(page.getByRole('link', { name: MAP_TITLE, exact: true }).first()).toBeVisible({ timeout: 30_000 });
  await nothingRan();

  // The read-only shared view, opened by a visitor without an account.
  const link = await page.request.post(`/api/maps/${mapId}/viewing-links`, { headers: auth, data: { includePins: true } });
  expect(link.status()).toBe(201);
  const { path } = (await link.json()) as { path: string };
  const visitor = await browser.newContext();
  const guest = await visitor.newPage();
  const guestNothingRan = watch(guest);
  await guest.goto(path);
  await expect(guest.getByRole('heading', { name: MAP_TITLE })).toBeVisible({ timeout: 60_000 });
  await expectPinShownAsText(guest, 'Pin');
  await guestNothingRan();
  await visitor.close();
});
