import type { Page } from 'playwright-core';
import { beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PEOPLE } from '../../db/seeds/01_demo_people.ts';
import { screenshot } from '../support/browser.ts';
import { callApi, signInThroughPage, useBrowserSession } from '../support/browser-session.ts';
import {
  DESKTOP,
  MIN_TARGET,
  PHONE,
  PHONE_MIN_TARGET,
  auditAccessibility,
  auditLayout,
  type Finding,
} from '../support/page-audit.ts';

/**
 * Every page at 375×812 and 1280×800, signed out and as each demo role (issue 17): no sideways
 * scrolling, no clipped box, primary table columns on screen, targets of 44 px on phones and 24 px
 * everywhere, a visible focus for hidden file inputs, and no serious or critical axe-core violation.
 * The rules live in tests/support/page-audit.ts; screenshots go to test-results/screenshots/audit-*.
 */
type Role = 'signed-out' | 'runner' | 'coach' | 'admin';
type AuditedPage = { name: string; path: string | ((page: Page) => Promise<string>) };

const person = (role: 'runner' | 'coach' | 'admin') => DEMO_PEOPLE.find((p) => p.role === role)!;

const firstRun = async (page: Page) => {
  const { runs } = await callApi<{ runs: { id: string }[] }>(page, 'GET', '/api/runs?per_page=1');
  return `/runs/${runs[0]!.id}`;
};
const longRunFuelPlan = async (page: Page) => {
  const { plans } = await callApi<{ plans: { id: string; title: string }[] }>(page, 'GET', '/api/plans');
  const long = plans.find((p) => /long run/i.test(p.title)) ?? plans[0]!;
  // A fuel plan with every column filled (a caffeinated gel, a bottle with refills), so its schedule and hourly tables are audited.
  const { item: gel } = await callApi<{ item: { id: string } }>(page, 'POST', '/api/fuel-items', {
    name: 'Audit gel with caffeine',
    serving: '1 gel',
    carbohydrate_g: 25,
    sodium_mg: 60,
    caffeine_mg: 50,
    fluid_ml: 0,
  });
  await callApi(page, 'PUT', `/api/plans/${long.id}/fuel-plan`, {
    body_mass_kg: 58,
    easy_pace_s_per_km: 360,
    expected_duration_s: 3 * 3600,
    start_clock: '07:30',
    bottles: [{ id: 'A', volume_ml: 500, contents: [] }],
    intakes: [
      { item_id: gel.id, servings: 1, when: { type: 'every_time', every_s: 40 * 60 } },
      { bottle: 'A', ml: 150, when: { type: 'every_time', every_s: 20 * 60 } },
    ],
  });
  return `/plan/${long.id}/fuel`;
};
const firstWeekReview = async (page: Page) => {
  await page.goto(`${page.url().split('/').slice(0, 3).join('/')}/squad`);
  const link = page.locator('a[href*="/week/"]').first();
  await link.waitFor();
  return (await link.getAttribute('href'))!;
};
/** The coach's view of a squad runner's plan (week or month), reached from the squad overview. */
const firstRunnerPlan = (view: 'week' | 'month') => async (page: Page) => {
  await page.goto(`${page.url().split('/').slice(0, 3).join('/')}/squad`);
  const link = page.locator('a[href$="/plan"], a[href*="/plan?"]').first();
  await link.waitFor();
  const href = (await link.getAttribute('href'))!.split('?')[0]!;
  return view === 'month' ? `${href}?view=month` : href;
};

const PAGES: Record<Role, AuditedPage[]> = {
  'signed-out': [
    { name: 'sign-in', path: '/sign-in' },
    { name: 'sign-up', path: '/sign-up' },
    { name: 'sign-up-confirm', path: '/sign-up/confirm/not-a-real-token' },
    { name: 'forgot-password', path: '/forgot-password' },
    { name: 'reset-password', path: '/reset-password/not-a-real-token' },
    { name: 'invitation', path: '/invite/not-a-real-token' },
    { name: 'notices-off', path: '/notices/off/not-a-real-token' },
    { name: 'not-found', path: '/no-such-page' },
  ],
  runner: [
    { name: 'log', path: '/log' },
    { name: 'run', path: firstRun },
    { name: 'plan-week', path: '/plan' },
    { name: 'plan-month', path: '/plan?view=month' },
    { name: 'my-week', path: '/week' },
    { name: 'tools', path: '/tools' },
    { name: 'fuel', path: '/fuel' },
    { name: 'session-fuel-plan', path: longRunFuelPlan },
    { name: 'goal-race-fuel-plan', path: '/goal-race/fuel' },
    { name: 'profile', path: '/profile' },
  ],
  coach: [
    { name: 'log', path: '/log' },
    { name: 'squad', path: '/squad' },
    { name: 'week-review', path: firstWeekReview },
    { name: 'plan', path: '/plan' },
    { name: 'runner-plan-week', path: firstRunnerPlan('week') },
    { name: 'runner-plan-month', path: firstRunnerPlan('month') },
    { name: 'tools', path: '/tools' },
    { name: 'profile', path: '/profile' },
  ],
  admin: [
    { name: 'admin', path: '/admin' },
    { name: 'log', path: '/log' },
    { name: 'profile', path: '/profile' },
  ],
};

const session = useBrowserSession({ bypassCSP: true });
let page: Page;

beforeAll(async () => {
  page = await session.browser.context.newPage();
});

/** Opens the page at one size, waits for its data, photographs it and runs every rule. */
async function auditAt(path: string, size: { width: number; height: number }, shot: string): Promise<Finding[]> {
  await page.setViewportSize(size);
  await page.goto(`${session.server.url}${path}`);
  await page.waitForLoadState('networkidle');
  await page.locator('h1').first().waitFor();
  await page.evaluate(() => document.fonts.ready);
  await screenshot(page, shot);
  const phone = size.width === PHONE.width;
  const findings = [...(await auditLayout(page, phone ? PHONE_MIN_TARGET : MIN_TARGET)), ...(await auditAccessibility(page))];
  const label = `${size.width}px`;
  return findings.map((f) => ({ rule: f.rule, detail: `${label} ${f.detail}` }));
}

for (const role of Object.keys(PAGES) as Role[]) {
  describe(`every page ${role === 'signed-out' ? 'signed out' : `as the demo ${role}`}, at 375 and 1280 px`, () => {
    beforeAll(async () => {
      if (role === 'signed-out') {
        await session.browser.context.clearCookies();
        return;
      }
      await signInThroughPage(page, session.server.url, person(role), DESKTOP);
    });

    for (const audited of PAGES[role]) {
      it(`${audited.name}: no sideways scroll, primary columns on screen, targets large enough, no serious axe finding`, async () => {
        const path = typeof audited.path === 'string' ? audited.path : await audited.path(page);
        const findings = [
          ...(await auditAt(path, PHONE, `audit-${role}-${audited.name}-375`)),
          ...(await auditAt(path, DESKTOP, `audit-${role}-${audited.name}-1280`)),
        ];
        expect(findings, `${role} ${path}`).toEqual([]);
      });
    }
  });
}
