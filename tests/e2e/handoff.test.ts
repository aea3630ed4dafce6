// Hand-off in Chromium: a photographer hands a ready stack to the demo retoucher, who downloads the
// bundle (checked with Info-ZIP's unzip) and sends back the merged picture; an outside retoucher
// does the same through a share link; the photographer sees both stacks merged.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fs from 'node:fs';
import sharp from 'sharp';
import type { Download, Locator, Page } from 'playwright-core';
import { expectNoSeriousA11yViolations, screenshot, signInThroughForm, signOutThroughShell, startBrowserHarness, type BrowserHarness } from '../helpers/browser';
import { sessionsBase, shootBursts, sessionWithCard, type SortingV } from '../helpers/sessions';
import { startTestWorkers, until } from '../helpers/worker';
import { checkZip } from '../helpers/handoff';
import { DEMO_USERS } from '../../scripts/lib/demo-users';

import { agentFor, type Agent } from '../helpers/api';
let h: BrowserHarness;
let workers: { stop: () => Promise<void> };
let photographerApi: Agent;
let studioId: string;
const photographer = DEMO_USERS.find((u) => u.role === 'photographer')!;
const retoucher = DEMO_USERS.find((u) => u.role === 'retoucher')!;

const apiAgent = (creds: { email: string; password: string }): Promise<Agent> => agentFor(h.baseUrl, creds);

/** A ready stack with its previews made, renamed so pages can tell the two stacks apart. */
async function readyStack(name: string, prefix: string) {
  const { sessionId, sorting } = await sessionWithCard(photographerApi, studioId, await shootBursts([{ count: 6, stepS: 3 }], 300, prefix));
  const stack = sorting.stacks[0];
  const url = `${sessionsBase(studioId)}/${sessionId}/stacks/${stack.id}`;
  await photographerApi.patch(url).set('x-csrf-token', photographerApi.csrf).send({ name }).expect(200);
  await photographerApi.post(`${url}/state`).set('x-csrf-token', photographerApi.csrf).send({ state: 'ready' }).expect(200);
  await until('previews', async () => {
    const v = (await photographerApi.get(`${sessionsBase(studioId)}/${sessionId}/sorting`)).body as SortingV;
    return v.stacks[0].frames.every((f) => f.previewStatus === 'done');
  });
  return { sessionId, stackId: stack.id, frameNames: stack.frames.map((f) => f.fileName) };
}

const mergedPicture = () => sharp({ create: { width: 640, height: 427, channels: 3, background: { r: 70, g: 120, b: 80 } } }).jpeg({ quality: 85 }).toBuffer();

async function downloadedZip(page: Page, link: Locator): Promise<Buffer> {
  const [file]: [Download, void] = await Promise.all([page.waitForEvent('download'), link.click()]);
  const saved = await file.path();
  return fs.readFileSync(saved);
}

async function uploadMerged(scope: Locator | Page, fileName: string) {
  await scope.getByLabel(/Merged picture/).setInputFiles({ name: fileName, mimeType: 'image/jpeg', buffer: await mergedPicture() });
  await scope.getByRole('button', { name: 'Upload merged result' }).click();
}

beforeAll(async () => {
  h = await startBrowserHarness();
  const { seedDemo } = await import('../../scripts/lib/demo-seed');
  await seedDemo();
  workers = await startTestWorkers();
  photographerApi = await apiAgent(photographer);
  studioId = (await photographerApi.get('/api/auth/me').expect(200)).body.activeStudioId;
});
afterAll(async () => {
  await workers?.stop();
  await h?.close();
});

describe('handing stacks off', () => {
  it('to the studio’s retoucher and to an outside retoucher, each sending back the merged picture', async () => {
    const member = await readyStack('Fern frond, dew at dawn', 'HDM');
    const outside = await readyStack('Watch movement, balance wheel', 'HDO');
    const page = await h.context.newPage();

    // The photographer hands the first stack to the demo retoucher.
    await signInThroughForm(page, h.baseUrl, photographer.email, photographer.password);
    await page.goto(`${h.baseUrl}/sessions/${member.sessionId}/stacks/${member.stackId}`);
    const panel = page.getByRole('region', { name: 'Hand-off' });
    await panel.getByLabel('Retoucher', { exact: true }).selectOption({ label: `${retoucher.name} (${retoucher.email})` });
    await panel.getByRole('button', { name: 'Hand off' }).click();
    await expect.poll(() => panel.getByTestId('handoff-state').textContent(), { timeout: 30_000 }).toBe('Handed off');
    await panel.getByText(`handed the stack off to ${retoucher.name}`).waitFor();

    // The second goes to someone outside by e-mail, with a 5-day link shown once.
    await page.goto(`${h.baseUrl}/sessions/${outside.sessionId}/stacks/${outside.stackId}`);
    await panel.getByLabel('Someone outside the studio, by e-mail (a share link)').check();
    await panel.getByLabel('E-mail', { exact: true }).fill('bench-retouch@outside.example');
    await panel.getByLabel(/Link valid for/).fill('5');
    await panel.getByRole('button', { name: 'Hand off' }).click();
    const linkField = panel.getByRole('textbox', { name: 'Share link for bench-retouch@outside.example' });
    await linkField.waitFor();
    const shareUrl = await linkField.inputValue();
    expect(shareUrl).toMatch(/\/share\/[A-Za-z0-9_-]{43}$/);
    await panel.getByRole('list', { name: 'Share links of this stack' }).getByRole('listitem').filter({ hasText: /bench-retouch@outside\.example · Active/ }).waitFor();
    await expectNoSeriousA11yViolations(page);
    await screenshot(page, 'handoff');
    await signOutThroughShell(page);

    // The retoucher finds the stack under "Handed to me", downloads the bundle and uploads the result.
    await signInThroughForm(page, h.baseUrl, retoucher.email, retoucher.password);
    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Handed to me' }).click();
    const card = page.getByRole('article', { name: 'Fern frond, dew at dawn' });
    await card.getByRole('img', { name: /Contact sheet of Fern frond, dew at dawn/ }).waitFor({ timeout: 60_000 });
    const download = card.getByRole('link', { name: /Download bundle of Fern frond, dew at dawn/ });
    await download.waitFor({ timeout: 60_000 });
    await expectNoSeriousA11yViolations(page);
    await screenshot(page, 'retoucher-inbox');
    // Info-ZIP's unzip checks the archive; the manifest lists the frames in stack order.
    const memberZip = checkZip(await downloadedZip(page, download));
    expect(memberZip.testOutput).toMatch(/No errors detected/);
    expect(memberZip.manifest.frames.map((f) => f.files[0].originalName)).toEqual(member.frameNames);
    await uploadMerged(card, 'fern-merged.jpg');
    await card.getByText('fern-merged.jpg').waitFor();
    await card.getByText('Merged', { exact: true }).waitFor();
    await signOutThroughShell(page);

    // The outside retoucher, with no account, opens the link.
    await page.goto(shareUrl);
    await page.getByRole('heading', { name: 'Watch movement, balance wheel' }).waitFor();
    await page.getByText(/This link works until/).waitFor();
    const shareDownload = page.getByRole('link', { name: /Download bundle of Watch movement, balance wheel/ });
    await shareDownload.waitFor({ timeout: 60_000 });
    const outsideZip = checkZip(await downloadedZip(page, shareDownload));
    expect(outsideZip.testOutput).toMatch(/No errors detected/);
    expect(outsideZip.manifest.frames.map((f) => f.files[0].originalName)).toEqual(outside.frameNames);
    await uploadMerged(page, 'balance-wheel-merged.jpg');
    await page.getByText(/Received balance-wheel-merged\.jpg/).waitFor();
    await expectNoSeriousA11yViolations(page);

    // The photographer sees both merged, with the merged picture's preview.
    await signInThroughForm(page, h.baseUrl, photographer.email, photographer.password);
    for (const s of [member, outside]) {
      await page.goto(`${h.baseUrl}/sessions/${s.sessionId}/stacks/${s.stackId}`);
      await expect.poll(() => panel.getByTestId('handoff-state').textContent(), { timeout: 30_000 }).toBe('Merged');
      const preview = panel.getByRole('img', { name: /Merged result of/ });
      await preview.waitFor({ timeout: 60_000 });
      await expect.poll(() => preview.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth), { timeout: 30_000 }).toBeGreaterThan(0);
    }
    await panel.getByText(/downloaded the bundle/).first().waitFor();
    await page.close();
  });
});
