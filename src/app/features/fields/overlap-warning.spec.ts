import { overlapWarning } from './overlap-warning';

const acres = (a: number) => `${a.toFixed(1)} ac`;

describe('overlap warning', () => {
  it('when a boundary overlaps nothing, then there is no warning', () => {
    expect(overlapWarning([], acres)).toBeNull();
    expect(overlapWarning(undefined, acres)).toBeNull();
  });

  it('when it overlaps one or several fields, then each is named with its overlap in the farm units', () => {
    const home = { fieldId: 1, name: 'Home Quarter', areaM2: 50_000, acres: 12.36 };
    const west = { fieldId: 2, name: 'West Half', areaM2: 1_500, acres: 0.37 };
    const draw = { fieldId: 3, name: 'Draw Half', areaM2: 900, acres: 0.22 };
    expect(overlapWarning([home], acres)).toBe('Overlaps Home Quarter by 12.4 ac.');
    expect(overlapWarning([home, west, draw], acres)).toBe(
      'Overlaps Home Quarter by 12.4 ac, West Half by 0.4 ac and Draw Half by 0.2 ac.',
    );
  });
});
