import { expect, test } from '@playwright/test';
import { DEMO, VIEWPORT, bandTopY, ensureDemoData, guideShot, openMapByTitle, signIn, probeMagnesiumAt20T, speciesX, waitForComputedMap } from './support/journey';

// The user guide's worked question, on the demo data exactly as `npm start` seeds it: "which of these species have a
// field-induced state that survives at 4 K in a 20 T magnet, and how strongly bound is it?" (docs/guide/README.md).
// A newcomer signs in as the demo viewer, opens the 4 K map, reads the survivors at the top of the 20 T band and
// probes magnesium there. Also takes the guide's screenshots of these steps.

test.use({ viewport: VIEWPORT });
test.describe.configure({ timeout: 420_000 });

test.beforeAll(() => ensureDemoData());

test('the guide’s question is answered from the demo: magnesium survives 4 K at 20 T, bound by about 70 µeV in m = 0', async ({ page }) => {
  await signIn(page, DEMO.viewer);
  await expect(page.getByTestId('team-switcher')).toContainText(DEMO.team);
  await expect(page.getByRole('link', { name: DEMO.maps.lab4K, exact: true })).toBeVisible();
  await guideShot(page, 'maps-list');

  await openMapByTitle(page, DEMO.maps.lab4K);
  await expect(page.getByTestId('save-state')).toContainText('Read only: you are a viewer of this team');
  await waitForComputedMap(page);
  // Ion motion is applied: the regions are survivors of a 4 K ensemble observed for 1 s.
  await expect(page.getByRole('complementary', { name: 'Legend' })).toContainText('Survivors: states that last the observation time', { timeout: 120_000 });
  await expect(page.getByText(/Ion motion: a state is bound when its width/)).toBeVisible();
  await guideShot(page, 'map-4K');

  // Magnesium at the top of the group magnet's band (20 T).
  const x = await speciesX(page, 'Mg');
  const y = await bandTopY(page, 'Group magnet (up to 20 T)');
  const { cells, headers } = await probeMagnesiumAt20T(page, x, y);
  // …and it lasts the observation time for the 4 K ensemble: the class column says bound.
  const classColumn = headers.indexOf('Class');
  expect(classColumn).toBeGreaterThan(-1);
  expect(cells[classColumn]).toMatch(/^bound/);
  await guideShot(page, 'probe-4K');
});
