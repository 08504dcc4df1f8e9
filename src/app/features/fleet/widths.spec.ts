import { ROAD_CAUTION, FOLDING_CAUTION, cautionsFor, folds, isWideOnRoad } from './cautions';
import { formatWidth, metresToWidth, widthToMetres } from './widths';

describe('implement widths', () => {
  it('when 84 ft is typed on a US farm, then 25.6032 m goes to the API and comes back as 84 ft', () => {
    expect(widthToMetres(84, 'us')).toBe(25.6032);
    expect(metresToWidth(25.6032, 'us')).toBe(84);
    expect(formatWidth(25.6032, 'us')).toBe('84.0 ft');
  });

  it('when the farm is metric, then metres pass through and show to the centimetre', () => {
    expect(widthToMetres(18.29, 'metric')).toBe(18.29);
    expect(metresToWidth(18.288, 'metric')).toBe(18.288);
    expect(formatWidth(18.288, 'metric')).toBe('18.29 m');
    expect(formatWidth(18.288, 'us')).toBe('60.0 ft');
  });

  it('when a width is not known, then a dash shows', () => {
    expect(formatWidth(null, 'us')).toBe('—');
  });
});

describe('implement cautions', () => {
  it('when an 84 ft harrow folds to 20 ft, then it is wide on the road and folds', () => {
    const harrow = { widthM: 25.6032, transportWidthM: 6.096 };
    expect(isWideOnRoad(harrow)).toBe(true);
    expect(folds(harrow)).toBe(true);
    expect(cautionsFor(harrow)).toEqual([ROAD_CAUTION, FOLDING_CAUTION]);
  });

  it('when an implement travels at 8.5 ft or less, then no road caution shows', () => {
    expect(isWideOnRoad({ widthM: 6, transportWidthM: 2.5908 })).toBe(false);
    expect(cautionsFor({ widthM: 2.4, transportWidthM: null })).toEqual([]);
  });

  it('when a 12 ft implement has no transport width, then its working width is what goes on the road', () => {
    expect(cautionsFor({ widthM: 3.6576, transportWidthM: null })).toEqual([ROAD_CAUTION]);
  });
});
