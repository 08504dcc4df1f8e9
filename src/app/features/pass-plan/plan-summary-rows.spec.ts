import { planResult } from './plan-fixtures';
import { formatDistance, summaryRows } from './plan-summary-rows';

const byKey = (rows: ReturnType<typeof summaryRows>) => Object.fromEntries(rows.map((r) => [r.key, r]));

describe('summaryRows', () => {
  it('when the farm uses US units, then areas are acres, distance miles and capacity ac/h with its rule', () => {
    const rows = byKey(summaryRows(planResult(), 'us', false));
    expect(rows['field'].value).toBe('159.6 ac');
    expect(rows['headland']).toMatchObject({ value: '12.3 ac', note: '2 laps around the edge' });
    expect(rows['worked'].value).toBe('146.1 ac');
    expect(rows['unworked'].value).toBe('0.8 ac');
    expect(rows['overlap']).toBeUndefined();
    expect(rows['passes'].value).toBe('31');
    expect(rows['turns'].value).toBe('30');
    // 27,200 m ÷ 1,609.344 m per mile = 16.9 mi.
    expect(rows['distance'].value).toBe('16.9 mi');
    expect(rows['hours']).toMatchObject({ label: 'Hours: driving and turns', value: '2.8 h' });
    expect(rows['hours'].note).toBe('driving every pass and headland lap at 7.0 mph, plus 20 s for each of the 30 turns; no stops');
    expect(rows['capacityHours']).toMatchObject({ label: 'Hours: rule of thumb', value: '3.1 h' });
    expect(rows['capacityHours'].note).toContain('width × speed × field efficiency 85 %');
    // The published source sits in the tooltip, not in the words on the card.
    expect(rows['capacityHours'].note).not.toMatch(/AEN|Kentucky|GRDC/);
    expect(rows['capacityHours'].source).toContain('AEN-73, University of Kentucky (1991)');
    expect(rows['capacity']).toMatchObject({ label: 'Acres per hour', value: '51.5 ac/h' });
    expect(rows['capacity'].note).toBe('width (ft) × speed (mph) × field efficiency ÷ 8.25');
    expect(rows['capacity'].source).toContain('AEN-73');
    expect(rows['heading']).toMatchObject({ value: '90.0°', note: 'degrees clockwise from north' });
  });

  it('when the farm is metric, then hectares, kilometres and ha/h (GRDC)', () => {
    const rows = byKey(summaryRows(planResult(), 'metric', true));
    // 159.6 ac × 0.40468564224 ha/ac = 64.6 ha.
    expect(rows['field'].value).toBe('64.6 ha');
    expect(rows['distance'].value).toBe('27.2 km');
    expect(rows['capacity']).toMatchObject({ label: 'Hectares per hour', value: '20.8 ha/h' });
    expect(rows['capacity'].note).toBe('speed (km/h) × width (m) × field efficiency ÷ 10');
    expect(rows['capacity'].source).toContain('GRDC');
    expect(rows['heading'].note).toBe('chosen for the least field time, along an edge when nearly as fast');
  });

  it('when no skip is allowed, then the overlap shows instead of the unworked area', () => {
    const rows = byKey(summaryRows(planResult({ coverage: 'full', overlapAcres: 1.25, unworkedAcres: 0 }), 'us', false));
    expect(rows['overlap'].value).toBe('1.3 ac');
    expect(rows['unworked']).toBeUndefined();
  });

  it('when passes are split, then the segment count is explained', () => {
    const rows = byKey(summaryRows(planResult({ segmentCount: 36 }), 'us', false));
    expect(rows['passes'].note).toBe('36 segments: some passes are split by hazards or holes');
  });

  it('when a figure is not a number, then a dash shows, never NaN', () => {
    const rows = summaryRows(planResult({ hours: NaN, totalDistanceM: Infinity, fieldAcres: NaN, headingDeg: NaN }), 'us', false);
    const text = rows.map((r) => `${r.value} ${r.note ?? ''}`).join(' ');
    expect(text).not.toMatch(/NaN|Infinity/);
    expect(byKey(rows)['hours'].value).toBe('—');
    expect(formatDistance(NaN, 'metric')).toBe('—');
  });
});
