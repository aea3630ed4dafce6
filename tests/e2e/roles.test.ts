// Roles in Chromium on the seeded demo studio: the guest reads plans, sessions and contact sheets and
// can change nothing (no buttons, and the API answers 403); the retoucher sees the stacks handed to
// them and nothing else, with a clear message where their role stops. Also: every action of the
// sorting page is reached with Tab and shows a focus ring, stack names link to the stack page, pages
// fit 1280 px, and capture times are on the camera's clock (checked against Debian's exiftool).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { expectNoSeriousA11yViolations, screenshot, signInThroughForm, startBrowserHarness, type BrowserHarness } from '../helpers/browser';
import { sessionsBase, type SortingV } from '../helpers/sessions';
import { startTestWorkers, until } from '../helpers/worker';
import { readWithExiftool } from '../helpers/exiftool';
import { DEMO_USERS } from '../../scripts/lib/demo-users';
import { DEMO_SESSION_TITLE } from '../../scripts/lib/demo-session';
import type { StackChecksView } from '../../shared/schemas/check-views';

import { agentFor, type Agent } from '../helpers/api';
let h: BrowserHarness;
let workers: { stop: () => Promise<void> };
let studioId = '';
let sessionId = '';
let sorting: SortingV;
const demo = (role: string) => DEMO_USERS.find((u) => u.role === role)!;
const stackId = (name: string) => sorting.stacks.find((s) => s.name === name)!.id;
const stackUrl = (name: string) => `${h.baseUrl}/sessions/${sessionId}/stacks/${stackId(name)}`;
// The demo shoot (scripts/lib/demo-session.ts): stacks 1 and 4 handed to the retoucher, 2 and 3 drafts.
const HANDED = ['Dew on frond, left drop', 'Beetle head'];
const DRAFT = 'Beetle elytra';

const apiAgent = (creds: { email: string; password: string }): Promise<Agent> => agentFor(h.baseUrl, creds);

async function signInAs(role: string): Promise<Page> {
  // Each test signs in afresh, as its own member. The last member's session ends on the server first:
  // a late answer to a closed page's polling would otherwise bring its (rolling) cookie back.
  const csrf = (await (await h.context.request.get(`${h.baseUrl}/api/auth/csrf`)).json()).csrfToken as string;
  await h.context.request.post(`${h.baseUrl}/api/auth/sign-out`, { headers: { 'x-csrf-token': csrf } });
  for (const open of h.context.pages()) await open.close();
  await h.context.clearCookies();
  const page = await h.context.newPage();
  await signInThroughForm(page, h.baseUrl, demo(role).email, demo(role).password);
  return page;
}

/** A request made by the page itself (its cookie, fetch, the CSRF token from /api/auth/csrf); answers the status. */
async function fetchFromPage(page: Page, method: string, path: string, body: object = {}): Promise<number> {
  return page.evaluate(async ({ method, path, body }) => {
    const { csrfToken } = await (await fetch('/api/auth/csrf')).json();
    const res = await fetch(path, { method, headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': csrfToken }, body: method === 'GET' ? undefined : JSON.stringify(body) });
    return res.status;
  }, { method, path, body });
}

const buttonCount = (page: Page, name: string | RegExp) => page.getByRole('button', { name }).count();
const pageWidth = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth);

/** Presses Tab from the skip link to the end of the page; each stop with its name and whether a focus ring shows. */
async function tabStops(page: Page, max = 400) {
  await page.getByRole('link', { name: 'Skip to content' }).focus();
  const stops: { name: string; role: string; ring: boolean }[] = [];
  for (let i = 0; i < max; i++) {
    await page.keyboard.press('Tab');
    const stop = await page.evaluate(() => {
      const el = document.activeElement as HTMLElement | null;
      if (!el || el === document.body) return null;
      const ring = (e: Element) => {
        const s = getComputedStyle(e);
        return (s.outlineStyle !== 'none' && parseFloat(s.outlineWidth) >= 2) || s.boxShadow !== 'none';
      };
      const label = el.closest('label');
      const labelText = (el as HTMLInputElement).labels?.[0]?.textContent;
      return {
        name: (el.getAttribute('aria-label') ?? labelText ?? el.textContent ?? '').trim().replace(/\s+/g, ' '),
        role: el.getAttribute('role') ?? el.tagName.toLowerCase(),
        ring: ring(el) || (label ? ring(label) : false),
      };
    });
    if (!stop) break;
    stops.push(stop);
  }
  return stops;
}

beforeAll(async () => {
  h = await startBrowserHarness();
  const { seedDemo } = await import('../../scripts/lib/demo-seed');
  await seedDemo();
  workers = await startTestWorkers();
  const photographer = await apiAgent(demo('photographer'));
  studioId = (await photographer.get('/api/auth/me').expect(200)).body.activeStudioId;
  const { sessions } = (await photographer.get(sessionsBase(studioId)).expect(200)).body as { sessions: { id: string; title: string }[] };
  sessionId = sessions.find((s) => s.title === DEMO_SESSION_TITLE)!.id;
  sorting = await until('the demo previews', async () => {
    const v = (await photographer.get(`${sessionsBase(studioId)}/${sessionId}/sorting`).expect(200)).body as SortingV;
    return [...v.stacks.flatMap((s) => s.frames), ...v.loose].every((f) => f.previewStatus !== 'pending') && v;
  }, 150_000);
  // The contact sheet the guest will look at, and the checks of the stack with the moved lamp.
  await photographer.post(`/api/studios/${studioId}/stacks/${stackId(DRAFT)}/contact-sheet`).set('x-csrf-token', photographer.csrf).send({}).expect(202);
  await until('the contact sheet', async () => (await photographer.get(`/api/studios/${studioId}/stacks/${stackId(DRAFT)}`)).body.contactSheet?.status === 'done', 90_000);
  await until('the checks', async () => ((await photographer.get(`/api/studios/${studioId}/stacks/${stackId(DRAFT)}/checks`)).body as StackChecksView).status === 'current', 60_000);
}, 300_000);
afterAll(async () => {
  await workers?.stop();
  await h?.close();
});

describe('the photographer on the demo shoot', () => {
  it('reaches every action of the sorting page with Tab, with a focus ring, and opens a stack from its name', async () => {
    const page = await signInAs('photographer');
    await page.goto(`${h.baseUrl}/sessions/${sessionId}`);
    await page.getByRole('heading', { name: DEMO_SESSION_TITLE }).waitFor();
    const frames = sorting.stacks.reduce((n, s) => n + s.frames.length, sorting.loose.length);
    await expect.poll(() => page.locator('img[src*="/preview/small"]').count(), { timeout: 60_000 }).toBe(frames);
    expect(await page.getByText(/Making previews/).count()).toBe(0);
    expect(await pageWidth(page)).toBeLessThanOrEqual(1280);
    await expectNoSeriousA11yViolations(page);
    await page.evaluate(() => document.getElementById('sorting-h')?.scrollIntoView());
    await screenshot(page, 'session-sorting-demo');

    // Select one frame with the keyboard, so the selection bar's actions are on the page too.
    const frame = page.getByRole('button', { name: new RegExp(`^Frame 3 of ${DRAFT}`) });
    await frame.focus();
    await page.keyboard.press('Space');
    await page.getByRole('region', { name: 'Selected frames' }).waitFor();
    const stops = await tabStops(page);
    const names = stops.map((s) => s.name);
    const actions = [DRAFT, `Rename (${DRAFT})`, `Mark ready (${DRAFT})`, `Merge with next (${DRAFT})`, `Plan linked to ${DRAFT}`, /^Move to/, 'Move', 'Exclude', 'Include',
      'Split stack before this frame', 'Clear selection', /^(Undo: |Nothing to undo)/, 'Choose files', 'Choose a card folder', /^Gap factor/, /^Filter/, 'Edit details'];
    for (const action of actions) expect(names.some((n) => (typeof action === 'string' ? n === action : action.test(n))), String(action)).toBe(true);
    expect(names.filter((n) => n.startsWith(`Frame `)).length).toBeGreaterThanOrEqual(sorting.stacks.filter((s) => s.state === 'draft').reduce((n, s) => n + s.frames.length, 0));
    expect(stops.filter((s) => !s.ring), 'stops without a focus ring').toEqual([]);
    // Frames of a stack that is handed off cannot be selected, and are no tab stops.
    expect(names.some((n) => n.startsWith(`Frame 1 of ${HANDED[1]}`))).toBe(false);

    // The stack's name is a link to its page, and Enter follows it.
    const link = page.getByTestId('stack-row').getByRole('link', { name: DRAFT, exact: true });
    expect(await link.getAttribute('href')).toBe(`/sessions/${sessionId}/stacks/${stackId(DRAFT)}`);
    await page.getByRole('button', { name: 'Clear selection' }).click();
    await link.focus();
    await page.keyboard.press('Enter');
    await page.waitForURL(stackUrl(DRAFT));
    await page.getByRole('heading', { name: DRAFT, level: 1 }).waitFor();
    await page.close();
  });

  it('shows the stack with the moved lamp: its exposure jump, capture times on the camera’s clock, at 1280 px', async () => {
    const page = await signInAs('photographer');
    // A browser far from the camera's zone (UTC−08:00 in May against the camera's +02:00).
    await (await h.context.newCDPSession(page)).send('Emulation.setTimezoneOverride', { timezoneId: 'America/Anchorage' });
    await page.goto(stackUrl(DRAFT));
    await page.getByRole('heading', { name: DRAFT, level: 1 }).waitFor();
    const summary = page.getByTestId('checks-summary');
    await expect.poll(() => summary.textContent(), { timeout: 30_000 }).toMatch(/exposure jump/i);
    await page.getByRole('img', { name: /^Contact sheet of Beetle elytra/ }).waitFor();
    expect(await pageWidth(page)).toBeLessThanOrEqual(1280);
    await expectNoSeriousA11yViolations(page);

    // Debian's exiftool reads the first frame's DateTimeOriginal + SubSecTimeOriginal + offset: the
    // page shows that wall-clock time (to the tenth of a second), not the browser's.
    const { getDataSource } = await import('../../server/lib/data-source');
    const { getStore } = await import('../../server/lib/storage');
    const { StoredFile } = await import('../../server/entities/session');
    const first = sorting.stacks.find((s) => s.name === DRAFT)!.frames[0];
    const file = await getDataSource().getRepository(StoredFile).findOneByOrFail({ frameId: first.id });
    const [tags] = await readWithExiftool([getStore().localPath(file.storageKey)]);
    const camera = /^\d{4}:\d{2}:\d{2} (\d{2}:\d{2}:\d{2})\.(\d)\d*([+-]\d{2}:\d{2})$/.exec(String(tags['Composite:SubSecDateTimeOriginal']));
    expect(camera, String(tags['Composite:SubSecDateTimeOriginal'])).not.toBeNull();
    const tile = page.getByRole('list', { name: `Frames of ${DRAFT}` }).getByRole('listitem').first();
    expect(await tile.textContent()).toContain(`${camera![1]}.${camera![2]}`);
    expect(await tile.getByTitle(`camera time (UTC${camera![3].replace('-', '−')})`).count()).toBe(1);

    const checks = await page.getByRole('heading', { name: 'Checks' }).boundingBox();
    await page.evaluate((y) => window.scrollTo(0, y), Math.max(0, (checks?.y ?? 0) - 160));
    await screenshot(page, 'stack-page-demo');
    await page.close();
  });
});

describe('the guest', () => {
  it('reads plans, a plan and its print view, with no button that changes them', async () => {
    const page = await signInAs('guest');
    await page.goto(`${h.baseUrl}/planner`);
    const plans = page.getByRole('table', { name: /Saved plans/ });
    await plans.getByRole('link', { name: 'Museum beetle (3×)' }).waitFor();
    expect(await plans.getByRole('link').count()).toBeGreaterThanOrEqual(3);
    expect(await buttonCount(page, /^Save/)).toBe(0);
    await expectNoSeriousA11yViolations(page);
    await plans.getByRole('link', { name: 'Museum beetle (3×)' }).click();
    await page.getByRole('heading', { name: 'Museum beetle (3×)', level: 1 }).waitFor();
    await page.getByText('read-only', { exact: false }).waitFor();
    for (const name of ['Save plan', 'Save changes', 'Delete', 'Duplicate']) expect(await buttonCount(page, name), name).toBe(0);
    expect(await page.getByRole('link', { name: 'Edit in planner' }).count()).toBe(0);
    expect(await pageWidth(page)).toBeLessThanOrEqual(1280);
    await expectNoSeriousA11yViolations(page);
    await screenshot(page, 'guest-plan');
    await page.getByRole('link', { name: 'Print' }).click();
    await page.getByRole('button', { name: 'Print' }).waitFor();
    expect(await page.getByRole('table', { name: /Focus positions/ }).first().getByRole('row').count()).toBeGreaterThan(2);
    await page.close();
  });

  it('reads sessions, stacks and contact sheets, with no button that changes them', async () => {
    const page = await signInAs('guest');
    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Sessions' }).click();
    await page.getByRole('link', { name: DEMO_SESSION_TITLE }).click();
    await page.getByRole('heading', { name: DEMO_SESSION_TITLE, level: 1 }).waitFor();
    await expect.poll(() => page.getByTestId('stack-row').count()).toBe(4);
    for (const name of ['Edit details', /^Undo/, 'Nothing to undo', /^Mark ready/, /^Back to draft/, /^Rename/, /^Merge with next/, 'Split stack before this frame', 'Choose files']) {
      expect(await buttonCount(page, name), String(name)).toBe(0);
    }
    expect(await page.getByRole('heading', { name: 'Card import' }).count()).toBe(0);
    expect(await page.getByTestId('card-folder-input').count()).toBe(0);
    expect(await page.getByRole('group', { name: 'Gap rule' }).count()).toBe(0);
    // The guest's frames are no buttons; the stack name still opens the stack.
    expect(await page.getByRole('list', { name: `Frames of ${DRAFT}` }).getByRole('button').count()).toBe(0);
    await expectNoSeriousA11yViolations(page);
    // On a phone the page narrows instead of scrolling sideways (the file table scrolls in its own box).
    await page.setViewportSize({ width: 375, height: 800 });
    await expect.poll(() => pageWidth(page)).toBeLessThanOrEqual(375);
    await page.setViewportSize({ width: 1280, height: 800 });

    await page.getByTestId('stack-row').getByRole('link', { name: DRAFT, exact: true }).click();
    await page.getByRole('heading', { name: DRAFT, level: 1 }).waitFor();
    const sheet = page.getByRole('img', { name: /^Contact sheet of Beetle elytra/ });
    await expect.poll(() => sheet.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth), { timeout: 30_000 }).toBeGreaterThan(0);
    for (const name of ['Make bundle', 'Hand off', 'Make the contact sheet again', 'Bundle the session']) expect(await buttonCount(page, name), name).toBe(0);
    await expectNoSeriousA11yViolations(page);
    await page.setViewportSize({ width: 375, height: 800 });
    await expect.poll(() => pageWidth(page)).toBeLessThanOrEqual(375);
    await page.setViewportSize({ width: 1280, height: 800 });

    // A handed-off stack with its bundle made: the guest gets no download.
    await page.goto(stackUrl(HANDED[0]));
    await page.getByRole('heading', { name: HANDED[0], level: 1 }).waitFor();
    await page.getByText('guests see the contact sheet only').waitFor({ timeout: 60_000 });
    expect(await page.getByRole('link', { name: /^Download (bundle|.*\.zip)/ }).count()).toBe(0);
    expect(await buttonCount(page, /^Take back/)).toBe(0);
    await page.close();
  });

  it('has no invitation or kit editing, and the API refuses every change the guest tries', async () => {
    const page = await signInAs('guest');
    await page.goto(`${h.baseUrl}/studio`);
    await page.getByRole('table', { name: 'Studio members' }).waitFor();
    expect(await page.getByRole('heading', { name: 'Invite someone' }).count()).toBe(0);
    expect(await buttonCount(page, /invitation|Remove/)).toBe(0);
    await expectNoSeriousA11yViolations(page);
    await page.goto(`${h.baseUrl}/kit`);
    await page.getByRole('table', { name: /Lenses/ }).waitFor();
    expect(await buttonCount(page, /^(Add|Edit|Delete)/)).toBe(0);
    await expectNoSeriousA11yViolations(page);

    const studio = `/api/studios/${studioId}`;
    const draft = sorting.stacks.find((s) => s.name === DRAFT)!;
    const attempts: [string, string, object][] = [
      ['POST', `${studio}/plans`, { name: 'A guest’s plan' }],
      ['POST', `${studio}/sessions`, { title: 'A guest’s shoot', shootDate: '2026-05-15' }],
      ['PATCH', `${studio}/sessions/${sessionId}`, { title: 'Renamed by a guest' }],
      ['POST', `${studio}/sessions/${sessionId}/stacks/${draft.id}/state`, { state: 'ready' }],
      ['PATCH', `${studio}/sessions/${sessionId}/stacks/${draft.id}`, { name: 'Renamed by a guest' }],
      ['POST', `${studio}/stacks/${draft.id}/bundles`, {}],
      ['POST', `${studio}/stacks/${draft.id}/handoff`, { to: 'email', email: 'someone@outside.example', expiryDays: 3 }],
      ['POST', `${studio}/invitations`, { email: 'friend@outside.example', role: 'owner' }],
    ];
    for (const [method, path, body] of attempts) expect(await fetchFromPage(page, method, path, body), `${method} ${path}`).toBe(403);
    // Nothing changed.
    const stack = await page.evaluate(async (url) => (await fetch(url)).json(), `${studio}/stacks/${draft.id}`);
    expect({ name: stack.name, state: stack.state, bundle: stack.latestBundle }).toEqual({ name: DRAFT, state: 'draft', bundle: null });
    await page.close();
  });
});

describe('the retoucher', () => {
  it('sees the two demo stacks handed to them, and a clear message where their role stops', async () => {
    const page = await signInAs('retoucher');
    const crashes: string[] = [];
    page.on('pageerror', (e) => crashes.push(e.message));
    const nav = page.getByRole('navigation', { name: 'Sections' });
    expect(await nav.getByRole('link', { name: 'Sessions' }).count()).toBe(0);
    await nav.getByRole('link', { name: 'Handed to me' }).click();
    for (const name of HANDED) await page.getByRole('article', { name }).waitFor();
    expect(await page.getByRole('article', { name: DRAFT }).count()).toBe(0);
    expect(await pageWidth(page)).toBeLessThanOrEqual(1280);
    await expectNoSeriousA11yViolations(page);

    // A draft stack's page: the server's 403 in words, and the way back.
    await page.goto(stackUrl(DRAFT));
    await page.getByRole('heading', { name: 'This stack cannot be opened' }).waitFor();
    await page.getByRole('alert').filter({ hasText: 'This stack has not been handed to you.' }).waitFor();
    await page.getByRole('link', { name: 'See the stacks handed to you' }).waitFor();
    expect(await fetchFromPage(page, 'GET', `/api/studios/${studioId}/stacks/${stackId(DRAFT)}`)).toBe(403);

    // Sessions: the API refuses; the pages say why and where to go instead of breaking.
    expect(await fetchFromPage(page, 'GET', `/api/studios/${studioId}/sessions`)).toBe(403);
    expect(await fetchFromPage(page, 'GET', `/api/studios/${studioId}/sessions/${sessionId}/sorting`)).toBe(403);
    for (const url of [`${h.baseUrl}/sessions`, `${h.baseUrl}/sessions/${sessionId}`]) {
      await page.goto(url);
      await page.getByText('Sessions are not shown to retouchers.').waitFor();
      await page.getByRole('link', { name: 'Go to Handed to me' }).waitFor();
    }
    await expectNoSeriousA11yViolations(page);

    // A stack handed to them opens, with the way back to their list.
    await page.goto(stackUrl(HANDED[1]));
    await page.getByRole('heading', { name: HANDED[1], level: 1 }).waitFor();
    await page.getByRole('navigation', { name: 'Breadcrumb' }).getByRole('link', { name: 'Handed to me' }).waitFor();
    expect(crashes).toEqual([]);
    await page.close();
  });
});
