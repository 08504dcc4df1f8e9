import type { ImportPreview } from '@shared/schemas/fields';
import { farmNameSet, rename, rowsFromPreview, selectionOf, selectionProblems, setAllTicked, setTicked } from './import-selection';

const preview = (names: string[], nameAttribute = 'name'): ImportPreview => ({
  format: 'kml',
  attributes: ['name', 'legal'],
  nameAttribute,
  features: [
    { index: 0, name: names[0], acres: 158.2, geometry: {}, properties: {}, problems: [], errors: [] },
    {
      index: 1,
      name: names[1],
      acres: null,
      geometry: {},
      properties: {},
      problems: [{ code: 'self-intersection', message: 'Ring 1 crosses itself near 47.6° N, 99.9° W', index: 1 }],
      errors: ['Ring 1 crosses itself near 47.6° N, 99.9° W'],
    },
    { index: 2, name: names[2], acres: 79.9, geometry: {}, properties: {}, problems: [], errors: [] },
  ],
});

describe('upload preview selection', () => {
  it('when a preview arrives, then usable features are ticked and features with errors are not and cannot be', () => {
    const rows = rowsFromPreview(preview(['North', 'Bowtie', 'South']));
    expect(rows.map((r) => [r.ticked, r.tickable])).toEqual([
      [true, true],
      [false, false],
      [true, true],
    ]);
    expect(setTicked(rows, 1, true)[1].ticked).toBe(false);
    expect(setAllTicked(rows, true).map((r) => r.ticked)).toEqual([true, false, true]);
  });

  it('when the owner unticks one and renames another, then the selection carries exactly those', () => {
    let rows = rowsFromPreview(preview(['North', 'Bowtie', 'South']));
    rows = setTicked(rows, 0, false);
    rows = rename(rows, 2, '  South quarter ');
    expect(selectionOf(rows)).toEqual([{ index: 2, name: 'South quarter' }]);
    expect(selectionProblems(rows)).toEqual([]);
  });

  it('when the preview is re-run with another name attribute, then the new names show and unticked stays unticked', () => {
    const first = setTicked(rowsFromPreview(preview(['North', 'Bowtie', 'South'])), 2, false);
    const again = rowsFromPreview(preview(['NE 12-140-71', 'x', 'SW 12-140-71'], 'legal'), first);
    expect(again.map((r) => r.name)).toEqual(['NE 12-140-71', 'x', 'SW 12-140-71']);
    expect(again.map((r) => r.ticked)).toEqual([true, false, false]);
  });

  it('when nothing is ticked, a name is blank or two names repeat, then saving is refused with a reason', () => {
    const rows = rowsFromPreview(preview(['North', 'Bowtie', 'South']));
    expect(selectionProblems(setAllTicked(rows, false))).toEqual(['Tick at least one field to save.']);
    expect(selectionProblems(rename(rows, 0, '  '))).toEqual(['Feature 1 needs a name.']);
    expect(selectionProblems(rename(rows, 2, 'north'))[0]).toMatch(/Two ticked fields are called “north”/);
  });

  it('when a feature’s only problem is its name, then it starts unticked but can be ticked, and renaming clears the problem', () => {
    const taken = 'A field called "North" already exists on this farm; rename it or untick it';
    const withTaken = preview(['North', 'Bowtie', 'South']);
    withTaken.features[0] = { ...withTaken.features[0], problems: [{ code: 'name-taken', message: taken, index: 0 }], errors: [taken] };
    let rows = rowsFromPreview(withTaken);
    expect(rows.map((r) => [r.ticked, r.tickable])).toEqual([
      [false, true],
      [false, false],
      [true, true],
    ]);
    expect(rows[0].errors).toEqual([taken]);
    rows = setTicked(rows, 0, true);
    // Decided by the problem's code (name-taken), not its words: the save is held back until renamed.
    expect(selectionProblems(rows)).toEqual([taken]);
    rows = rename(rows, 0, 'North forty');
    expect(rows[0].errors).toEqual([]);
    expect(selectionProblems(rows)).toEqual([]);
    expect(selectionOf(rows)).toEqual([
      { index: 0, name: 'North forty' },
      { index: 2, name: 'South' },
    ]);
  });
});

describe('renaming in the upload preview', () => {
  const taken = 'A field called "North" already exists on this farm; rename it or untick it';
  const withTaken = (): ImportPreview => {
    const p = preview(['North', 'Bowtie', 'South']);
    p.features[0] = { ...p.features[0], problems: [{ code: 'name-taken', message: taken, index: 0 }], errors: [taken] };
    return p;
  };
  const farm = farmNameSet(['North', 'Home Quarter', ' River Flat ']);

  it('when a row held back by a name the farm has is renamed to a free name, then it is ticked and can be saved', () => {
    const rows = rename(rowsFromPreview(withTaken()), 0, 'North forty', farm);
    expect(rows[0].ticked).toBe(true);
    expect(selectionProblems(rows)).toEqual([]);
    expect(selectionOf(rows)).toEqual([
      { index: 0, name: 'North forty' },
      { index: 2, name: 'South' },
    ]);
  });

  it('when a row is renamed to another name the farm already has (any case), then the problem shows at once and it stays unticked', () => {
    const rows = rename(rowsFromPreview(withTaken()), 0, 'home quarter', farm);
    expect(rows[0].ticked).toBe(false);
    expect(rows[0].errors).toEqual(['A field called "home quarter" already exists on this farm; choose another name']);
    const ticked = setTicked(rows, 0, true);
    expect(selectionProblems(ticked)).toEqual(['A field called "home quarter" already exists on this farm; choose another name']);
    // A good row renamed onto a farm name is caught the same way.
    expect(rename(rows, 2, 'River flat', farm)[2].errors[0]).toMatch(/already exists on this farm/);
  });

  it('when the owner unticks a renamed row, then renaming it again does not tick it behind their back', () => {
    let rows = rename(rowsFromPreview(withTaken()), 0, 'North forty', farm);
    rows = setTicked(rows, 0, false);
    rows = rename(rows, 0, 'North forty acres', farm);
    expect(rows[0].ticked).toBe(false);
  });

  it('when the preview carries overlaps, then the row keeps them as a warning that does not block saving', () => {
    const p = preview(['North', 'Bowtie', 'South']);
    p.features[2] = { ...p.features[2], overlaps: [{ fieldId: 9, name: 'Home Quarter', areaM2: 50_000, acres: 12.36 }] };
    const rows = rowsFromPreview(p);
    expect(rows[2].overlaps).toEqual([{ fieldId: 9, name: 'Home Quarter', areaM2: 50_000, acres: 12.36 }]);
    expect(selectionProblems(rows)).toEqual([]);
  });
});
