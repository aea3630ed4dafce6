// The stack page in Chromium: a photographer opens a stack, sees its contact sheet, makes a bundle,
// follows its progress and downloads it; the zip is checked with Info-ZIP's `unzip -t`.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { expectNoSeriousA11yViolations, screenshot, signInThroughForm, startBrowserHarness, type BrowserHarness } from '../helpers/browser';
import { createStudioWithRoles, type StudioFixture } from '../helpers/fixtures';
import { sessionWithCard, sessionsBase, shootBursts, type SortingV } from '../helpers/sessions';
import { startTestWorkers, until } from '../helpers/worker';
import { unzipTest, zipEntries } from '../helpers/bundles';

import { agentFor, type Agent } from '../helpers/api';
let h: BrowserHarness;
let fx: StudioFixture;
let workers: { stop: () => Promise<void> };
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'lamella-e2e-bundle-'));

const apiAgent = (creds: { email: string; password: string }): Promise<Agent> => agentFor(h.baseUrl, creds);

beforeAll(async () => {
  h = await startBrowserHarness();
  fx = await createStudioWithRoles('Bundle Browser Studio');
  workers = await startTestWorkers();
});
afterAll(async () => {
  await workers?.stop();
  await h?.close();
  fs.rmSync(tmp, { recursive: true, force: true });
});

describe('the stack page', () => {
  it('shows the contact sheet, makes a bundle with progress and downloads it', async () => {
    const photographer = await apiAgent(fx.users.photographer);
    const { sessionId, sorting } = await sessionWithCard(photographer, fx.studioId, await shootBursts([{ count: 8, stepS: 3 }], 300, 'DEW'));
    const stack = sorting.stacks[0];
    await photographer.patch(`${sessionsBase(fx.studioId)}/${sessionId}/stacks/${stack.id}`).set('x-csrf-token', photographer.csrf).send({ name: 'Dew on fern, frond tip' }).expect(200);
    await until('previews', async () => {
      const v = (await photographer.get(`${sessionsBase(fx.studioId)}/${sessionId}/sorting`)).body as SortingV;
      return v.stacks[0].frames.every((f) => f.previewStatus === 'done');
    });

    const page = await h.context.newPage();
    await signInThroughForm(page, h.baseUrl, fx.users.photographer.email, fx.users.photographer.password);
    await page.goto(`${h.baseUrl}/sessions/${sessionId}/stacks/${stack.id}`);
    await page.getByRole('heading', { name: 'Dew on fern, frond tip' }).waitFor();
    expect(await page.getByRole('list', { name: 'Frames of Dew on fern, frond tip' }).getByRole('listitem').count()).toBe(8);
    // Opening the page asks for the sheet of this version; it appears once the worker made it.
    const sheet = page.getByRole('img', { name: /Contact sheet of Dew on fern, frond tip/ });
    await sheet.waitFor({ timeout: 60_000 });
    await expect.poll(() => sheet.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth), { timeout: 30_000 }).toBeGreaterThan(0);

    await page.getByRole('button', { name: 'Make bundle' }).click();
    const download = page.getByRole('link', { name: 'Download Dew on fern, frond tip.zip' });
    await download.waitFor({ timeout: 60_000 });
    await expectNoSeriousA11yViolations(page);
    await screenshot(page, 'stack-bundle');

    const [file] = await Promise.all([page.waitForEvent('download'), download.click()]);
    expect(file.suggestedFilename()).toBe('Dew on fern, frond tip.zip');
    const zip = path.join(tmp, 'from-browser.zip');
    await file.saveAs(zip);
    expect(unzipTest(zip)).toMatch(/No errors detected/); // Info-ZIP unzip -t
    expect(zipEntries(zip).filter((e) => /^Dew on fern, frond tip_\d{3}\.jpg$/.test(e))).toHaveLength(8);

    // An edit makes the bundle stale; the page says so and offers a new one.
    const frameId = stack.frames[7].id;
    await photographer.post(`${sessionsBase(fx.studioId)}/${sessionId}/frames/exclusion`).set('x-csrf-token', photographer.csrf).send({ frameIds: [frameId], excluded: true }).expect(200);
    await page.reload();
    await page.getByText(/The stack changed since this bundle was asked for/).waitFor();
    expect(await page.getByRole('button', { name: 'Make bundle' }).count()).toBe(1);
    await page.close();
  });
});
