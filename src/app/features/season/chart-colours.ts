// Furlong's own chart colours (from the prairie palette in styles/_theme-colors.scss), chosen to
// read on both the light and the dark theme and on paper.
export const CHART = {
  /** Bars: this season's work each week. */
  wheat: '#c7972b',
  /** Lines and the compared season. */
  slate: '#2f6d78',
  /** Axis labels and grid lines. */
  ink: '#7d8486',
  grid: 'rgba(125, 132, 134, 0.25)',
} as const;
