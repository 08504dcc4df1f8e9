// The owner's side of reports from the field: the open list (with the machines a breakdown has
// put down), confirm or dismiss, and the e-mail that tells the owners at once.
import { OPERATION_INFO } from '../../shared/operations';
import type { FieldReport, FieldReports } from '../../shared/schemas/run-sheet';
import type { AppDeps } from '../app-deps';
import type { Tx } from '../db/knex';
import { AppError, notFound } from '../http/errors';
import type { SessionPrincipal } from '../http/session-user';
import { enqueueMail } from '../mail/outbox.repository';
import { keptActions } from '../run-sheet/client-events.repository';
import { confirmHazard, lockReport, openReports, ownersToTell, setReview } from './reports.repository';

const KIND_WORDS: Record<FieldReport['kind'], string> = { breakdown: 'a breakdown', hazard: 'a new hazard', other: 'a problem' };

export async function listReports(deps: AppDeps, by: SessionPrincipal): Promise<FieldReports> {
  const reports = await openReports(deps.db, by.farmId);
  const down = new Map<number, FieldReports['machinesDown'][number]>();
  // Newest first: the oldest open breakdown of a machine is the one it is down since.
  for (const r of reports)
    if (r.kind === 'breakdown') down.set(r.machine.id, { machineId: r.machine.id, name: r.machine.name, reportId: r.id, since: r.at });
  return { reports, machinesDown: [...down.values()], keptActions: await keptActions(deps.db, by.farmId) };
}

/**
 * Confirm: the owner has taken the report in hand (a reported hazard becomes a confirmed hazard of
 * the field). Dismiss: nothing to act on (a reported hazard stays on the field as reported, for the
 * owner to remove there). Either way the report leaves the open list; a second review is a 409.
 */
export async function reviewReport(deps: AppDeps, by: SessionPrincipal, id: number, action: 'confirm' | 'dismiss'): Promise<FieldReport> {
  return deps.db.transaction(async (tx) => {
    const report = await lockReport(tx, by.farmId, id);
    if (!report) throw notFound('That report');
    if (report.review !== 'open')
      throw new AppError(409, 'report_reviewed', `This report was already ${report.review}; the list shows only open reports`);
    const review = action === 'confirm' ? 'confirmed' : 'dismissed';
    await setReview(tx, id, review, by.id);
    if (review === 'confirmed' && report.hazardId !== null) await confirmHazard(tx, by.farmId, report.hazardId);
    return { ...report, review };
  });
}

/**
 * Tells every owner of the farm of a new report, through the outbox in the report's own
 * transaction: the mail exists exactly when the report does.
 */
export async function mailOwners(
  tx: Tx,
  publicUrl: string,
  farmId: number,
  report: {
    id: number;
    kind: FieldReport['kind'];
    note: string;
    by: string;
    fieldName: string;
    operation: FieldReport['job']['operation'];
    day: string;
    jobId: number;
    paused: boolean;
  },
): Promise<void> {
  const what = KIND_WORDS[report.kind];
  const job = `${report.fieldName}, ${OPERATION_INFO[report.operation].label.toLowerCase()} on ${report.day}`;
  const link = `${publicUrl.replace(/\/$/, '')}/reports`;
  for (const owner of await ownersToTell(tx, farmId)) {
    await enqueueMail(tx, {
      farmId,
      kind: 'field-report',
      ref: `report:${report.id}:${owner.email}`,
      to: owner.email,
      subject: `${report.by} reported ${what}: ${report.fieldName}`,
      text: [
        `${report.by} reported ${what} on ${job}.`,
        '',
        `"${report.note}"`,
        ...(report.paused ? ['', 'The job was paused.'] : []),
        '',
        `Confirm or dismiss it: ${link}`,
      ].join('\n'),
    });
  }
}
