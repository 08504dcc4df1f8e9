// How the work board is laid out: one column per person who can run a machine, their cards in
// running order, and what a drag (or a keyboard move) sends to the order endpoint.
import type { Board, BoardAssignment, BoardOrder, OrderChanges, WorkOrderState } from '@shared/schemas/board';
import { roundTo } from '@shared/round';
import type { CrewMember } from '@shared/schemas/fleet';

export interface BoardColumn {
  membershipId: number;
  name: string;
  /** Planned hours of the day (the server's figure when it sent one). */
  plannedHours: number;
  overLimit: boolean;
  cards: BoardAssignment[];
  order: WorkOrderState | null;
}

export interface CardPlace {
  membershipId: number;
  index: number;
}

export type OrderColumns = BoardOrder['columns'];

const byRunningOrder = (a: BoardAssignment, b: BoardAssignment) => a.order - b.order || a.id - b.id;

/**
 * The board's columns: every operator and owner of the crew (operators first), then anyone else
 * the board names, each with their cards in running order. Called-off cards stay in the column but
 * add no hours. A card adds the hours it books (the server's one rule: the longer of its planned
 * hours and its window), never only its window.
 */
export function boardColumns(board: Board, crew: readonly CrewMember[]): BoardColumn[] {
  const people = new Map<number, string>();
  for (const role of ['operator', 'owner'] as const) {
    for (const c of crew) if (c.role === role) people.set(c.membershipId, c.name);
  }
  for (const o of board.operators) if (!people.has(o.membershipId)) people.set(o.membershipId, o.name);
  for (const a of board.assignments) if (!people.has(a.operator.membershipId)) people.set(a.operator.membershipId, a.operator.name);

  return [...people].map(([membershipId, name]) => {
    const cards = board.assignments.filter((a) => a.operator.membershipId === membershipId).sort(byRunningOrder);
    const fromServer = board.operators.find((o) => o.membershipId === membershipId)?.plannedHours;
    const plannedHours = roundTo(fromServer ?? cards.filter((a) => a.state !== 'called-off').reduce((sum, a) => sum + a.bookedHours, 0));
    return {
      membershipId,
      name,
      plannedHours,
      overLimit: plannedHours > board.dayHoursLimit,
      cards,
      order: board.orders.find((o) => o.membershipId === membershipId) ?? null,
    };
  });
}

/**
 * The order body for moving the card at `from` to `to` (an index in the target column as it is
 * before the move, as the drop list reports it): the source and the target column, each with all
 * its cards in their new order. Null when the card stays where it was.
 */
export function orderAfterMove(columns: readonly BoardColumn[], from: CardPlace, to: CardPlace): OrderColumns | null {
  const source = columns.find((c) => c.membershipId === from.membershipId);
  const target = columns.find((c) => c.membershipId === to.membershipId);
  if (!source || !target) return null;
  const card = source.cards[from.index];
  if (!card) return null;

  const sourceIds = source.cards.map((a) => a.id);
  sourceIds.splice(from.index, 1);
  if (source === target) {
    const index = clamp(to.index, 0, sourceIds.length);
    if (index === from.index) return null;
    sourceIds.splice(index, 0, card.id);
    return [{ membershipId: source.membershipId, assignmentIds: sourceIds }];
  }
  const targetIds = target.cards.map((a) => a.id);
  targetIds.splice(clamp(to.index, 0, targetIds.length), 0, card.id);
  return [
    { membershipId: source.membershipId, assignmentIds: sourceIds },
    { membershipId: target.membershipId, assignmentIds: targetIds },
  ];
}

/**
 * The board as it will look once the server takes the order body, shown at once while the save
 * runs (the server's answer replaces it; a refusal puts the old board back).
 */
export function applyOrder(board: Board, columns: OrderColumns, names: ReadonlyMap<number, string>): Board {
  const placed = new Map<number, { membershipId: number; order: number }>();
  for (const column of columns)
    column.assignmentIds.forEach((id, i) => placed.set(id, { membershipId: column.membershipId, order: i + 1 }));
  return {
    ...board,
    assignments: board.assignments.map((a) => {
      const place = placed.get(a.id);
      if (!place) return a;
      const operator =
        place.membershipId === a.operator.membershipId
          ? a.operator
          : { membershipId: place.membershipId, name: names.get(place.membershipId) ?? '' };
      return { ...a, operator, order: place.order };
    }),
  };
}

const CHANGE_WORDS: ReadonlyArray<[keyof OrderChanges, string]> = [
  ['added', 'added'],
  ['moved', 'moved'],
  ['edited', 'edited'],
  ['removed', 'removed'],
];

/**
 * What a column says of an order that changed since it was published: "Since publishing: 1 added,
 * 1 moved"; "Changed since publishing" when what changed is not known (an order published before
 * the jobs were kept, or a change outside the jobs, such as the cautions); null when unchanged.
 */
export function changesText(order: WorkOrderState | null): string | null {
  if (!order?.changedSincePublish) return null;
  const parts = CHANGE_WORDS.filter(([k]) => (order.changes?.[k] ?? 0) > 0).map(([k, word]) => `${order.changes![k]} ${word}`);
  return parts.length ? `Since publishing: ${parts.join(', ')}` : 'Changed since publishing';
}

/** Conflicts by card id, hard ones first. */
export function conflictsByCard(board: Board): Map<number, Board['conflicts']> {
  const out = new Map<number, Board['conflicts']>();
  const sorted = [...board.conflicts].sort((a, b) => (a.severity === b.severity ? 0 : a.severity === 'hard' ? -1 : 1));
  for (const c of sorted) for (const id of c.assignmentIds) out.set(id, [...(out.get(id) ?? []), c]);
  return out;
}

const clamp = (n: number, min: number, max: number) => Math.min(max, Math.max(min, n));
