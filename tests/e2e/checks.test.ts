// Stack checks in Chromium: two rendered stacks (one with an exposure jump, a repeated frame and a
// skipped focus step, one clean) uploaded through the API; the stack page shows the injected
// faults in its summary and on the frames, and nothing on the clean stack. The Studio page's
// limits form refuses a bad limit beside its field.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { expectNoSeriousA11yViolations, screenshot, signInThroughForm, startBrowserHarness, type BrowserHarness } from '../helpers/browser';
import { createStudioWithRoles, type StudioFixture } from '../helpers/fixtures';
import { createImport, createSession, sessionsBase, uploadFiles, type SortingV } from '../helpers/sessions';
import { startTestWorkers, until } from '../helpers/worker';
import { renderStack } from '../../scripts/lib/stack-renderer';
import type { StackChecksView } from '../../shared/schemas/check-views';

import { agentFor, type Agent } from '../helpers/api';
let h: BrowserHarness;
let fx: StudioFixture;
let workers: { stop: () => Promise<void> };
let photographer: Agent;
let sessionId = '';
const stacks = { faulty: { id: '', name: 'Dew drop, bumped lamp' }, clean: { id: '', name: 'Dew drop, clean run' } };

const SIZE = { widthPx: 320, heightPx: 213, frameCount: 16, scene: 'drop-on-leaf' } as const;
const GLYPH_NAMES = /^(Exposure jump|Focus gap|Duplicate frame|Setting change|Plan mismatch)$/;

const apiAgent = (creds: { email: string; password: string }): Promise<Agent> => agentFor(h.baseUrl, creds);

beforeAll(async () => {
  h = await startBrowserHarness();
  fx = await createStudioWithRoles('Checks Browser Studio');
  workers = await startTestWorkers();
  photographer = await apiAgent(fx.users.photographer);
  const [faulty, clean] = await Promise.all([
    renderStack({ ...SIZE, seed: 33, faults: { exposureJumpAt: 3, repeatAt: 7, skipStepAt: 11 } }),
    renderStack({ ...SIZE, seed: 31, startTime: '2026-05-14T08:30:00.000+02:00', firstFileNumber: 101 }),
  ]);
  sessionId = await createSession(photographer, fx.studioId, 'Dew on fern, checked');
  const importId = await createImport(photographer, fx.studioId, sessionId);
  const files = [...faulty.files, ...clean.files].map((f) => ({ name: f.name, data: f.buffer }));
  expect((await uploadFiles(photographer, fx.studioId, sessionId, importId, files)).status).toBe(201);
  await photographer.post(`${sessionsBase(fx.studioId)}/${sessionId}/imports/${importId}/complete`).set('x-csrf-token', photographer.csrf).send({}).expect(200);
  const sorting = (await photographer.get(`${sessionsBase(fx.studioId)}/${sessionId}/sorting`).expect(200)).body as SortingV;
  expect(sorting.stacks.map((s) => s.frames.length)).toEqual([16, 16]);
  [stacks.faulty.id, stacks.clean.id] = sorting.stacks.map((s) => s.id);
  for (const s of Object.values(stacks)) {
    await photographer.patch(`${sessionsBase(fx.studioId)}/${sessionId}/stacks/${s.id}`).set('x-csrf-token', photographer.csrf).send({ name: s.name }).expect(200);
    await until(`checks of ${s.name}`, async () => {
      const v = (await photographer.get(`/api/studios/${fx.studioId}/stacks/${s.id}/checks`).expect(200)).body as StackChecksView;
      return v.status === 'current' && v.results !== null;
    });
  }
});
afterAll(async () => {
  await workers?.stop();
  await h?.close();
});

/** The check glyphs on each frame of the stack page, as "number:Glyph+Glyph" for marked frames. */
async function frameMarks(page: Page, stackName: string): Promise<string[]> {
  const items = page.getByRole('list', { name: `Frames of ${stackName}` }).getByRole('listitem');
  const marks: string[] = [];
  for (let i = 0; i < (await items.count()); i++) {
    const names = await items.nth(i).getByRole('img', { name: GLYPH_NAMES }).evaluateAll((els) => els.map((e) => e.getAttribute('aria-label')));
    if (names.length) marks.push(`${i + 1}:${names.join('+')}`);
  }
  return marks;
}

describe('stack checks on the stack page', () => {
  it('show the injected faults in the summary, the list and on the frames', async () => {
    await h.context.clearCookies(); // each test signs in afresh, as its own member
    const page = await h.context.newPage();
    await signInThroughForm(page, h.baseUrl, fx.users.photographer.email, fx.users.photographer.password);
    await page.goto(`${h.baseUrl}/sessions/${sessionId}/stacks/${stacks.faulty.id}`);
    await page.getByRole('heading', { name: stacks.faulty.name }).waitFor();
    const summary = page.getByTestId('checks-summary');
    await summary.waitFor();
    expect(await summary.textContent()).toBe('3 problems: exposure jump at frame 4, frames 8 and 9 duplicate each other, focus gap between frames 12 and 13.');
    const items = page.getByRole('list', { name: 'Checks raised' }).getByTestId('check-item');
    expect(await items.count()).toBe(3);
    expect(await items.nth(2).textContent()).toMatch(/Focus gap.*Problem.*Shoot one more frame focused between frames 12 and 13/);
    expect(await frameMarks(page, stacks.faulty.name)).toEqual(['4:Exposure jump', '8:Duplicate frame', '9:Duplicate frame', '12:Focus gap', '13:Focus gap']);
    // the pictures: exposure strip and focus map, each with its text alternative
    await page.getByText('Exposure per frame as a table').waitFor();
    expect(await page.getByRole('img', { name: /^Focus map:/ }).count()).toBe(1);

    await page.setViewportSize({ width: 1280, height: 1500 }); // the whole panel, pictures included
    await page.evaluate(() => document.getElementById('checks-h')?.scrollIntoView());
    await expectNoSeriousA11yViolations(page);
    await screenshot(page, 'stack-checks');
    await page.close();
  });

  it('show nothing on the clean stack', async () => {
    await h.context.clearCookies(); // each test signs in afresh, as its own member
    const page = await h.context.newPage();
    await signInThroughForm(page, h.baseUrl, fx.users.guest.email, fx.users.guest.password);
    await page.goto(`${h.baseUrl}/sessions/${sessionId}/stacks/${stacks.clean.id}`);
    await page.getByRole('heading', { name: stacks.clean.name }).waitFor();
    const summary = page.getByTestId('checks-summary');
    await summary.waitFor();
    expect(await summary.textContent()).toMatch(/^No problems found/);
    expect(await page.getByTestId('check-item').count()).toBe(0);
    expect(await page.getByRole('list', { name: `Frames of ${stacks.clean.name}` }).getByRole('listitem').count()).toBe(16);
    expect(await frameMarks(page, stacks.clean.name)).toEqual([]);
    await page.close();
  });
});

describe('check limits on the Studio page', () => {
  it('refuse a bad limit beside its field, and save a good one', async () => {
    await h.context.clearCookies(); // each test signs in afresh, as its own member
    const page = await h.context.newPage();
    await signInThroughForm(page, h.baseUrl, fx.users.photographer.email, fx.users.photographer.password);
    await page.goto(`${h.baseUrl}/studio`);
    const field = page.getByLabel('Exposure jump (stops)');
    await field.fill('9');
    await page.getByRole('button', { name: 'Save limits' }).click();
    await page.getByRole('alert').filter({ hasText: /4/ }).waitFor();
    expect(await field.getAttribute('aria-invalid')).toBe('true');
    await field.fill('0.5');
    await page.getByRole('button', { name: 'Save limits' }).click();
    await page.getByRole('status').filter({ hasText: 'Saved' }).waitFor();
    const saved = (await photographer.get(`/api/studios/${fx.studioId}/check-thresholds`).expect(200)).body;
    expect(saved.custom).toEqual({ exposureJumpStops: 0.5 });
    await expectNoSeriousA11yViolations(page);
    await page.getByRole('button', { name: 'Back to the defaults' }).click();
    await expect.poll(async () => (await photographer.get(`/api/studios/${fx.studioId}/check-thresholds`)).body.custom).toEqual({});
    await page.close();
  });
});
