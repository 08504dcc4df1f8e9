import type { SeasonSummary } from '@shared/schemas/season';
import { fieldsTable } from '../../features/season/season-shaping';
import { cropLegend } from '../map/crop-colours';
import { CropPipe } from './crop-pipe';

// One style for crop names (sentence case, shared/figures.ts): the field lists (this pipe), the
// fields map's colour key and the season's table read a crop the same however it was typed.
// Sentence case: only the first word capitalised (common practice for labels, no published source).
const TYPED = ['spring wheat', 'Spring wheat', 'Spring Wheat', ' SPRING  wheat '];

describe('crop names', () => {
  it('when a crop is typed in any case, then the field lists show it in sentence case, and a dash for none', () => {
    const pipe = new CropPipe();
    expect(TYPED.map((c) => pipe.transform(c))).toEqual(TYPED.map(() => 'Spring wheat'));
    expect(pipe.transform(null)).toBe('—');
    expect(pipe.transform(undefined, 'not planned')).toBe('not planned');
  });

  it('when fields have the same crop typed three ways, then the map key lists it once, in the same style', () => {
    expect(cropLegend([...TYPED, 'durum', null]).map((e) => [e.label, e.count])).toEqual([
      ['Spring wheat', 4],
      ['Durum', 1],
      ['Not planned', 1],
    ]);
  });

  it('when the season lists those fields, then each row names the crop as the list and the map key do', () => {
    const summary = {
      year: 2026,
      operations: [],
      byField: TYPED.map((crop, i) => ({
        fieldId: i + 1,
        field: `F${i}`,
        crop,
        acres: 10,
        operations: {},
        totalAcres: 0,
        totalHours: 0,
        costCents: 0,
        costPerAcreCents: null,
      })),
      totals: { costCents: 0 },
    } as unknown as SeasonSummary;
    const crops = fieldsTable(summary, 'us').rows.map((r) => r['crop']);
    expect(crops).toEqual(TYPED.map(() => 'Spring wheat'));
    expect(new Set([...crops, new CropPipe().transform('spring wheat'), cropLegend(TYPED)[0].label])).toEqual(new Set(['Spring wheat']));
  });
});
