import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { screenshot, signIn, watchErrors } from '../support/browser.ts';
import { useBrowserSession } from '../support/browser-session.ts';
import { formatFileSize } from '../../shared/units.ts';
import { createUser } from '../support/factories.ts';

/** "Your data" and "Delete my account" on the profile (issue 17), each with its own throwaway account. */
const { server, browser } = useBrowserSession({ acceptDownloads: true });

async function signedInOnProfile(email: string, password: string, width: number) {
  await browser.context.clearCookies();
  const page = await browser.context.newPage();
  await page.setViewportSize({ width, height: 812 });
  await page.goto(`${server.url}/sign-in?next=%2Fprofile`);
  await signIn(page, email, password);
  await page.waitForURL(/\/profile$/);
  return page;
}

describe('the profile’s data and account cards', () => {
  it('"Download all my data" downloads the whole export as a .zip', async () => {
    const { user, password } = await createUser({ name: 'Wren Export', email: `wren-${Date.now()}@example.test` });
    const page = await signedInOnProfile(user.email, password, 375);
    const errors = watchErrors(page);
    const link = page.getByRole('link', { name: 'Download all my data (.zip)' });
    await expect.poll(() => link.count()).toBe(1);
    const [download] = await Promise.all([page.waitForEvent('download'), link.click()]);
    expect(download.suggestedFilename()).toMatch(/^pacewright-export-\d{4}-\d{2}-\d{2}\.zip$/);
    const file = await download.path();
    // A zip starts with the local file header signature "PK\x03\x04" (PKWARE APPNOTE.TXT, 4.3.7).
    expect(readFileSync(file).subarray(0, 4).toString('binary')).toBe('PK\u0003\u0004');
    expect(errors).toEqual([]);
    await page.close();
  });

  it("the storage line reads the account's own figures from GET /api/me/storage, at 375 and 1280 px", async () => {
    const { user, password } = await createUser({ name: 'Wren Storage', email: `wren-storage-${Date.now()}@example.test` });
    for (const width of [375, 1280]) {
      const page = await signedInOnProfile(user.email, password, width);
      const errors = watchErrors(page);
      const answer = await page.request.get(`${server.url}/api/me/storage`);
      expect(answer.status()).toBe(200);
      const usage = (await answer.json()) as { used_bytes: number; quota_bytes: number; files: number };
      expect(usage.quota_bytes).toBeGreaterThan(0);
      const line = page.getByText(/^Storage: .* used \(/);
      await expect.poll(() => line.count()).toBe(1);
      // The figures are the API's, in the file-size words of shared/units.ts.
      await expect
        .poll(() => line.textContent())
        .toBe(
          `Storage: ${formatFileSize(usage.used_bytes)} of ${formatFileSize(usage.quota_bytes)} used (${usage.files} original files)`,
        );
      const box = await line.boundingBox();
      expect(box && box.x >= 0 && box.x + box.width <= width).toBe(true);
      await screenshot(page, `profile-storage-${width}`);
      expect(errors).toEqual([]);
      await page.close();
    }
  });

  it('"Delete my account" needs the password and a last confirmation, signs the user out, and the sign-in then fails', async () => {
    const { user, password } = await createUser({ name: 'Ash Leaving', email: `ash-${Date.now()}@example.test` });
    const page = await signedInOnProfile(user.email, password, 1280);
    const form = page.getByRole('form', { name: 'Delete my account' });
    await form.scrollIntoViewIfNeeded();

    // A wrong password: the message sits at the field, nothing is deleted.
    await form.getByLabel('Your password').fill('not my password');
    await form.getByRole('button', { name: 'Delete my account…' }).click();
    await form.getByRole('button', { name: 'Yes, delete everything' }).click();
    await expect.poll(() => form.getByLabel('Your password').getAttribute('aria-invalid')).toBe('true');
    await expect.poll(() => form.textContent()).toMatch(/password/i);
    expect(new URL(page.url()).pathname).toBe('/profile');

    await form.getByLabel('Your password').fill(password);
    await form.getByRole('button', { name: 'Delete my account…' }).click();
    await screenshot(page, 'profile-delete-account-confirm');
    await form.getByRole('button', { name: 'Yes, delete everything' }).click();
    await page.waitForURL(/\/sign-in\?deleted=1$/);
    await expect.poll(() => page.getByText('Your account and everything in it have been deleted.').count()).toBe(1);

    // Signed out: the profile sends to sign-in; and the old credentials no longer sign in.
    await page.goto(`${server.url}/profile`);
    await page.waitForURL(/\/sign-in\?next=%2Fprofile$/);
    await signIn(page, user.email, password);
    await expect.poll(() => page.getByRole('alert').first().textContent()).toMatch(/do not match/);
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await page.close();
  });
});
