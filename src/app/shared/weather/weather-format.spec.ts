import { ageOf } from './weather-format';

describe('weather-format', () => {
  it('when the forecast age is given, then minutes under an hour and hours after, one decimal like every hour figure', () => {
    expect(ageOf(25)).toBe('25 min old');
    expect(ageOf(120)).toBe('2.0 h old');
    expect(ageOf(90)).toBe('1.5 h old');
    expect(ageOf(700)).toBe('11.7 h old');
  });
});
