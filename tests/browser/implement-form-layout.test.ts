// Add / Edit implement laid out in a real browser: every box of the dialog, "Minimum power" above
// all, at a desktop and a phone width, light and dark, empty, typed, focused and opened with a
// stored value. A box fails when its label overlaps the value, the label text is cut short, the
// outline runs through the floating label, the typed value does not fit, or the box leaves the dialog.
import fs from 'node:fs';
import path from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { demo, screenshot, signIn, startRig, type BrowserRig } from '../support/browser';

const tag = `T${Date.now().toString(36).slice(-5)}${Math.floor(Math.random() * 1296).toString(36)}`;
const storedName = `${tag} power check harrow`;
const artifacts = process.env.ARTIFACTS_DIR ?? path.resolve(__dirname, '..', '..', 'artifacts');

const SIZES = [
  { name: 'desktop', width: 1366, height: 900 },
  { name: 'phone', width: 390, height: 844 },
] as const;
const SCHEMES = ['light', 'dark'] as const;

interface Rect {
  top: number;
  bottom: number;
  left: number;
  right: number;
}

interface Measure {
  label: string;
  floating: boolean;
  value: string;
  labelBox: Rect;
  inputBox: Rect;
  /** The label text is wider than the room it is given (cut off or ellipsed). */
  labelCut: boolean;
  /** The typed value is wider than the input (scrolled out of sight). */
  valueCut: boolean;
  numeric: boolean;
  /** Width of the gap in the outline the floating label sits in, and the label's own width. */
  notchWidth: number | null;
  labelWidth: number;
  suffixBox: Rect | null;
  /** Hints, errors and other words of the dialog outside this box. */
  otherTexts: Array<{ text: string; box: Rect }>;
  fieldBox: Rect;
  contentBox: Rect;
}

/** Everything that decides whether one box reads right, from the page's own layout. */
async function measure(field: Locator): Promise<Measure> {
  return field.evaluate((f) => {
    const rect = (el: Element | null): Rect => {
      const r = el!.getBoundingClientRect();
      return { top: r.top, bottom: r.bottom, left: r.left, right: r.right };
    };
    const labelEl = f.querySelector('label.mdc-floating-label') as HTMLElement;
    const input = f.querySelector('input, textarea') as HTMLInputElement;
    const notch = f.querySelector('.mdc-notched-outline__notch') as HTMLElement | null;
    const suffix = f.querySelector('.mat-mdc-form-field-text-suffix');
    const text = f.querySelector('mat-label') as HTMLElement;
    return {
      label: text.textContent!.trim(),
      floating: labelEl.classList.contains('mdc-floating-label--float-above'),
      value: input.value,
      labelBox: rect(labelEl),
      inputBox: rect(input),
      labelCut: labelEl.scrollWidth > labelEl.clientWidth + 1 || text.scrollWidth > labelEl.clientWidth + 1,
      valueCut: input.scrollWidth > input.clientWidth + 1,
      numeric: input.type === 'number',
      notchWidth: notch ? notch.getBoundingClientRect().width : null,
      labelWidth: labelEl.getBoundingClientRect().width,
      // The unit shows only while the label floats (it fades in with it).
      suffixBox: suffix && (suffix as HTMLElement).offsetWidth && Number(getComputedStyle(suffix).opacity) > 0 ? rect(suffix) : null,
      otherTexts: [...f.closest('mat-dialog-content')!.querySelectorAll('mat-hint, mat-error, legend, .mat-mdc-checkbox, p')]
        .filter((el) => !f.contains(el) && (el as HTMLElement).offsetWidth > 0)
        .map((el) => ({ text: el.textContent!.trim().slice(0, 30), box: rect(el) })),
      fieldBox: rect(f),
      contentBox: rect(f.closest('mat-dialog-content')),
    };
  });
}

/** What is wrong with one box as measured; empty when it reads right. */
function problems(m: Measure): string[] {
  const out: string[] = [];
  const overlap = (a: Rect, b: Rect) => a.left < b.right - 1 && b.left < a.right - 1 && a.top < b.bottom - 1 && b.top < a.bottom - 1;
  if (m.floating && overlap(m.labelBox, m.inputBox)) out.push('floating label overlaps the value');
  if (!m.floating && m.value !== '') out.push('label rests over a value');
  if (m.labelCut) out.push('label text cut short');
  // A long name scrolls inside its box as any text box does; a number must show whole.
  if (m.valueCut && m.numeric) out.push('typed value does not fit');
  // The outline has a gap the floating label sits in: narrower than the label, the line runs through it.
  if (m.floating && m.notchWidth !== null && m.notchWidth + 1 < m.labelWidth)
    out.push(`outline runs through the label (${m.notchWidth} < ${m.labelWidth})`);
  if (m.suffixBox && !m.floating && overlap(m.labelBox, m.suffixBox)) out.push('resting label overlaps the unit');
  if (m.suffixBox && m.value !== '' && overlap(m.inputBox, m.suffixBox)) out.push('value overlaps the unit');
  for (const o of m.otherTexts) if (overlap(m.labelBox, o.box)) out.push(`label overlaps "${o.text}"`);
  if (m.fieldBox.left < m.contentBox.left - 0.5 || m.fieldBox.right > m.contentBox.right + 0.5) out.push('box leaves the dialog sideways');
  return out;
}

describe('Implement form layout in a real browser', () => {
  let rig: BrowserRig;
  const seen: Array<Record<string, unknown>> = [];

  beforeAll(async () => {
    rig = await startRig();
  });
  afterAll(async () => {
    await rig.t.db('implements').where({ name: storedName }).delete();
    fs.mkdirSync(artifacts, { recursive: true });
    fs.writeFileSync(path.join(artifacts, 'implement-form-layout.json'), JSON.stringify(seen, null, 1));
    await rig.close();
  });

  async function openDialog(page: Page, button: Locator, title: string): Promise<Locator> {
    await button.click();
    const dialog = page.getByRole('dialog', { name: title });
    await dialog.waitFor();
    return dialog;
  }

  /** Every text box of the dialog, checked as it stands; the failures, each named by box and case. */
  async function checkAll(page: Page, dialog: Locator, where: string): Promise<string[]> {
    const found: string[] = [];
    const fields = dialog.locator('mat-form-field').filter({ has: page.locator('input, textarea') });
    for (let i = 0; i < (await fields.count()); i++) {
      const field = fields.nth(i);
      await field.scrollIntoViewIfNeeded();
      const m = await measure(field);
      seen.push({ where, ...m });
      for (const p of problems(m)) found.push(`${where} / ${m.label}: ${p}`);
    }
    return found;
  }

  beforeAll(async () => {
    // An implement with a stored minimum power, so Edit opens with the label floating from the start.
    const setup = await rig.newPage();
    await signIn(setup, demo('owner'));
    const status = await setup.evaluate(async (name) => {
      const token = decodeURIComponent(
        document.cookie
          .split('; ')
          .find((c) => c.startsWith('XSRF-TOKEN='))
          ?.split('=')[1] ?? '',
      );
      const res = await fetch('/api/fleet/implements', {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'X-XSRF-TOKEN': token },
        body: JSON.stringify({
          name,
          kind: 'harrow',
          widthM: 25.6032,
          operations: ['harrowing'],
          machineIds: [],
          minPowerHp: 425,
          notes: null,
        }),
      });
      return res.status;
    }, storedName);
    expect(status).toBe(201);
    await setup.context().close();
  });

  const cases = SIZES.flatMap((size) => SCHEMES.map((scheme) => ({ size, scheme })));

  it.each(cases)(
    'when the owner opens Add and Edit implement at $size.name width in $scheme, then no label covers a value and nothing is cut',
    async ({ size, scheme }) => {
      const failures: string[] = [];
      const page = await rig.newPage();
      await page.emulateMedia({ colorScheme: scheme });
      // Signed in at the default size: on a phone the main navigation sits behind the menu button.
      await signIn(page, demo('owner'));
      await page.setViewportSize({ width: size.width, height: size.height });
      await page.goto('/fleet');
      await page.getByRole('heading', { level: 1, name: 'Fleet' }).waitFor();
      const where = `${size.name} ${size.width}x${size.height} ${scheme}`;
      const before = seen.length;

      // Add: empty, then with Minimum power focused, then typed and left.
      let dialog = await openDialog(page, page.getByRole('button', { name: 'Add implement' }), 'Add an implement');
      failures.push(...(await checkAll(page, dialog, `${where} add empty`)));
      const power = dialog.getByLabel('Minimum power (hp)');
      await power.focus();
      failures.push(...(await checkAll(page, dialog, `${where} add power focused`)));
      await dialog.getByLabel('Name').fill('Twelve-metre heavy harrow with a long name for the row');
      await dialog.getByLabel('Working width (ft)').fill('84.25');
      await dialog.getByLabel('Transport width (ft)').fill('18.5');
      await power.fill('12345');
      await dialog.getByLabel('Notes').click();
      failures.push(...(await checkAll(page, dialog, `${where} add typed`)));
      await power.scrollIntoViewIfNeeded();
      await screenshot(page, `implement-form-${size.name}-${scheme}-typed`);
      await dialog.getByRole('button', { name: 'Cancel' }).click();
      await dialog.waitFor({ state: 'detached' });

      // Edit: the stored value is there as the dialog opens; measured at once and after it settles.
      const row = page.locator('app-implements-table tr.mat-mdc-row').filter({ has: page.getByText(storedName, { exact: true }) });
      await row.scrollIntoViewIfNeeded();
      dialog = await openDialog(page, row.getByRole('button', { name: `Edit ${storedName}` }), `Edit ${storedName}`);
      failures.push(...(await checkAll(page, dialog, `${where} edit at open`)));
      await page.waitForTimeout(400);
      failures.push(...(await checkAll(page, dialog, `${where} edit settled`)));
      expect(await dialog.getByLabel('Minimum power (hp)').inputValue()).toBe('425');
      await dialog.getByLabel('Minimum power (hp)').scrollIntoViewIfNeeded();
      await screenshot(page, `implement-form-${size.name}-${scheme}-edit`);
      await page.context().close();

      // Each case was measured (label, value, notch and unit boxes go to artifacts/implement-form-layout.json).
      expect(seen.slice(before).filter((m) => m.label === 'Minimum power (hp)')).toHaveLength(5);
      expect(failures).toEqual([]);
    },
  );
});
