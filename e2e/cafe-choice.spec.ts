// An owner of two cafés moves between them from the staff menu: the page loads again on the
// chosen café, and so does every other tab of the same sign-in (its board belonged to the other
// café). Nobody else sees the chooser.
import { errorsOf, expect, pageAs, test } from './fixtures';
import { shot } from './shots';

test('the owner chooses the second café of the group, and both tabs of the sign-in follow', async ({ browser }) => {
  const team = await pageAs(browser, 'owner', '/admin/team', { width: 1366, height: 900 });
  const choice = team.getByTestId('cafe-choice');
  await expect(choice.locator('option:checked')).toHaveText('Harbour & Hearth Coffee');
  await expect(team.locator('[data-testid="team-row"][data-username="cashier"]')).toBeVisible();

  // a second tab of the same sign-in, on the Bar
  const bar = await team.context().newPage();
  await bar.goto('/bar');
  await expect(bar.getByTestId('cafe-choice').locator('option:checked')).toHaveText('Harbour & Hearth Coffee');
  await expect(bar.getByText('Live', { exact: true })).toBeVisible(); // its socket is open

  await choice.selectOption({ label: 'Ropewalk Coffee Bar' });
  await expect(team.getByTestId('cafe-choice').locator('option:checked')).toHaveText('Ropewalk Coffee Bar');
  await expect(team.locator('[data-testid="team-row"][data-username="rw-cashier"]')).toBeVisible();
  await expect(team.locator('[data-testid="team-row"][data-username="cashier"]')).toHaveCount(0);
  await team.screenshot(shot('cafe-choice-team'));

  // the Bar tab was told over its socket and loaded again on Ropewalk
  await expect(bar.getByTestId('cafe-choice').locator('option:checked')).toHaveText('Ropewalk Coffee Bar');
  await expect(bar.getByText('Live', { exact: true })).toBeVisible();
  await bar.screenshot(shot('cafe-choice-bar'));

  // back home, for the specs that follow on this server
  await team.getByTestId('cafe-choice').selectOption({ label: 'Harbour & Hearth Coffee' });
  await expect(team.locator('[data-testid="team-row"][data-username="cashier"]')).toBeVisible();
  expect(errorsOf(team)).toEqual([]);
  await team.context().close();
});

test('a lead works on their own café only: no chooser', async ({ browser }) => {
  const lead = await pageAs(browser, 'lead', '/pulse');
  await expect(lead.getByRole('navigation', { name: 'Screens' })).toBeVisible();
  await expect(lead.getByTestId('cafe-choice')).toHaveCount(0);
  await lead.context().close();
});
