import type { CardWeather, DayStrip } from '@shared/schemas/board';

export const VERDICT_LABELS: Record<CardWeather['verdict'], string> = { go: 'Go', caution: 'Caution', 'no-go': 'No-go' };

/** "20 min", "3 h", "1.5 h": a forecast's age. */
export function ageText(minutes: number): string {
  if (minutes < 60) return `${Math.max(0, Math.round(minutes))} min`;
  const hours = Math.round((minutes / 60) * 10) / 10;
  return `${hours.toLocaleString('en-US')} h`;
}

/**
 * A forecast's freshness as the page sees it now: stale when the server said so, or when its
 * clock has passed the time the forecast turns stale (a board kept in memory does not age).
 */
export function freshness(
  w: Pick<CardWeather | DayStrip, 'fetchedAt' | 'ageMinutes' | 'stale' | 'staleReason' | 'staleAfter'>,
  now = new Date(),
): { stale: boolean; ageMinutes: number; text: string } {
  const ageMinutes = Math.max(w.ageMinutes, Math.floor((now.getTime() - new Date(w.fetchedAt).getTime()) / 60_000));
  const stale = w.stale || now.getTime() >= new Date(w.staleAfter).getTime();
  const age = ageText(ageMinutes);
  // The server's words when it found the forecast stale (they say why); else the page's own.
  const text = stale ? `Stale: ${w.staleReason ?? `Forecast from ${age} ago: no newer forecast has arrived`}` : `Forecast from ${age} ago`;
  return { stale, ageMinutes, text };
}
