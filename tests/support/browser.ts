import fs from 'node:fs';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import AxeBuilder from '@axe-core/playwright';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { demoAccounts, type DemoAccount } from '../../seeds/01_demo_farm';
import { startTestApp, type TestApp } from './test-app';

export interface BrowserRig {
  t: TestApp;
  baseUrl: string;
  browser: Browser;
  /** Every request the pages made to anything but 127.0.0.1. */
  outside: string[];
  newPage: (viewport?: { width: number; height: number }) => Promise<Page>;
  close: () => Promise<void>;
}

const artifacts = process.env.ARTIFACTS_DIR ?? path.resolve(__dirname, '..', '..', 'artifacts');

/** The real server on a free loopback port, with the built app, and a headless Chromium. */
export async function startRig(): Promise<BrowserRig> {
  const t = await startTestApp();
  const server = t.app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  const baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
  const outside: string[] = [];
  const contexts: BrowserContext[] = [];
  return {
    t,
    baseUrl,
    browser,
    outside,
    newPage: async (viewport = { width: 1280, height: 800 }) => {
      const context = await browser.newContext({ viewport, baseURL: baseUrl, locale: 'en-US' });
      contexts.push(context);
      context.on('request', (req) => {
        const url = new URL(req.url());
        if (!['data:', 'blob:'].includes(url.protocol) && url.hostname !== '127.0.0.1') outside.push(req.url());
      });
      return context.newPage();
    },
    close: async () => {
      for (const c of contexts) await c.close().catch(() => undefined);
      await browser.close();
      server.closeAllConnections();
      await new Promise((r) => server.close(r));
      await t.close();
    },
  };
}

export const demo = (role: DemoAccount['role'], index = 0): DemoAccount => demoAccounts.filter((a) => a.role === role)[index];

export async function signIn(page: Page, account: DemoAccount): Promise<void> {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(account.email);
  await page.getByLabel('Password', { exact: true }).fill(account.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
}

export async function screenshot(page: Page, name: string): Promise<string> {
  const dir = path.join(artifacts, 'screenshots');
  fs.mkdirSync(dir, { recursive: true });
  const file = path.join(dir, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/** Serious and critical accessibility violations found by axe on the current page. */
export async function seriousViolations(page: Page): Promise<string[]> {
  const result = await new AxeBuilder({ page }).analyze();
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`);
}

/**
 * A day far ahead that no board of any farm has yet, so a test builds its own board and leaves
 * the demo farm's days alone.
 */
export async function freeBoardDay(rig: BrowserRig): Promise<string> {
  for (let i = 0; i < 50; i++) {
    const year = 2040 + Math.floor(Math.random() * 55);
    const month = 1 + Math.floor(Math.random() * 12);
    const date = 1 + Math.floor(Math.random() * 28);
    const day = `${year}-${String(month).padStart(2, '0')}-${String(date).padStart(2, '0')}`;
    const [jobs, days] = await Promise.all([rig.t.db('assignments').where({ day }).first(), rig.t.db('board_days').where({ day }).first()]);
    if (!jobs && !days) return day;
  }
  throw new Error('no free board day found');
}
