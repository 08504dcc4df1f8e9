// A farm's calendar: which day it is at the farm, whatever the clock of the machine asking.

const dayFormats = new Map<string, Intl.DateTimeFormat>();

/** The calendar day (YYYY-MM-DD) at an instant in an IANA time zone. */
export function dayIn(timeZone: string, at: Date = new Date()): string {
  let f = dayFormats.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' });
    dayFormats.set(timeZone, f);
  }
  const parts = f.formatToParts(at);
  const part = (type: string) => parts.find((p) => p.type === type)!.value;
  return `${part('year')}-${part('month')}-${part('day')}`;
}

/** The calendar year at an instant in an IANA time zone: the farm's current season. */
export const yearIn = (timeZone: string, at: Date = new Date()): number => Number(dayIn(timeZone, at).slice(0, 4));
