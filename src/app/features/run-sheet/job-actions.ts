// Which buttons a job shows on the run sheet, and what the dialogs start from. The server checks
// the same transitions (a 409 if the job moved on meanwhile); this only keeps the screen honest.
import type { AssignmentState, EventType } from '@shared/schemas/jobs';
import type { RunSheetEvent, RunSheetItem } from '@shared/schemas/run-sheet';
import { roundTo } from '@shared/round';

export const ACTIONS_BY_STATE: Readonly<Record<AssignmentState, readonly EventType[]>> = {
  planned: ['start', 'call-off'],
  underway: ['pause', 'finish', 'call-off'],
  paused: ['resume', 'finish', 'call-off'],
  finished: [],
  'called-off': [],
};

export const ACTION_LABELS: Readonly<Record<EventType, string>> = {
  start: 'Start',
  pause: 'Pause',
  resume: 'Resume',
  finish: 'Finish',
  'call-off': 'Call off',
};

export const ACTION_ICONS: Readonly<Record<EventType, string>> = {
  start: 'play_arrow',
  pause: 'pause',
  resume: 'play_arrow',
  finish: 'flag',
  'call-off': 'block',
};

/** The buttons for a job: only its operator logs it (a mentor sees it, and may report a problem). */
export function actionsFor(item: Pick<RunSheetItem, 'state' | 'role'>): readonly EventType[] {
  return item.role === 'operator' ? ACTIONS_BY_STATE[item.state] : [];
}

/** A problem can be reported while the job is still to do or going. */
export const canReportProblem = (state: AssignmentState): boolean => state === 'planned' || state === 'underway' || state === 'paused';

/** Start: the machine's meter as Furlong last knew it. */
export function startDefaults(item: Pick<RunSheetItem, 'machine'>): { engineHours: number } {
  return { engineHours: roundTo(item.machine.engineHours, 1) };
}

/**
 * Finish: the acres planned, and the meter as last known (the machine's, or the start reading when
 * that is higher) for the operator to correct.
 */
export function finishDefaults(item: Pick<RunSheetItem, 'acresPlanned' | 'machine' | 'log'>): { acres: number; engineHours: number } {
  return {
    acres: roundTo(item.acresPlanned, 2),
    engineHours: roundTo(Math.max(item.machine.engineHours, item.log.engineHoursStart ?? 0), 1),
  };
}

/** Where each step leaves a job (the server's state machine; the screen only previews it). */
const STEP_LEADS_TO: Readonly<Record<EventType, AssignmentState>> = {
  start: 'underway',
  pause: 'paused',
  resume: 'underway',
  finish: 'finished',
  'call-off': 'called-off',
};

/** An action tapped on this device and not yet sent (the outbox's body). */
export interface UnsentAction {
  type: EventType | 'problem';
  at: string;
  clientEventId: string;
  acres?: number;
  engineHours?: number;
  reason?: string;
  note?: string;
  kind?: string;
}

/** A job's log entry that exists only on this device so far. */
export type ShownEvent = RunSheetEvent & { unsent?: boolean };
/** A job as shown: the server's, with the log entries waiting on this device added. */
export type ShownItem = Omit<RunSheetItem, 'events'> & { events: ShownEvent[] };

/**
 * The job as it will be once the actions waiting on this device are applied, so the operator can
 * go on working (finish after an offline start). Each unsent entry is marked; the server's answer
 * replaces the whole preview. A step the job's state does not allow is left out of the state (the
 * server will judge it and say why). Actions already sent but not yet in a reading of the day
 * (`sentNotRead`) are applied first, unmarked: without them the job would show its old state (and
 * its Start button) between the server's answer and the day read again.
 */
export function withUnsent(item: RunSheetItem, unsent: readonly UnsentAction[], sentNotRead: readonly UnsentAction[] = []): ShownItem {
  if (!unsent.length && !sentNotRead.length) return item;
  let state = item.state;
  const log = { ...item.log };
  const events: ShownEvent[] = [...item.events];
  const all = [...sentNotRead.map((u) => ({ u, sent: true })), ...unsent.map((u) => ({ u, sent: false }))];
  all.forEach(({ u, sent }, i) => {
    if (u.type !== 'problem' && ACTIONS_BY_STATE[state].includes(u.type)) {
      state = STEP_LEADS_TO[u.type];
      if (u.type === 'start' && u.engineHours !== undefined) log.engineHoursStart = u.engineHours;
      if (u.type === 'finish') {
        log.acresDone = u.acres ?? item.acresPlanned;
        if (u.engineHours !== undefined) log.engineHoursEnd = u.engineHours;
      }
    }
    events.push({
      id: -(i + 1),
      type: u.type,
      at: u.at,
      by: null,
      acres: u.type === 'finish' ? (u.acres ?? null) : null,
      engineHours: u.engineHours ?? null,
      reason: u.type === 'problem' ? (u.kind ?? null) : (u.reason ?? null),
      note: u.note ?? null,
      hazardId: null,
      unsent: !sent,
    });
  });
  return { ...item, state, log, events };
}
