// Publishing a board day mails each person's work order through the outbox, in the same
// transaction that records what was sent. A re-publish mails only the orders whose content
// changed (or whose last mail failed), and tells anyone who had jobs and now has none that
// their order is withdrawn. A mail-server outage only delays orders: the outbox retries.
import type { PublishResult } from '../../shared/schemas/board';
import type { AppDeps } from '../app-deps';
import { AppError } from '../http/errors';
import type { SessionPrincipal } from '../http/session-user';
import { enqueueMail } from '../mail/outbox.repository';
import { lockDay, markPublished } from './board-days.repository';
import { readBoard } from './board.read';
import { staleBoard } from './board.service';
import { findConflicts } from './conflicts';
import { loadDay } from './day-context';
import { loadDayWeather } from './day-weather';
import { dateLabel, orderWarnings } from './work-order.content';
import { withdrawalMail, workOrderMail } from './work-order.message';
import { planOrders } from './work-order.state';
import { ordersOfDay, saveOrder } from './work-orders.repository';

export async function publishBoard(deps: AppDeps, by: SessionPrincipal, day: string, version: number | undefined): Promise<PublishResult> {
  const publicUrl = deps.config.publicUrl;
  const result = await deps.db.transaction(async (tx) => {
    const locked = await lockDay(tx, by.farmId, day);
    if (version !== undefined && version !== locked.version) throw await staleBoard(tx, by.farmId, day, version, publicUrl);
    const ctx = await loadDay(tx, by.farmId, day);
    const weather = await loadDayWeather(tx, ctx);
    const conflicts = findConflicts(ctx.cards, ctx.skills, ctx.farm.dayHoursLimit, weather.cards);
    const hard = conflicts.filter((c) => c.severity === 'hard');
    if (hard.length) {
      throw new AppError(
        409,
        'board_conflicts',
        `Fix ${hard.length === 1 ? 'this conflict' : `these ${hard.length} conflicts`} before publishing: ${hard.map((c) => c.message).join('; ')}`,
        undefined,
        { conflicts: hard },
      );
    }
    const plans = planOrders(ctx, await ordersOfDay(tx, by.farmId, day), publicUrl);
    if (!plans.length) throw new AppError(409, 'empty_board', `There are no jobs on the board for ${dateLabel(day)} to publish`);
    const sent: PublishResult['sent'] = [];
    const unchanged: PublishResult['unchanged'] = [];
    for (const p of plans) {
      if (!p.changed && p.last?.mail_status !== 'failed') {
        unchanged.push({ membershipId: p.membershipId, name: p.name });
        continue;
      }
      const jobIds = p.marks.map((m) => m.id);
      const mail = p.content
        ? workOrderMail(p.content, p.email, by.farmId, p.membershipId, ctx.farm.timeZone, orderWarnings(conflicts, jobIds))
        : withdrawalMail(
            { name: p.name, farm: ctx.farm.name, date: day, dateLabel: dateLabel(day), link: `${publicUrl}/run-sheet?date=${day}` },
            p.email,
            by.farmId,
            p.membershipId,
          );
      const mailId = await enqueueMail(tx, mail);
      await saveOrder(tx, {
        farm_id: by.farmId,
        day,
        membership_id: p.membershipId,
        kind: p.kind,
        content_hash: p.hash,
        jobs: p.marks,
        mail_id: mailId,
        board_version: locked.version,
      });
      sent.push({ membershipId: p.membershipId, name: p.name, kind: p.kind });
    }
    await markPublished(tx, by.farmId, day);
    return { sent, unchanged };
  });
  if (result.sent.length) deps.nudgeMail();
  return { ...result, board: await readBoard(deps.db, by.farmId, day, publicUrl) };
}
