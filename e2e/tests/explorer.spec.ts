import { expect, test, type Page } from '@playwright/test';
import { levels, motionStates, teslaToAtomic, toHartree, hartreeTo, type Tesla } from '@fieldbound/shared';
import { DEMO, VIEWPORT, ensureDemoData, mapOverlay, openMapByTitle, signIn, waitForComputedMap } from './support/journey';

// The map explorer on the demo map with ion motion: contours drawn, a probed point whose numbers match the engine's
// own output for the same α and B (computed here, in the test process, with the built engine), a zoom, a save and a
// reload that finds the same view (zoom window, shown orbital, probe point) from the URL.

test.use({ viewport: VIEWPORT });
test.describe.configure({ timeout: 420_000 });

/** Reads a number as the interface writes it: "2.4 × 10⁻⁹", "10⁻⁹", "0.0421", "−3". */
function readNumber(text: string): number {
  const sup: Record<string, string> = { '⁰': '0', '¹': '1', '²': '2', '³': '3', '⁴': '4', '⁵': '5', '⁶': '6', '⁷': '7', '⁸': '8', '⁹': '9', '⁻': '-' };
  const t = text.trim().replace(/−/g, '-');
  const m = /^(-?[\d.]+)?\s*(?:×\s*)?(?:10([⁻⁰¹²³⁴⁵⁶⁷⁸⁹]+))?$/.exec(t);
  if (!m || (m[1] === undefined && m[2] === undefined)) return Number.NaN;
  const exponent = m[2] ? Number([...m[2]].map((c) => sup[c]).join('')) : 0;
  return (m[1] === undefined ? 1 : Number(m[1])) * 10 ** exponent;
}

/** Relative agreement to the figures shown: a value written with d significant figures is within 5·10⁻ᵈ. */
function expectShown(text: string, expected: number, digits: number) {
  const shown = readNumber(text);
  expect(Number.isFinite(shown), `"${text}" is a number`).toBe(true);
  expect(Math.abs(shown / expected - 1), `${text} against the engine's ${expected}`).toBeLessThanOrEqual(5 * 10 ** -digits * 1.0001);
}

async function probeTable(page: Page) {
  const probe = page.getByRole('dialog', { name: 'Probe' });
  // The states' table (the point's own α, B and r_c above it are rows too).
  await expect(probe.locator('.ant-table-tbody tr.ant-table-row').first()).toBeVisible({ timeout: 60_000 });
  const headers = await probe.getByRole('columnheader').allInnerTexts();
  const rows = await probe.locator('.ant-table-tbody tr.ant-table-row').evaluateAll((trs) => trs.map((tr) => [...tr.querySelectorAll('td')].map((td) => (td as unknown as { innerText: string }).innerText)));
  return { headers, rows };
}

function probeParam(url: string): { alpha: number; tesla: number } {
  const text = new URL(url).searchParams.get('probe');
  expect(text, 'the probe point is in the URL').not.toBeNull();
  const [alpha, tesla] = text!.split(',').map(Number);
  return { alpha, tesla };
}

test('the explorer draws the 4 K demo map, probes a point with the engine’s numbers, zooms, saves and reopens the same view', async ({ page }) => {
  ensureDemoData();
  await signIn(page, DEMO.editorA);
  await openMapByTitle(page, DEMO.maps.lab4K);
  await waitForComputedMap(page);
  // Contours: survivor regions (ion motion applied) and labelled binding-energy iso-lines.
  await expect(page.locator('.map-view path.region').first()).toBeAttached({ timeout: 60_000 });
  await expect(page.locator('.map-view path.iso-line').first()).toBeAttached();
  await expect(page.getByText(/Ion motion: a state is bound when its width/)).toBeVisible();

  // Probe a point: the panel's numbers against the engine's own levels and motionStates at the same α and B.
  const box = (await mapOverlay(page).boundingBox())!;
  // Dispatched on the plot's own layer: the demo's pins (drawn above it) must not take the click.
  await mapOverlay(page).dispatchEvent('click', { clientX: box.x + box.width * 0.62, clientY: box.y + box.height * 0.4, bubbles: true });
  await expect(page).toHaveURL(/probe=/);
  const point = probeParam(page.url());
  const { headers, rows } = await probeTable(page);
  const col = (start: string) => headers.findIndex((h) => h.startsWith(start));
  expect(headers[col('Binding energy')]).toBe('Binding energy (µeV)');
  // The demo map's setup (backend/src/demo/demo-maps.ts): r_c = 2 a₀, m = 0…5, floor 10⁻³ K, thermal ions at 4 K of
  // mass number 24, observation time 1 s.
  const fieldAu = teslaToAtomic(point.tesla as Tesla) as number;
  const states = levels({ alpha: point.alpha, fieldAu, cutoffBohr: 2, mMax: 5, energyFloorHartree: toHartree('K', 1e-3) });
  const motion = motionStates({
    fieldAu,
    states: states.map((s) => ({ m: s.m, nu: s.nu, bindingHartree: s.flags.includes('below-floor') ? 0 : s.bindingHartree })),
    motion: { massNumber: 24, observationTimeSeconds: 1, temperatureKelvin: 4 },
  });
  expect(rows).toHaveLength(states.length);
  let checkedWidths = 0;
  states.forEach((s, k) => {
    const row = rows[k];
    expect(row[0]).toBe(String(s.m));
    expect(row[1]).toBe(String(s.nu));
    expectShown(row[col('Binding energy')], hartreeTo('ueV', s.bindingHartree as never) as number, 4);
    expectShown(row[col('ε/B')], s.bindingOverB, 3);
    if (s.flags.includes('below-floor')) {
      expect(row[col('Class')]).toContain('below floor');
      return;
    }
    const mv = motion[k];
    expect(row[col('Class')]).toContain(mv.class);
    // Thermal ions: the share of the ensemble that stays bound, in per cent to 3 figures.
    const share = /([^\n]+) % bound/.exec(row[col('Class')]);
    expect(share, 'the bound fraction is shown').not.toBeNull();
    if (mv.fractions!.bound === 0) expect(share![1]).toBe('0');
    else expectShown(share![1], 100 * mv.fractions!.bound, 3);
    const width = row[col('Width Γ')];
    const lifetime = row[col('Lifetime')];
    if (mv.widthHartree === 0) {
      expect(width).toBe('0');
      expect(lifetime).toBe('∞');
    } else if (mv.widthHartree === Infinity) {
      expect(width).toBe('destroyed');
    } else {
      expectShown(width, hartreeTo('ueV', mv.widthHartree as never) as number, 3);
      expectShown(lifetime, mv.lifetimeSeconds, 3);
      checkedWidths++;
    }
  });
  test.info().annotations.push({ type: 'probe', description: `α = ${point.alpha} a₀³, B = ${point.tesla} T: ${states.length} states, ${checkedWidths} finite widths` });

  // Zoom in around the middle of the map's uncovered part (the open probe lies over its right side): the window is
  // recomputed and kept in the URL.
  const drawer = (await page.getByRole('dialog', { name: 'Probe' }).boundingBox())!;
  const uncovered = Math.min(box.width, drawer.x - box.x);
  expect(uncovered, 'the probe leaves part of the map in view').toBeGreaterThan(100);
  // The map is redrawn beside the open probe (its plot ends left of the drawer), so the probed point stays in view.
  await expect.poll(async () => {
    const plot = (await mapOverlay(page).boundingBox())!;
    return plot.x + plot.width <= drawer.x + 1;
  }).toBe(true);
  const marker = (await page.locator('.map-view .probe-marker').boundingBox())!;
  expect(marker.x + marker.width, 'the probed point is left of the probe').toBeLessThanOrEqual(drawer.x);
  await mapOverlay(page).hover({ position: { x: uncovered / 2, y: box.height / 2 } });
  for (let k = 0; k < 3; k++) await page.mouse.wheel(0, -240);
  await expect(page).toHaveURL(/[?&]alpha=[^&]+/, { timeout: 30_000 });
  await expect(page.getByRole('button', { name: 'Show the whole map' })).toBeEnabled();
  await expect(page.getByRole('status', { name: 'Computation progress' })).toHaveCount(0, { timeout: 240_000 });

  // Show orbital m = 1 (view state: kept in the URL), change the contour levels (content) and save.
  const version = Number(/version (\d+)/.exec(await page.getByTestId('save-state').innerText())![1]);
  await page.getByRole('combobox', { name: 'Regions show' }).first().click();
  await page.locator('.ant-select-item-option').filter({ hasText: /^Orbital m = 1$/ }).first().click();
  await expect(page).toHaveURL(/show=m1/);
  const contours = page.getByLabel('Binding-energy contours');
  // Levels that differ from the saved ones (a database kept from an earlier run may already hold the first choice).
  const newLevels = (await contours.inputValue()) === '0.5, 5, 50' ? '0.4, 4, 40' : '0.5, 5, 50';
  await contours.fill(newLevels);
  await contours.press('Enter');
  await expect(page.getByTestId('save-state')).toContainText('Unsaved changes');
  await expect(page.locator('.map-view path.iso-line[data-level-kelvin]')).not.toHaveCount(0);
  await page.getByRole('button', { name: /^(save )?Save$/ }).click();
  await expect(page.getByTestId('save-state')).toContainText(`Saved · version ${version + 1}`);

  const before = new URL(page.url());
  const xTicks = async () => (await page.locator('.map-view svg[role="img"] g.tick text').allInnerTexts()).join('|');
  const ticksBefore = await xTicks();
  const probeBefore = await probeTable(page);

  // Reload: the same view comes back from the URL and the saved setup.
  await page.reload();
  await expect(page.getByRole('heading', { name: DEMO.maps.lab4K })).toBeVisible({ timeout: 60_000 });
  const after = new URL(page.url());
  for (const key of ['alpha', 'field', 'show', 'probe']) expect(after.searchParams.get(key), key).toBe(before.searchParams.get(key));
  await expect(page.getByTestId('save-state')).toContainText(`Saved · version ${version + 1}`);
  await expect(page.getByRole('button', { name: 'Show the whole map' })).toBeEnabled();
  await expect(page.getByText('Orbital m = 1', { exact: true }).first()).toBeVisible();
  await expect(page.getByLabel('Binding-energy contours')).toHaveValue(newLevels);
  await expect.poll(xTicks, { timeout: 60_000 }).toBe(ticksBefore);
  const probeAfter = await probeTable(page);
  expect(probeAfter.rows).toEqual(probeBefore.rows);
});
