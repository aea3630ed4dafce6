import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { expectNoSeriousA11yViolations, screenshot, signInThroughForm, startBrowserHarness, type BrowserHarness } from '../helpers/browser';
import { startTestWorkers } from '../helpers/worker';
import { DEMO_USERS } from '../../scripts/lib/demo-users';
import { renderCard, type RenderedCard } from '../../scripts/lib/stack-renderer';

let h: BrowserHarness;
let workers: { stop: () => Promise<void> };
let cardDir: string;
let card: RenderedCard;

// A small card from the synthetic renderer: three stacks, each after one or two test shots.
const STACK_SIZES = [9, 8, 8];

beforeAll(async () => {
  h = await startBrowserHarness();
  const { seedDemo } = await import('../../scripts/lib/demo-seed');
  await seedDemo();
  workers = await startTestWorkers();
  card = await renderCard({
    widthPx: 240,
    heightPx: 160,
    stacks: [
      { frameCount: STACK_SIZES[0], scene: 'drop-on-leaf', testShots: 2 },
      { frameCount: STACK_SIZES[1], scene: 'beetle', testShots: 1 },
      { frameCount: STACK_SIZES[2], scene: 'drop-on-leaf', testShots: 1 },
    ],
  });
  cardDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lamella-card-'));
  const folder = path.join(cardDir, 'DCIM', '100FERN');
  fs.mkdirSync(folder, { recursive: true });
  for (const f of card.files) fs.writeFileSync(path.join(folder, f.name), f.buffer);
  // What else a card holds: a note saved under a picture's name, and a hidden system file.
  fs.writeFileSync(path.join(folder, 'NOTE_0001.JPG'), 'left antenna bent, retake stack 2\n');
  fs.writeFileSync(path.join(cardDir, '.card-index'), Buffer.alloc(64, 1));
});
afterAll(async () => {
  await workers?.stop();
  await h?.close();
  await (await import('../../server/lib/queues')).closeQueues();
  await (await import('../../server/lib/redis')).closeRedis();
  if (cardDir) fs.rmSync(cardDir, { recursive: true, force: true });
});

const stackRows = (page: Page) => page.getByTestId('stack-row');
const frameCounts = async (page: Page) => {
  const rows = stackRows(page);
  const n = await rows.count();
  const counts: number[] = [];
  for (let i = 0; i < n; i++) counts.push(await rows.nth(i).getByRole('list').getByRole('button').count());
  return counts;
};

describe('importing a card and sorting it by hand', () => {
  it('creates a session, uploads a card folder, and edits the stacks with undo, all kept over a reload', async () => {
    const photographer = DEMO_USERS.find((u) => u.role === 'photographer')!;
    const page = await h.context.newPage();
    await signInThroughForm(page, h.baseUrl, photographer.email, photographer.password);
    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Sessions' }).click();
    await page.getByRole('heading', { name: 'Sessions' }).waitFor();
    await expectNoSeriousA11yViolations(page);
    await page.getByRole('button', { name: 'New session' }).click();
    await page.getByLabel('Title').fill('Dew on the fern, browser test');
    await page.getByLabel('Date').fill('2026-05-14');
    await page.getByLabel('Subject').fill('fern frond with dew');
    await page.getByLabel('Location').fill('studio bench');
    await page.getByRole('button', { name: 'Create session' }).click();
    await page.getByRole('heading', { name: 'Dew on the fern, browser test' }).waitFor();
    expect(page.url()).toMatch(/\/sessions\/[0-9a-f-]{36}$/);

    // The whole card folder, as a photographer picks it from the card reader.
    await page.getByTestId('card-folder-input').setInputFiles(cardDir);
    await page.getByText('Import finished').waitFor({ timeout: 60_000 });
    await expect.poll(() => page.getByTestId('import-phase').textContent()).toContain('100 %');
    expect(await page.getByRole('progressbar', { name: 'Whole import' }).getAttribute('aria-valuenow')).toBe('100');
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'stored' }).first().textContent())
      .toMatch(new RegExp(`^${card.files.length} stored · 0 already there · 1 refused · 0 failed · 1 hidden system file left out`));
    const attention = page.getByRole('list', { name: 'Files that need attention' });
    await expect.poll(() => attention.textContent()).toMatch(/NOTE_0001\.JPG.*refused: .*looks like text/);
    await screenshot(page, 'session-import');

    await expect.poll(() => frameCounts(page), { timeout: 30_000 }).toEqual(STACK_SIZES);
    const loose = page.getByRole('list', { name: 'Loose frames' }).getByRole('button');
    await expect.poll(() => loose.count(), { timeout: 10_000 }).toBe(card.truth.looseFrames.length);
    await expect.poll(() => page.locator('img[src*="/preview/small"]').count(), { timeout: 60_000 }).toBe(card.files.length);
    await page.evaluate(() => document.getElementById('sorting-h')?.scrollIntoView());
    await screenshot(page, 'session-sorting');
    await expectNoSeriousA11yViolations(page);

    // Split the first stack before its 4th frame, choosing the frame with the keyboard.
    const fourth = stackRows(page).first().getByRole('button', { name: /^Frame 4 of Stack 01/ });
    await fourth.focus();
    await page.keyboard.press('Space');
    await expect.poll(() => fourth.getAttribute('aria-pressed')).toBe('true');
    await page.getByRole('button', { name: 'Split stack before this frame' }).click();
    await expect.poll(() => frameCounts(page), { timeout: 10_000 }).toEqual([3, STACK_SIZES[0] - 3, STACK_SIZES[1], STACK_SIZES[2]]);
    await page.getByRole('heading', { name: 'Stack 01 (2)' }).waitFor();
    await page.getByRole('button', { name: 'Undo: split Stack 01' }).waitFor();

    // Merge them again, then mark the second stack ready.
    await page.getByRole('button', { name: 'Merge with next (Stack 01)' }).click();
    await expect.poll(() => frameCounts(page), { timeout: 10_000 }).toEqual(STACK_SIZES);
    await page.getByRole('button', { name: 'Mark ready (Stack 02)' }).click();
    await page.getByRole('button', { name: 'Back to draft (Stack 02)' }).waitFor();

    await page.reload();
    await expect.poll(() => frameCounts(page), { timeout: 10_000 }).toEqual(STACK_SIZES);
    expect(await stackRows(page).nth(1).getByText('ready', { exact: true }).count()).toBe(1);
    expect(await page.getByRole('heading', { name: 'Stack 01 (2)' }).count()).toBe(0);

    // Undo the last change: the stack is a draft again, also after another reload.
    await page.getByRole('button', { name: 'Undo: mark Stack 02 ready' }).click();
    await page.getByRole('button', { name: 'Mark ready (Stack 02)' }).waitFor();
    await page.reload();
    await page.getByRole('button', { name: 'Mark ready (Stack 02)' }).waitFor();
    await page.getByRole('button', { name: /^Undo: merge Stack 01 with Stack 01 \(2\)$/ }).waitFor();

    // The gap rule re-groups live: with 20 frames the smallest stack, every draft stack dissolves.
    await page.getByLabel(/Smallest stack/).fill('20');
    await expect.poll(() => stackRows(page).count(), { timeout: 15_000 }).toBe(0);
    await page.getByRole('button', { name: 'Undo: regroup' }).click();
    await expect.poll(() => frameCounts(page), { timeout: 10_000 }).toEqual(STACK_SIZES);

    // The frame table lists every stored file with its settings, and filters.
    const table = page.getByRole('table', { name: /Files of this session/ });
    await expect.poll(() => table.getByRole('row').count(), { timeout: 10_000 }).toBe(card.files.length + 1);
    await page.getByRole('searchbox').last().fill('loose');
    await expect.poll(() => table.getByRole('row').count(), { timeout: 10_000 }).toBe(card.truth.looseFrames.length + 1);
    await page.close();
  });
});
