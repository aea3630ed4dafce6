import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { expectNoSeriousA11yViolations, screenshot, signInThroughForm, signOutThroughShell, startBrowserHarness, type BrowserHarness } from '../helpers/browser';
import { DEMO_USERS } from '../../scripts/lib/demo-users';

let h: BrowserHarness;

beforeAll(async () => {
  h = await startBrowserHarness();
  const { seedDemo } = await import('../../scripts/lib/demo-seed');
  await seedDemo();
});
afterAll(async () => h?.close());

describe('signing in as each demo role', () => {
  it('shows the sign-in page without serious accessibility problems', async () => {
    const page = await h.context.newPage();
    await page.goto(`${h.baseUrl}/planner`);
    await page.getByRole('heading', { name: 'Sign in to your studio' }).waitFor();
    expect(page.url()).toContain('/sign-in?next=%2Fplanner');
    await expectNoSeriousA11yViolations(page);
    await screenshot(page, 'sign-in');
    await page.close();
  });

  it('refuses a wrong password with a readable message', async () => {
    const page = await h.context.newPage();
    await page.goto(`${h.baseUrl}/sign-in`);
    await page.getByLabel('E-mail').fill(DEMO_USERS[0].email);
    await page.getByLabel('Password').fill('wrong-password-here');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => page.getByRole('alert').textContent()).toContain('do not match');
    await page.close();
  });

  for (const user of DEMO_USERS) {
    it(`signs in as the ${user.role}, sees the role and the sections, and signs out`, async () => {
      const page = await h.context.newPage();
      await signInThroughForm(page, h.baseUrl, user.email, user.password);
      const nav = page.getByRole('navigation', { name: 'Sections' });
      const sections = user.role === 'retoucher' ? ['Planner', 'Kit', 'Studio', 'Handed to me'] : ['Planner', 'Sessions', 'Kit', 'Studio'];
      for (const section of sections) await expect.poll(() => nav.getByRole('link', { name: section }).count()).toBe(1);
      await page.getByRole('link', { name: 'Studio' }).click();
      await page.getByRole('heading', { name: 'Members' }).waitFor();
      const roleLabel = user.role[0].toUpperCase() + user.role.slice(1);
      await expect.poll(() => page.locator('header').textContent()).toContain(roleLabel);
      // Only an owner sees the invitation form.
      expect(await page.getByRole('heading', { name: 'Invite someone' }).count()).toBe(user.role === 'owner' ? 1 : 0);
      if (user.role === 'owner') {
        await expectNoSeriousA11yViolations(page);
        await screenshot(page, 'studio-members');
      }
      await signOutThroughShell(page);
      await page.close();
    });
  }
});
