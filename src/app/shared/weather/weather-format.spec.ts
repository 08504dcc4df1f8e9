import { ageOf, compassOf, compassWords, deltaTOf, rainOf, speedOf, temperatureOf } from './weather-format';

describe('weather-format', () => {
  it('when a temperature is shown, then °F for US units and °C for metric', () => {
    // 20 °C = 68 °F: °F = °C × 9/5 + 32 (NIST SP 811, appendix B.8).
    expect(temperatureOf(20, 'us')).toBe('68 °F');
    expect(temperatureOf(20, 'metric')).toBe('20 °C');
    // −40 is the same on both scales (NIST SP 811, B.8 formula).
    expect(temperatureOf(-40, 'us')).toBe('-40 °F');
    expect(temperatureOf(null, 'us')).toBe('—');
  });

  it('when a wind speed is shown, then mph for US units and km/h for metric', () => {
    // 30 km/h ÷ 1.609344 km/mile (international mile, 1959 agreement) = 18.64 mph → 19.
    expect(speedOf(30, 'us')).toBe('19 mph');
    expect(speedOf(30, 'metric')).toBe('30 km/h');
    // 16.09344 km/h is exactly 10 mph (same definition).
    expect(speedOf(16.09344, 'us')).toBe('10 mph');
  });

  it('when rain is shown, then inches to the hundredth for US units and mm for metric', () => {
    // 1 in = 25.4 mm exactly (international inch, 1959 agreement).
    expect(rainOf(25.4, 'us')).toBe('1 in');
    expect(rainOf(2.5, 'us')).toBe('0.1 in');
    expect(rainOf(2.5, 'metric')).toBe('2.5 mm');
  });

  it('when Delta T is shown, then a difference: × 9/5 without the 32 in °F', () => {
    // A difference of 5 K is 9 °F (NIST SP 811, B.8: a temperature interval of 1 °C = 1.8 °F).
    expect(deltaTOf(5, 'us')).toBe('9 °F');
    expect(deltaTOf(5, 'metric')).toBe('5 °C');
  });

  it('when a wind direction is given, then the nearest of eight compass points and its words', () => {
    // Meteorological convention: the direction the wind blows from, clockwise from north (WMO No. 8, ch. 5).
    expect([0, 44, 45, 90, 135, 180, 200, 225, 270, 315, 337, 338, 360].map(compassOf)).toEqual([
      'N',
      'NE',
      'NE',
      'E',
      'SE',
      'S',
      'S',
      'SW',
      'W',
      'NW',
      'NW',
      'N',
      'N',
    ]);
    expect(compassOf(null)).toBeNull();
    expect(compassWords(225)).toBe('from the south-west');
  });

  it('when the forecast age is given, then minutes under an hour and hours after', () => {
    expect(ageOf(25)).toBe('25 min old');
    expect(ageOf(120)).toBe('2 h old');
    expect(ageOf(90)).toBe('1.5 h old');
  });
});
