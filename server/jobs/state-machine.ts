import { EVENT_TYPES, STATE_LABELS, type AssignmentState, type EventType } from '../../shared/schemas/jobs';

const NEXT: Record<EventType, { from: readonly AssignmentState[]; to: AssignmentState; hint: string }> = {
  start: { from: ['planned'], to: 'underway', hint: 'Only a planned job can be started.' },
  pause: { from: ['underway'], to: 'paused', hint: 'Only a job underway can be paused.' },
  resume: { from: ['paused'], to: 'underway', hint: 'Only a paused job can be resumed.' },
  finish: { from: ['underway', 'paused'], to: 'finished', hint: 'Start the job before finishing it.' },
  'call-off': { from: ['planned', 'underway', 'paused'], to: 'called-off', hint: 'A finished or called-off job cannot be called off.' },
};

const DONE: Record<EventType, string> = {
  start: 'started',
  pause: 'paused',
  resume: 'resumed',
  finish: 'finished',
  'call-off': 'called off',
};

/**
 * A job's next state after an operator's action, or why the action does not fit the state.
 *
 * @example nextState('planned', 'start') // { state: 'underway' }
 * @example nextState('finished', 'start') // { error: 'This job is finished: it cannot be started. Only a planned job can be started.' }
 */
export function nextState(state: AssignmentState, type: EventType): { state: AssignmentState } | { error: string } {
  const rule = NEXT[type];
  if (rule.from.includes(state)) return { state: rule.to };
  return { error: `This job is ${STATE_LABELS[state]}: it cannot be ${DONE[type]}. ${rule.hint}` };
}

export const pastTense = (type: EventType): string => DONE[type];

const isStep = (type: string): type is EventType => (EVENT_TYPES as readonly string[]).includes(type);

export interface LoggedStep {
  type: string;
  at: Date;
}

export type OrderVerdict =
  /** `state`: the job's state after the whole log; `late`: the event goes before entries already logged. */
  | { ok: true; state: AssignmentState; late: boolean; startedAt: Date | null; finishedAt: Date | null }
  /**
   * `failing`: the first entry that does not fit (the event itself or a later one); `after`: the
   * entry before it (null: none) and `state` the job's state then.
   */
  | { ok: false; late: boolean; state: AssignmentState; failing: LoggedStep; after: LoggedStep | null };

/**
 * Judges an action by the time it was tapped, not the time it arrived: it takes its place in the
 * job's log (after entries of the same time), and the log from the last deletion on is run through
 * the state machine from `planned`. A pause tapped at 16:00 that arrives after a finish tapped at
 * 16:40 fits (underway → paused → finished); a finish tapped at 16:30 on another phone does not
 * (it goes before the logged one, which then follows a finished job).
 *
 * @param log the job's log, any order (problems and corrections are passed over)
 * @example judgeInOrder([{ type: 'start', at: t('08:00') }, { type: 'finish', at: t('16:40') }], { type: 'pause', at: t('16:00') }) // { ok: true, state: 'finished', late: true, … }
 */
export function judgeInOrder(log: readonly LoggedStep[], event: { type: EventType; at: Date }): OrderVerdict {
  const sorted = [...log].sort((a, b) => a.at.getTime() - b.at.getTime());
  const reset = sorted.map((e) => e.type).lastIndexOf('log-deleted');
  const steps = sorted.slice(reset + 1).filter((e) => isStep(e.type));
  let place = steps.findIndex((e) => e.at.getTime() > event.at.getTime());
  const late = place >= 0;
  if (place < 0) place = steps.length;
  const all: LoggedStep[] = [...steps.slice(0, place), event, ...steps.slice(place)];
  let state: AssignmentState = 'planned';
  let startedAt: Date | null = null;
  let finishedAt: Date | null = null;
  for (let i = 0; i < all.length; i++) {
    const step = all[i];
    const next = nextState(state, step.type as EventType);
    if ('error' in next) return { ok: false, late, state, failing: step, after: i > 0 ? all[i - 1] : null };
    state = next.state;
    if (step.type === 'start') startedAt ??= step.at;
    if (step.type === 'finish') finishedAt = step.at;
  }
  return { ok: true, state, late, startedAt, finishedAt };
}
