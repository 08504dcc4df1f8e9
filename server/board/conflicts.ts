// The work board's conflict rules. Hard conflicts (a machine, implement or person in two places,
// an implement that cannot do the job, a learner alone) block publishing; soft ones warn. A no-go
// forecast over a card's window warns, or blocks when the owner made that operation's rule blocking.
import { OPERATION_INFO, type Operation } from '../../shared/operations';
import { formatEngineHours, formatHours } from '../../shared/figures';
import { mayMentor, worksAlone, type BoardAssignment, type CardWeather, type Conflict } from '../../shared/schemas/board';
import type { SkillLevel } from '../../shared/schemas/fleet';
import { coveredHours } from '../jobs/hours';
import { isFinishedForSeason } from '../jobs/progress';
import { formatMinutes } from './clock';

export interface ConflictCard {
  a: BoardAssignment;
  /** Effective start and end, minutes after midnight (server/board/schedule.ts). */
  start: number;
  end: number;
  /** The window the owner set, or null. */
  window: { start: number; end: number } | null;
  implementOperations: readonly Operation[];
  /** Why the machine cannot take the implement, or null. */
  cannotPull: string | null;
  serviceDueInHours: number | null;
  /** The machine's open breakdown report from a run sheet (since when, in the farm's time), or null. */
  machineDown?: { since: string; note: string | null } | null;
}

export type Skills = ReadonlyMap<number, Partial<Record<Operation, SkillLevel>>>;

const job = (c: ConflictCard) =>
  `${c.a.field.name} ${OPERATION_INFO[c.a.operation].label.toLowerCase()} ${formatMinutes(c.start)}–${formatMinutes(c.end)}`;
const overlaps = (x: ConflictCard, y: ConflictCard) => x.start < y.end && y.start < x.end;
const live = (c: ConflictCard) => c.a.state !== 'called-off';
const people = (c: ConflictCard) => [
  { id: c.a.operator.membershipId, name: c.a.operator.name, mentoring: false },
  ...(c.a.mentor ? [{ id: c.a.mentor.membershipId, name: c.a.mentor.name, mentoring: true }] : []),
];

/** Planned hours per person (operator or mentor), overlaps counted once, and their cards. */
export function hoursByPerson(cards: readonly ConflictCard[]): Map<number, { name: string; hours: number; ids: number[] }> {
  const spans = new Map<number, { name: string; spans: Array<[number, number]>; ids: number[] }>();
  for (const c of cards.filter(live)) {
    for (const p of people(c)) {
      const s = spans.get(p.id) ?? { name: p.name, spans: [], ids: [] };
      s.spans.push([c.start, c.end]);
      s.ids.push(c.a.id);
      spans.set(p.id, s);
    }
  }
  return new Map([...spans].map(([id, s]) => [id, { name: s.name, hours: coveredHours(s.spans), ids: s.ids }]));
}

function doubleBookings(cards: ConflictCard[]): Conflict[] {
  const out: Conflict[] = [];
  for (let i = 0; i < cards.length; i++) {
    for (let j = i + 1; j < cards.length; j++) {
      const [x, y] = [cards[i], cards[j]];
      if (!overlaps(x, y)) continue;
      const ids = [x.a.id, y.a.id];
      if (x.a.machine.id === y.a.machine.id) {
        out.push({
          code: 'machine_double_booked',
          severity: 'hard',
          message: `${x.a.machine.name} is on two jobs at once: ${job(x)} and ${job(y)}`,
          assignmentIds: ids,
        });
      }
      if (x.a.implement.id === y.a.implement.id) {
        out.push({
          code: 'implement_double_booked',
          severity: 'hard',
          message: `${x.a.implement.name} is on two jobs at once: ${job(x)} and ${job(y)}`,
          assignmentIds: ids,
        });
      }
      const seen = new Set<number>();
      for (const p of people(x)) {
        const q = people(y).find((o) => o.id === p.id);
        if (!q || seen.has(p.id)) continue;
        seen.add(p.id);
        // A mentor may work beside the learner in the same field; anywhere else is two places at once.
        if ((p.mentoring || q.mentoring) && x.a.field.id === y.a.field.id) continue;
        out.push({
          code: 'person_double_booked',
          severity: 'hard',
          message: `${p.name} is on two jobs at once: ${job(x)} and ${job(y)}`,
          assignmentIds: ids,
        });
      }
    }
  }
  return out;
}

/**
 * The hours a card's weather is read over (on the board and the run sheet alike): the window the owner set (an end, with or without a
 * start); else, when the owner set only a start, the job's own hours from it (its planned hours
 * on, as the card shows them); null for a job with no time set, read over the farm's working day.
 * A start alone is a time the operator was given: the run sheet shows that job's hours, so its
 * weather must cover them, not the whole working day.
 */
export const weatherWindowOf = (card: Pick<ConflictCard, 'a' | 'start' | 'end' | 'window'>): { start: number; end: number } | null =>
  card.window ?? (card.a.plannedStart ? { start: card.start, end: card.end } : null);

/**
 * What to say of a card whose planned hours do not fit the window the owner set, naming both; null
 * when they fit. The board's warning and the work order say the same.
 */
export function windowWarning(c: Pick<ConflictCard, 'a' | 'window'>): string | null {
  if (c.a.fitsWindow || !c.window) return null;
  const { start, end } = c.window;
  return `Planned ${formatHours(c.a.planHours)} does not fit ${formatMinutes(start)}–${formatMinutes(end)} (${formatHours((end - start) / 60)})`;
}

function equipment(c: ConflictCard): Conflict[] {
  const out: Conflict[] = [];
  const op = OPERATION_INFO[c.a.operation].label.toLowerCase();
  if (!c.implementOperations.includes(c.a.operation)) {
    out.push({
      code: 'implement_wrong_operation',
      severity: 'hard',
      message: `${c.a.implement.name} does not do ${op} (${c.a.field.name})`,
      assignmentIds: [c.a.id],
    });
  }
  if (c.cannotPull)
    out.push({
      code: 'implement_wrong_machine',
      severity: 'hard',
      message: `${c.cannotPull} (${c.a.field.name} ${op})`,
      assignmentIds: [c.a.id],
    });
  return out;
}

function mentoring(c: ConflictCard, skills: Skills): Conflict[] {
  const op = c.a.operation;
  const label = OPERATION_INFO[op].label.toLowerCase();
  const own = skills.get(c.a.operator.membershipId)?.[op];
  if (worksAlone(own)) return [];
  const who = `${c.a.operator.name} is ${own === 'learning' ? `learning ${label}` : `not trained for ${label}`}`;
  const mentor = c.a.mentor;
  let message: string | null = null;
  if (!mentor || mentor.membershipId === c.a.operator.membershipId) message = `${who} and has no mentor on ${c.a.field.name}`;
  else if (!mayMentor(skills.get(mentor.membershipId)?.[op])) message = `${who}; ${mentor.name} is not a mentor for ${label}`;
  return message ? [{ code: 'learner_without_mentor', severity: 'hard', message, assignmentIds: [c.a.id] }] : [];
}

/** A no-go forecast over the card's window, with its first reason: hard when the operation's rule is blocking. */
function weatherNoGo(c: ConflictCard, weather: ReadonlyMap<number, CardWeather>): Conflict[] {
  const w = weather.get(c.a.id);
  if (!w || w.verdict !== 'no-go') return [];
  const op = OPERATION_INFO[c.a.operation].label.toLowerCase();
  const over = w.over === 'card' ? `${w.from}–${w.to}` : `the working day ${w.from}–${w.to}`;
  return [
    {
      code: 'weather_no_go',
      severity: w.blocking ? 'hard' : 'soft',
      message: `Weather no-go for ${c.a.field.name} ${op} over ${over}: ${w.reason ?? 'outside the limits'}`,
      assignmentIds: [c.a.id],
    },
  ];
}

/**
 * Every conflict on a board day. Called-off jobs take part in none; finished ones only in double
 * bookings. `weather`: the cards' verdicts (server/board/day-weather.ts), none when not read.
 */
export function findConflicts(
  cards: readonly ConflictCard[],
  skills: Skills,
  dayHoursLimit: number,
  weather: readonly CardWeather[] = [],
): Conflict[] {
  const verdicts = new Map(weather.map((w) => [w.assignmentId, w]));
  const active = cards.filter(live);
  const open = active.filter((c) => c.a.state !== 'finished');
  const out = [...doubleBookings(active)];
  for (const c of open) out.push(...equipment(c), ...mentoring(c, skills), ...weatherNoGo(c, verdicts));
  for (const c of open.filter((c) => isFinishedForSeason(c.a.acresToDo))) {
    const op = OPERATION_INFO[c.a.operation].label.toLowerCase();
    out.push({
      code: 'field_finished',
      severity: 'soft',
      message: `${c.a.field.name} is already finished for ${op} this season`,
      assignmentIds: [c.a.id],
    });
  }
  for (const c of open) {
    const warning = windowWarning(c);
    if (warning) {
      const op = OPERATION_INFO[c.a.operation].label.toLowerCase();
      out.push({ code: 'window_too_short', severity: 'soft', message: `${warning}: ${c.a.field.name} ${op}`, assignmentIds: [c.a.id] });
    }
  }
  for (const p of hoursByPerson(active).values()) {
    if (p.hours > dayHoursLimit) {
      out.push({
        code: 'over_day_hours',
        severity: 'soft',
        message: `${p.name} has ${formatHours(p.hours)} planned, more than the farm's ${formatHours(dayHoursLimit)} day`,
        assignmentIds: p.ids,
      });
    }
  }
  const down = new Map<number, ConflictCard[]>();
  for (const c of open.filter((c) => c.machineDown)) down.set(c.a.machine.id, [...(down.get(c.a.machine.id) ?? []), c]);
  for (const list of down.values()) {
    const c = list[0];
    const { since, note } = c.machineDown!;
    out.push({
      code: 'machine_reported_down',
      severity: 'soft',
      message: `${c.a.machine.name} was reported broken down on ${since}${note ? ` ("${note}")` : ''}: give the job another machine, or confirm the report under "Reports from the field" once it is fixed`,
      assignmentIds: list.map((x) => x.a.id),
    });
  }
  const overdue = new Map<number, ConflictCard[]>();
  for (const c of open.filter((c) => c.serviceDueInHours != null && c.serviceDueInHours < 0))
    overdue.set(c.a.machine.id, [...(overdue.get(c.a.machine.id) ?? []), c]);
  for (const list of overdue.values()) {
    const c = list[0];
    out.push({
      code: 'service_overdue',
      severity: 'soft',
      message: `${c.a.machine.name} is ${formatEngineHours(-c.serviceDueInHours!)} past its service interval`,
      assignmentIds: list.map((x) => x.a.id),
    });
  }
  return out;
}
