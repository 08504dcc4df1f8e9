// An instant as the farm's clock reads it, whatever the zone of the browser or server showing it:
// a publish time seen from a phone abroad, or an e-mail read on a laptop set to another zone,
// still tells the farm's hour. Built on Intl (no date library in the browser bundle).

/**
 * - `clock`: "14:05"
 * - `stamp`: "May 15, 14:05"
 * - `weekday`: "Thu, May 15, 14:05"
 */
export type FarmTimeStyle = 'clock' | 'stamp' | 'weekday';

const FIELDS: Record<FarmTimeStyle, Intl.DateTimeFormatOptions> = {
  clock: { hour: '2-digit', minute: '2-digit', hourCycle: 'h23' },
  stamp: { month: 'short', day: 'numeric', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' },
  weekday: { weekday: 'short', month: 'short', day: 'numeric', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' },
};

const formats = new Map<string, Intl.DateTimeFormat>();

function formatOf(timeZone: string | undefined, fields: Intl.DateTimeFormatOptions, key: string): Intl.DateTimeFormat {
  const k = `${timeZone ?? ''}|${key}`;
  let f = formats.get(k);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', { ...fields, timeZone });
    formats.set(k, f);
  }
  return f;
}

const instant = (at: string | Date): Date => (typeof at === 'string' ? new Date(at) : at);

/**
 * The zone's short name at an instant, as people there say it: "CST", "CDT"; zones without a
 * common English abbreviation read as their offset ("GMT+9").
 */
export function zoneAbbreviation(timeZone: string, at: string | Date): string {
  const parts = formatOf(timeZone, { timeZoneName: 'short' }, 'zone').formatToParts(instant(at));
  return parts.find((p) => p.type === 'timeZoneName')?.value ?? timeZone;
}

/**
 * An instant (ISO string or Date) in the farm's time zone (IANA name). `zone: true` adds the zone's
 * abbreviation ("14:05 CDT") for readers who might be elsewhere, such as e-mail. An unknown zone
 * (`undefined`, only before the farm is loaded) falls back to the machine's own.
 */
export function farmTime(
  at: string | Date,
  timeZone: string | undefined,
  style: FarmTimeStyle = 'clock',
  opts: { zone?: boolean } = {},
): string {
  const text = formatOf(timeZone, FIELDS[style], style).format(instant(at));
  return opts.zone && timeZone ? `${text} ${zoneAbbreviation(timeZone, at)}` : text;
}

/**
 * A board time ('HH:MM') as a person reads it. The board's running order can carry a day's last
 * job past midnight, and keeps that as hours past 24 ('25:43'); a clock never shows those: it is
 * 01:43 the next day.
 *
 * @example dayClock('25:43') // '01:43 next day'
 */
export function dayClock(hhmm: string): string {
  const m = /^(\d{2,}):(\d{2})$/.exec(hhmm);
  const hours = m ? Number(m[1]) : 0;
  if (!m || hours < 24) return hhmm;
  const days = Math.floor(hours / 24);
  return `${String(hours % 24).padStart(2, '0')}:${m[2]} ${days === 1 ? 'next day' : `${days} days later`}`;
}

/** A job's time span as a person reads it: '08:00–17:30', '20:00–01:43 next day'. */
export const daySpan = (start: string, end: string): string => `${dayClock(start)}–${dayClock(end)}`;
