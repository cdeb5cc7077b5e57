import { expect, test, type Page } from '@playwright/test';
import { NEW_ACCOUNT_PASSWORD, unique } from './support/journey';

// One journey: an owner invites a colleague by e-mail; the colleague opens the local mailbox,
// follows the link, creates an account and lands in the team.

// A whole journey with two accounts (argon2 hashing, several page loads) on a possibly busy 2-core machine.
test.describe.configure({ timeout: 180_000 });


async function signUp(page: Page, name: string, email: string) {
  await page.goto('/sign-up');
  await page.getByLabel('Your name').fill(name);
  await page.getByLabel('E-mail address').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(NEW_ACCOUNT_PASSWORD);
  await page.getByLabel('Password again').fill(NEW_ACCOUNT_PASSWORD);
  await page.getByRole('button', { name: 'Create account' }).click();
}

async function createTeam(page: Page, name: string) {
  await expect(page.getByTestId('no-team')).toBeVisible();
  await page.getByLabel('Team name').fill(name);
  await page.getByRole('button', { name: 'Create team' }).click();
  await expect(page.getByTestId('team-switcher')).toContainText(name);
}

async function invite(page: Page, email: string, role: 'viewer' | 'editor' | 'owner') {
  await page.goto('/team');
  await page.getByLabel('E-mail address').fill(email);
  await page.getByRole('combobox', { name: 'Role', exact: true }).click();
  await page.getByTitle(new RegExp(`^${role === 'viewer' ? 'reads' : role === 'editor' ? 'also creates' : 'also manages'}`)).click();
  await page.getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByText(`Invitation sent to ${email}.`)).toBeVisible();
}

async function signOut(page: Page) {
  await page.getByTestId('user-menu').click();
  await page.getByRole('menuitem', { name: 'Sign out' }).click();
  await expect(page).toHaveURL(/\/sign-in/);
}

test('an owner invites a colleague, who accepts from the local mailbox, signs up and sees the team', async ({ page }) => {
  const id = unique();
  const team = `Anion group ${id}`;
  const ownerEmail = `owner-${id}@example.test`;
  const colleagueEmail = `colleague-${id}@example.test`;

  await signUp(page, 'Ada Owner', ownerEmail);
  await createTeam(page, team);
  await invite(page, colleagueEmail, 'editor');
  await page.getByRole('tab', { name: /Invitations/ }).click();
  await expect(page.getByRole('row', { name: new RegExp(colleagueEmail) })).toContainText('pending');
  await signOut(page);

  // The colleague reads the e-mail in the local mailbox and follows its link.
  await page.goto('/dev/mailbox');
  const message = page.getByTestId('mail-message').filter({ hasText: colleagueEmail }).first();
  await expect(message).toContainText(`Join ${team} on Fieldbound`);
  await message.getByRole('link', { name: /\/invitations\// }).click();

  await expect(page.getByRole('heading', { name: `Join ${team}` })).toBeVisible();
  await expect(page.getByText('editor — also creates, edits and deletes maps and pins')).toBeVisible();
  await page.getByLabel('Your name').fill('Lise Colleague');
  await page.getByLabel('Password', { exact: true }).fill(NEW_ACCOUNT_PASSWORD);
  await page.getByLabel('Password again').fill(NEW_ACCOUNT_PASSWORD);
  await page.getByRole('button', { name: 'Create account and join' }).click();

  // In the team, on its maps page.
  await expect(page).toHaveURL(/\/maps$/);
  await expect(page.getByTestId('team-switcher')).toContainText(team);
  await page.goto('/team');
  await expect(page.getByRole('heading', { name: team })).toBeVisible();
  await expect(page.getByText('you are an editor')).toBeVisible();
  await expect(page.getByRole('row', { name: /Ada Owner/ })).toContainText('owner');
  await expect(page.getByRole('row', { name: /Lise Colleague/ })).toContainText('editor');
});

test('a signed-out visitor is sent to sign in and brought back to the page they asked for', async ({ page, request }) => {
  const id = unique();
  const email = `returning-${id}@example.test`;
  const res = await request.post('/api/auth/register', { data: { email, password: NEW_ACCOUNT_PASSWORD, displayName: 'Returning Visitor' } });
  expect(res.status()).toBe(201);
  await page.goto('/profile');
  await expect(page).toHaveURL(/\/sign-in\?next=%2Fprofile$/);
  await page.getByLabel('E-mail address').fill(email);
  await page.getByLabel('Password').fill(NEW_ACCOUNT_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).toHaveURL(/\/profile$/);
  await expect(page.getByText(`Signed in as ${email}.`)).toBeVisible();
  // A reload keeps the session (the refresh cookie brings a new access token).
  await page.reload();
  await expect(page.getByText(`Signed in as ${email}.`)).toBeVisible();
});
