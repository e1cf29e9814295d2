import type { Page } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import type { RunningServer } from '../../server/index.ts';
import { CSRF_COOKIE, CSRF_HEADER } from '../../shared/auth/schemas.ts';
import { launchBrowser, signIn, startAppServer } from './browser.ts';

type Browser = Awaited<ReturnType<typeof launchBrowser>>;

/**
 * A stand-in for an object that exists only once `beforeAll` has run: each property read goes to the object of
 * that moment. So a file can write `const { server, browser } = useBrowserSession()` at the top and use
 * `server.url` and `browser.context` in its tests and helpers as if they were plain variables.
 */
function whenStarted<T extends object>(current: () => T | undefined, what: string): T {
  return new Proxy({} as T, {
    get(_, key) {
      const target = current();
      if (!target) throw new Error(`The ${what} starts in beforeAll: read it inside a test or hook.`);
      const value: unknown = Reflect.get(target, key);
      return typeof value === 'function' ? value.bind(target) : value;
    },
  });
}

/**
 * The built app on a free port and one Chromium for the whole file: started before the first test,
 * closed after the last. Read `server` and `browser` inside tests and hooks (they exist from then on).
 */
export function useBrowserSession(options: Parameters<typeof launchBrowser>[0] = {}): {
  readonly server: RunningServer;
  readonly browser: Browser;
} {
  let server: RunningServer | undefined;
  let browser: Browser | undefined;
  beforeAll(async () => {
    server = await startAppServer();
    browser = await launchBrowser(options);
  });
  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });
  return { server: whenStarted(() => server, 'app server'), browser: whenStarted(() => browser, 'browser') };
}

/**
 * Signs `who` in through the sign-in page at the given size, from a clean cookie jar (so the
 * browser's earlier person is gone), and waits until the app has left the sign-in page.
 */
export async function signInThroughPage(
  page: Page,
  baseUrl: string,
  who: { email: string; password: string },
  size: { width: number; height: number },
): Promise<void> {
  await page.context().clearCookies();
  await page.setViewportSize(size);
  await page.goto(`${baseUrl}/sign-in`);
  await signIn(page, who.email, who.password);
  await page.waitForURL((url) => url.pathname !== '/sign-in');
}

/** A request as the app makes it, from inside the page: JSON with the CSRF header from its cookie. */
export async function callApi<T>(page: Page, method: string, url: string, body?: unknown): Promise<T> {
  return page.evaluate(
    async ({ method, url, body, cookie, header }) => {
      const token = decodeURIComponent(
        document.cookie
          .split('; ')
          .find((c) => c.startsWith(`${cookie}=`))
          ?.split('=')[1] ?? '',
      );
      const res = await fetch(url, {
        method,
        credentials: 'same-origin',
        headers: { 'content-type': 'application/json', [header]: token },
        body: body === undefined ? undefined : JSON.stringify(body),
      });
      if (!res.ok) throw new Error(`${method} ${url}: ${res.status} ${await res.text()}`);
      return res.status === 204 ? null : res.json();
    },
    { method, url, body, cookie: CSRF_COOKIE, header: CSRF_HEADER },
  );
}
