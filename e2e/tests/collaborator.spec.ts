import { expect, test, type Page } from '@playwright/test';
import { DEMO, VIEWPORT, ensureDemoData, guideShot, openMapByTitle, signIn, waitForComputedMap } from './support/journey';

// The collaborator's journey in the demo group: Kofi (editor) opens a teammate's map (Ilse's cutoff comparison), pins a
// region and asks about it; Ilse, signed in elsewhere, opens the same map, finds the pin and replies; Kofi reads the
// reply and resolves the thread. (The live two-context behaviour and the viewer's view are covered by
// collaboration.spec.ts; here each person opens the map as they would.)

test.use({ viewport: VIEWPORT });
test.describe.configure({ timeout: 420_000 });

test.beforeAll(() => ensureDemoData());

const TEAMMATES_MAP = 'Cutoff sensitivity: r_c = 4 a₀';

async function pinsLayerBox(page: Page) {
  const box = await page.locator('svg.pins-layer').boundingBox();
  expect(box).not.toBeNull();
  return box!;
}

test('a collaborator pins a region of a teammate’s map, the teammate replies, and the collaborator resolves it', async ({ page, browser }) => {
  const pinTitle = `Does m = 0 survive r_c = 4 a₀ here? ${Math.random().toString(36).slice(2, 7)}`;

  await signIn(page, DEMO.editorA);
  await openMapByTitle(page, TEAMMATES_MAP);
  await waitForComputedMap(page);
  await expect(page.getByTestId('save-state')).not.toContainText('Read only');

  // A rectangle over the lower-middle of the map, dragged with the rectangle tool.
  await page.getByRole('button', { name: 'Add rectangle pin' }).click();
  const box = await pinsLayerBox(page);
  await page.mouse.move(box.x + box.width * 0.45, box.y + box.height * 0.5);
  await page.mouse.down();
  await page.mouse.move(box.x + box.width * 0.65, box.y + box.height * 0.75, { steps: 6 });
  await page.mouse.up();
  const dialog = page.getByRole('dialog', { name: 'New pin on a rectangle' });
  await dialog.getByLabel('Title').fill(pinTitle);
  await dialog.getByLabel('What to discuss').fill('With the doubled cutoff the m = 0 binding drops by about four. Is this region still above our floor, or only on the r_c = 2 a₀ map?');
  await dialog.getByLabel('Category').fill('question');
  // Close the category's suggestions (they would cover the dialog's buttons).
  await dialog.getByLabel('Title').click();
  await expect(page.locator('.ant-select-dropdown:visible')).toHaveCount(0);
  await guideShot(page, 'new-pin');
  await dialog.getByRole('button', { name: 'Add pin' }).click();
  const thread = page.getByRole('article', { name: `Thread: ${pinTitle}` });
  await expect(thread).toBeVisible();
  await expect(thread.getByTestId('pin-region')).toContainText(/Under it now:/);

  // The teammate, in a browser of her own, finds the pin on her map and replies.
  const ilseContext = await browser.newContext({ viewport: VIEWPORT });
  const ilse = await ilseContext.newPage();
  await signIn(ilse, DEMO.editorB);
  await openMapByTitle(ilse, TEAMMATES_MAP);
  await waitForComputedMap(ilse);
  // An area pin is clicked by its title or outline: its inside belongs to the map (probe, pan, zoom).
  await ilse.getByRole('button', { name: pinTitle }).locator('text').click();
  const ilseThread = ilse.getByRole('article', { name: `Thread: ${pinTitle}` });
  await expect(ilseThread).toContainText('Kofi Mensah');
  const reply = 'Mostly bound here, fully bound on the r_c = 2 a₀ map: the edge moves with the cutoff. Quote both maps.';
  await ilseThread.getByRole('textbox', { name: 'Reply' }).fill(reply);
  await ilseThread.getByRole('button', { name: 'Reply' }).click();
  await expect(ilseThread.getByRole('list', { name: 'Replies' }).getByText(reply)).toBeVisible();
  await ilseContext.close();

  // Kofi sees the reply (after a reload at the latest) and resolves the thread.
  await page.reload();
  await expect(page.getByRole('heading', { name: TEAMMATES_MAP })).toBeVisible({ timeout: 60_000 });
  await page.getByRole('button', { name: pinTitle }).locator('text').click();
  const again = page.getByRole('article', { name: `Thread: ${pinTitle}` });
  await expect(again.getByRole('list', { name: 'Replies' }).getByText(reply)).toBeVisible({ timeout: 30_000 });
  await expect(again).toContainText('Ilse Varga');
  await guideShot(page, 'pin-thread');
  await again.getByRole('button', { name: /Resolve/ }).click();
  await expect(again.getByRole('button', { name: /Reopen/ })).toBeVisible();
  await expect(again.getByText('Resolved', { exact: true })).toBeVisible();
  await expect(page.getByRole('button', { name: pinTitle })).toHaveAttribute('data-status', 'resolved');
});
