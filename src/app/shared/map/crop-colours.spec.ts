import { CROPS } from '@shared/schemas/fields';
import { CROP_COLOURS, cropColour, cropLegend } from './crop-colours';

describe('crop colours', () => {
  it('when every known crop is given a colour, then no two crops share one', () => {
    const colours = CROPS.map((c) => cropColour(c));
    expect(colours.every((c) => /^#[0-9a-f]{6}$/.test(c ?? ''))).toBe(true);
    expect(new Set(colours).size).toBe(CROPS.length);
  });

  it('when a crop is written in another case or is not in the list, then it still gets one colour, always the same', () => {
    expect(cropColour('Spring Wheat ')).toBe(CROP_COLOURS['spring wheat']);
    expect(cropColour('hemp')).toBe(cropColour('Hemp'));
    expect(cropColour('hemp')).not.toBeNull();
    expect(cropColour(null)).toBeNull();
  });

  it('when the key is built, then each crop shows once with its count in list order, unplanned fields last', () => {
    expect(cropLegend(['canola', null, 'durum', 'Canola', 'hemp', undefined])).toEqual([
      { label: 'Durum', colour: CROP_COLOURS.durum, count: 1 },
      { label: 'Canola', colour: CROP_COLOURS.canola, count: 2 },
      { label: 'Hemp', colour: cropColour('hemp'), count: 1 },
      { label: 'Not planned', colour: null, count: 2 },
    ]);
  });
});
