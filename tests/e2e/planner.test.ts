import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { execFileSync } from 'node:child_process';
import type { Page } from 'playwright-core';
import { expectNoSeriousA11yViolations, screenshot, signInThroughForm, signOutThroughShell, startBrowserHarness, type BrowserHarness } from '../helpers/browser';
import { DEMO_USERS } from '../../scripts/lib/demo-users';
import { THIRD_STOP_SERIES } from '@shared/optics';

let h: BrowserHarness;
const tag = crypto.randomBytes(3).toString('hex');
const demo = (role: string) => DEMO_USERS.find((u) => u.role === role)!;
let planUrl = '';
let planFrames = 0;

beforeAll(async () => {
  h = await startBrowserHarness();
  const { seedDemo } = await import('../../scripts/lib/demo-seed');
  await seedDemo();
});
afterAll(async () => h?.close());

/** JSON calls with the page's session cookie and CSRF token. */
async function apiAs(page: Page) {
  const csrf = (await (await page.request.get(`${h.baseUrl}/api/auth/csrf`)).json()).csrfToken as string;
  const me = await (await page.request.get(`${h.baseUrl}/api/auth/me`)).json();
  const studio = `${h.baseUrl}/api/studios/${me.activeStudioId}`;
  const headers = { 'x-csrf-token': csrf };
  return {
    post: (path: string, data: object) => page.request.post(`${studio}${path}`, { data, headers }),
    patch: (path: string, data: object) => page.request.patch(`${studio}${path}`, { data, headers }),
    get: (path: string) => page.request.get(`${studio}${path}`),
  };
}

/** A TextField by its label and unit (the unit is part of the label). */
const input = (page: Page, label: string, unit: string) =>
  page.getByLabel(new RegExp(`^${label.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}\\s*\\(${unit}\\)$`));
/**
 * The test's fern stack worked by hand: APS-C (23.5 × 15.6 mm), 50 mm lens on 25 mm of tubes (0.5×),
 * 4 mm deep, 20 % overlap, 5 µm rail. Wikipedia, "Depth of field" (close-up):
 * DOF = 2Nc(1 + m)/(m² − (Nc/f)²), c = diagonal / 1500; the step is rounded down to whole rail
 * steps and n = ⌈depth / step⌉ + 1 (PRODUCT.md, Optics).
 */
function fernByHand(fNumber: number) {
  const c = Math.hypot(23.5, 15.6) / 1500;
  const dofMm = (2 * fNumber * c * 1.5) / (0.25 - ((fNumber * c) / 50) ** 2);
  const stepMm = (Math.floor((dofMm * 0.8 * 1000) / 5) * 5) / 1000;
  return { stepMm, frames: Math.ceil(4 / stepMm) + 1 };
}

const figure = (page: Page, label: string) => page.locator(`section[aria-labelledby="results-h"] dt:text-is("${label}") + dd`);

describe('the stack planner', () => {
  it('plans a stack from the kit, saves it and prints one row per frame', async () => {
    await h.context.clearCookies(); // each test signs in afresh, whatever the last one left
    const page = await h.context.newPage();
    await signInThroughForm(page, h.baseUrl, demo('photographer').email, demo('photographer').password);
    const api = await apiAs(page);
    const body = `APS-C body ${tag}`;
    const lens = `50 mm lens ${tag}`;
    const tubes = `Tubes ${tag}`;
    expect((await api.post('/kit/bodies', { name: body, sensorFormat: 'aps-c-23.5', pixelsAcross: 3872 })).status()).toBe(201);
    expect((await api.post('/kit/lenses', { name: lens, focalLengthMm: 50, widestFNumber: 1.8, narrowestFNumber: 16, maxMagnification: 0.15 })).status()).toBe(201);
    expect((await api.post('/kit/extension-sets', { name: tubes, tubeLengthsMm: [12, 13, 36] })).status()).toBe(201);

    // The rail goes in through the kit page's form.
    const rail = `Rail ${tag}`;
    await page.goto(`${h.baseUrl}/kit`);
    await page.getByRole('button', { name: 'Add rail' }).click();
    const railForm = page.getByRole('form', { name: 'Add rail (rail)' });
    await railForm.getByLabel('Name').fill(rail);
    await railForm.getByLabel('Travel').fill('50');
    await railForm.getByLabel('Smallest step').fill('0');
    await railForm.getByRole('button', { name: 'Add rail' }).click();
    await expect.poll(() => railForm.getByRole('alert').first().textContent()).toContain('at least 0.01 µm');
    await railForm.getByLabel('Smallest step').fill('5');
    await railForm.getByRole('button', { name: 'Add rail' }).click();
    await page.getByRole('cell', { name: rail, exact: true }).waitFor();
    await expectNoSeriousA11yViolations(page);

    await page.goto(`${h.baseUrl}/planner`);
    await page.getByRole('heading', { name: 'Results' }).waitFor();
    await page.getByLabel('Body', { exact: true }).selectOption({ label: body });
    await page.getByLabel('Lens', { exact: true }).selectOption({ label: lens });
    await page.getByLabel('Extension set', { exact: true }).selectOption({ label: tubes });
    await page.getByRole('checkbox', { name: '12 mm' }).check();
    await page.getByRole('checkbox', { name: '13 mm' }).check();
    await expect.poll(() => input(page, 'Extension', 'mm').inputValue()).toBe('25');
    await input(page, 'Lens’s own magnification', '×').fill('0');
    await input(page, 'Aperture', 'f-number').fill('8');
    await input(page, 'Depth to cover', 'mm').fill('4');
    await input(page, 'Overlap', '%').fill('20');
    await page.getByLabel('Rail', { exact: true }).selectOption({ label: rail });
    await input(page, 'Seconds per frame', 's').fill('2');
    await input(page, 'Exposure time', 's').fill('1/125');
    await input(page, 'Subject stays still for', 'min').fill('5');

    // Thin lens (extension-tube tutorials): 25 mm of tubes on a 50 mm lens at infinity → 0.5×.
    await expect.poll(() => figure(page, 'Magnification').textContent()).toBe('0.5×');
    const { stepMm, frames } = fernByHand(8);
    await expect.poll(() => figure(page, 'Frames').first().textContent()).toBe(String(frames));
    planFrames = frames;

    // The sweep: one row per ⅓ stop from f/2.8 to f/22 (common practice). Wikipedia, "Airy disk":
    // 2.44 · λ · N_w must stay within 2.5 pixel pitches (common practice) → the largest such stop.
    const sweep = page.getByRole('table', { name: 'Aperture sweep' });
    expect(await sweep.locator('tbody tr').count()).toBe(THIRD_STOP_SERIES.length);
    const pitchUm = (23.5 / 3872) * 1000;
    const sharpest = [...THIRD_STOP_SERIES].filter((n) => 2.44 * 0.55 * n * 1.5 <= 2.5 * pitchUm).at(-1);
    const recommendedRow = sweep.locator('tbody tr[aria-current="true"]');
    expect(await recommendedRow.locator('th').textContent()).toBe(`f/${sharpest}recommended`);
    const f8Row = sweep.locator('tbody tr', { has: page.locator('th', { hasText: /^f\/8$/ }) });
    expect(await f8Row.locator('td').first().textContent()).toBe(String(frames));
    await page.getByRole('heading', { name: 'Hot lights and eyes' }).waitFor();
    await expect.poll(() => page.locator('figure svg').count()).toBeGreaterThanOrEqual(2);

    await expectNoSeriousA11yViolations(page);
    await page.evaluate(() => { (document.activeElement as HTMLElement | null)?.blur(); window.scrollTo(0, 0); });
    await screenshot(page, 'planner');

    await page.getByLabel('Plan name').fill(`Fern frond ${tag}`);
    await page.getByLabel('Notes').fill('Before the sun reaches the frond.');
    await page.getByRole('button', { name: 'Save plan' }).click();
    await page.getByRole('heading', { name: `Fern frond ${tag}` }).waitFor();
    expect(page.url()).toMatch(/\/plans\/[0-9a-f-]{36}$/);
    planUrl = page.url();
    await expect.poll(() => figure(page, 'Frames').first().textContent()).toBe(String(frames));

    await page.getByRole('link', { name: 'Print' }).click();
    await page.waitForURL(/\/print$/);
    const rows = page.locator('table[aria-label^="Focus positions"] tbody tr');
    await rows.first().waitFor();
    expect(await rows.count()).toBe(frames);
    // The last frame sits (frames − 1) steps from the first, in mm and in rail steps.
    const last = rows.last().locator('td');
    expect(Number(await last.nth(0).textContent())).toBeCloseTo((frames - 1) * stepMm, 6);
    expect(Number(await last.nth(1).textContent())).toBe(((frames - 1) * stepMm * 1000) / 5);
    await page.emulateMedia({ media: 'print' });
    expect(await page.locator('header').isVisible()).toBe(false);
    await page.emulateMedia({ media: 'screen' });

    // The demo beetle at 3× has a long table: still one row per frame, and one printed A4 page.
    const plans = (await (await api.get('/plans')).json()).plans as { id: string; name: string; frames: number }[];
    const beetle = plans.find((p) => p.name.startsWith('Museum beetle'))!;
    expect(beetle.frames).toBeGreaterThan(100);
    await page.goto(`${h.baseUrl}/plans/${beetle.id}/print`);
    await rows.first().waitFor();
    expect(await rows.count()).toBe(beetle.frames);
    await screenshot(page, 'plan-print');
    const pdfPath = path.join(os.tmpdir(), `lamella-plan-print-${tag}.pdf`);
    await page.emulateMedia({ media: 'print' });
    await page.pdf({ path: pdfPath, format: 'A4' });
    await page.emulateMedia({ media: 'screen' });
    try {
      // Debian's poppler-utils reads the page count of the printed PDF.
      expect(execFileSync('/usr/bin/pdfinfo', [pdfPath], { encoding: 'utf8' })).toMatch(/^Pages:\s+1$/m);
    } finally {
      fs.rmSync(pdfPath, { force: true });
    }

    await signOutThroughShell(page);
    await page.close();
  });

  it('lets the guest read the plan without write buttons, and the API refuses the guest’s change', async () => {
    expect(planUrl).not.toBe('');
    await h.context.clearCookies(); // each test signs in afresh, whatever the last one left
    const page = await h.context.newPage();
    await signInThroughForm(page, h.baseUrl, demo('guest').email, demo('guest').password);
    await page.goto(planUrl);
    await page.getByRole('heading', { name: `Fern frond ${tag}` }).waitFor();
    await expect.poll(() => figure(page, 'Frames').first().textContent()).toBe(String(planFrames));
    await page.getByRole('link', { name: 'Print' }).waitFor();
    for (const name of ['Delete', 'Duplicate', 'Save plan', 'Save changes']) expect(await page.getByRole('button', { name }).count()).toBe(0);
    const planId = planUrl.split('/').at(-1)!;
    const api = await apiAs(page);
    const refused = await api.patch(`/plans/${planId}`, { name: 'Changed by a guest' });
    expect(refused.status()).toBe(403);
    expect((await (await api.get(`/plans/${planId}`)).json()).name).toBe(`Fern frond ${tag}`);
    await signOutThroughShell(page);
    await page.close();
  });

  it('duplicates a plan and edits the copy in the planner, leaving the original as it was', async () => {
    await h.context.clearCookies();
    const page = await h.context.newPage();
    await signInThroughForm(page, h.baseUrl, demo('photographer').email, demo('photographer').password);
    await page.goto(planUrl);
    await page.getByRole('button', { name: 'Duplicate' }).click();
    await page.getByRole('heading', { name: `Fern frond ${tag} (copy)` }).waitFor();
    const copyUrl = page.url();
    expect(copyUrl).not.toBe(planUrl);
    await page.getByRole('link', { name: 'Edit in planner' }).click();
    await page.getByRole('heading', { name: `Planner: Fern frond ${tag} (copy)` }).waitFor();
    await input(page, 'Aperture', 'f-number').fill('5.6');
    const { frames } = fernByHand(5.6);
    await expect.poll(() => figure(page, 'Frames').first().textContent()).toBe(String(frames));
    await page.getByRole('button', { name: 'Save changes' }).click();
    await page.waitForURL(copyUrl);
    await expect.poll(() => figure(page, 'Frames').first().textContent()).toBe(String(frames));
    const api = await apiAs(page);
    const original = await (await api.get(`/plans/${planUrl.split('/').at(-1)}`)).json();
    expect(original.inputs.fNumber).toBe(8);
    expect(original.result.frames).toBe(planFrames);
    await signOutThroughShell(page);
    await page.close();
  });

  it('fits a phone screen and explains a bad value beside its field', async () => {
    await h.context.clearCookies(); // each test signs in afresh, whatever the last one left
    const page = await h.context.newPage();
    await page.setViewportSize({ width: 375, height: 800 });
    await signInThroughForm(page, h.baseUrl, demo('photographer').email, demo('photographer').password);
    await page.goto(`${h.baseUrl}/planner`);
    await page.getByRole('heading', { name: 'Results' }).waitFor();
    await figure(page, 'Frames').first().waitFor();
    await page.getByRole('heading', { name: 'Aperture sweep' }).waitFor();
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(375);
    const aperture = input(page, 'Aperture', 'f-number');
    await aperture.fill('500');
    await expect.poll(() => page.getByText('At most f/128.').count()).toBe(1);
    expect(await aperture.getAttribute('aria-invalid')).toBe('true');
    await page.getByText('Fix the marked fields to see the figures.').waitFor();
    expect(await page.getByRole('button', { name: 'Save plan' }).isDisabled()).toBe(true);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(375);
    await signOutThroughShell(page);
    await page.close();
  });
});
