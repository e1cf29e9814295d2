import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PEOPLE } from '../../db/seeds/01_demo_people.ts';
import { generateLakeRun, type Phase } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { screenshot, signIn } from '../support/browser.ts';
import { useBrowserSession } from '../support/browser-session.ts';
import { buildZip } from '../support/zip-builder.ts';

const RUNNER = DEMO_PEOPLE.find((p) => p.email.startsWith('tomas@'))!;
const FILES = 6;

const { server, browser } = useBrowserSession();
let workDir: string;

beforeAll(() => {
  workDir = mkdtempSync(path.join(tmpdir(), 'pacewright-history-'));
});

afterAll(() => {
  if (workDir) rmSync(workDir, { recursive: true, force: true });
});

/** A small history: six short generated runs on days long past (far from the demo data), and one photo. */
function historyZip(): string {
  const phases: Phase[] = [{ kind: 'run', duration_s: 900, speed_mps: 3 }];
  const entries = Array.from({ length: FILES }, (_, i) => {
    const run = generateLakeRun({ start_t: Date.UTC(2019, 3, 1 + i, 12), phases, seed: 40 + i, sample_s: 5 });
    return { name: `2019/run-${i + 1}.gpx`, data: Buffer.from(writeGpx(`Old run ${i + 1}`, [run.points])) };
  });
  entries.push({ name: '2019/photo.jpg', data: Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0, 16]) });
  const file = path.join(workDir, 'history.zip');
  writeFileSync(file, buildZip(entries));
  return file;
}

describe('bringing in a whole history', () => {
  it('uploads a zip on the Log page and watches the progress bar reach the end; the photo is refused with its reason', async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    await page.goto(`${server.url}/sign-in`);
    await signIn(page, RUNNER.email, RUNNER.password);
    await page.waitForURL(/\/log$/);

    await page.getByLabel('Bring in a whole history (.zip)').setInputFiles(historyZip());
    const bar = page.getByRole('progressbar', { name: 'Files imported from the archive' });
    await bar.waitFor({ timeout: 20_000 });
    // The bar survives a reload: the import is in the address.
    await page.waitForURL(/[?&]import=/);
    await page.reload();
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Finished.' }).count(), { timeout: 30_000 }).toBe(1);
    expect(await bar.getAttribute('value')).toBe(String(FILES + 1));
    expect(await bar.getAttribute('max')).toBe(String(FILES + 1));
    const status = await page.getByRole('status').filter({ hasText: 'Finished.' }).textContent();
    expect(status).toMatch(new RegExp(`${FILES} imported`));
    expect(status).toMatch(/1 refused/);
    await page.getByText(/Why one file was refused/).click();
    expect(await page.getByRole('list', { name: 'Refused files' }).textContent()).toMatch(/photo\.jpg: not a GPS file/);
    await screenshot(page, 'history-import');
    await page.close();
  });
});
