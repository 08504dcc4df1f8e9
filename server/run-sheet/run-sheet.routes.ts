import { eventBody, logPatchBody, outboxBody, problemBody, runSheetQuery, type OutboxAnswer } from '../../shared/schemas/run-sheet';
import { idParam } from '../../shared/schemas/common';
import type { AppDeps } from '../app-deps';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { body, params, query } from '../http/validate';
import { logEvent } from './events.service';
import { measureAfterFinish } from '../phone-track/phone-track.service';
import { deleteLog, editLog } from './log.service';
import { sendOutbox } from './outbox.service';
import { reportProblem } from './problems.service';
import { readRunSheet } from './run-sheet.service';

/** The run sheet is for the people doing the work and the owner; viewers read the season instead. */
export function runSheetRoutes(r: Routes, deps: AppDeps): void {
  r.get('/', ['owner', 'operator'], async (req, res) => {
    const q = query(req, runSheetQuery);
    res.json(await readRunSheet(deps, principal(req), q.date, q.membershipId));
  });
  // A phone's waiting actions at once, in tap order: each answered as the single route answers it
  // (short answers), in one request and one transaction.
  r.post('/outbox', ['owner', 'operator'], async (req, res) => {
    const { events } = body(req, outboxBody);
    const answer: OutboxAnswer = { results: await sendOutbox(deps, principal(req), events, req.id) };
    res.json(answer);
  });
}

/**
 * `Prefer: return=minimal` (RFC 7240): the answer to an action with a device-made id is its short
 * record, not the whole job (the phone's outbox reads the day once after sending).
 */
const wantsMinimal = (prefer: string | undefined): boolean => !!prefer && /(^|[\s,;])return=minimal(\s*($|[,;]))/i.test(prefer);

/** What happens on a job, logged by its operator (or the owner); log corrections are the owner's. */
export function jobLogRoutes(r: Routes, deps: AppDeps): void {
  r.post('/:id/events', ['owner', 'operator'], async (req, res) => {
    // A replay of a device's action gets its first answer again, status and body alike.
    const minimal = wantsMinimal(req.get('prefer'));
    const input = body(req, eventBody);
    const { id } = params(req, idParam);
    const answer = await logEvent(deps, principal(req), id, input, req.id, minimal);
    // A finished job's phone track becomes its coverage (server/phone-track), before the answer.
    if (input.type === 'finish' && answer.status === 201) await measureAfterFinish(deps, principal(req), id);
    if (answer.minimal) res.set('Preference-Applied', 'return=minimal');
    res.status(answer.status).json(answer.body);
  });
  r.post('/:id/problems', ['owner', 'operator'], async (req, res) => {
    const minimal = wantsMinimal(req.get('prefer'));
    const answer = await reportProblem(deps, principal(req), params(req, idParam).id, body(req, problemBody), req.id, minimal);
    if (answer.minimal) res.set('Preference-Applied', 'return=minimal');
    res.status(answer.status).json(answer.body);
  });
  r.patch('/:id/log', ['owner'], async (req, res) => {
    res.json(await editLog(deps, principal(req), params(req, idParam).id, body(req, logPatchBody)));
  });
  r.delete('/:id/log', ['owner'], async (req, res) => {
    res.json(await deleteLog(deps, principal(req), params(req, idParam).id));
  });
}
