// The demo farm's seasons, worked out for the day the demo is loaded: which days each field was
// harrowed, seeded, sprayed, swathed and combined, which days rain stopped the work, and which days
// are still to come. Pure (no database), so a test can check it for any date.
//
// Every field follows the order of a season (harrowing → seeding → spraying → swathing → combining):
// an operation starts on a field only the day after the one before it was finished there. The machines
// work field after field at their own capacity (the same width × speed × efficiency rule the board
// uses), so a large field spills over into the next day as a partial finish.
import { DateTime } from 'luxon';
import type { Operation } from '../shared/operations';

/** The operations the demo farm runs, in the order of a season (no baler in the demo fleet). */
export const DEMO_OPERATIONS = ['harrowing', 'seeding', 'spraying', 'swathing', 'combining'] as const satisfies readonly Operation[];
export type DemoOperation = (typeof DEMO_OPERATIONS)[number];

export type DemoPerson = 'ingrid' | 'tomas' | 'ada' | 'milo';

/** A field as one season sees it: its crop that season decides swathing and when it is ripe. */
export interface SeasonField {
  id: number;
  acres: number;
  crop: string;
}

/** One field's share of one operation on one day. */
export interface DemoPiece {
  season: number;
  day: string;
  fieldId: number;
  op: DemoOperation;
  acres: number;
  who: DemoPerson;
  mentor?: DemoPerson;
  /** `done`: worked before the load date; `rained-off`: called off for the weather; `open`: still to do. */
  outcome: 'done' | 'rained-off' | 'open';
}

/**
 * When the work of a season may start, as [month, day]. Spring: fieldwork in North Dakota starts on
 * average about April 15 (NDSU Crop and Pest Report, 9 May 2002, "normal starting date is April 15";
 * read); the harrow goes out a few days after that (common practice, no published source).
 * In-crop spraying from June 1, swathing canola from August 8, and combining from early August by
 * crop (common practice, no published source).
 */
const HARROW_FROM: [number, number] = [4, 20];
const SPRAY_FROM: [number, number] = [6, 1];
const SWATH_FROM: [number, number] = [8, 8];
const RIPE_FROM: Record<string, [number, number]> = {
  'field peas': [8, 5],
  barley: [8, 10],
  'spring wheat': [8, 15],
  durum: [8, 18],
};
/** Days from seeding to in-crop spraying (weeds and crop at a few leaves; common practice, no published source). */
const SEED_TO_SPRAY_DAYS = 30;
/** Days a canola swath lies before the combine picks it up (common practice, no published source). */
const SWATH_TO_COMBINE_DAYS = 10;
/** Hours a machine works in a day: under the demo farm's 12-hour day limit. */
export const DEMO_WORK_HOURS = 11;
/** How many days with work ahead of the load date the demo plans (today's jobs count when there are any). */
export const DEMO_PLANNED_DAYS = 3;

/**
 * Whether a past day was too wet (or, for the sprayer, too windy) to work: invented weather, about one
 * day in ten, the same for every load so the demo's history is reproducible.
 */
export const wetDay = (day: DateTime): boolean => (day.ordinal * 37 + day.year * 11) % 10 === 0;

const on = (season: number, [month, day]: [number, number], zone: string) => DateTime.fromObject({ year: season, month, day }, { zone });
const later = (a: DateTime, b: DateTime) => (a > b ? a : b);

interface QueueItem {
  field: SeasonField;
  earliest: DateTime;
}

/**
 * Works the queue field after field with one machine of `acresPerDay`: a day's capacity left over
 * goes to the next field; a wet day before `today` is called off and the work moves on a day.
 */
function work(
  season: number,
  op: DemoOperation,
  queue: QueueItem[],
  acresPerDay: number,
  today: DateTime,
  out: DemoPiece[],
): Map<number, DateTime> {
  const finishedOn = new Map<number, DateTime>();
  const ordered = [...queue].sort((a, b) => a.earliest.toMillis() - b.earliest.toMillis());
  let day: DateTime | null = null;
  let left = acresPerDay;
  const piece = (fieldId: number, acres: number, outcome: DemoPiece['outcome']) =>
    out.push({ season, day: day!.toISODate()!, fieldId, op, acres, who: 'tomas', outcome });
  for (const { field, earliest } of ordered) {
    if (!day || earliest > day) {
      day = earliest;
      left = acresPerDay;
    }
    let remaining = field.acres;
    while (remaining > 1e-6) {
      if (day < today && wetDay(day)) {
        piece(field.id, Math.min(remaining, left), 'rained-off');
        day = day.plus({ days: 1 });
        left = acresPerDay;
        continue;
      }
      // A last strip of under a twentieth of a day is finished the same day rather than left for the next.
      const take = remaining - left < acresPerDay * 0.05 ? remaining : left;
      piece(field.id, take, day < today ? 'done' : 'open');
      remaining -= take;
      left -= take;
      finishedOn.set(field.id, day);
      // Less than a twentieth of a day left: not worth moving the machine to another field.
      if (left < acresPerDay * 0.05) {
        day = day.plus({ days: 1 });
        left = acresPerDay;
      }
    }
  }
  return finishedOn;
}

/**
 * One season's field work, every field in the order of a season, as of `today` (the load date at
 * the farm): days before it are done or rained off, days from it on are open.
 *
 * @param capacityAcPerH each operation's machine capacity, acres per hour
 */
export function scheduleSeason(
  season: number,
  fields: SeasonField[],
  capacityAcPerH: Record<DemoOperation, number>,
  today: DateTime,
): DemoPiece[] {
  const zone = today.zoneName ?? 'UTC';
  const perDay = (op: DemoOperation) => capacityAcPerH[op] * DEMO_WORK_HOURS;
  const next = (m: Map<number, DateTime>, f: SeasonField) => m.get(f.id)!.plus({ days: 1 });
  const out: DemoPiece[] = [];

  const harrowed = work(
    season,
    'harrowing',
    fields.map((field) => ({ field, earliest: on(season, HARROW_FROM, zone) })),
    perDay('harrowing'),
    today,
    out,
  );
  const seeded = work(
    season,
    'seeding',
    fields.map((field) => ({ field, earliest: next(harrowed, field) })),
    perDay('seeding'),
    today,
    out,
  );
  const sprayed = work(
    season,
    'spraying',
    fields.map((field) => ({
      field,
      earliest: later(on(season, SPRAY_FROM, zone), seeded.get(field.id)!.plus({ days: SEED_TO_SPRAY_DAYS })),
    })),
    perDay('spraying'),
    today,
    out,
  );
  const canola = fields.filter((f) => f.crop === 'canola');
  const swathed = work(
    season,
    'swathing',
    canola.map((field) => ({ field, earliest: later(on(season, SWATH_FROM, zone), next(sprayed, field)) })),
    perDay('swathing'),
    today,
    out,
  );
  work(
    season,
    'combining',
    fields.map((field) => ({
      field,
      earliest:
        field.crop === 'canola'
          ? swathed.get(field.id)!.plus({ days: SWATH_TO_COMBINE_DAYS })
          : later(on(season, RIPE_FROM[field.crop] ?? [8, 15], zone), next(sprayed, field)),
    })),
    perDay('combining'),
    today,
    out,
  );
  assignPeople(out);
  return out;
}

/**
 * Who runs each piece. The harrow alternates by day between Tomas and Milo, who is learning it with
 * Tomas riding along as his mentor; Ada runs the drill while Tomas is on the harrow, else Tomas does;
 * Ada sprays and swaths; Tomas combines on weekdays and Ingrid at weekends.
 */
function assignPeople(pieces: DemoPiece[]): void {
  const harrowDays = [...new Set(pieces.filter((p) => p.op === 'harrowing').map((p) => p.day))].sort();
  for (const p of pieces) {
    if (p.op === 'harrowing') {
      if (harrowDays.indexOf(p.day) % 2 === 1) {
        p.who = 'milo';
        p.mentor = 'tomas';
      } else p.who = 'tomas';
    } else if (p.op === 'seeding') {
      p.who = harrowDays.includes(p.day) ? 'ada' : 'tomas';
    } else if (p.op === 'spraying' || p.op === 'swathing') p.who = 'ada';
    else p.who = DateTime.fromISO(p.day).weekday >= 6 ? 'ingrid' : 'tomas';
  }
}

/** The seasons of the demo as of a load date, and all their work. */
export interface DemoYear {
  /** The season whose work is under way or comes next. */
  workSeason: number;
  /** Seasons with logged work: the season before and this one once it has started, else the two before. */
  historySeasons: number[];
  /** Seasons that get a crop plan: the history and the work season. */
  cropSeasons: number[];
  /** Finished and rained-off work of the history seasons, and the open work of the planned days. */
  pieces: DemoPiece[];
  /** The days with open work the demo puts on the board (on or after the load date). */
  plannedDays: string[];
}

/**
 * The demo's seasons as of `today`: the work season is this calendar year while it still has work
 * left, else the next one (so from the end of harvest until spring, the planned days lie in the
 * coming spring).
 *
 * @param fieldsIn the farm's fields as each season sees them (its crop that season)
 */
export function demoYear(
  today: DateTime,
  fieldsIn: (season: number) => SeasonField[],
  capacityAcPerH: Record<DemoOperation, number>,
): DemoYear {
  const schedule = (season: number) => scheduleSeason(season, fieldsIn(season), capacityAcPerH, today);
  let current = schedule(today.year);
  let workSeason = today.year;
  if (!current.some((p) => p.outcome === 'open')) {
    workSeason = today.year + 1;
    current = schedule(workSeason);
  }
  const started = current.some((p) => p.outcome !== 'open');
  const historySeasons = started ? [workSeason - 1, workSeason] : [workSeason - 2, workSeason - 1];
  const plannedDays = [...new Set(current.filter((p) => p.outcome === 'open').map((p) => p.day))].sort().slice(0, DEMO_PLANNED_DAYS);
  const pieces = [
    ...historySeasons.filter((s) => s !== workSeason).flatMap(schedule),
    ...current.filter((p) => p.outcome !== 'open' || plannedDays.includes(p.day)),
  ];
  return {
    workSeason,
    historySeasons,
    cropSeasons: [...new Set([...historySeasons, workSeason])],
    pieces,
    plannedDays,
  };
}
