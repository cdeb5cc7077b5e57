import { expect, test } from '@playwright/test';

test('the app opens in Chromium with its shell and a connected database', async ({ page }) => {
  await page.goto('/');
  // Signed out: the app asks to sign in, and will come back to / afterwards.
  await expect(page).toHaveURL(/\/sign-in\?next=%2F$/);
  await expect(page.getByRole('link', { name: 'Fieldbound home' })).toBeVisible();
  const health = page.getByTestId('health');
  await expect(health).toHaveAttribute('data-state', 'up');
  await expect(health).toContainText('Database connected');
});

test('an unknown address shows the not-found page with a way back', async ({ page }) => {
  await page.goto('/no/such/page');
  await expect(page.getByRole('heading', { name: 'Nothing at this address' })).toBeVisible();
  await expect(page.getByRole('button', { name: 'Go to the maps' })).toBeVisible();
});
