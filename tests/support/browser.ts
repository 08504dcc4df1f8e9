import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import AxeBuilder from '@axe-core/playwright';
import { chromium, type Browser, type BrowserContext, type Locator, type Page } from 'playwright-core';
import { demoAccounts, type DemoAccount } from '../../seeds/01_demo_farm';
import { startTestApp, type TestApp } from './test-app';

export interface BrowserRig {
  t: TestApp;
  baseUrl: string;
  browser: Browser;
  /** Every request the pages made to anything but 127.0.0.1. */
  outside: string[];
  /**
   * A page in a fresh browser context. `serviceWorkers: 'block'` for a page that stubs the API with
   * `page.route`: requests the service worker makes for the page never pass through page routes.
   */
  newPage: (
    viewport?: { width: number; height: number },
    options?: { serviceWorkers?: 'allow' | 'block'; touch?: boolean },
  ) => Promise<Page>;
  close: () => Promise<void>;
}

const artifacts = process.env.ARTIFACTS_DIR ?? path.resolve(__dirname, '..', '..', 'artifacts');

/** The real server on a free loopback port, with the built app, and a headless Chromium. */
export async function startRig(): Promise<BrowserRig> {
  // The port first, then the app: its public address (PUBLIC_URL) is where it is served here, so the
  // links it mails and the page the payment service returns a customer to lead back to this server.
  const server = http.createServer();
  server.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  const baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const t = await startTestApp({ PUBLIC_URL: baseUrl });
  server.on('request', t.app);
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
    newPage: async (viewport = { width: 1280, height: 800 }, options = {}) => {
      const context = await browser.newContext({
        viewport,
        baseURL: baseUrl,
        locale: 'en-US',
        serviceWorkers: options.serviceWorkers ?? 'allow',
        // A touch phone: touch events, and CSS's (pointer: coarse) matches.
        ...(options.touch ? { hasTouch: true, isMobile: true } : {}),
      });
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

/**
 * The dialog that is open, once it has finished opening. Material moves the focus into a dialog
 * (its first box) only when the opening animation ends: text typed into a later box before then
 * lands at the end of the first one when the focus jumps (96.5 acres became 96.5289 that way).
 */
export async function openedDialog(page: Page): Promise<Locator> {
  const dialog = page.getByRole('dialog');
  await dialog.waitFor();
  // Asked of the element, not with waitForFunction: its text predicate failed on the app's
  // Content-Security-Policy once the service worker served the page.
  const container = page.locator('mat-dialog-container').last();
  const deadline = Date.now() + 15_000;
  for (;;) {
    const ready = await container.evaluate((c) => {
      const open = c.classList.contains('mdc-dialog--open') && !c.classList.contains('mdc-dialog--opening');
      return open && c.contains(c.ownerDocument.activeElement);
    });
    if (ready) break;
    if (Date.now() > deadline) throw new Error('The dialog did not finish opening (no focus inside it) within 15 s');
    await page.waitForTimeout(50);
  }
  return dialog;
}

export async function screenshot(page: Page, name: string): Promise<string> {
  const dir = path.join(artifacts, 'screenshots');
  fs.mkdirSync(dir, { recursive: true });
  const file = path.join(dir, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/**
 * Serious and critical accessibility violations found by axe on the current page, once what is
 * moving has settled: a snack bar or dialog half faded in is measured at its partial opacity, and
 * its text then reads as too faint although the person sees it a moment later at full contrast.
 * Endless animations (a spinner) are not waited for.
 */
/** What a running animation tells (the DOM's Animation, declared here for the server's type-check). */
type Moving = { playState: string; effect: { getComputedTiming(): { iterations?: number } } | null };

export async function seriousViolations(page: Page): Promise<string[]> {
  // Asked of an element in a loop, as openedDialog does, not with waitForFunction (the app's
  // Content-Security-Policy refuses its predicate once the service worker serves the page).
  const deadline = Date.now() + 10_000;
  for (;;) {
    const settled = await page
      .locator('html')
      .evaluate((html) =>
        html.ownerDocument
          .getAnimations()
          .every((a: Moving) => a.playState !== 'running' || a.effect?.getComputedTiming().iterations === Number.POSITIVE_INFINITY),
      );
    if (settled) break;
    if (Date.now() > deadline) throw new Error('The page was still animating 10 s on; axe would measure colours half faded in');
    await page.waitForTimeout(50);
  }
  const result = await new AxeBuilder({ page }).analyze();
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`);
}

/**
 * A day far ahead that no board of any farm has yet, so a test builds its own board and leaves
 * the demo farm's days alone. `months` (1–12) keeps it to a season: the fake forecast's weather
 * follows the month, and a spraying day in January is no spraying day. `past`: a day long gone
 * instead, for a test whose operator starts the job (a start waits for the job's day).
 */
export async function freeBoardDay(
  rig: BrowserRig,
  months: readonly number[] = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12],
  { past = false }: { past?: boolean } = {},
): Promise<string> {
  for (let i = 0; i < 50; i++) {
    const year = (past ? 1950 : 2040) + Math.floor(Math.random() * 55);
    const month = months[Math.floor(Math.random() * months.length)];
    const date = 1 + Math.floor(Math.random() * 28);
    const day = `${year}-${String(month).padStart(2, '0')}-${String(date).padStart(2, '0')}`;
    const [jobs, days] = await Promise.all([rig.t.db('assignments').where({ day }).first(), rig.t.db('board_days').where({ day }).first()]);
    if (!jobs && !days) return day;
  }
  throw new Error('no free board day found');
}
