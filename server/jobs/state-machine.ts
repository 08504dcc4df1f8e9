import { STATE_LABELS, type AssignmentState, type EventType } from '../../shared/schemas/jobs';

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
