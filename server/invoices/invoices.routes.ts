import { idParam } from '../../shared/schemas/common';
import {
  invoiceCreditBody,
  invoiceDraftBody,
  invoiceExportParams,
  invoiceSettingsBody,
  invoiceVoidBody,
} from '../../shared/schemas/invoices';
import type { AppDeps } from '../app-deps';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { body, params } from '../http/validate';
import { currentPdf, expireCheckout, sendInvoice } from './invoice-send';
import { invoicesCsv, paymentsCsv, receivablesCsv } from './invoices.csv';
import * as service from './invoices.service';

/** Money: the owner and viewers (the accountant) read and export; only the owner changes; operators are refused. */
const READERS = ['owner', 'viewer'] as const;
const OWNER = ['owner'] as const;

export function invoiceRoutes(r: Routes, deps: AppDeps): void {
  const db = deps.db;
  const today = (tz: string) => service.farmToday(tz);

  // Fixed paths first: they would otherwise be read as an invoice id.
  r.get('/settings', READERS, async (req, res) => {
    res.json(await service.invoiceSettings(db, principal(req).farmId));
  });
  r.put('/settings', OWNER, async (req, res) => {
    res.json(await service.saveInvoiceSettings(db, principal(req).farmId, body(req, invoiceSettingsBody)));
  });
  r.get('/receivables', READERS, async (req, res) => {
    const me = principal(req);
    res.json(await service.receivables(db, me.farmId, me.timeZone));
  });
  r.get('/payments', READERS, async (req, res) => {
    res.json(await service.listPayments(db, principal(req).farmId));
  });
  r.get('/export/:table.csv', READERS, async (req, res) => {
    const { table } = params(req, invoiceExportParams);
    const me = principal(req);
    const csv =
      table === 'invoices'
        ? invoicesCsv(await service.listInvoices(db, me.farmId))
        : table === 'receivables'
          ? receivablesCsv(await service.receivables(db, me.farmId, me.timeZone))
          : paymentsCsv(await service.listPayments(db, me.farmId));
    res
      .set('Content-Disposition', `attachment; filename="furlong-${table}.csv"`)
      .set('Cache-Control', 'no-store')
      .type('text/csv; charset=utf-8')
      .send(csv);
  });

  r.get('/', READERS, async (req, res) => {
    res.json(await service.listInvoices(db, principal(req).farmId));
  });
  r.post('/', OWNER, async (req, res) => {
    const me = principal(req);
    res.status(201).json(await service.draftInvoice(db, me.farmId, today(me.timeZone), body(req, invoiceDraftBody)));
  });
  r.get('/:id', READERS, async (req, res) => {
    res.json(await service.getInvoice(db, principal(req).farmId, params(req, idParam).id));
  });
  r.get('/:id/pdf', READERS, async (req, res) => {
    const { pdf, name } = await currentPdf(deps, principal(req).farmId, params(req, idParam).id);
    res.set('Content-Disposition', `inline; filename="${name}"`).set('Cache-Control', 'no-store').type('application/pdf').send(pdf);
  });
  r.post('/:id/send', OWNER, async (req, res) => {
    res.json(await sendInvoice(deps, principal(req).farmId, params(req, idParam).id));
  });
  r.post('/:id/void', OWNER, async (req, res) => {
    const { id } = params(req, idParam);
    const { detail, openCheckout } = await service.voidInvoice(db, principal(req).farmId, id, body(req, invoiceVoidBody).reason);
    await expireCheckout(deps, openCheckout);
    res.json(detail);
  });
  r.post('/:id/credit', OWNER, async (req, res) => {
    const me = principal(req);
    const { id } = params(req, idParam);
    const { detail, openCheckout } = await service.creditInvoice(
      db,
      me.farmId,
      id,
      today(me.timeZone),
      body(req, invoiceCreditBody).reason,
    );
    // The credited invoice's payment link stops working, as after a void.
    await expireCheckout(deps, openCheckout);
    if (detail.mailed) deps.nudgeMail();
    res.status(201).json(detail);
  });
}
