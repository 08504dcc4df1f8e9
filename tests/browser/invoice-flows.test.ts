// Invoice flows in a real browser that custom-work.test.ts does not walk: the customer paying on
// the fake checkout and landing, signed out, on the page the payment link returns to; a card
// declined on the checkout, after which the owner sees the invoice still unpaid and voids it from
// the invoice's page (its payment link then takes no payment); a paid invoice credited from its
// page, the credit note mailed to the customer with its PDF; and an invoice of several lines read
// on a 390 × 844 phone without sideways scrolling.
//
// The farm is one of its own (tests/support/farm-factory.ts), so the demo farm is left alone.
// Expected money is worked out here from the inputs, not read from the app: a line is the quantity
// × the rate in cents, rounded once to the cent, a half cent away from zero (the rule of
// shared/money.ts); no tax line is set, so the total is the sum of the lines. The seeding rate is
// the default of shared/custom-rates.ts, $17.82 per acre (USDA NASS with NDSU, "North Dakota 2020
// Custom Rates", as tests/api/invoices.test.ts cites it).
import type { Page } from 'playwright-core';
import type { InvoiceDetail } from '../../shared/schemas/invoices';
import { screenshot, seriousViolations, signIn, startRig, type BrowserRig } from '../support/browser';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { insertCustomer, insertCustomerField, insertJob } from '../support/invoice-fixtures';
import { signedIn, type Client } from '../support/test-app';

const HARROWING_CENTS = 1250;
const BALING_CENTS = 9550;
/** The seeding default (see the head of this file). */
const SEEDING_CENTS = 1782;

/** Half away from zero, to the whole cent (the rule stated in shared/money.ts). */
const roundHalfAway = (x: number) => Math.sign(x) * Math.round(Math.abs(x));
/** Cents as the screens write money: "$1,234.56", and "−$12.00" with a minus sign (U+2212). */
const usd = (cents: number) =>
  `${cents < 0 ? '\u2212' : ''}$${(Math.abs(cents) / 100).toLocaleString('en-US', { minimumFractionDigits: 2, maximumFractionDigits: 2 })}`;

/**
 * The open dialog once its opening animation has ended. Locators only: the app's CSP refuses the
 * string predicate the shared openedDialog helper evaluates (as in custom-work.test.ts).
 */
async function openedDialog(page: Page) {
  await page.locator('mat-dialog-container.mdc-dialog--open:not(.mdc-dialog--opening)').waitFor();
  return page.getByRole('dialog');
}

/** The link the customer's e-mail carries ("Pay online: …"), from the fake mail server. */
async function mailedLink(rig: BrowserRig, to: string, number: number): Promise<string> {
  await rig.t.flushMail();
  const mail = await rig.t.mail.waitFor((m) => m.to.includes(to) && m.subject.startsWith(`Invoice ${number} `));
  const link = /Pay online: (\S+)/.exec(mail.text)?.[1];
  expect(link).toMatch(new RegExp(`^http://127\\.0\\.0\\.1:${rig.t.payments.port}/pay/cs_test_`));
  return link!;
}

/** Until the fake payment server has an answer from the app's webhook for an event of this type after `from`. */
async function delivered(rig: BrowserRig, from: number, type: string): Promise<void> {
  const deadline = Date.now() + 10_000;
  while (!rig.t.payments.deliveries.slice(from).some((d) => d.event.type === type && d.status === 200)) {
    if (Date.now() > deadline) throw new Error(`no ${type} event was answered 200 by the app`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

interface Layout {
  page: { scrollWidth: number; clientWidth: number };
  content: { scrollWidth: number; clientWidth: number } | null;
  tables: Array<{ label: string; width: number; boxWidth: number; boxScrollWidth: number }>;
}

/** The page's and each table's widths against their boxes (written as text: this file is also type-checked without the DOM's types). */
const layoutOf = (page: Page) =>
  page.evaluate(`(() => {
    const se = document.scrollingElement;
    const content = document.querySelector('mat-sidenav-content');
    return {
      page: { scrollWidth: se.scrollWidth, clientWidth: se.clientWidth },
      content: content && { scrollWidth: content.scrollWidth, clientWidth: content.clientWidth },
      tables: [...document.querySelectorAll('table')].map((t) => ({
        label: t.getAttribute('aria-label') ?? '',
        width: t.getBoundingClientRect().width,
        boxWidth: t.parentElement.clientWidth,
        boxScrollWidth: t.parentElement.scrollWidth,
      })),
    };
  })()`) as Promise<Layout>;

describe('Invoice flows in a real browser: paying, a declined card, void, credit note, a phone', () => {
  let rig: BrowserRig;
  let farm: TestFarm;
  let owner: Client;
  let ownerPage: Page;
  /** Sent, then paid by the customer, then credited. */
  let paid: InvoiceDetail;
  /** Sent, declined at the checkout, then voided. */
  let declined: InvoiceDetail;
  /** A draft of three lines, for the phone. */
  let long: InvoiceDetail;
  let paidLink: string;
  let declinedLink: string;

  /** A customer of the farm with the given jobs, drafted into one invoice over their days. */
  async function drafted(name: string, jobs: Array<Parameters<typeof insertJob>[4]>, fieldName?: string): Promise<InvoiceDetail> {
    const db = rig.t.db;
    const customer = await insertCustomer(db, farm.id, name);
    const field = await insertCustomerField(db, farm.id, customer, fieldName);
    for (const j of jobs) await insertJob(db, farm.id, field, farm.operator.membershipId, j);
    const days = jobs.map((j) => j.day).sort();
    const res = await owner.post('/api/invoices', { customerId: customer, from: days[0], to: days.at(-1) });
    expect(res.status).toBe(201);
    return res.body as InvoiceDetail;
  }

  beforeAll(async () => {
    rig = await startRig();
    // The fake payment server tells this app when a checkout is paid, signed as the real service signs.
    rig.t.payments.webhookUrl = `${rig.baseUrl}/api/payments/webhook`;
    farm = await makeFarm(rig.t.db, 'Invoice flows');
    owner = await signedIn(rig.t.app, farm.owner.email, farm.owner.password);
    expect((await owner.put('/api/rate-card/harrowing', { unit: 'acre', rateCents: HARROWING_CENTS })).status).toBe(200);
    expect((await owner.put('/api/rate-card/baling', { unit: 'hour', rateCents: BALING_CENTS })).status).toBe(200);

    paid = await drafted('Willow Bend Grain', [{ day: '2026-04-14', operation: 'harrowing', acres: '40', hours: '2' }]);
    declined = await drafted('Sandhill Cooperative', [{ day: '2026-04-15', operation: 'harrowing', acres: '64.5', hours: '3' }]);
    long = await drafted(
      'Prairie Coulee Land & Cattle',
      [
        { day: '2026-04-20', operation: 'harrowing', acres: '100.25', hours: '3.5' },
        { day: '2026-05-04', operation: 'seeding', acres: '118.5', hours: '6.75' },
        { day: '2026-06-20', operation: 'baling', acres: '80.5', hours: '3.75' },
      ],
      'North Quarter past the old schoolhouse road',
    );
    for (const inv of [paid, declined]) {
      const sent = await owner.post(`/api/invoices/${inv.id}/send`);
      expect(sent.body).toMatchObject({ state: 'sent', mailed: true });
    }
    paidLink = await mailedLink(rig, paid.customerEmail, paid.number);
    declinedLink = await mailedLink(rig, declined.customerEmail, declined.number);

    ownerPage = await rig.newPage({ width: 1366, height: 900 });
    await signIn(ownerPage, { role: 'owner', name: farm.owner.name, email: farm.owner.email, password: farm.owner.password });
  });

  afterAll(async () => {
    await rig?.close();
  });

  it('when the customer pays on the checkout the mailed link opens, then they land, not signed in, on a page that says in plain words that it is paid', async () => {
    // The customer: a phone, no session with the app.
    const customer = await rig.newPage({ width: 390, height: 844 });
    await customer.goto(paidLink);
    await customer.getByRole('heading', { name: 'Local test checkout' }).waitFor();
    // 40 ac × $12.50 = $500.00, no tax line.
    expect(paid.totalCents).toBe(roundHalfAway(40 * HARROWING_CENTS));
    expect(await customer.getByTestId('amount').innerText()).toBe('500.00 USD');
    const from = rig.t.payments.deliveries.length;
    await customer.getByRole('button', { name: 'Pay 500.00 USD' }).click();

    // The checkout returns the customer to the app's own page, which asks for no sign-in.
    await customer.waitForURL((u) => u.origin === rig.baseUrl && u.pathname === '/paid');
    const heading = customer.getByRole('heading', { level: 1 });
    await heading.waitFor();
    await customer.waitForLoadState('networkidle');
    expect(new URL(customer.url()).pathname).toBe('/paid');
    expect(await heading.innerText()).toMatch(/\bpaid\b/i);
    expect(await customer.locator('main').innerText()).toContain('Nothing more is needed');
    expect(await customer.getByRole('button', { name: 'Sign in' }).count()).toBe(0);
    expect(await seriousViolations(customer)).toEqual([]);
    await screenshot(customer, 'invoice-flows-1-customer-paid');
    await customer.close();

    // The app was told: the owner's invoice reads paid.
    await delivered(rig, from, 'checkout.session.completed');
    await ownerPage.goto(`/invoices/${paid.id}`);
    await ownerPage.locator('app-state-chip', { hasText: 'Paid' }).waitFor();
  });

  it('when the customer’s card is declined on the checkout, then the customer is told nothing was charged and the owner sees the invoice sent and not paid', async () => {
    const customer = await rig.newPage({ width: 390, height: 844 });
    await customer.goto(declinedLink);
    // 64.5 ac × $12.50 = $806.25.
    expect(declined.totalCents).toBe(roundHalfAway(64.5 * HARROWING_CENTS));
    const from = rig.t.payments.deliveries.length;
    await customer.getByRole('button', { name: 'Decline the card' }).click();
    await customer.getByRole('status').filter({ hasText: 'declined' }).waitFor();
    expect(await customer.getByRole('status').innerText()).toContain('Nothing was charged');
    await screenshot(customer, 'invoice-flows-2-checkout-declined');
    await customer.close();
    // A decline on the hosted page sends no event: nothing reached the app.
    expect(rig.t.payments.deliveries.length).toBe(from);

    await ownerPage.goto(`/invoices/${declined.id}`);
    await ownerPage.getByRole('heading', { level: 1, name: `Invoice ${declined.number}` }).waitFor();
    expect(await ownerPage.locator('app-state-chip').innerText()).toContain('Sent, not paid');
    expect(await ownerPage.locator('.page').innerText()).toContain('The invoice is marked paid when the payment service says so.');
    expect(await ownerPage.locator('.page').innerText()).not.toMatch(/\bPaid\b/);
    // Still among what is owed to the farm.
    await ownerPage.goto('/invoices');
    const owed = ownerPage.getByRole('table', { name: 'Receivables' });
    const row = owed.getByRole('row', { name: new RegExp(`Invoice ${declined.number}\\b`) });
    await row.waitFor();
    expect(await row.innerText()).toContain(usd(declined.totalCents));
    await screenshot(ownerPage, 'invoice-flows-3-owner-still-owed');
  });

  it('when the owner voids the sent invoice from its page, then it reads void with the reason and its payment link takes no payment', async () => {
    await ownerPage.goto(`/invoices/${declined.id}`);
    await ownerPage.getByRole('button', { name: 'Void' }).click();
    const dialog = await openedDialog(ownerPage);
    expect(await dialog.innerText()).toContain(`Void invoice ${declined.number}?`);
    // Refused without a reason: the box says so and nothing is sent.
    await dialog.getByRole('button', { name: 'Void invoice' }).click();
    await dialog.getByText('Say why').waitFor();
    await dialog.getByLabel('Reason').fill('Card declined; billing the co-op by cheque instead');
    await dialog.getByRole('button', { name: 'Void invoice' }).click();
    await dialog.waitFor({ state: 'detached' });

    await ownerPage
      .getByRole('status')
      .filter({ hasText: `Invoice ${declined.number} is void.` })
      .waitFor();
    expect(await ownerPage.locator('app-state-chip').innerText()).toContain('Void');
    expect(await ownerPage.locator('.facts').innerText()).toContain('Card declined; billing the co-op by cheque instead');
    expect(await ownerPage.getByRole('button', { name: /^(Send|Void|Credit note)$/ }).count()).toBe(0);
    expect(await seriousViolations(ownerPage)).toEqual([]);
    await screenshot(ownerPage, 'invoice-flows-4-voided');
    expect((await rig.t.db('invoices').where({ id: declined.id }).first('state')).state).toBe('void');

    // The old link: the checkout is expired, with no button to pay.
    const customer = await rig.newPage({ width: 390, height: 844 });
    await customer.goto(declinedLink);
    expect(await customer.getByRole('status').innerText()).toContain('This checkout is expired.');
    expect(await customer.getByRole('button', { name: /^Pay/ }).count()).toBe(0);
    await customer.close();
  });

  it('when the owner makes a credit note for the paid invoice from its page, then the credit note shows with its own number and negative total, is mailed with its PDF, and the invoice reads credited', async () => {
    await ownerPage.goto(`/invoices/${paid.id}`);
    await ownerPage.locator('app-state-chip', { hasText: 'Paid' }).waitFor();
    expect(await ownerPage.getByRole('button', { name: 'Void' }).count()).toBe(0);
    await ownerPage.getByRole('button', { name: 'Credit note' }).click();
    const dialog = await openedDialog(ownerPage);
    expect(await dialog.innerText()).toContain(`The credit note is mailed to ${paid.customerEmail} with its PDF.`);
    await dialog.getByLabel('Reason').fill('Harrowed the wrong quarter');
    await dialog.getByRole('button', { name: 'Make credit note' }).click();

    await ownerPage.waitForURL((u) => /^\/invoices\/\d+$/.test(u.pathname) && u.pathname !== `/invoices/${paid.id}`);
    const heading = ownerPage.getByRole('heading', { level: 1, name: /^Credit note \d+$/ });
    await heading.waitFor();
    const noteNumber = Number((await heading.innerText()).replace(/\D/g, ''));
    // The next number of the farm's one series: after the three drafts above.
    expect(noteNumber).toBe(Math.max(paid.number, declined.number, long.number) + 1);
    expect(await ownerPage.locator('app-state-chip').innerText()).toContain('Credit note');
    expect(
      await ownerPage
        .locator('.facts')
        .getByRole('link', { name: `Invoice ${paid.number}` })
        .count(),
    ).toBe(1);
    expect(await ownerPage.getByTestId('invoice-total').innerText()).toBe(usd(-paid.totalCents));
    const lines = ownerPage.getByRole('table', { name: 'Lines of the invoice' });
    expect(await lines.locator('tbody tr td').last().innerText()).toBe(usd(-roundHalfAway(40 * HARROWING_CENTS)));
    expect(await ownerPage.getByTestId('credit-mail').innerText()).toBe(`Mailed to ${paid.customerEmail} with its PDF.`);
    expect(await seriousViolations(ownerPage)).toEqual([]);
    await screenshot(ownerPage, 'invoice-flows-5-credit-note');

    // The customer's mail: the credit note's PDF, through the outbox.
    await rig.t.flushMail();
    const mail = await rig.t.mail.waitFor((m) => m.to.includes(paid.customerEmail) && m.subject.startsWith(`Credit note ${noteNumber} `));
    expect(mail.text).toContain(`It credits invoice ${paid.number}`);
    const pdf = mail.attachments.find((a) => a.contentType === 'application/pdf');
    expect(pdf?.filename).toBe(`credit-note-${noteNumber}.pdf`);
    // A PDF file starts with its header "%PDF-" (ISO 32000-1 §7.5.2).
    expect(pdf!.content.subarray(0, 5).toString('latin1')).toBe('%PDF-');

    // The invoice itself: unchanged but for reading credited, with no action left.
    await ownerPage
      .locator('.facts')
      .getByRole('link', { name: `Invoice ${paid.number}` })
      .click();
    await ownerPage.getByRole('heading', { level: 1, name: `Invoice ${paid.number}` }).waitFor();
    expect(await ownerPage.locator('app-state-chip').innerText()).toContain('Paid, credited');
    // It names its credit note by number, as the customer knows it.
    await ownerPage
      .locator('.facts')
      .getByRole('link', { name: `Credit note ${noteNumber}` })
      .waitFor();
    expect(await ownerPage.getByRole('button', { name: /^(Send|Void|Credit note)$/ }).count()).toBe(0);
    expect(await ownerPage.getByTestId('invoice-total').innerText()).toBe(usd(paid.totalCents));
    await screenshot(ownerPage, 'invoice-flows-6-invoice-credited');
  });

  it('when an invoice of several lines is read on a 390 × 844 phone, then nothing scrolls sideways and each line reads whole', async () => {
    // Signed in wide (the menu hides behind a button on a phone), then turned to a phone's size.
    const phone = await rig.newPage({ width: 1366, height: 900 });
    await signIn(phone, { role: 'owner', name: farm.owner.name, email: farm.owner.email, password: farm.owner.password });
    await phone.setViewportSize({ width: 390, height: 844 });
    await phone.goto(`/invoices/${long.id}`);
    await phone.getByRole('heading', { level: 1, name: `Invoice ${long.number}` }).waitFor();
    await phone.waitForLoadState('networkidle');

    const layout = await layoutOf(phone);
    expect(layout.page.scrollWidth).toBeLessThanOrEqual(layout.page.clientWidth);
    if (layout.content) expect(layout.content.scrollWidth).toBeLessThanOrEqual(layout.content.clientWidth);
    expect(layout.tables.map((t) => t.label)).toEqual(['Lines of the invoice']);
    for (const t of layout.tables) {
      // No table wider than its box, and the box has nothing to scroll sideways (a pixel of rounding allowed).
      expect(t.width).toBeLessThanOrEqual(t.boxWidth + 1);
      expect(t.boxScrollWidth).toBeLessThanOrEqual(t.boxWidth);
    }

    // Each line: its field, operation, date, quantity, rate and amount, all inside the screen.
    const expected = [
      { operation: 'Harrowing', day: '2026-04-20', quantity: '100.25 ac', cents: roundHalfAway(100.25 * HARROWING_CENTS) },
      { operation: 'Seeding', day: '2026-05-04', quantity: '118.50 ac', cents: roundHalfAway(118.5 * SEEDING_CENTS) },
      { operation: 'Baling', day: '2026-06-20', quantity: '3.75 h', cents: roundHalfAway(3.75 * BALING_CENTS) },
    ];
    // 100.25 × 1250 = 125,312.5 → 125,313; 118.5 × 1782 = 211,167; 3.75 × 9550 = 35,812.5 → 35,813.
    expect(expected.map((e) => e.cents)).toEqual([125_313, 211_167, 35_813]);
    const table = phone.getByRole('table', { name: 'Lines of the invoice' });
    // Still a table to a screen reader: a row per line (and the head and foot rows), cells in them.
    const rows = table.locator('tbody').getByRole('row');
    expect(await rows.count()).toBe(3);
    const tableBox = (await table.boundingBox())!;
    for (const [i, e] of expected.entries()) {
      const row = rows.nth(i);
      // Each line takes the table's whole width (not squeezed into its first column).
      const rowBox = (await row.boundingBox())!;
      expect(rowBox.width).toBeGreaterThanOrEqual(tableBox.width - 1);
      const text = await row.innerText();
      expect(text).toContain('North Quarter past the old schoolhouse road');
      expect(text).toContain(e.operation);
      expect(text).toContain(e.day);
      // As billed: 100.25 ac, not rounded to 100.3 ac (which × $12.50 is not the amount shown).
      expect(text).toContain(e.quantity);
      expect(text).toContain(usd(e.cents));
      expect(await row.getByRole('cell').count()).toBe(6);
      for (const cell of await row.getByRole('cell').all()) {
        const box = (await cell.boundingBox())!;
        expect(box.x).toBeGreaterThanOrEqual(0);
        expect(box.x + box.width).toBeLessThanOrEqual(390);
      }
    }
    // Chromium's own accessibility tree (through the DevTools protocol), not the test library's
    // reading of the tags: a row or cell laid out as a grid or a block must still be one there.
    const cdp = await phone.context().newCDPSession(phone);
    const { nodes } = (await cdp.send('Accessibility.getFullAXTree')) as {
      nodes: Array<{ ignored: boolean; role?: { value: string }; name?: { value: string } }>;
    };
    const roles = nodes.filter((n) => !n.ignored).map((n) => n.role?.value);
    const count = (role: string) => roles.filter((r) => r === role).length;
    // A head row, three lines and two foot rows (subtotal, total: no tax line): six rows; six
    // column headings; six cells a line and the two foot amounts.
    expect([count('table'), count('row'), count('columnheader'), count('cell')]).toEqual([1, 6, 6, 3 * 6 + 2]);
    await cdp.detach();

    const total = phone.getByTestId('invoice-total');
    expect(await total.innerText()).toBe(usd(expected.reduce((s, e) => s + e.cents, 0)));
    const totalBox = (await total.boundingBox())!;
    expect(totalBox.x + totalBox.width).toBeLessThanOrEqual(390);
    // The total sits at the table's right edge, under the lines' amounts.
    expect(totalBox.x + totalBox.width).toBeGreaterThanOrEqual(tableBox.x + tableBox.width - 12);
    expect(await seriousViolations(phone)).toEqual([]);
    await screenshot(phone, 'invoice-flows-7-phone-invoice');
    await total.scrollIntoViewIfNeeded();
    await screenshot(phone, 'invoice-flows-8-phone-invoice-total');
    expect(rig.outside).toEqual([]);
    await phone.close();
  });
});
