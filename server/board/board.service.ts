// The owner's edits to a work board day. Every save names the board version it was made on and
// is refused (409 stale_board, with what changed and the board as it is now) when someone else
// saved first: never a silent overwrite. Conflicts do not block a save; they show on the board.
import { OPERATION_INFO, type Operation } from '../../shared/operations';
import {
  brokenCardRules,
  settledMentor,
  type AssignmentCreate,
  type AssignmentPatch,
  type Board,
  type BoardOrder,
  type CardFacts,
} from '../../shared/schemas/board';
import type { AppDeps } from '../app-deps';
import type { Tx } from '../db/knex';
import { AppError, notFound } from '../http/errors';
import type { SessionPrincipal } from '../http/session-user';
import { defaultAcres } from '../jobs/acres-check';
import * as repo from '../jobs/assignments.repository';
import type { DbAssignmentRow } from '../jobs/jobs.rows';
import { bumpDay, changesSince, lockDay } from './board-days.repository';
import { readBoard } from './board.read';
import { formatMinutes, parseTime } from './clock';
import { skillOf } from './day.repository';
import { resolveRefs } from './references';

interface Change {
  summary: string;
  assignmentIds: number[];
}

const opLabel = (op: Operation) => OPERATION_INFO[op].label.toLowerCase();

export const versionRequired = () =>
  new AppError(
    428,
    'version_required',
    'Reload the work board and try again: the save did not say which version of the board it was made on',
  );

export async function staleBoard(tx: Tx, farmId: number, day: string, version: number, publicUrl: string): Promise<AppError> {
  const changes = await changesSince(tx, farmId, day, version);
  const current = await readBoard(tx, farmId, day, publicUrl);
  const what = changes.length
    ? `: ${changes.map((c) => `${c.by} ${c.summary.charAt(0).toLowerCase()}${c.summary.slice(1)}`).join('; ')}`
    : '';
  return new AppError(
    409,
    'stale_board',
    `Someone else changed this board since you opened it${what}. Nothing of yours was saved; look at the board as it is now and make your change again.`,
    undefined,
    {
      changes,
      current,
    },
  );
}

/**
 * Runs `work` with the board days locked (in date order, so two saves never wait on each other
 * in a circle), after checking the version of `day`, and raises the version of each day touched.
 */
async function save(
  deps: AppDeps,
  by: SessionPrincipal,
  day: string,
  version: number | undefined,
  alsoDays: string[],
  work: (tx: Tx) => Promise<Change>,
): Promise<Board> {
  if (version === undefined) throw versionRequired();
  const days = [...new Set([day, ...alsoDays])].sort();
  await deps.db.transaction(async (tx) => {
    const locked = new Map<string, number>();
    for (const d of days) locked.set(d, (await lockDay(tx, by.farmId, d)).version);
    if (locked.get(day) !== version) throw await staleBoard(tx, by.farmId, day, version, deps.config.publicUrl);
    const change = await work(tx);
    for (const d of days) await bumpDay(tx, by.farmId, d, { byUserId: by.id, ...change });
  });
  return readBoard(deps.db, by.farmId, day, deps.config.publicUrl);
}

/** Puts card `id` at 1-based `place` (default last) in its operator's column and renumbers it. */
async function placeInColumn(
  tx: Tx,
  farmId: number,
  card: Pick<DbAssignmentRow, 'id' | 'day' | 'operator_id'>,
  place?: number,
): Promise<void> {
  const ids = (await repo.columnOf(tx, farmId, card.day, card.operator_id)).map((c) => c.id).filter((x) => x !== card.id);
  const at = Math.min(Math.max((place ?? ids.length + 1) - 1, 0), ids.length);
  ids.splice(at, 0, card.id);
  await repo.renumber(tx, ids);
}

async function renumberColumn(tx: Tx, farmId: number, day: string, operatorId: number): Promise<void> {
  await repo.renumber(
    tx,
    (await repo.columnOf(tx, farmId, day, operatorId)).map((c) => c.id),
  );
}

/** Refuses a card, as it would be saved, that breaks a rule between its fields (shared/schemas/board.ts). */
function keepsCardRules(card: CardFacts): void {
  const [broken] = brokenCardRules(card);
  if (broken) throw new AppError(422, 'invalid_input', broken.message, { [broken.field]: broken.hint });
}

const minutesOf = (hhmm: string | null) => (hhmm ? parseTime(hhmm) : null);
const timeOf = (min: number | null) => (min == null ? null : formatMinutes(min));

export async function createAssignment(deps: AppDeps, by: SessionPrincipal, input: AssignmentCreate): Promise<Board> {
  let savedId = 0;
  const board = await save(deps, by, input.date, input.version, [], async (tx) => {
    const refs = await resolveRefs(tx, by.farmId, { ...input, mentorId: input.mentorId ?? null });
    keepsCardRules({ ...input, operatorSkill: await skillOf(tx, by.farmId, input.operatorId, input.operation) });
    const start = minutesOf(input.startTime ?? null);
    const end = minutesOf(input.endTime ?? null);
    savedId = await repo.insertAssignment(tx, by.farmId, {
      day: input.date,
      field_id: input.fieldId,
      operation: input.operation,
      operator_id: input.operatorId,
      machine_id: input.machineId,
      implement_id: input.implementId,
      mentor_id: input.mentorId ?? null,
      run_order: 1000,
      start_min: start,
      end_min: end,
      note: input.note ?? null,
      acres_planned: input.acresPlanned ?? (await defaultAcres(tx, by.farmId, refs.field!, input.operation, input.date)),
    });
    await placeInColumn(tx, by.farmId, { id: savedId, day: input.date, operator_id: input.operatorId }, input.order);
    return { summary: `Added ${refs.field!.name} ${opLabel(input.operation)} for ${refs.operator!.name}`, assignmentIds: [savedId] };
  });
  return { ...board, savedAssignmentId: savedId };
}

const WORDS: Record<string, string> = {
  date: 'day',
  fieldId: 'field',
  operation: 'operation',
  operatorId: 'operator',
  machineId: 'machine',
  implementId: 'implement',
  mentorId: 'mentor',
  order: 'running order',
  startTime: 'start time',
  endTime: 'end time',
  note: 'note',
  acresPlanned: 'acres planned',
};

export async function updateAssignment(deps: AppDeps, by: SessionPrincipal, id: number, patch: AssignmentPatch): Promise<Board> {
  const before = await repo.getAssignment(deps.db, by.farmId, id);
  if (!before) throw notFound('That job');
  const board = await save(deps, by, before.day, patch.version, patch.date ? [patch.date] : [], async (tx) => {
    const a = (await repo.lockAssignment(tx, by.farmId, id))!;
    const keys = Object.keys(patch).filter((k) => k !== 'version' && patch[k as keyof AssignmentPatch] !== undefined);
    if (a.state !== 'planned' && keys.some((k) => k !== 'note')) {
      throw new AppError(
        409,
        'job_started',
        `This job is ${a.state === 'called-off' ? 'called off' : a.state}: only its note can change. Call it off and add a new job instead.`,
      );
    }
    const refs = await resolveRefs(tx, by.farmId, patch);
    const operatorId = patch.operatorId ?? a.operator_id;
    const operation = patch.operation ?? a.operation;
    // Only a planned card's people can change (above); a started one keeps its mentor as it is.
    const operatorSkill = a.state === 'planned' ? await skillOf(tx, by.farmId, operatorId, operation) : undefined;
    // A mentor the owner did not name this time stays only while the operator needs one.
    const mentorId = patch.mentorId === undefined ? settledMentor({ operatorId, mentorId: a.mentor_id, operatorSkill }) : patch.mentorId;
    const startTime = patch.startTime === undefined ? timeOf(a.start_min) : patch.startTime;
    const endTime = patch.endTime === undefined ? timeOf(a.end_min) : patch.endTime;
    keepsCardRules({ operatorId, mentorId, startTime, endTime, operatorSkill });
    const start = patch.startTime === undefined ? a.start_min : minutesOf(patch.startTime);
    const end = patch.endTime === undefined ? a.end_min : minutesOf(patch.endTime);
    const day = patch.date ?? a.day;
    const fieldChanged = (patch.fieldId && patch.fieldId !== a.field_id) || (patch.operation && patch.operation !== a.operation);
    const field = refs.field ?? (await resolveRefs(tx, by.farmId, { fieldId: a.field_id })).field!;
    await repo.updateAssignment(tx, id, {
      day,
      field_id: field.id,
      operation,
      operator_id: operatorId,
      machine_id: patch.machineId ?? a.machine_id,
      implement_id: patch.implementId ?? a.implement_id,
      mentor_id: mentorId,
      start_min: start,
      end_min: end,
      note: patch.note === undefined ? a.note : patch.note,
      acres_planned: patch.acresPlanned ?? (fieldChanged ? await defaultAcres(tx, by.farmId, field, operation, day) : a.acres_planned),
    });
    const moved = day !== a.day || operatorId !== a.operator_id;
    if (moved || patch.order !== undefined) {
      await placeInColumn(tx, by.farmId, { id, day, operator_id: operatorId }, patch.order);
      if (moved) await renumberColumn(tx, by.farmId, a.day, a.operator_id);
    }
    if (mentorId !== a.mentor_id && patch.mentorId === undefined) keys.push('mentorId');
    const what = [...new Set(keys.map((k) => WORDS[k]))].join(', ');
    return { summary: `Changed ${field.name} ${opLabel(operation)} (${what})`, assignmentIds: [id] };
  });
  return { ...board, savedAssignmentId: id };
}

export async function deleteAssignment(deps: AppDeps, by: SessionPrincipal, id: number, version: number | undefined): Promise<Board> {
  const before = await repo.getAssignment(deps.db, by.farmId, id);
  if (!before) throw notFound('That job');
  return save(deps, by, before.day, version, [], async (tx) => {
    const a = (await repo.lockAssignment(tx, by.farmId, id))!;
    if (a.state !== 'planned' && a.state !== 'called-off') {
      throw new AppError(
        409,
        'job_started',
        a.state === 'finished'
          ? 'This job is finished: delete its log first, or keep it for the season totals'
          : 'This job has started: call it off instead of deleting it',
      );
    }
    const field = (await resolveRefs(tx, by.farmId, { fieldId: a.field_id })).field!;
    await repo.deleteAssignment(tx, id);
    await renumberColumn(tx, by.farmId, a.day, a.operator_id);
    return { summary: `Removed ${field.name} ${opLabel(a.operation)}`, assignmentIds: [id] };
  });
}

/** Drag and drop: each listed column gets exactly the listed cards in that order, then any of its own cards not listed. */
export async function reorderBoard(deps: AppDeps, by: SessionPrincipal, day: string, input: BoardOrder): Promise<Board> {
  const listed = input.columns.flatMap((c) => c.assignmentIds);
  if (new Set(listed).size !== listed.length) throw new AppError(400, 'invalid_input', 'A job appears twice in the new order');
  if (new Set(input.columns.map((c) => c.membershipId)).size !== input.columns.length)
    throw new AppError(400, 'invalid_input', 'A person appears twice in the new order');
  return save(deps, by, day, input.version, [], async (tx) => {
    const cards = new Map((await repo.cardsOfDay(tx, by.farmId, day)).map((c) => [c.id, c]));
    const stranger = listed.find((id) => !cards.has(id));
    if (stranger) throw new AppError(422, 'unknown_reference', `Job ${stranger} is not on the board for ${day}`);
    for (const col of input.columns) await resolveRefs(tx, by.farmId, { operatorId: col.membershipId });
    const touched = new Set<number>();
    let moves = 0;
    for (const col of input.columns) {
      for (const id of col.assignmentIds) {
        const c = cards.get(id)!;
        if (c.operator_id === col.membershipId) continue;
        if (c.state !== 'planned')
          throw new AppError(409, 'job_started', 'A job that has started stays with its operator; call it off and add a new one instead');
        touched.add(c.operator_id);
        // Moved to someone who works alone (or to the mentor themself): the mentor goes with the need.
        const operatorSkill = await skillOf(tx, by.farmId, col.membershipId, c.operation);
        const mentorId = settledMentor({ operatorId: col.membershipId, mentorId: c.mentor_id, operatorSkill });
        await repo.updateAssignment(tx, id, { operator_id: col.membershipId, mentor_id: mentorId });
        moves++;
      }
      const rest = (await repo.columnOf(tx, by.farmId, day, col.membershipId))
        .map((c) => c.id)
        .filter((id) => !col.assignmentIds.includes(id));
      await repo.renumber(tx, [...col.assignmentIds, ...rest]);
    }
    for (const op of touched) if (!input.columns.some((c) => c.membershipId === op)) await renumberColumn(tx, by.farmId, day, op);
    return {
      summary: moves ? `Moved ${moves} job${moves > 1 ? 's' : ''} between operators` : 'Changed the running order',
      assignmentIds: listed,
    };
  });
}
