import { describe, expect, it } from 'vitest';
import { SESSION_COOKIE } from '../../shared/auth/schemas.ts';
import { createUser } from '../support/factories.ts';
import { screenshot, signIn, watchErrors } from '../support/browser.ts';
import { useBrowserSession } from '../support/browser-session.ts';

const { server, browser } = useBrowserSession();

/** What a copied session cookie gets from the server now. */
async function statusWithCookie(cookie: string): Promise<number> {
  return (await fetch(`${server.url}/api/auth/me`, { headers: { Cookie: `${SESSION_COOKIE}=${cookie}` } })).status;
}

describe('password and sign-ins on the profile (issue 13 #3)', () => {
  it('a runner changes the password (this browser stays signed in), then signs out everywhere; a copied cookie gets 401', async () => {
    const { user, password } = await createUser({ name: 'Teal Ferris', email: `teal-${Date.now()}@example.test` });
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    const errors = watchErrors(page, [/401/]);
    await page.goto(`${server.url}/sign-in`);
    await signIn(page, user.email, password);
    await page.waitForURL(/\/log$/);
    const copied = (await browser.context.cookies()).find((c) => c.name === SESSION_COOKIE)!.value;
    expect(await statusWithCookie(copied)).toBe(200);

    await page.goto(`${server.url}/profile`);
    await page.getByLabel('Current password').fill('not my password at all');
    await page.getByLabel('New password').fill('a new evening route');
    await page.getByRole('button', { name: 'Change password' }).click();
    await expect
      .poll(() => page.getByRole('alert').allTextContents())
      .toContain('That is not your current password, so it was not changed.');

    await page.getByLabel('Current password').fill(password);
    await page.getByLabel('New password').fill('a new evening route');
    await page.getByRole('button', { name: 'Change password' }).click();
    await expect
      .poll(() => page.getByRole('status').allTextContents())
      .toContain('Password changed. Other devices are signed out.');
    await screenshot(page, 'profile-password-changed');
    // The session that changed it is the one kept.
    expect(await statusWithCookie(copied)).toBe(200);

    await page.getByRole('button', { name: 'Sign out everywhere' }).click();
    await page.getByRole('button', { name: 'Yes, sign out on every device' }).click();
    await page.waitForURL(/\/sign-in/);
    expect(await statusWithCookie(copied)).toBe(401);

    await signIn(page, user.email, 'a new evening route');
    await page.waitForURL(/\/log$/);
    expect(errors).toEqual([]);
    await page.close();
  });
});
