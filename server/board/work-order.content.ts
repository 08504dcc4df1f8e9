// What a person's work order says, as data: built from the board day, hashed to tell whether
// it changed since it was last mailed, and rendered to text and HTML by work-order.message.ts.
import { createHash } from 'node:crypto';
import { DateTime } from 'luxon';
import { OPERATION_INFO, type Operation } from '../../shared/operations';
import { HAZARD_LABELS, type HazardKind } from '../../shared/schemas/fields';
import type { UnitSystem } from '../../shared/schemas/auth';
import type { Conflict } from '../../shared/schemas/board';
import { windowWarning, type ConflictCard } from './conflicts';
import type { DayContext } from './day-context';
import { planKey } from './day-context';

export interface OrderHazard {
  label: string;
  /** Metres, as stored; the mail writes it in the farm's unit, whole (shared/figures.ts). */
  clearanceM: number;
  note: string | null;
  /** Reported by an operator, not yet confirmed by the owner. */
  reported: boolean;
}

export interface OrderJob {
  role: 'operator' | 'mentor';
  field: string;
  operation: string;
  /** The window the owner set when the work does not fit it; else the job's effective times. */
  start: string;
  end: string;
  /** As the board's card has it; written by shared/figures.ts like the card. */
  acresPlanned: number;
  /** The hours the work takes (the board's planned hours). */
  hours: number;
  /** Set when those hours do not fit the window: the board's warning, word for word. */
  doesNotFit: string | null;
  machine: string;
  implement: string;
  /** Working width in metres, as stored; the mail writes it in the farm's unit (shared/figures.ts). */
  widthM: number;
  operator: string;
  mentor: string | null;
  hazards: OrderHazard[];
  passPlan: { headingDeg: number | null; passCount: number | null; headlandPasses: number } | null;
  note: string | null;
}

export interface OrderContent {
  farm: string;
  /** The farm's units: the figures of the mail read as on the board (a switch changes the order). */
  units: UnitSystem;
  date: string;
  dateLabel: string;
  name: string;
  jobs: OrderJob[];
  cautions: Array<{ operation: string; lines: readonly string[] }>;
  link: string;
}

const num = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);

export const dateLabel = (day: string): string => DateTime.fromISO(day).setLocale('en-US').toFormat('cccc, LLLL d, yyyy');

/** The person's jobs that day (as operator or mentor), in time order; called-off jobs are left out. */
export function jobsOf(ctx: DayContext, person: { membershipId: number }): ConflictCard[] {
  return ctx.cards
    .filter(
      (c) =>
        c.a.state !== 'called-off' &&
        (c.a.operator.membershipId === person.membershipId || c.a.mentor?.membershipId === person.membershipId),
    )
    .sort((x, y) => x.start - y.start || x.a.order - y.a.order || x.a.id - y.a.id);
}

/** The person's order: their jobs (see `jobsOf`, in that order), the operations' cautions and the link. */
export function orderContent(ctx: DayContext, person: { membershipId: number; name: string }, publicUrl: string): OrderContent {
  const operations = new Set<Operation>();
  const jobs = jobsOf(ctx, person).map((card): OrderJob => {
    const { a } = card;
    operations.add(a.operation);
    const plan = ctx.passPlans.get(planKey(a.field.id, a.operation));
    const doesNotFit = windowWarning(card);
    return {
      role: a.operator.membershipId === person.membershipId ? 'operator' : 'mentor',
      field: a.field.name,
      operation: OPERATION_INFO[a.operation].label,
      start: a.startTime,
      end: doesNotFit && a.plannedEnd ? a.plannedEnd : a.endTime,
      acresPlanned: a.acresPlanned,
      hours: a.planHours,
      doesNotFit,
      machine: a.machine.name,
      implement: a.implement.name,
      widthM: a.implement.widthM,
      operator: a.operator.name,
      mentor: a.mentor?.name ?? null,
      hazards: ctx.hazards
        .filter((h) => h.field_id === a.field.id)
        .map((h) => ({
          label: HAZARD_LABELS[h.kind as HazardKind] ?? h.kind,
          clearanceM: h.clearance_m,
          note: h.note,
          reported: h.status === 'reported',
        })),
      passPlan: plan
        ? {
            headingDeg: num(plan.summary.headingDeg) ?? plan.heading_deg,
            passCount: num(plan.summary.passCount),
            headlandPasses: plan.headland_passes,
          }
        : null,
      note: a.note,
    };
  });
  return {
    farm: ctx.farm.name,
    units: ctx.farm.units,
    date: ctx.day,
    dateLabel: dateLabel(ctx.day),
    name: person.name,
    jobs,
    cautions: [...operations].map((op) => ({ operation: OPERATION_INFO[op].label, lines: OPERATION_INFO[op].cautions })),
    link: `${publicUrl}/run-sheet?date=${ctx.day}`,
  };
}

/** The board's warnings an order repeats: the person's day over its hours once, the rest per job. */
export interface OrderWarnings {
  day: string[];
  /** Per job of the order, in its order. */
  jobs: string[][];
}

/**
 * The soft conflicts standing for a person's jobs (`jobIds`, in the order's order), word for word
 * as the board and the publish dialog show them, so the operator reads what the owner confirmed.
 * The window that does not fit is left out (the order says it as `doesNotFit`). Not part of the
 * order's content or hash: a forecast that turns does not make a published order "changed".
 */
export function orderWarnings(conflicts: readonly Conflict[], jobIds: readonly number[]): OrderWarnings {
  const soft = conflicts.filter((c) => c.severity === 'soft' && c.code !== 'window_too_short');
  const mine = new Set(jobIds);
  const messages = (list: Conflict[]) => [...new Set(list.map((c) => c.message))];
  const dayWide = (c: Conflict) => c.code === 'over_day_hours';
  return {
    day: messages(soft.filter((c) => dayWide(c) && c.assignmentIds.some((id) => mine.has(id)))),
    jobs: jobIds.map((id) => messages(soft.filter((c) => !dayWide(c) && c.assignmentIds.includes(id)))),
  };
}

/** SHA-256 of the order's content: equal hashes mean the same order. */
export const hashOrder = (content: OrderContent | { withdrawn: string }): string =>
  createHash('sha256').update(JSON.stringify(content)).digest('hex');

/** What a published order said of one job: enough to tell later whether it moved or changed. */
export interface OrderJobMark {
  id: number;
  /** Its times and place among the person's jobs. */
  at: string;
  /** SHA-256 of the rest of what the order said of it. */
  body: string;
}

/** One mark per job of an order, in the order's order (`jobs` of `orderContent` for the same person). */
export function orderMarks(cards: readonly ConflictCard[], jobs: readonly OrderJob[]): OrderJobMark[] {
  return jobs.map(({ start, end, ...rest }, i) => ({
    id: cards[i].a.id,
    at: `${start}–${end} #${i + 1}`,
    body: createHash('sha256').update(JSON.stringify(rest)).digest('hex'),
  }));
}

/** The people who get an order that day: everyone on a live job as operator or mentor. */
export function peopleWithJobs(ctx: DayContext): Array<{ membershipId: number; name: string }> {
  const out = new Map<number, string>();
  for (const { a } of ctx.cards) {
    if (a.state === 'called-off') continue;
    out.set(a.operator.membershipId, a.operator.name);
    if (a.mentor) out.set(a.mentor.membershipId, a.mentor.name);
  }
  return [...out].map(([membershipId, name]) => ({ membershipId, name }));
}
