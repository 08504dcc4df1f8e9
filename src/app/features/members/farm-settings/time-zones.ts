/** The time zones the browser knows (IANA names), North American ones first, for the picker. */
export function timeZoneChoices(): string[] {
  const all: string[] =
    typeof Intl.supportedValuesOf === 'function' ? Intl.supportedValuesOf('timeZone') : ['America/Chicago', 'America/Denver', 'UTC'];
  const first = (z: string) => (z.startsWith('America/') || z.startsWith('Canada/') ? 0 : 1);
  return [...all].sort((a, b) => first(a) - first(b) || a.localeCompare(b));
}

/** "Tue 21:14": the clock at the farm now, to check a choice by. */
export function clockIn(timeZone: string, now = new Date()): string {
  return new Intl.DateTimeFormat('en-US', { timeZone, weekday: 'short', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).format(now);
}
