import type { Page } from 'playwright-core';
import { demo, screenshot, seriousViolations, signIn, startRig, type BrowserRig } from '../support/browser';

const navLabels = async (page: Page) =>
  (await page.getByRole('navigation', { name: 'Main' }).getByRole('link').allInnerTexts()).map((t) => t.replace(/^\S+\s+/, '').trim());

describe('the app shell in a real browser', () => {
  let rig: BrowserRig;
  beforeAll(async () => {
    rig = await startRig();
  });
  afterAll(() => rig.close());

  it('when the sign-in page opens, then it has no serious accessibility problems and its fonts come from the app', async () => {
    const page = await rig.newPage();
    const fonts: string[] = [];
    page.on('response', (r) => {
      if (/\.(woff2?|ttf)(\?|$)/.test(r.url()) && r.ok()) fonts.push(r.url());
    });
    await page.goto('/sign-in');
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    await page.evaluate(() => document.fonts.ready);
    expect(await seriousViolations(page)).toEqual([]);
    await screenshot(page, 'foundation-sign-in');
    const loaded = await page.evaluate(() => [...document.fonts].filter((f) => f.status === 'loaded').map((f) => f.family));
    expect(loaded.join(',')).toMatch(/Roboto/);
    expect(fonts.length).toBeGreaterThan(0);
    expect(fonts.every((u) => u.startsWith(rig.baseUrl))).toBe(true);
  });

  it('when a wrong password is typed, then a readable message shows, not JSON', async () => {
    const page = await rig.newPage();
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').fill(demo('owner').email);
    await page.getByLabel('Password', { exact: true }).fill('not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    const alert = page.getByRole('alert');
    await alert.waitFor();
    expect(await alert.innerText()).toMatch(/do not match/);
    expect(await alert.innerText()).not.toMatch(/[{}]/);
  });

  const expected: Array<[string, 'owner' | 'operator' | 'viewer', string[], string[]]> = [
    [
      'owner',
      'owner',
      ['Home', 'Work board', 'Run sheet', 'Fields', 'Pass plan', 'Fleet', 'Crew', 'Season', 'Custom work', 'Invoices', 'Members'],
      [],
    ],
    [
      'operator',
      'operator',
      ['Home', 'Run sheet', 'Fields', 'Pass plan', 'Fleet'],
      ['Work board', 'Crew', 'Season', 'Custom work', 'Invoices', 'Members'],
    ],
    [
      'viewer',
      'viewer',
      ['Home', 'Fields', 'Fleet', 'Season', 'Custom work', 'Invoices'],
      ['Work board', 'Run sheet', 'Pass plan', 'Crew', 'Members'],
    ],
  ];

  it.each(expected)('when the %s signs in, then the navigation shows what that role may use', async (_label, role, mustHave, mustNot) => {
    const page = await rig.newPage();
    await signIn(page, demo(role));
    await page.getByRole('heading', { level: 1 }).waitFor();
    const labels = await navLabels(page);
    for (const l of mustHave) expect(labels).toContain(l);
    for (const l of mustNot) expect(labels).not.toContain(l);
    expect(await seriousViolations(page)).toEqual([]);
    await screenshot(page, `foundation-shell-${role}`);
    if (role !== 'owner') {
      await page.goto('/members');
      await page.waitForURL((u) => !u.pathname.startsWith('/members'));
    }
  });

  it('when the farm database is not answering as a signed-in owner opens a page, then the app says so and keeps them signed in, and Try again opens the page', async () => {
    // The outage is stubbed with a page route, which the service worker's own requests would bypass.
    const page = await rig.newPage(undefined, { serviceWorkers: 'block' });
    await signIn(page, demo('owner'));
    // The server's answer during an outage (shown by the fault suite against a stopped PostgreSQL).
    const outage = {
      error: { code: 'db_unavailable', message: "The farm's database is not answering; your work is not lost. Try again in a minute." },
    };
    await page.route('**/api/auth/me', (r) => r.fulfill({ status: 503, contentType: 'application/json', body: JSON.stringify(outage) }));
    await page.goto('/fleet');
    await page.getByRole('alert').getByText('You are still signed in').waitFor();
    expect(page.url()).not.toContain('sign-in');
    expect(await page.getByRole('alert').innerText()).toContain("The farm's database is not answering");
    expect(await seriousViolations(page)).toEqual([]);
    await screenshot(page, 'foundation-database-not-answering');
    await page.unroute('**/api/auth/me');
    await page.getByRole('button', { name: 'Try again' }).click();
    await page.getByRole('heading', { name: 'Fleet' }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/fleet');
  });

  it('when the owner opens Members and switches to the dark theme, then the table shows the crew and the choice is remembered', async () => {
    const page = await rig.newPage();
    await signIn(page, demo('owner'));
    await page.goto('/members');
    // The members table (the page also has the weather limits' tables).
    const members = page.getByRole('table').filter({ hasText: 'E-mail' });
    await members.waitFor();
    expect(await members.innerText()).toContain(demo('operator').email);
    await page.getByRole('button', { name: 'Switch to dark theme' }).click();
    await page.reload();
    await page.getByRole('button', { name: 'Switch to light theme' }).waitFor();
    expect(await seriousViolations(page)).toEqual([]);
    await screenshot(page, 'foundation-members-dark');
  });

  it('when a session ends on the server, then the next call returns the person to sign-in', async () => {
    const page = await rig.newPage();
    await signIn(page, demo('viewer'));
    await rig.t.db('session').delete();
    await page.reload();
    await page.waitForURL(/\/sign-in/);
  });

  it('when every page above loaded, then no request left 127.0.0.1', () => {
    expect(rig.outside).toEqual([]);
  });
});
