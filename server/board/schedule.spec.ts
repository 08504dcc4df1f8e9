import { cardSpan, schedule } from './schedule';

// Minutes after midnight; all expectations are clock arithmetic (60 min = 1 h).
describe('cardSpan', () => {
  it('when the window is shorter than the planned hours, then the card runs its planned hours from the start and does not fit', () => {
    // 08:00 + 28.5 h = 08:00 + 1710 min = 2190 min (36:30).
    expect(cardSpan({ startMin: 480, endMin: 720, planHours: 28.5 }, 420)).toEqual({
      start: 480,
      end: 2190,
      window: { start: 480, end: 720 },
      fits: false,
    });
  });

  it('when the window is longer than the planned hours, then the card books the whole window and fits', () => {
    expect(cardSpan({ startMin: 480, endMin: 1080, planHours: 2 }, 420)).toEqual({
      start: 480,
      end: 1080,
      window: { start: 480, end: 1080 },
      fits: true,
    });
  });

  it('when the window is exactly the planned hours, then it fits', () => {
    expect(cardSpan({ startMin: 480, endMin: 720, planHours: 4 }, 420).fits).toBe(true);
  });

  it('when only an end is set, then the card starts early enough to end by it, never before midnight', () => {
    expect(cardSpan({ startMin: null, endMin: 720, planHours: 2 }, 420)).toMatchObject({ start: 420, end: 720, fits: true });
    // After a card that ends at 08:20 (500), 4.5 h (270 min) must start by 07:30 (450) to end by 12:00.
    expect(cardSpan({ startMin: null, endMin: 720, planHours: 4.5 }, 500)).toMatchObject({ start: 450, end: 720, fits: true });
    expect(cardSpan({ startMin: null, endMin: 360, planHours: 10 }, 420)).toMatchObject({ start: 0, end: 600, fits: false });
  });

  it('when no times are set, then the card starts at the cursor and takes its planned hours', () => {
    expect(cardSpan({ startMin: null, endMin: null, planHours: 1.5 }, 600)).toEqual({ start: 600, end: 690, window: null, fits: true });
  });
});

describe('schedule', () => {
  it('when a card does not fit its window, then the next card in running order starts after its planned hours, not after the window', () => {
    const out = schedule([
      { id: 1, operatorId: 7, order: 1, startMin: 480, endMin: 600, planHours: 3 },
      { id: 2, operatorId: 7, order: 2, startMin: null, endMin: null, planHours: 1 },
    ]);
    // 08:00 + 3 h = 11:00 (660); then 1 h to 12:00 (720).
    expect(out.get(1)).toMatchObject({ start: 480, end: 660, fits: false });
    expect(out.get(2)).toMatchObject({ start: 660, end: 720, fits: true });
  });
});
