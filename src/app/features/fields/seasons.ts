/** Seasons offered in pickers: next year (planning ahead) back to five years ago, newest first. */
export function seasonChoices(thisYear: number): number[] {
  return Array.from({ length: 7 }, (_, i) => thisYear + 1 - i);
}
