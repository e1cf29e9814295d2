import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { startServer, type RunningServer } from '../../server/index.ts';

export const SCREENSHOT_DIR = path.resolve('test-results/screenshots');

/** Debian's Chromium (never a downloaded browser), headless, with a throwaway profile. */
export async function launchBrowser(
  // `timezoneId` sets the browser's clock zone, to show a page does not take its dates from the device.
  options: { bypassCSP?: boolean; acceptDownloads?: boolean; timezoneId?: string } = {},
): Promise<{ context: BrowserContext; close(): Promise<void> }> {
  const profile = mkdtempSync(path.join(tmpdir(), 'pacewright-e2e-'));
  const context = await chromium.launchPersistentContext(profile, {
    // `bypassCSP` lets the accessibility audit inject axe-core; the app's CSP stays on for every other test.
    ...options,
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1200, height: 800 },
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
  return {
    context,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** The built app on a free loopback port, against the e2e database that tests/run.ts seeded. */
export async function startAppServer(): Promise<RunningServer> {
  return startServer({ ...process.env, PORT: '0', HOST: '127.0.0.1', NODE_ENV: 'test', MAIL_CATCHER_PORT: '0' });
}

/**
 * The same, on a port chosen before start so the server's public address (links in e-mails, the
 * calendar feed address) is the one the test can open.
 */
export async function startAppServerWithPublicUrl(): Promise<RunningServer> {
  const port = await new Promise<number>((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      probe.close(() => resolve(typeof address === 'object' && address ? address.port : 0));
    });
  });
  return startServer({
    ...process.env,
    PORT: String(port),
    HOST: '127.0.0.1',
    PUBLIC_URL: `http://127.0.0.1:${port}`,
    NODE_ENV: 'test',
    MAIL_CATCHER_PORT: '0',
  });
}

export async function screenshot(page: Page, name: string): Promise<void> {
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  await page.screenshot({ path: path.join(SCREENSHOT_DIR, `${name}.png`), fullPage: true });
}

/** Collects page errors and failed requests, so a test can assert the page ran cleanly. */
export function watchErrors(page: Page, ignore: RegExp[] = []): string[] {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(String(e)));
  page.on('console', (m) => {
    if (m.type() === 'error' && !ignore.some((r) => r.test(m.text()))) errors.push(m.text());
  });
  page.on('response', (r) => {
    if (r.status() >= 500) errors.push(`${r.status()} ${r.url()}`);
  });
  return errors;
}

export async function signIn(page: Page, email: string, password: string): Promise<void> {
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}
