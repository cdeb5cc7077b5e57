import { expect, test } from '@playwright/test';
import { createMapFromPreset, registerWithTeam, unique, waitForComputedMap } from './support/journey';

// One journey: an editor creates a map from a preset, sees it computed, saves an edit, reloads and finds it; shares it
// with a viewing link that a signed-out visitor opens read-only; revokes the link and the visitor is refused.

// Computing a 256 × 256 map in the browser's workers on a possibly busy 2-core machine takes a while.
test.describe.configure({ timeout: 300_000 });


test('an editor creates, computes, saves and shares a map; a signed-out visitor opens the link read-only until it is revoked', async ({ page, browser }) => {
  const id = unique();
  const title = `Alkali scan ${id}`;
  await registerWithTeam(page.request, { label: 'maps', displayName: 'Ada Mapper', team: `Map group ${id}` });

  await createMapFromPreset(page, title, 'Pulsed-field facilities');
  await expect(page.getByRole('heading', { name: title })).toBeVisible({ timeout: 60_000 });
  await waitForComputedMap(page);
  await expect(page.getByTestId('save-state')).toContainText('Saved · version 1');

  // Edit the setup (the observation time applies without recomputing), save, reload, and find it.
  const observation = page.getByLabel('Observation time', { exact: true });
  await observation.fill('2.5');
  await observation.press('Tab');
  await expect(page.getByTestId('save-state')).toContainText('Unsaved changes');
  await page.getByRole('button', { name: /Save$/ }).click();
  await expect(page.getByTestId('save-state')).toContainText('Saved · version 2');
  await page.reload();
  await expect(page.getByRole('heading', { name: title })).toBeVisible({ timeout: 60_000 });
  await expect(page.getByLabel('Observation time', { exact: true })).toHaveValue('2.5');
  await expect(page.getByTestId('save-state')).toContainText('Saved · version 2');

  // Share: a read-only link, shown once.
  await page.getByRole('button', { name: 'Share' }).click();
  const share = page.getByRole('dialog', { name: `Share “${title}”` });
  await share.getByRole('button', { name: 'Create viewing link' }).click();
  const linkField = share.getByRole('textbox', { name: 'New viewing link' });
  await expect(linkField).toHaveValue(/\/view\//);
  const link = await linkField.inputValue();

  // A visitor with no account.
  const visitor = await browser.newContext();
  const guest = await visitor.newPage();
  await guest.goto(link);
  await expect(guest.getByRole('heading', { name: title })).toBeVisible({ timeout: 60_000 });
  await expect(guest.getByText('Read-only view')).toBeVisible();
  await waitForComputedMap(guest);
  await expect(guest.getByRole('button', { name: /Save/ })).toHaveCount(0);
  await expect(guest.getByRole('complementary', { name: 'Setup' })).toHaveCount(0);

  // Revoke it; the visitor's next visit is refused.
  await share.getByRole('button', { name: 'Revoke' }).click();
  await page.locator('.ant-popconfirm-buttons').getByRole('button', { name: 'Revoke' }).click();
  await expect(share.getByText(/^revoked/)).toBeVisible();
  await guest.reload();
  await expect(guest.getByText('This viewing link does not work')).toBeVisible({ timeout: 60_000 });
  await expect(guest.getByRole('heading', { name: title })).toHaveCount(0);
  await visitor.close();
});
