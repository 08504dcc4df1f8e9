/**
 * Above this width an implement is a wide load on the road in most places: 8.5 ft (2.59 m) in the
 * US, 2.6 m in much of Canada. A rule of thumb for showing a caution, not the law where you travel.
 */
export const ROAD_WIDTH_LIMIT_M = 2.6;

export const ROAD_CAUTION =
  'Moving on public roads: lights, flashers and slow-moving-vehicle emblem, and check the width and escort rules where you travel.';
export const FOLDING_CAUTION =
  'Folding or unfolding: look up first and keep well clear of overhead power lines and poles; fold only where the sky is clear.';
export const DEFER_TO_LAW = 'Reminders only: local law and the operator’s manual come first.';

export interface WidthsOf {
  widthM: number | null;
  transportWidthM: number | null;
}

/** Wider than a road lane allows when moved: its transport width, or its working width when it does not fold. */
export function isWideOnRoad(i: WidthsOf): boolean {
  const roadWidth = i.transportWidthM ?? i.widthM;
  return roadWidth !== null && roadWidth > ROAD_WIDTH_LIMIT_M;
}

/** Folds for the road: narrower in transport than at work. */
export function folds(i: WidthsOf): boolean {
  return i.transportWidthM !== null && i.widthM !== null && i.transportWidthM < i.widthM;
}

/** The cautions that apply to an implement of these widths, in plain words. */
export function cautionsFor(i: WidthsOf): string[] {
  return [...(isWideOnRoad(i) ? [ROAD_CAUTION] : []), ...(folds(i) ? [FOLDING_CAUTION] : [])];
}
