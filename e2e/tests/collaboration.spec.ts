import { defaultSetup } from '@fieldbound/shared';
import { expect, test, type APIRequestContext, type BrowserContext, type Page } from '@playwright/test';
import { NEW_ACCOUNT_PASSWORD, unique } from './support/journey';

// Collaboration on a map with two people at once: an editor pins a region and a viewer of the team sees it appear
// live and replies; the editor resolves it. A signed-out visitor opens a viewing link with pins, sees them without any
// edit control, is refused by the write API, sees a new pin arrive live, and is turned away once the link is revoked.
// Then the lecture view: opened from the map, ←/→ step through the pins, Esc leaves.

// Two or three browser contexts computing maps in workers on a possibly busy 2-core machine.
test.describe.configure({ timeout: 300_000 });


/**
 * The engine's default setup (the server validates it the same way). Imported like every other spec imports the
 * shared package: a second, ESM-style import of its built files next to Playwright's transformed copy fails.
 */
async function smallSetup(): Promise<Record<string, unknown>> {
  // A small grid and few orbitals: quick to compute in the browser, still a real map.
  return { ...defaultSetup(), grid: { nAlpha: 48, nField: 48 }, orbitals: { mMax: 1 } };
}

async function register(request: APIRequestContext, name: string, email: string): Promise<string> {
  const res = await request.post('/api/auth/register', { data: { email, password: NEW_ACCOUNT_PASSWORD, displayName: name } });
  expect(res.status(), await res.text()).toBe(201);
  return ((await res.json()) as { accessToken: string }).accessToken;
}

const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

/** An editor with a team and a small map, and a viewer of that team who joined through an e-mailed invitation. */
async function teamWithMap(editor: BrowserContext, viewer: BrowserContext | null, title: string) {
  const id = unique();
  const token = await register(editor.request, 'Ilse Editor', `editor-${id}@example.test`);
  const team = await editor.request.post('/api/teams', { data: { name: `Pin group ${id}` }, headers: bearer(token) });
  expect(team.status()).toBe(201);
  const teamId = ((await team.json()) as { id: string }).id;

  if (viewer) {
    const viewerEmail = `viewer-${id}@example.test`;
    const invited = await editor.request.post(`/api/teams/${teamId}/invitations`, { data: { email: viewerEmail, role: 'viewer' }, headers: bearer(token) });
    expect(invited.status(), await invited.text()).toBe(201);
    let invitation: string | null = null;
    await expect
      .poll(
        async () => {
          const box = (await (await editor.request.get('/api/dev/mailbox')).json()) as { messages: { to: string[]; links: string[] }[] };
          const link = box.messages.find((m) => m.to.some((t) => t.includes(viewerEmail)))?.links.find((l) => l.includes('/invitations/'));
          invitation = link ? decodeURIComponent(link.split('/invitations/')[1]) : null;
          return invitation;
        },
        { timeout: 30_000 },
      )
      .not.toBeNull();
    const joined = await viewer.request.post(`/api/invitations/${encodeURIComponent(invitation!)}/register`, { data: { displayName: 'Tariq Viewer', password: NEW_ACCOUNT_PASSWORD } });
    expect(joined.status(), await joined.text()).toBe(201);
  }

  const map = await editor.request.post(`/api/teams/${teamId}/maps`, { data: { title, setup: await smallSetup() }, headers: bearer(token) });
  expect(map.status(), await map.text()).toBe(201);
  return { token, teamId, mapId: ((await map.json()) as { id: string }).id };
}

async function openMap(page: Page, mapId: string, title: string) {
  await page.goto(`/maps/${mapId}`);
  await expect(page.getByRole('heading', { name: title })).toBeVisible({ timeout: 60_000 });
  await expect(page.getByText(/computed in [\d.]+ s/)).toBeVisible({ timeout: 180_000 });
  await expect(page.getByTestId('live-status')).toHaveAttribute('data-status', 'live', { timeout: 30_000 });
}

/** The plot area of the map (the pins layer covers it exactly). */
async function plotBox(page: Page) {
  const box = await page.locator('svg.pins-layer').boundingBox();
  expect(box).not.toBeNull();
  return box!;
}

test('an editor pins a region, a viewer sees it live and replies, the editor resolves it; a viewing link shows pins read-only until revoked', async ({ browser }) => {
  const title = `Caesium window ${unique()}`;
  const editorCtx = await browser.newContext();
  const viewerCtx = await browser.newContext();
  const { token, mapId } = await teamWithMap(editorCtx, viewerCtx, title);
  const editor = await editorCtx.newPage();
  const viewer = await viewerCtx.newPage();
  await openMap(editor, mapId, title);
  await openMap(viewer, mapId, title);

  // The viewer has no pin tools at all.
  await expect(viewer.getByRole('toolbar', { name: 'Pin tools' })).toHaveCount(0);

  // The editor drags a rectangle on the map and names the pin.
  const pinTitle = 'Resonance edge near 20 T';
  await editor.getByRole('button', { name: 'Add rectangle pin' }).click();
  const box = await plotBox(editor);
  await editor.mouse.move(box.x + box.width * 0.35, box.y + box.height * 0.35);
  await editor.mouse.down();
  await editor.mouse.move(box.x + box.width * 0.55, box.y + box.height * 0.6, { steps: 6 });
  await editor.mouse.up();
  const dialog = editor.getByRole('dialog', { name: 'New pin on a rectangle' });
  await dialog.getByLabel('Title').fill(pinTitle);
  await dialog.getByLabel('What to discuss').fill('Is the m = 0 state still bound here once the ion moves?\n<b>markup stays text</b>');
  await dialog.getByRole('button', { name: 'Add pin' }).click();
  const editorThread = editor.getByRole('article', { name: `Thread: ${pinTitle}` });
  await expect(editorThread).toBeVisible();
  await expect(editorThread.getByText('<b>markup stays text</b>', { exact: false })).toBeVisible();
  await expect(editorThread.getByTestId('pin-region')).toContainText(/Under it now: (mostly )?(bound|unbound|resonance)/);

  // The viewer sees it appear without reloading, opens the thread and replies.
  const viewerPin = viewer.getByRole('button', { name: pinTitle });
  await expect(viewerPin).toBeVisible({ timeout: 5_000 });
  // An area pin is hovered and clicked by its outline or title (its inside belongs to the map: probe, pan, zoom).
  await viewerPin.locator('text').hover();
  await expect(viewer.getByRole('tooltip')).toContainText('Under it now:');
  await viewerPin.locator('text').click();
  const viewerThread = viewer.getByRole('article', { name: `Thread: ${pinTitle}` });
  await expect(viewerThread).toBeVisible();
  await expect(viewerThread.getByRole('button', { name: /Resolve/ })).toHaveCount(0);
  const reply = 'Checked the widths: still a resonance at 4 K.';
  await viewerThread.getByRole('textbox', { name: 'Reply' }).fill(reply);
  await viewerThread.getByRole('button', { name: 'Reply' }).click();
  await expect(viewerThread.getByRole('list', { name: 'Replies' }).getByText(reply)).toBeVisible();
  await expect(viewerThread.getByRole('textbox', { name: 'Reply' })).toHaveValue('');

  // The reply reaches the editor's open thread live; the editor resolves the pin and the viewer sees that live.
  const editorReplies = editorThread.getByRole('list', { name: 'Replies' });
  await expect(editorReplies.getByText(reply)).toBeVisible({ timeout: 5_000 });
  await expect(editorReplies.getByText('Tariq Viewer')).toBeVisible();
  await editorThread.getByRole('button', { name: /Resolve/ }).click();
  await expect(editorThread.getByRole('button', { name: /Reopen/ })).toBeVisible();
  await expect(viewerThread.getByText('Resolved', { exact: true })).toBeVisible({ timeout: 5_000 });
  await expect(viewer.getByRole('button', { name: pinTitle })).toHaveAttribute('data-status', 'resolved');

  // A viewing link that shows pins, opened by someone with no account.
  const created = await editorCtx.request.post(`/api/maps/${mapId}/viewing-links`, { data: { includePins: true }, headers: bearer(token) });
  expect(created.status()).toBe(201);
  const { path: linkPath, link } = (await created.json()) as { path: string; link: { id: string } };
  const anonCtx = await browser.newContext();
  const anon = await anonCtx.newPage();
  await anon.goto(linkPath);
  await expect(anon.getByRole('heading', { name: title })).toBeVisible({ timeout: 60_000 });
  await expect(anon.getByText('Read-only view')).toBeVisible();
  await expect(anon.getByText(/computed in [\d.]+ s/)).toBeVisible({ timeout: 180_000 });
  const anonPin = anon.getByRole('button', { name: pinTitle });
  await expect(anonPin).toBeVisible();
  await expect(anon.getByRole('toolbar', { name: 'Pin tools' })).toHaveCount(0);
  await expect(anon.getByRole('button', { name: /Save/ })).toHaveCount(0);
  await anonPin.locator('text').click();
  const anonPanel = anon.getByRole('article', { name: `Pin: ${pinTitle}` });
  await expect(anonPanel).toBeVisible();
  await expect(anonPanel.getByText('Resolved', { exact: true })).toBeVisible();
  await expect(anon.getByRole('textbox')).toHaveCount(0);
  await expect(anon.getByRole('button', { name: /Resolve|Reopen|Reply|Delete/ })).toHaveCount(0);
  await expect(anon.getByTestId('pin-handle')).toHaveCount(0);
  // The replies of the team stay with the team.
  await expect(anon.getByText(reply)).toHaveCount(0);

  // Writing directly is refused: no account, and the link is not a credential.
  const pinId = await anonPin.getAttribute('data-pin-id');
  const geometry = { kind: 'point', at: { alpha: 10, fieldTesla: 10 } };
  const writes = [
    await anonCtx.request.post(`/api/maps/${mapId}/pins`, { data: { geometry, title: 'x' } }),
    await anonCtx.request.patch(`/api/pins/${pinId}`, { data: { expectedVersion: 1, status: 'open' } }),
    await anonCtx.request.post(`/api/pins/${pinId}/replies`, { data: { body: 'x' } }),
    await anonCtx.request.delete(`/api/pins/${pinId}`),
    await anonCtx.request.post(`/api/maps/${mapId}/viewing-links`, { data: {} }),
  ];
  for (const w of writes) expect([401, 403]).toContain(w.status());

  // A pin added by the editor reaches the link holder live.
  await expect(anon.getByTestId('live-status')).toHaveAttribute('data-status', 'live', { timeout: 30_000 });
  const second = await editorCtx.request.post(`/api/maps/${mapId}/pins`, { data: { geometry: { kind: 'point', at: { alpha: 30, fieldTesla: 5 } }, title: 'Compare with Rb' }, headers: bearer(token) });
  expect(second.status()).toBe(201);
  await expect(anon.getByRole('button', { name: 'Compare with Rb' })).toBeVisible({ timeout: 5_000 });

  // The link's lecture view: the pins are the steps; Esc comes back to the shared view.
  await anon.getByRole('dialog').getByRole('button', { name: 'Close' }).click();
  await anon.getByRole('button', { name: 'Present' }).click();
  const lecture = anon.getByTestId('lecture-view');
  await expect(lecture.getByTestId('lecture-overview')).toContainText('2 pins');
  await anon.keyboard.press('ArrowRight');
  await expect(lecture.getByTestId('lecture-current-pin')).toContainText(`Pin 1 of 2 ${pinTitle} (resolved)`);
  await anon.keyboard.press('Escape');
  await expect(anon.getByText('Read-only view')).toBeVisible();
  await expect(anon.getByTestId('live-status')).toHaveAttribute('data-status', 'live', { timeout: 30_000 });

  // Revoked: the open page turns into the explanation, and so does a fresh visit.
  const revoked = await editorCtx.request.delete(`/api/maps/${mapId}/viewing-links/${link.id}`, { headers: bearer(token) });
  expect(revoked.status()).toBe(204);
  await expect(anon.getByText('This viewing link does not work')).toBeVisible({ timeout: 30_000 });
  await anon.reload();
  await expect(anon.getByText('This viewing link does not work')).toBeVisible({ timeout: 30_000 });
  await expect(anon.getByText(/revoked by the person who shared it/)).toBeVisible();
  await expect(anon.getByRole('heading', { name: title })).toHaveCount(0);

  await anonCtx.close();
  await viewerCtx.close();
  await editorCtx.close();
});

test('the lecture view opens from the map, steps through the pins with the arrow keys and leaves with Esc', async ({ browser }) => {
  const title = `Lecture map ${unique()}`;
  const ctx = await browser.newContext({ viewport: { width: 1280, height: 800 } });
  const { token, mapId } = await teamWithMap(ctx, null, title);
  for (const [t, alpha] of [['First: the m = 0 edge', 20], ['Second: caesium', 400]] as const) {
    const r = await ctx.request.post(`/api/maps/${mapId}/pins`, { data: { geometry: { kind: 'point', at: { alpha, fieldTesla: 10 } }, title: t, body: `About ${t}` }, headers: bearer(token) });
    expect(r.status()).toBe(201);
  }
  const page = await ctx.newPage();
  await openMap(page, mapId, title);
  await page.getByRole('button', { name: 'Present' }).click();
  await expect(page).toHaveURL(new RegExp(`/maps/${mapId}/present`));
  const lecture = page.getByTestId('lecture-view');
  await expect(lecture).toBeVisible();
  await expect(lecture.getByRole('heading', { name: title, level: 1 })).toBeVisible();
  await expect(lecture.getByText(/Model estimates/)).toBeVisible();
  await expect(lecture.getByTestId('lecture-overview')).toContainText('2 pins');
  await expect(lecture.getByText(/computed in [\d.]+ s/)).toBeVisible({ timeout: 180_000 });

  await page.keyboard.press('ArrowRight');
  await expect(lecture.getByTestId('lecture-current-pin')).toContainText('Pin 1 of 2');
  await expect(lecture.getByTestId('lecture-current-pin')).toContainText('First: the m = 0 edge');
  await page.keyboard.press('ArrowRight');
  await expect(lecture.getByTestId('lecture-current-pin')).toContainText('Pin 2 of 2');
  await expect(lecture.getByTestId('lecture-current-pin')).toContainText('About Second: caesium');
  await page.keyboard.press('ArrowLeft');
  await expect(lecture.getByTestId('lecture-current-pin')).toContainText('Pin 1 of 2');
  // Each step moves the map to the pin: the whole-map button becomes available.
  await expect(lecture.getByRole('button', { name: 'Show the whole map' })).toBeEnabled();
  // The pointer highlight follows the mouse.
  await page.mouse.move(400, 300);
  await expect(page.locator('.lecture-pointer')).toBeVisible();

  await page.keyboard.press('Escape');
  await expect(page).toHaveURL(new RegExp(`/maps/${mapId}(\\?.*)?$`));
  await expect(page.getByTestId('lecture-view')).toHaveCount(0);
  await ctx.close();
});
