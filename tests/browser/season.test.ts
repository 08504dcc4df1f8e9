import fs from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { DEMO_FARM_NAME } from '../../seeds/01_demo_farm';
import { demo, screenshot, seriousViolations, signIn, startRig, type BrowserRig } from '../support/browser';

const artifacts = process.env.ARTIFACTS_DIR ?? path.resolve(__dirname, '..', '..', 'artifacts');
const oneDecimal = new Intl.NumberFormat('en-US', { minimumFractionDigits: 1, maximumFractionDigits: 1 });

/** A change to a finished log sent from inside the page with its own XSRF token, so only the role can refuse it. */
async function patchLogFromPage(page: Page, id: number): Promise<{ status: number; code: string }> {
  return page.evaluate(async (jobId) => {
    const token = decodeURIComponent(
      document.cookie
        .split('; ')
        .find((c) => c.startsWith('XSRF-TOKEN='))
        ?.split('=')[1] ?? '',
    );
    const res = await fetch(`/api/assignments/${jobId}/log`, {
      method: 'PATCH',
      headers: { 'Content-Type': 'application/json', 'X-XSRF-TOKEN': token },
      body: JSON.stringify({ acresDone: 1 }),
    });
    const body = (await res.json()) as { error?: { code?: string } };
    return { status: res.status, code: body.error?.code ?? '' };
  }, id);
}

/** The whole screen in one picture: the shell scrolls inside its content box, so grow the viewport to fit. */
async function wholePage(page: Page, name: string): Promise<void> {
  const height = await page.locator('mat-sidenav-content').evaluate((e) => e.scrollHeight);
  const viewport = page.viewportSize()!;
  await page.setViewportSize({ width: viewport.width, height: Math.min(height + 80, 8000) });
  await screenshot(page, name);
  await page.setViewportSize(viewport);
}

describe('Season in a real browser', () => {
  let rig: BrowserRig;
  let farmId: number;
  /** The newest season with finished work on the demo farm, and what it adds up to, read straight from the tables. */
  let year: number;
  let acresFinished: number;
  let finishedJobs: number;

  beforeAll(async () => {
    rig = await startRig();
    const db = rig.t.db;
    farmId = (await db('farms').where({ name: DEMO_FARM_NAME }).first('id')).id;
    // Other browser tests may log jobs on far-future days; the demo's own history ends this year.
    const [latest] = await db('assignments')
      .where({ farm_id: farmId, state: 'finished' })
      .andWhere('day', '<', `${new Date().getFullYear() + 1}-01-01`)
      .select(db.raw('max(extract(year from day))::int as year'));
    year = latest.year;
    const [sum] = await db('assignments')
      .where({ farm_id: farmId, state: 'finished' })
      .andWhere('day', '>=', `${year}-01-01`)
      .andWhere('day', '<', `${year + 1}-01-01`)
      .select(db.raw('coalesce(sum(acres_done), 0)::float as acres, count(*)::int as jobs'));
    acresFinished = sum.acres;
    finishedJobs = sum.jobs;
  });
  afterAll(() => rig.close());

  let page: Page;
  const consoleErrors: string[] = [];

  it('when a viewer opens the season, then the newest worked season shows its totals and a chart per operation', async () => {
    expect(finishedJobs).toBeGreaterThan(0);
    page = await rig.newPage({ width: 1280, height: 1000 });
    await signIn(page, demo('viewer'));
    // From here on (the sign-in page's own "who am I?" answers 401 by design).
    page.on('console', (m) => {
      if (m.type() === 'error') consoleErrors.push(m.text());
    });
    await page.goto(`/season?year=${year}`);
    await page.getByRole('heading', { level: 1, name: `Season ${year}` }).waitFor();

    // The headline agrees with the logs summed here, to the tenth the screen shows.
    const headline = page.getByTestId('season-headline');
    await headline.waitFor();
    expect(await headline.innerText()).toContain(`${oneDecimal.format(acresFinished)} ac finished`);
    expect(await headline.innerText()).toContain(`${finishedJobs} jobs finished`);

    // A chart per operation with work, painted on its canvas.
    const canvas = page.locator('app-week-chart canvas').first();
    await canvas.waitFor();
    const painted = await canvas.evaluate((c: HTMLCanvasElement) => {
      const data = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data;
      let n = 0;
      for (let i = 3; i < data.length; i += 4) if (data[i] > 0) n++;
      return n;
    });
    expect(painted).toBeGreaterThan(1000);
    expect(await page.getByRole('progressbar', { name: 'Harrowing covered' }).count()).toBe(1);
  });

  it('when the tables show, then each has rows and a totals row, and a column sorts', async () => {
    const fields = page.getByRole('table', { name: 'Work per field' });
    const fieldRows = fields.locator('tbody tr');
    const count = await fieldRows.count();
    expect(count).toBeGreaterThan(5);
    expect(await fields.locator('tr.totals').innerText()).toContain(`${count} fields`);
    await fields.getByRole('columnheader', { name: /^Area \(ac\)/ }).click();
    const areas = (await fields.locator('tbody tr td:nth-child(3)').allInnerTexts()).map((s) => Number(s.replace(/[^\d.]/g, '')));
    expect(areas).toEqual([...areas].sort((a, b) => a - b));
    for (const name of ['Work per person', 'Work per machine', 'Planned against actual hours per operation']) {
      expect(await page.getByRole('table', { name }).locator('tbody tr').count()).toBeGreaterThan(0);
    }
    // The people add up to the headline: their totals row, read off the screen.
    const everyone = await page.getByRole('table', { name: 'Work per person' }).locator('tr.totals').innerText();
    expect(everyone).toContain(oneDecimal.format(acresFinished));
    await wholePage(page, 'season-1-viewer');
    await fields.screenshot({ path: path.join(artifacts, 'screenshots', 'season-2-fields-table.png') });
  });

  it('when the fields table is downloaded, then a CSV file with a BOM and a header with units arrives', async () => {
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('link', { name: 'Download the fields table as CSV' }).click(),
    ]);
    expect(download.suggestedFilename()).toBe(`furlong-${year}-fields.csv`);
    const csv = fs.readFileSync((await download.path())!);
    expect([...csv.subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    const lines = csv.subarray(3).toString('utf8').split('\r\n');
    expect(lines[0]).toBe(
      'field,crop,field_acres,operation,acres_finished,hours_logged,date_finished,cost_dollars,field_cost_dollars,field_cost_per_acre_dollars,' +
        'jobs_finished,jobs_measured,acres_measured,acres_typed_on_measured_jobs,acres_skipped,acres_worked_twice',
    );
    // Counted from the end: a field's name may hold a comma. acres_finished is the twelfth column from the end.
    const total = lines.slice(1, -1).reduce((s, l) => s + Number(l.split(',').at(-12)), 0);
    expect(Math.abs(total - acresFinished)).toBeLessThan(0.01 * lines.length);
  });

  it('when the season before is chosen to compare, then both show side by side', async () => {
    await page.locator('mat-form-field', { hasText: 'Compare with' }).click();
    await page.getByRole('option', { name: String(year - 1) }).click();
    await page.getByRole('heading', { name: `${year - 1} beside ${year}` }).waitFor();
    await page.locator('app-compare-chart canvas').waitFor();
    expect(
      await page
        .getByRole('table', { name: `Seasons ${year - 1} and ${year} side by side` })
        .locator('tbody tr')
        .count(),
    ).toBeGreaterThan(0);
    expect(page.url()).toContain(`compare=${year - 1}`);
    await page
      .locator('section[aria-labelledby="compare-heading"]')
      .screenshot({ path: path.join(artifacts, 'screenshots', 'season-3-compare.png') });
  });

  it('when axe checks the screen, then it finds nothing serious', async () => {
    expect(await seriousViolations(page)).toEqual([]);
  });

  it('when the season is printed, then navigation and buttons are gone, text is black on white and each section starts a page', async () => {
    await page.emulateMedia({ media: 'print' });
    expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(false);
    expect(await page.getByRole('button', { name: 'Print' }).isVisible()).toBe(false);
    expect(await page.getByRole('link', { name: 'Download the fields table as CSV' }).isVisible()).toBe(false);
    const colours = await page
      .locator('#fields-heading')
      .evaluate((h) => [getComputedStyle(h).color, getComputedStyle(document.body).backgroundColor]);
    expect(colours).toEqual(['rgb(0, 0, 0)', 'rgb(255, 255, 255)']);
    expect(
      await page
        .locator('.sheet + .sheet')
        .first()
        .evaluate((s) => getComputedStyle(s).breakBefore),
    ).toBe('page');
    // Letter paper is 8.5 in wide: 816 CSS px.
    await page.setViewportSize({ width: 816, height: 1056 });
    await screenshot(page, 'season-4-print');
    const pdf = await page.pdf({ format: 'Letter', printBackground: true });
    fs.writeFileSync(path.join(artifacts, 'season-print.pdf'), pdf);
    const pages = (pdf.toString('latin1').match(/\/Type\s*\/Page[^s]/g) ?? []).length;
    // Each section starts a page, except a short one marked to follow the one before it.
    expect(pages).toBeGreaterThanOrEqual(await page.locator('.sheet:not(.follows)').count());
    expect(consoleErrors).toEqual([]);
    expect(rig.outside).toEqual([]);
  });

  it('when the viewer tries to correct a finished log from the page, then the server refuses it', async () => {
    const job = await rig.t.db('assignments').where({ farm_id: farmId, state: 'finished' }).first('id', 'acres_done');
    await page.emulateMedia({ media: 'screen' });
    expect(await patchLogFromPage(page, job.id)).toEqual({ status: 403, code: 'forbidden' });
    const after = await rig.t.db('assignments').where({ id: job.id }).first('acres_done');
    expect(after.acres_done).toBe(job.acres_done);
    expect(rig.outside).toEqual([]);
  });
});
