import { basisPointsOf, percentText } from './tax-rate';

describe('tax rate in per cent and basis points', () => {
  // 1 % = 100 basis points: the definition of a basis point (one hundredth of a per cent).
  it('when a rate is typed, then it becomes whole basis points exactly', () => {
    expect(basisPointsOf('5')).toBe(500);
    expect(basisPointsOf('7.25')).toBe(725);
    expect(basisPointsOf(' 0.1 %')).toBe(10);
    expect(basisPointsOf('8,5')).toBe(850);
    expect(basisPointsOf('0')).toBe(0);
  });

  it('when it is not a rate, then null', () => {
    for (const bad of ['', 'five', '-5', '1.234', '1e2']) expect(basisPointsOf(bad)).toBeNull();
  });

  it('when basis points are shown, then they read as the per cent typed', () => {
    expect(percentText(725)).toBe('7.25');
    expect(percentText(500)).toBe('5');
    expect(percentText(850)).toBe('8.5');
    expect(percentText(5)).toBe('0.05');
    for (const t of ['5', '7.25', '0.1', '12.5']) expect(percentText(basisPointsOf(t)!)).toBe(t);
  });
});
