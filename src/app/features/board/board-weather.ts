import { formatAge } from '@shared/figures';
import type { CardWeather, DayStrip } from '@shared/schemas/board';

export const VERDICT_LABELS: Record<CardWeather['verdict'], string> = { go: 'Go', caution: 'Caution', 'no-go': 'No-go' };

/** "20 min", "3.0 h", "1.5 h": a forecast's age, as the server and the run sheet write it (shared/figures.ts). */
export const ageText = (minutes: number): string => formatAge(minutes);

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
