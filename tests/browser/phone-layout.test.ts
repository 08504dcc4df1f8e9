// The fleet's and the fields' tables on a 390 × 844 phone, in a real browser: each row stacks as a
// block (its name first, every other cell after its column's name), so nothing scrolls sideways,
// neither the page nor the table inside its own box. On a desktop the same tables keep their columns.
// On a touch phone the maps' zoom buttons are 44 × 44 px: WCAG 2.2 success criterion 2.5.5 (Target
// Size, Enhanced).
import type { Page } from 'playwright-core';
import { demo, screenshot, signIn, startRig, type BrowserRig } from '../support/browser';

const PHONE = { width: 390, height: 844 };

/** Boxes wider than what shows of them: the page, the app's content, and every table's box. */
async function sidewaysScrollers(page: Page): Promise<string[]> {
  // Written as text: this file is also type-checked without the browser's types.
  return page.evaluate(`(() => [document.documentElement, document.querySelector('mat-sidenav-content'), ...document.querySelectorAll('.table-wrap')]
    .filter((e) => e && e.scrollWidth > e.clientWidth + 1)
    .map((e) => e.className || e.tagName))()`) as Promise<string[]>;
}

describe('Tables and map buttons on a phone, in a real browser', () => {
  let rig: BrowserRig;

  beforeAll(async () => {
    rig = await startRig();
  });
  afterAll(async () => {
    await rig.close();
  });

  it.each([
    ['/fleet', 'table.machines', 'Engine hours: ', 'phone-fleet'],
    ['/fleet', 'table.implements', 'Working width: ', 'phone-fleet'],
    ['/fields', 'table.fields', 'Hazards: ', 'phone-fields'],
  ])(
    'when the owner opens %s on a phone, then %s reads as stacked rows with labelled cells and nothing scrolls sideways',
    async (path, table, label, shot) => {
      // Signed in wide (the menu hides behind a button on a phone), then turned to a phone's size.
      const page = await rig.newPage({ width: 1366, height: 900 });
      await signIn(page, demo('owner'));
      await page.goto(path);
      const rows = page.locator(`${table} tbody tr.mat-mdc-row`);
      await rows.first().waitFor();
      // On a desktop: columns, with their headings on screen.
      expect(await page.locator(`${table} thead th`).first().isVisible()).toBe(true);
      expect(await rows.first().evaluate((r) => getComputedStyle(r).display)).toBe('table-row');

      await page.setViewportSize(PHONE);
      // Opened afresh at the phone's size, as a phone would (the menu starts closed).
      await page.reload();
      await rows.first().waitFor();
      // The container query follows the table box's new width within a frame or two.
      for (let i = 0; i < 50 && (await rows.first().evaluate((r) => getComputedStyle(r).display)) !== 'grid'; i++)
        await page.waitForTimeout(100);
      expect(await rows.first().evaluate((r) => getComputedStyle(r).display)).toBe('grid');
      expect(await sidewaysScrollers(page)).toEqual([]);
      // Each cell after the name says which column it is, in the row's own words.
      const first = rows.first();
      const labelled = await first
        .locator('td[data-label]')
        .evaluateAll((tds) =>
          tds.filter((td) => getComputedStyle(td, '::before').content !== 'none').map((td) => `${td.dataset['label']}: `),
        );
      expect(labelled).toContain(label);
      // Every cell of the row lies within the screen's width.
      const boxes = await first.locator('td').evaluateAll((tds) => tds.map((td) => td.getBoundingClientRect().right));
      for (const right of boxes) expect(right).toBeLessThanOrEqual(PHONE.width + 0.5);
      await first.scrollIntoViewIfNeeded();
      await screenshot(page, shot);
      await page.close();
    },
  );

  it('when the owner opens the fields map on a touch phone, then its zoom buttons are at least 44 × 44 px (WCAG 2.2, 2.5.5)', async () => {
    // Signed in wide (the menu hides behind a button on a phone), then turned to a phone's size.
    const page = await rig.newPage({ width: 1366, height: 900 }, { touch: true });
    await signIn(page, demo('owner'));
    await page.setViewportSize(PHONE);
    await page.goto('/fields');
    const zoomIn = page.getByRole('button', { name: 'Zoom in' });
    await zoomIn.waitFor();
    for (const button of [zoomIn, page.getByRole('button', { name: 'Zoom out' })]) {
      const box = await button.boundingBox();
      expect(box?.width).toBeGreaterThanOrEqual(44);
      expect(box?.height).toBeGreaterThanOrEqual(44);
    }
    await page.close();
  });
});
