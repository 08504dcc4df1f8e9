// Custom work in a real browser: the owner adds a neighbour as a customer and marks a field as
// theirs, sets the farm's own harrowing rate and a tax line; a harrowing job on that field is
// finished (through the API, as the operator's phone would); the owner drafts the invoice, sends it
// through a payment-service outage and a retry, the fake mail server receives it with the PDF and
// the payment link, the link opens the fake payment server's checkout, which is paid, and the
// invoice reads paid. The viewer exports the receivables as CSV; the operator sees no money.
//
// Expected money is worked out here from the inputs, not read from the app: a line is acres × the
// rate per acre, rounded once to the cent; the tax is the subtotal × the rate, rounded once to the
// cent, half away from zero (the rounding rule of shared/money.ts, as PostgreSQL's round(numeric)).
import fs from 'node:fs';
import type { Page } from 'playwright-core';
import { DEMO_FARM_NAME } from '../../seeds/01_demo_farm';
import { demo, screenshot, seriousViolations, signIn, startRig, type BrowserRig } from '../support/browser';
import { rect } from '../support/geo-fixtures';
import { signedIn, type Client } from '../support/test-app';

const tag = Math.random().toString(36).slice(2, 8);
const CUSTOMER = `Coulee Gate Farms ${tag}`;
const CUSTOMER_EMAIL = `accounts-${tag}@coulee-gate.test`;
const FIELD = `Neighbour Quarter ${tag}`;
const ACRES_DONE = 78.4;
/** The owner's own harrowing rate, typed in dollars; in cents below. */
const RATE_TYPED = '6.25';
const RATE_CENTS = 625;
/** The tax line typed in per cent; in basis points below (1 % = 100 basis points). */
const TAX_TYPED = '5';
const TAX_BASIS_POINTS = 500;

/** Half away from zero, to the whole cent (the rule stated in shared/money.ts). */
const roundHalfAway = (x: number) => Math.sign(x) * Math.round(Math.abs(x));
const LINE_CENTS = roundHalfAway(ACRES_DONE * RATE_CENTS);
const TAX_CENTS = roundHalfAway((LINE_CENTS * TAX_BASIS_POINTS) / 10_000);
const TOTAL_CENTS = LINE_CENTS + TAX_CENTS;
/** Cents as the screens write money: "$1,234.56" (en-US grouping). */
const usd = (cents: number) => `$${(cents / 100).toLocaleString('en-US', { minimumFractionDigits: 2, maximumFractionDigits: 2 })}`;

/**
 * A recent past day (the run sheet logs taps up to a year back) on which the demo farm has as few
 * jobs as may be, so the test's job stands out on the run sheet.
 */
async function recentDay(rig: BrowserRig, farmId: number): Promise<string> {
  const days = [2, 3, 4].map((back) => new Date(Date.now() - back * 86_400_000).toISOString().slice(0, 10));
  for (const day of days) if (!(await rig.t.db('assignments').where({ farm_id: farmId, day }).first('id'))) return day;
  return days[0];
}

/**
 * The open dialog once its opening animation has ended (the focus moves in then). Locators only:
 * the app's CSP refuses the string predicate the shared openedDialog helper evaluates.
 */
async function openedDialog(page: Page) {
  await page.locator('mat-dialog-container.mdc-dialog--open:not(.mdc-dialog--opening)').waitFor();
  return page.getByRole('dialog');
}

/** Nothing on the page is wider than the screen (tables scroll inside their own box). */
async function fitsTheScreen(page: Page): Promise<boolean> {
  // Written as text: this file is also type-checked without the browser's types.
  return page.evaluate(`(() => [document.documentElement, document.querySelector('mat-sidenav-content')]
    .filter(Boolean).every((e) => e.scrollWidth <= e.clientWidth + 1))()`) as Promise<boolean>;
}

describe('Custom work billed and paid online, in a real browser', () => {
  let rig: BrowserRig;
  let farmId: number;
  let fieldId: number;
  let day: string;
  let owner: Client;
  let page: Page;
  let invoicePath: string;
  let invoiceNumber: number;
  let paymentLink: string;

  beforeAll(async () => {
    rig = await startRig();
    // The fake payment server tells this app when a checkout is paid, signed as the real service signs.
    rig.t.payments.webhookUrl = `${rig.baseUrl}/api/payments/webhook`;
    const db = rig.t.db;
    farmId = (await db('farms').where({ name: DEMO_FARM_NAME }).first('id')).id;
    day = await recentDay(rig, farmId);
    [{ id: fieldId }] = await db('fields')
      .insert({
        farm_id: farmId,
        name: FIELD,
        boundary: JSON.stringify(rect(-97.2 + Math.random() * 0.3, 45.6 + Math.random() * 0.2, 0.0075, 0.005)),
        area_m2: 80 * 4046.8564224,
        acres: 80,
      })
      .returning('id');
    owner = await signedIn(rig.t.app, demo('owner').email, demo('owner').password);
  });

  afterAll(async () => {
    // The demo farm's own rate and tax line go back to how they were.
    await owner?.delete('/api/rate-card/harrowing');
    await owner?.put('/api/invoices/settings', { taxName: null, taxBasisPoints: 0, currency: 'usd' });
    await rig?.close();
  });

  it('when the owner adds a neighbour and ticks a field as theirs, then the customer lists it', async () => {
    page = await rig.newPage({ width: 1366, height: 900 });
    await signIn(page, demo('owner'));
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Custom work' }).click();
    await page.getByRole('heading', { level: 1, name: 'Custom work' }).waitFor();
    await page.getByRole('button', { name: 'Add customer' }).click();
    const dialog = await openedDialog(page);
    await dialog.getByLabel('Name', { exact: true }).fill(CUSTOMER);
    await dialog.getByLabel('E-mail').fill(CUSTOMER_EMAIL);
    await dialog.getByLabel('Address').fill('RR 3\nMapleton');
    await dialog.getByRole('checkbox', { name: new RegExp(FIELD) }).check();
    await dialog.getByRole('button', { name: 'Save customer' }).click();
    await dialog.waitFor({ state: 'detached' });
    const row = page.locator('li.customer', { hasText: CUSTOMER });
    await row.getByText(`${FIELD} · 80.0 ac`).waitFor();
    // Saved on the server, not only on the screen.
    expect((await rig.t.db('fields').where({ id: fieldId }).first('customer_id')).customer_id).not.toBeNull();
  });

  it('when the owner sets the farm’s own harrowing rate, then it shows as theirs beside the default and its source', async () => {
    const harrowing = page.locator('li[data-operation="harrowing"]');
    await harrowing.getByLabel('Rate ($)').fill(RATE_TYPED);
    await harrowing.getByRole('button', { name: 'Save' }).click();
    await harrowing.getByText('the farm’s own rate').waitFor();
    expect(await harrowing.getByTestId('rate-now-harrowing').innerText()).toContain(`${usd(RATE_CENTS)} per acre`);
    expect(await harrowing.innerText()).toMatch(/Default \$\d+\.\d\d per acre/);
    expect(await harrowing.getByRole('button', { name: 'Use the default' }).count()).toBe(1);
    expect(await seriousViolations(page)).toEqual([]);
    await screenshot(page, 'custom-work-1-customers-and-rates');
  });

  it('when a harrowing job on the neighbour’s field is finished, then the owner drafts an invoice with its line, the tax line and the total', async () => {
    // The job, as the board and the operator's phone make it.
    const db = rig.t.db;
    const operator = demo('operator');
    const membership = await db('memberships')
      .join('users', 'users.id', 'memberships.user_id')
      .where({ 'memberships.farm_id': farmId, 'users.email': operator.email })
      .first('memberships.id');
    const [{ id: machineId }] = await db('machines')
      .insert({ farm_id: farmId, name: `4WD ${tag}`, kind: 'tractor-4wd', power_hp: 400, engine_hours: 2000 })
      .returning('id');
    const harrow = await db('implements').where({ farm_id: farmId }).whereRaw("'harrowing' = any(operations)").first('id');
    const version = (await owner.get(`/api/board?date=${day}`)).body.version as number;
    const made = await owner.post('/api/assignments', {
      version,
      date: day,
      operation: 'harrowing',
      fieldId,
      operatorId: membership.id,
      machineId,
      implementId: harrow.id,
      startTime: '08:00',
      endTime: '12:00',
    });
    expect(made.status).toBe(201);
    const jobId = made.body.savedAssignmentId as number;
    const phone = await signedIn(rig.t.app, operator.email, operator.password);
    expect((await phone.post(`/api/assignments/${jobId}/events`, { type: 'start', at: `${day}T14:00:00Z` })).status).toBe(201);
    const finish = { type: 'finish', at: `${day}T17:30:00Z`, acres: ACRES_DONE };
    expect((await phone.post(`/api/assignments/${jobId}/events`, finish)).status).toBe(201);

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Invoices' }).click();
    await page.getByRole('heading', { level: 1, name: 'Invoices' }).waitFor();
    const tax = page.getByRole('form', { name: 'Tax line of new invoices' });
    await tax.getByLabel('Tax name').fill('Sales tax');
    await tax.getByLabel('Tax rate').fill(TAX_TYPED);
    await tax.getByRole('button', { name: 'Save tax line' }).click();
    await tax.getByRole('status').waitFor();

    await page.getByRole('button', { name: 'Draft invoice' }).click();
    const dialog = await openedDialog(page);
    await dialog.locator('mat-form-field', { hasText: 'Customer' }).click();
    await page.getByRole('option', { name: CUSTOMER }).click();
    await dialog.getByRole('textbox', { name: 'From', exact: true }).fill(day);
    await dialog.getByRole('textbox', { name: 'To', exact: true }).fill(day);
    await dialog.getByRole('button', { name: 'Draft invoice' }).click();
    await page.waitForURL(/\/invoices\/\d+$/);
    invoicePath = new URL(page.url()).pathname;
    const heading = page.getByRole('heading', { level: 1, name: /^Invoice \d+$/ });
    await heading.waitFor();
    invoiceNumber = Number((await heading.innerText()).replace(/\D/g, ''));
    expect(await page.locator('app-state-chip').innerText()).toContain('Draft');

    const lines = page.getByRole('table', { name: 'Lines of the invoice' });
    const line = lines.locator('tbody tr');
    expect(await line.count()).toBe(1);
    const cells = await line.locator('td').allInnerTexts();
    expect(cells[0]).toBe(FIELD);
    expect(cells[1]).toBe('Harrowing');
    expect(cells[2]).toBe(day);
    // The quantity billed with every decimal the amount was worked from (at least two).
    expect(cells[3]).toContain(`${ACRES_DONE.toFixed(2)} ac`);
    expect(cells[4]).toBe(`${usd(RATE_CENTS)} per acre`);
    expect(cells[5]).toBe(usd(LINE_CENTS));
    const foot = await lines.locator('tfoot').innerText();
    expect(foot).toContain(`Sales tax (${TAX_TYPED} %)`);
    expect(foot).toContain(usd(TAX_CENTS));
    expect(await page.getByTestId('invoice-total').innerText()).toBe(usd(TOTAL_CENTS));
    expect(await seriousViolations(page)).toEqual([]);
    await screenshot(page, 'custom-work-2-draft-invoice');
  });

  it('when the payment service is down as the owner sends, then the invoice stays sent, says why, and Retry mails it with the PDF and link', async () => {
    rig.t.payments.mode = 'down';
    await page.getByRole('button', { name: 'Send' }).click();
    const confirm = await openedDialog(page);
    expect(await confirm.innerText()).toContain(CUSTOMER_EMAIL);
    await confirm.getByRole('button', { name: 'Send' }).click();
    const outage = page.locator('.outage');
    await outage.waitFor();
    expect(await outage.innerText()).toContain('payment service');
    expect(await page.locator('app-state-chip').innerText()).toContain('Sent, not paid');
    expect(rig.t.mail.to(CUSTOMER_EMAIL)).toHaveLength(0);
    await screenshot(page, 'custom-work-3-payment-service-down');

    rig.t.payments.mode = 'ok';
    await outage.getByRole('button', { name: 'Retry' }).click();
    await page
      .getByRole('status')
      .filter({ hasText: `Invoice ${invoiceNumber} was sent to ${CUSTOMER_EMAIL}` })
      .waitFor();
    expect(await outage.count()).toBe(0);

    await rig.t.flushMail();
    const mail = await rig.t.mail.waitFor((m) => m.to.includes(CUSTOMER_EMAIL));
    const pdf = mail.attachments.find((a) => a.contentType === 'application/pdf');
    expect(pdf?.filename).toBe(`invoice-${invoiceNumber}.pdf`);
    // A PDF file starts with its header "%PDF-" (ISO 32000-1 §7.5.2).
    expect(pdf!.content.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const link = /Pay online: (\S+)/.exec(mail.text)?.[1];
    expect(link).toMatch(new RegExp(`^http://127\\.0\\.0\\.1:${rig.t.payments.port}/pay/`));
    paymentLink = link!;
  });

  it('when the viewer exports the receivables, then the CSV lists the sent invoice with its total', async () => {
    const viewer = await rig.newPage({ width: 1366, height: 900 });
    await signIn(viewer, demo('viewer'));
    await viewer.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Invoices' }).click();
    await viewer.getByRole('heading', { level: 1, name: 'Invoices' }).waitFor();
    expect(await viewer.getByRole('button', { name: 'Draft invoice' }).count()).toBe(0);
    // The viewer does not read the customer list; the page must not tell them to add one.
    await viewer.getByTestId('receivables-total').waitFor();
    expect(await viewer.getByText('Add a customer under').count()).toBe(0);
    await viewer.getByTestId('receivables-total').waitFor();
    const [download] = await Promise.all([
      viewer.waitForEvent('download'),
      viewer.getByRole('link', { name: 'Export the receivables as CSV' }).click(),
    ]);
    expect(download.suggestedFilename()).toBe('furlong-receivables.csv');
    const csv = fs.readFileSync((await download.path())!, 'utf8').replace(/^\uFEFF/, '');
    const rows = csv.trim().split(/\r?\n/);
    expect(rows[0]).toBe('number,customer,issued_on,currency,total,days_outstanding');
    const ours = rows.find((r) => r.startsWith(`${invoiceNumber},`));
    expect(ours).toBeDefined();
    expect(ours).toContain(CUSTOMER);
    expect(ours).toContain(`,USD,${(TOTAL_CENTS / 100).toFixed(2)},`);
    // The viewer reads the invoice but has no button to change it.
    await viewer.goto(invoicePath);
    await viewer.getByTestId('invoice-total').waitFor();
    expect(await viewer.getByRole('button', { name: /Send|Void|Credit note|Retry/ }).count()).toBe(0);
    await screenshot(viewer, 'custom-work-4-viewer-invoice');
    await viewer.close();
  });

  it('when the customer pays on the checkout the link opens, then the owner sees the invoice paid', async () => {
    const customer = await rig.newPage({ width: 1366, height: 900 });
    await customer.goto(paymentLink);
    await customer.getByRole('heading', { name: 'Local test checkout' }).waitFor();
    await screenshot(customer, 'custom-work-5-checkout');
    const sent = rig.t.payments.deliveries.length;
    // The checkout asks for exactly the invoice's total, made by the app, not typed by the customer.
    const amount = `${(TOTAL_CENTS / 100).toFixed(2)} USD`;
    expect(await customer.locator('body').innerText()).toContain(`Amount: ${amount}`);
    await customer.getByRole('button', { name: `Pay ${amount}` }).click();
    // The fake server signs and sends checkout.session.completed to the app's webhook.
    const deadline = Date.now() + 10_000;
    while (!rig.t.payments.deliveries.slice(sent).some((d) => d.status === 200) && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 100));
    }
    expect(rig.t.payments.deliveries.slice(sent).map((d) => [d.event.type, d.status])).toContainEqual(['checkout.session.completed', 200]);
    await customer.close();

    await page.reload();
    await page.locator('app-state-chip', { hasText: 'Paid' }).waitFor();
    expect(await page.getByRole('button', { name: 'Credit note' }).count()).toBe(1);
    expect(await page.getByRole('button', { name: 'Void' }).count()).toBe(0);
    await screenshot(page, 'custom-work-6-paid');
    await page.goto('/invoices');
    const row = page.locator('tr[data-invoice]', { hasText: `Invoice ${invoiceNumber}` });
    await row.waitFor();
    expect(await row.locator('app-state-chip').innerText()).toContain('Paid');
    expect(await row.innerText()).toContain(usd(TOTAL_CENTS));
  });

  it('when the pages are opened on a phone, then nothing runs off the screen', async () => {
    // Signed in wide (the menu hides behind a button on a phone), then turned to a phone's size.
    const phone = await rig.newPage({ width: 1366, height: 900 });
    await signIn(phone, demo('owner'));
    await phone.setViewportSize({ width: 390, height: 844 });
    for (const [path, name] of [
      ['/custom-work', 'custom-work-7-phone-customers'],
      ['/invoices', 'custom-work-8-phone-invoices'],
      [invoicePath, 'custom-work-9-phone-invoice'],
    ] as const) {
      await phone.goto(path);
      await phone.getByRole('heading', { level: 1 }).waitFor();
      await phone.waitForLoadState('networkidle');
      expect(await fitsTheScreen(phone)).toBe(true);
      // Nor does an invoice list scroll sideways inside its own box: on a phone the rows stack.
      if (path !== '/custom-work') {
        const wraps = phone.locator('.table-wrap');
        expect(await wraps.count()).toBeGreaterThan(0);
        expect(await wraps.evaluateAll((ws) => ws.filter((w) => w.scrollWidth > w.clientWidth + 1).length)).toBe(0);
      }
      await screenshot(phone, name);
    }
    await phone.close();
  });

  it('when an operator signs in, then no money shows: no custom work or invoices in the menu, and the pages send them away', async () => {
    const op = await rig.newPage({ width: 1366, height: 900 });
    await signIn(op, demo('operator'));
    const nav = await op.getByRole('navigation', { name: 'Main' }).innerText();
    expect(nav).not.toContain('Custom work');
    expect(nav).not.toContain('Invoices');
    for (const path of ['/invoices', invoicePath, '/custom-work']) {
      await op.goto(path);
      await op.waitForURL((u) => !u.pathname.startsWith('/invoices') && !u.pathname.startsWith('/custom-work'));
      await op.getByRole('heading', { level: 1 }).waitFor();
      expect(await op.locator('body').innerText()).not.toContain('$');
    }
    // The day of the custom job on the operator's own run sheet: the job, never its price or customer.
    await op.goto(`/run-sheet?date=${day}`);
    await op.getByRole('heading', { level: 1 }).waitFor();
    await op.getByText(FIELD).first().waitFor();
    const sheet = await op.locator('body').innerText();
    expect(sheet).not.toContain('$');
    expect(sheet).not.toContain(CUSTOMER);
    expect(rig.outside).toEqual([]);
    await op.close();
  });
});
