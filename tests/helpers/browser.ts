// Serves the built client and the API in this process, and drives Debian's Chromium.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { createRequire } from 'node:module';
import type { Server } from 'node:http';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { expect } from 'vitest';
import { useTestEnv } from './api';

export interface BrowserHarness {
  baseUrl: string;
  context: BrowserContext;
  close: () => Promise<void>;
}

const CHROMIUM_ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'];

export async function startBrowserHarness(): Promise<BrowserHarness> {
  useTestEnv();
  const clientDir = path.resolve('dist/client');
  if (!fs.existsSync(path.join(clientDir, 'index.html'))) throw new Error('Build the client first (npm test does: vite build).');
  const { initDataSource } = await import('../../server/lib/data-source');
  await initDataSource();
  const { createApp } = await import('../../server/app');
  const app = createApp({ clientDir });
  const server: Server = await new Promise((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const port = (server.address() as { port: number }).port;
  process.env.PUBLIC_URL = `http://127.0.0.1:${port}`;
  const { resetEnvCache } = await import('../../server/lib/env');
  resetEnvCache();
  const profile = fs.mkdtempSync(path.join(os.tmpdir(), 'lamella-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: '/usr/bin/chromium',
    args: CHROMIUM_ARGS,
    viewport: { width: 1280, height: 800 },
    acceptDownloads: true,
  });
  return {
    baseUrl: `http://127.0.0.1:${port}`,
    context,
    close: async () => {
      await context.close();
      await new Promise<void>((r) => server.close(() => r()));
      fs.rmSync(profile, { recursive: true, force: true });
    },
  };
}

export async function signInThroughForm(page: Page, baseUrl: string, email: string, password: string) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('navigation', { name: 'Sections' }).waitFor();
}

export async function signOutThroughShell(page: Page) {
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.getByRole('heading', { name: 'Sign in to your studio' }).waitFor();
}

/** Saves a screenshot of a key screen under docs/screenshots (used by the README tour). */
export async function screenshot(page: Page, name: string) {
  const dir = path.resolve('docs/screenshots');
  fs.mkdirSync(dir, { recursive: true });
  await page.screenshot({ path: path.join(dir, `${name}.png`), fullPage: false });
}

const axeSource = fs.readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');

/** axe-core in the page: no serious or critical accessibility violations. */
export async function expectNoSeriousA11yViolations(page: Page) {
  await page.addScriptTag({ content: axeSource });
  const violations: { id: string; impact: string; nodes: unknown[] }[] = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, opts: object) => Promise<{ violations: { id: string; impact: string; nodes: unknown[] }[] }> } }).axe;
    const result = await axe.run(document, { resultTypes: ['violations'] });
    return result.violations.map((v) => ({ id: v.id, impact: v.impact, nodes: v.nodes.slice(0, 3) }));
  });
  const serious = violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(serious, JSON.stringify(serious, null, 2)).toEqual([]);
}
