import type { Conflict } from '@shared/schemas/board';
import { applyOrder, boardColumns, changesText, conflictsByCard, orderAfterMove } from './board-columns';
import { ADA, CREW, MILO, TOMAS, board, card } from './testing/board-fixtures';

describe('boardColumns', () => {
  it('when the crew has operators and an owner, then there is one column each, operators first, viewers left out', () => {
    const cols = boardColumns(board([]), CREW);
    expect(cols.map((c) => c.name)).toEqual(['Tomas Reyes', 'Ada Lindqvist', 'Milo Sorensen', 'Ingrid Sorensen']);
  });

  it('when cards come in any order, then each column holds its own cards in running order', () => {
    const b = board([card(3, TOMAS, 2), card(1, ADA, 1), card(2, TOMAS, 1), card(4, TOMAS, 3)]);
    const cols = boardColumns(b, CREW);
    expect(cols.find((c) => c.membershipId === TOMAS.membershipId)!.cards.map((a) => a.id)).toEqual([2, 3, 4]);
    expect(cols.find((c) => c.membershipId === ADA.membershipId)!.cards.map((a) => a.id)).toEqual([1]);
    expect(cols.find((c) => c.membershipId === MILO.membershipId)!.cards).toEqual([]);
  });

  it('when the server sends no hours, then the column sums its cards, leaving called-off ones out', () => {
    const b = board([
      card(1, TOMAS, 1, { planHours: 2.25 }),
      card(2, TOMAS, 2, { planHours: 3.5 }),
      card(3, TOMAS, 3, { planHours: 4, state: 'called-off' }),
    ]);
    const tomas = boardColumns(b, CREW)[0];
    expect(tomas.plannedHours).toBe(5.75);
    expect(tomas.overLimit).toBe(false);
  });

  it('when a card does not fit its window, then the column counts the hours it books (its planned hours), not the window', () => {
    const b = board([
      card(1, TOMAS, 1, { planHours: 28.5, bookedHours: 28.5, plannedStart: '08:00', plannedEnd: '12:00', fitsWindow: false }),
    ]);
    const tomas = boardColumns(b, CREW)[0];
    expect(tomas.plannedHours).toBe(28.5);
    expect(tomas.overLimit).toBe(true);
  });

  it('when the server sends hours (mentoring counted, overlaps once), then its figure wins and the day limit is checked', () => {
    const b = board([card(1, TOMAS, 1, { planHours: 2 })], { operators: [{ ...TOMAS, plannedHours: 11.5 }], dayHoursLimit: 10 });
    const tomas = boardColumns(b, CREW)[0];
    expect(tomas.plannedHours).toBe(11.5);
    expect(tomas.overLimit).toBe(true);
  });

  it('when a card belongs to someone not on the crew list, then they still get a column', () => {
    const stranger = { membershipId: 99, name: 'Former hand' };
    const cols = boardColumns(board([card(1, stranger, 1)]), CREW);
    expect(cols.at(-1)).toMatchObject({ membershipId: 99, name: 'Former hand' });
    expect(cols.at(-1)!.cards).toHaveLength(1);
  });

  it('when work orders were published, then each column carries its own order state', () => {
    const b = board([], {
      orders: [{ ...ADA, status: 'sent', sentAt: '2031-05-14T19:00:00Z', changedSincePublish: true, changes: null, kind: 'order' }],
    });
    const cols = boardColumns(b, CREW);
    expect(cols.find((c) => c.membershipId === ADA.membershipId)!.order).toMatchObject({ status: 'sent', changedSincePublish: true });
    expect(cols[0].order).toBeNull();
  });
});

describe('orderAfterMove (the drop handler body)', () => {
  const b = board([card(1, TOMAS, 1), card(2, TOMAS, 2), card(3, TOMAS, 3), card(4, ADA, 1)]);
  const cols = boardColumns(b, CREW);

  it('when a card moves down its own column, then only that column is sent in its new order', () => {
    expect(orderAfterMove(cols, { membershipId: TOMAS.membershipId, index: 0 }, { membershipId: TOMAS.membershipId, index: 2 })).toEqual([
      { membershipId: TOMAS.membershipId, assignmentIds: [2, 3, 1] },
    ]);
  });

  it('when a card moves up, then it lands before the one it was dropped on', () => {
    expect(orderAfterMove(cols, { membershipId: TOMAS.membershipId, index: 2 }, { membershipId: TOMAS.membershipId, index: 1 })).toEqual([
      { membershipId: TOMAS.membershipId, assignmentIds: [1, 3, 2] },
    ]);
  });

  it('when a card moves to another column, then both columns are sent with all their cards', () => {
    expect(orderAfterMove(cols, { membershipId: TOMAS.membershipId, index: 1 }, { membershipId: ADA.membershipId, index: 0 })).toEqual([
      { membershipId: TOMAS.membershipId, assignmentIds: [1, 3] },
      { membershipId: ADA.membershipId, assignmentIds: [2, 4] },
    ]);
  });

  it('when a card is dropped into an empty column past its end, then it becomes that column’s only card', () => {
    expect(orderAfterMove(cols, { membershipId: ADA.membershipId, index: 0 }, { membershipId: MILO.membershipId, index: 5 })).toEqual([
      { membershipId: ADA.membershipId, assignmentIds: [] },
      { membershipId: MILO.membershipId, assignmentIds: [4] },
    ]);
  });

  it('when a card is dropped where it was, or from nowhere, then nothing is sent', () => {
    expect(orderAfterMove(cols, { membershipId: TOMAS.membershipId, index: 1 }, { membershipId: TOMAS.membershipId, index: 1 })).toBeNull();
    expect(orderAfterMove(cols, { membershipId: TOMAS.membershipId, index: 9 }, { membershipId: ADA.membershipId, index: 0 })).toBeNull();
    expect(orderAfterMove(cols, { membershipId: 404, index: 0 }, { membershipId: ADA.membershipId, index: 0 })).toBeNull();
  });
});

describe('applyOrder', () => {
  it('when an order body is applied, then moved cards get their new operator and every listed card its place', () => {
    const b = board([card(1, TOMAS, 1), card(2, TOMAS, 2), card(4, ADA, 1)]);
    const next = applyOrder(
      b,
      [
        { membershipId: TOMAS.membershipId, assignmentIds: [1] },
        { membershipId: ADA.membershipId, assignmentIds: [2, 4] },
      ],
      new Map([[ADA.membershipId, ADA.name]]),
    );
    const two = next.assignments.find((a) => a.id === 2)!;
    expect(two.operator).toEqual(ADA);
    expect(two.order).toBe(1);
    expect(next.assignments.find((a) => a.id === 4)!.order).toBe(2);
    expect(b.assignments.find((a) => a.id === 2)!.operator).toEqual(TOMAS);
  });
});

describe('conflictsByCard', () => {
  it('when conflicts name several cards, then each card lists its own, hard before soft', () => {
    const soft: Conflict = { code: 'over_day_hours', severity: 'soft', message: 'Long day', assignmentIds: [1, 2] };
    const hard: Conflict = { code: 'machine_double_booked', severity: 'hard', message: 'Twice', assignmentIds: [2] };
    const map = conflictsByCard(board([card(1, TOMAS, 1), card(2, TOMAS, 2)], { conflicts: [soft, hard] }));
    expect(map.get(2)!.map((c) => c.message)).toEqual(['Twice', 'Long day']);
    expect(map.get(1)!.map((c) => c.message)).toEqual(['Long day']);
  });
});

describe('changesText', () => {
  const order = { ...ADA, status: 'sent' as const, sentAt: '2031-05-14T19:00:00Z', kind: 'order' as const };

  it('when jobs were added and moved since publishing, then the column says how many of each', () => {
    expect(changesText({ ...order, changedSincePublish: true, changes: { added: 1, moved: 1, edited: 0, removed: 0 } })).toBe(
      'Since publishing: 1 added, 1 moved',
    );
    expect(changesText({ ...order, changedSincePublish: true, changes: { added: 0, moved: 0, edited: 2, removed: 1 } })).toBe(
      'Since publishing: 2 edited, 1 removed',
    );
  });

  it('when what changed is not known, then it says only that it changed; unchanged, nothing', () => {
    expect(changesText({ ...order, changedSincePublish: true, changes: null })).toBe('Changed since publishing');
    expect(changesText({ ...order, changedSincePublish: true, changes: { added: 0, moved: 0, edited: 0, removed: 0 } })).toBe(
      'Changed since publishing',
    );
    expect(changesText({ ...order, changedSincePublish: false, changes: null })).toBeNull();
    expect(changesText(null)).toBeNull();
  });
});
