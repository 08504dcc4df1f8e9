// Which buttons a job shows on the run sheet, and what the dialogs start from. The server checks
// the same transitions (a 409 if the job moved on meanwhile); this only keeps the screen honest.
import type { AssignmentState, EventType } from '@shared/schemas/jobs';
import type { RunSheetItem } from '@shared/schemas/run-sheet';
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
