import { expect, test } from '@playwright/test';
import { DEMO, VIEWPORT, ensureDemoData, guideShot, openMapByTitle, signIn, waitForComputedMap } from './support/journey';

// The lecturer's journey on the demo group: the owner makes a viewing link of the laboratory map (pins included),
// opens it signed out in a second browser context as the students will, and presents it.

test.use({ viewport: VIEWPORT });
test.describe.configure({ timeout: 420_000 });

test.beforeAll(() => ensureDemoData());

test('a lecturer creates a viewing link with pins, opens it signed out and presents the map', async ({ page, browser }) => {
  await signIn(page, DEMO.owner);
  await openMapByTitle(page, DEMO.maps.lab);

  await page.getByRole('button', { name: 'Share' }).click();
  const share = page.getByRole('dialog', { name: `Share “${DEMO.maps.lab}”` });
  await share.getByRole('checkbox').check();
  await share.getByRole('button', { name: 'Create viewing link' }).click();
  const linkField = share.getByRole('textbox', { name: 'New viewing link' });
  await expect(linkField).toHaveValue(/\/view\/[^/]+$/);
  const link = await linkField.inputValue();
  await guideShot(page, 'share-dialog');
  await share.getByRole('button', { name: 'Done' }).click();

  // The room's computer: no account, no cookies.
  const room = await browser.newContext({ viewport: VIEWPORT });
  const screen = await room.newPage();
  await screen.goto(link);
  await expect(screen.getByRole('heading', { name: DEMO.maps.lab })).toBeVisible({ timeout: 60_000 });
  await expect(screen.getByText('Read-only view')).toBeVisible();
  await waitForComputedMap(screen);
  await expect(screen.getByRole('button', { name: /Save/ })).toHaveCount(0);
  await expect(screen.getByRole('complementary', { name: 'Setup' })).toHaveCount(0);
  // The shortlist's species markers come with the link (a visitor cannot read the team's species).
  await expect(screen.locator('.map-view g.species-marker text').filter({ hasText: /^Mg$/ })).toBeVisible();
  // The caution travels with the map.
  await expect(screen.getByText(/Model estimate/)).toBeVisible();
  await guideShot(screen, 'shared-view');

  // Present: the lecture view — the map and its caption only; the arrow keys step through the pins, Esc leaves.
  await screen.getByRole('button', { name: 'Present' }).click();
  const lecture = screen.getByTestId('lecture-view');
  await expect(lecture).toBeVisible();
  await expect(lecture.getByRole('heading', { name: DEMO.maps.lab, level: 1 })).toBeVisible();
  await expect(lecture.getByText(/Model estimates/)).toBeVisible();
  await expect(lecture.locator('.map-view g.species-marker text').filter({ hasText: /^Cd$/ })).toBeVisible();
  await expect(lecture.getByText(/computed in [\d.]+ s/)).toBeVisible({ timeout: 240_000 });
  await expect(lecture.getByTestId('lecture-overview')).toContainText(/\d+ pins/);
  await screen.keyboard.press('ArrowRight');
  await expect(lecture.getByTestId('lecture-current-pin')).toContainText(/Pin 1 of \d+/);
  await guideShot(screen, 'lecture-view');
  await screen.keyboard.press('ArrowRight');
  await expect(lecture.getByTestId('lecture-current-pin')).toContainText(/Pin 2 of \d+/);
  await screen.keyboard.press('Escape');
  await expect(screen.getByTestId('lecture-view')).toHaveCount(0);
  await expect(screen.getByText('Read-only view')).toBeVisible();

  // The link shows in the owner's list as opened once.
  await page.getByRole('button', { name: 'Share' }).click();
  const again = page.getByRole('dialog', { name: `Share “${DEMO.maps.lab}”` });
  await expect(again.getByRole('row').filter({ hasText: /with pins/ }).first()).toBeVisible();
  await room.close();
});

test('the demo lecture link opens for anyone without an account', async ({ browser }) => {
  const context = await browser.newContext({ viewport: VIEWPORT });
  const page = await context.newPage();
  await page.goto(`/view/${DEMO.lectureToken}`);
  await expect(page.getByRole('heading', { name: DEMO.maps.lab })).toBeVisible({ timeout: 60_000 });
  await expect(page.getByText('Read-only view')).toBeVisible();
  await context.close();
});
