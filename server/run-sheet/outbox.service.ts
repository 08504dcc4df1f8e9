// A phone's outbox sent in one request: the actions tapped with no signal, in tap order. Each is
// judged exactly as `POST /api/assignments/:id/events` (or `/problems`) judges it when asked the
// short answer, and gets the same answer: applied, kept as a log, refused, or (its id seen before)
// its first answer again. What differs is the cost: one request, one look-up of the ids already
// seen, one statement claiming all the ids, and one transaction instead of a round trip and a
// commit each; the board days are locked once and the board's changes and the answers written once
// (batch-memo.ts). A refused action rolls back to its own savepoint (the one every action is
// applied in) and the next one goes on; its claim is taken back at the end, as the single route's
// rolled-back transaction takes it back. A fault (the database going away) rolls the whole batch
// back, so nothing of it is applied and the phone sends it again.
import { eventBody, problemBody, type OutboxInput, type OutboxResult } from '../../shared/schemas/run-sheet';
import type { AppDeps } from '../app-deps';
import type { Tx } from '../db/knex';
import { AppError, errorBodyOf } from '../http/errors';
import type { SessionPrincipal } from '../http/session-user';
import { checked } from '../http/validate';
import { claimClientEvents, dropClaims, findClientEvent, type DbClientEventRow } from './client-events.repository';
import { type CallOffForecast, type EventAnswer, forecastForCallOff, logClientEvent, replay, tappedAt } from './events.service';
import { measureAfterFinish } from '../phone-track/phone-track.service';
import { reportClientProblem } from './problems.service';
import { type BatchMemo, flushMemo, lockBatchDays, newMemo } from './batch-memo';

type Item = OutboxInput['events'][number];

/** One action, checked as the single route checks its body, ready to apply; or its refusal. */
type Prepared =
  | { item: Item; refused: OutboxResult }
  | {
      item: Item;
      claim: ClaimRow;
      run: (tx: Tx, memo: BatchMemo, claimed: number) => Promise<EventAnswer | null>;
      problem: boolean;
    };

type ClaimRow = Parameters<typeof claimClientEvents>[1][number];

const answerOf = (item: Item, a: { status: number; body: unknown }): OutboxResult => ({
  clientEventId: item.clientEventId,
  assignmentId: item.assignmentId,
  status: a.status,
  body: a.body,
});

/** A refusal the single route would throw (and answer through the error handler); anything else is thrown on. */
function refusal(item: Item, err: unknown, requestId: string | undefined): OutboxResult {
  if (!(err instanceof AppError)) throw err;
  return answerOf(item, { status: err.status, body: errorBodyOf(err, requestId) });
}

/** The ids of this batch the farm has already recorded (with their answers). */
async function seenIds(deps: AppDeps, by: SessionPrincipal, items: Item[]): Promise<Map<string, DbClientEventRow>> {
  const rows = await deps
    .db<DbClientEventRow>('client_events')
    .where({ farm_id: by.farmId })
    .whereIn(
      'client_event_id',
      items.map((i) => i.clientEventId),
    )
    .whereNotNull('status');
  return new Map(rows.map((r) => [r.client_event_id, r]));
}

async function prepare(deps: AppDeps, by: SessionPrincipal, item: Item, requestId: string | undefined): Promise<Prepared> {
  const { assignmentId: id, type, ...rest } = item;
  const claim = (at: Date, input: object): ClaimRow => ({
    farm_id: by.farmId,
    client_event_id: item.clientEventId,
    user_id: by.id,
    assignment_id: id,
    type,
    at,
    input: input as Record<string, unknown>,
  });
  try {
    if (type === 'problem') {
      const input = { ...checked(problemBody, rest), clientEventId: item.clientEventId };
      const at = tappedAt(input);
      const { at: _at, clientEventId: _id, ...kept } = input;
      return {
        item,
        claim: claim(at, kept),
        problem: true,
        run: (tx, memo, claimed) => reportClientProblem(tx, deps, by, id, input, at, requestId, true, memo, claimed),
      };
    }
    const input = { ...checked(eventBody, { type, ...rest }), clientEventId: item.clientEventId };
    const at = tappedAt(input);
    const { type: _type, at: _at, clientEventId: _id, ...kept } = input;
    // Read before the transaction, as the single route does: no lock is held while the forecast is judged.
    const weather: CallOffForecast =
      input.type === 'call-off' && input.reason === 'weather' ? await forecastForCallOff(deps, by, id) : null;
    return {
      item,
      claim: claim(at, kept),
      problem: false,
      run: (tx, memo, claimed) => logClientEvent(tx, deps, by, id, input, at, weather, requestId, true, memo, claimed),
    };
  } catch (err) {
    return { item, refused: refusal(item, err, requestId) };
  }
}

/**
 * Applies a phone's waiting actions in the order sent and answers each as the single route would
 * (short answers). Exactly once per farm and device-made id, as there.
 */
export async function sendOutbox(deps: AppDeps, by: SessionPrincipal, items: Item[], requestId?: string): Promise<OutboxResult[]> {
  const prepared: Prepared[] = [];
  for (const item of items) prepared.push(await prepare(deps, by, item, requestId));
  const seen = await seenIds(deps, by, items);
  let reported = false;
  const results = await deps.db.transaction(async (tx) => {
    const memo = newMemo();
    const toApply = prepared.filter((p): p is Extract<Prepared, { claim: ClaimRow }> => 'claim' in p && !seen.has(p.item.clientEventId));
    await lockBatchDays(
      tx,
      by.farmId,
      toApply.map((p) => p.item.assignmentId),
      memo,
    );
    const firsts = new Map(toApply.map((p) => [p.item.clientEventId, p.claim] as const));
    const claims = await claimClientEvents(tx, [...firsts.values()]);
    // This batch's answers by device id, for the same id sent twice in it (stored only at the end).
    const answered = new Map<string, EventAnswer>();
    const unanswered = new Set<number>();
    const out: OutboxResult[] = [];
    for (const p of prepared) {
      if ('refused' in p) {
        out.push(p.refused);
        continue;
      }
      try {
        const before = seen.get(p.item.clientEventId);
        const earlier = answered.get(p.item.clientEventId);
        const claim = claims.get(p.item.clientEventId);
        if (before) out.push(answerOf(p.item, replay(before, by)));
        else if (earlier) out.push(answerOf(p.item, earlier));
        else if (claim === undefined)
          // Another copy of the same action claimed the id first and has committed its answer.
          out.push(answerOf(p.item, replay((await findClientEvent(tx, by.farmId, p.item.clientEventId))!, by)));
        else {
          unanswered.add(claim);
          const answer = (await p.run(tx, memo, claim))!;
          unanswered.delete(claim);
          answered.set(p.item.clientEventId, answer);
          if (p.problem && answer.status === 201) reported = true;
          out.push(answerOf(p.item, answer));
        }
      } catch (err) {
        out.push(refusal(p.item, err, requestId));
      }
    }
    await dropClaims(tx, [...unanswered]);
    await flushMemo(tx, by, memo);
    return out;
  });
  if (reported) deps.nudgeMail();
  // A job finished from the outbox gets its phone track measured as the single route measures it.
  const finished = new Set(results.filter((r, i) => r.status === 201 && items[i].type === 'finish').map((r) => r.assignmentId));
  for (const id of finished) await measureAfterFinish(deps, by, id);
  return results;
}
