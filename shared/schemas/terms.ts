// The words for a job's states and a report's kinds, kept apart from their validators (zod) so a
// screen that only shows them does not load the validation library: the run sheet opens sooner on
// a phone. jobs.ts and fields.ts export them too, beside the schemas that use them.

export const ASSIGNMENT_STATES = ['planned', 'underway', 'paused', 'finished', 'called-off'] as const;
export type AssignmentState = (typeof ASSIGNMENT_STATES)[number];
export const STATE_LABELS: Record<AssignmentState, string> = {
  planned: 'planned',
  underway: 'underway',
  paused: 'paused',
  finished: 'finished',
  'called-off': 'called off',
};

export const EVENT_TYPES = ['start', 'pause', 'resume', 'finish', 'call-off'] as const;
export type EventType = (typeof EVENT_TYPES)[number];

export const CALL_OFF_REASONS = ['weather', 'breakdown', 'other'] as const;
export const PROBLEM_KINDS = ['breakdown', 'hazard', 'other'] as const;

export const HAZARD_KINDS = ['bin', 'rock', 'power', 'draw', 'waterway', 'fence', 'neighbour', 'other'] as const;
export type HazardKind = (typeof HAZARD_KINDS)[number];

/** What each hazard kind is called on screen. */
export const HAZARD_LABELS: Record<HazardKind, string> = {
  bin: 'Bin or yard site',
  rock: 'Rock',
  power: 'Power pole or line',
  draw: 'Draw or steep break',
  waterway: 'Waterway',
  fence: 'Fence',
  neighbour: "Neighbour's edge",
  other: 'Other',
};
