import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import type { Me, Role, UnitSystem } from '@shared/schemas/auth';
import type { WeatherLimitsAnswer } from '@shared/schemas/weather';
import { mphToKmh } from '@shared/units';
import { DEFAULT_LIMITS, LIMIT_SOURCES, SPRAY_LABEL_CAUTION, type WeatherLimits } from '@shared/weather/limits';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { WeatherLimitsForm } from './weather-limits';

const me = (units: UnitSystem, role: Role = 'owner'): Me => ({
  user: { id: 1, email: 'ingrid@example.test', name: 'Ingrid Sorensen' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units, timeZone: 'America/Chicago' },
  membershipId: 1,
  role,
});

/** A deep copy (jsdom has no structuredClone). */
const clone = <T>(v: T): T => JSON.parse(JSON.stringify(v)) as T;

const answer = (limits: WeatherLimits = DEFAULT_LIMITS): WeatherLimitsAnswer => ({
  limits: clone(limits),
  defaults: clone(DEFAULT_LIMITS),
  sources: LIMIT_SOURCES as WeatherLimitsAnswer['sources'],
});

/**
 * Limits an owner typed on a metric farm: none of them is a whole number of mph, °F or inches, so
 * each one drifts if a US screen sends back its rounded reading converted again.
 */
const TYPED_IN_METRIC: WeatherLimits = {
  ...clone(DEFAULT_LIMITS),
  harrowing: { blocking: false, rainMm: 0.3, wetAfterRainHours: 5, dewSpreadC: 1.3, coldBelowC: 3.7 },
  seeding: { blocking: true, soilMinC: { 'spring wheat': 4.3, durum: 5.5, barley: 2.8, canola: 6.1, 'field peas': 4.9 }, heavyRainMm: 7 },
  spraying: { ...DEFAULT_LIMITS.spraying, windMinKmh: 5, windMaxKmh: 15, deltaTMinC: 2.3, deltaTGoodMaxC: 7.7, inversionWindKmh: 4.5 },
};

describe('WeatherLimitsForm', () => {
  let fixture: ComponentFixture<WeatherLimitsForm>;
  let httpTesting: HttpTestingController;
  let el: HTMLElement;

  async function open(units: UnitSystem, limits: WeatherLimits = DEFAULT_LIMITS, role: Role = 'owner'): Promise<void> {
    TestBed.configureTestingModule({
      imports: [WeatherLimitsForm],
      providers: [
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    TestBed.inject(AuthStore).signedInAs(me(units, role));
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(WeatherLimitsForm);
    el = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
    const req = httpTesting.expectOne('/api/weather/limits');
    expect(req.request.method).toBe('GET');
    req.flush(answer(limits));
    await fixture.whenStable();
  }

  afterEach(() => {
    httpTesting.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((o) => (o.innerHTML = ''));
  });

  const row = (key: string): HTMLTableRowElement => {
    const found = el.querySelector<HTMLTableRowElement>(`tr[data-limit="${key}"]`);
    if (!found) throw new Error(`no row ${key}`);
    return found;
  };
  const input = (key: string): HTMLInputElement => row(key).querySelector('input')!;
  const cell = (key: string, cls: string): string => row(key).querySelector(`.${cls}`)?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  const resetButton = (key: string): HTMLButtonElement => row(key).querySelector<HTMLButtonElement>('.reset button')!;
  const saveButton = (): HTMLButtonElement | null =>
    [...el.querySelectorAll('button')].find((b) => b.textContent?.trim() === 'Save weather limits') ?? null;
  const settle = async () => {
    fixture.detectChanges();
    await fixture.whenStable();
  };
  const type = async (key: string, value: string) => {
    const i = input(key);
    i.value = value;
    i.dispatchEvent(new Event('input'));
    i.dispatchEvent(new Event('blur'));
    await settle();
  };
  const save = async () => {
    saveButton()!.click();
    await settle();
  };
  const snackText = () => document.querySelector('.cdk-overlay-container')?.textContent ?? '';

  it('when the limits load on a US farm, then each row shows its number in mph, °F or inches with its default and the source of that default', async () => {
    await open('us');
    // 16.093 44 km/h is 10 mph (1 mile = 1,609.344 m exactly: units.spec.ts).
    expect(input('spraying.windMaxKmh').value).toBe('10');
    expect(row('spraying.windMaxKmh').textContent).toContain('mph');
    expect(cell('spraying.windMaxKmh', 'default')).toBe('10.0 mph');
    expect(cell('spraying.windMaxKmh', 'source')).toContain('published');
    expect(cell('spraying.windMaxKmh', 'source')).toContain('National Pesticide Stewardship Alliance');
    expect(cell('spraying.windMinKmh', 'default')).toBe('3.0 mph');
    // Delta T bands are differences: 2 °C apart is 3.6 °F apart (× 1.8, no offset); their source is marked "from memory".
    expect(cell('spraying.deltaTMinC', 'default')).toBe('3.6 °F');
    expect(cell('spraying.deltaTCautionMaxC', 'default')).toBe('18.0 °F');
    expect(cell('spraying.deltaTGoodMaxC', 'source')).toContain('from memory');
    // A soil minimum is a temperature: 4 °C is 39.2 °F (t/°F = 1.8 t/°C + 32).
    expect(cell('seeding.soilMinC.spring wheat', 'default')).toBe('39.2 °F');
    expect(cell('seeding.soilMinC.canola', 'source')).toContain('from memory');
    expect(cell('swathing.afterRainHours', 'default')).toBe('4.0 h');
    expect(cell('combining.humidityCautionPct', 'default')).toBe('70 %');
    expect(cell('harrowing.coldBelowC', 'source')).toContain('common practice, no published source');
    // 0.2 mm is 0.008 in, shown to 0.01 in as the board's reasons write rain.
    expect(cell('combining.rainMm', 'default')).toBe('0.01 in');
    for (const crop of ['spring wheat', 'durum', 'barley', 'canola', 'field peas']) {
      expect(row(`seeding.soilMinC.${crop}`).querySelector('th')?.textContent).toContain(crop);
    }
    // The label caution goes with the spraying table, and only with it.
    const spraying = el.querySelector('section[data-operation="spraying"]')!;
    expect(spraying.textContent).toContain(SPRAY_LABEL_CAUTION);
    expect(el.querySelector('section[data-operation="seeding"]')!.textContent).not.toContain(SPRAY_LABEL_CAUTION);
    // Rows at their default have nothing to reset; nothing changed, nothing to save.
    expect(resetButton('spraying.windMaxKmh').disabled).toBe(true);
    expect(saveButton()!.disabled).toBe(true);
  });

  it('when the farm is metric, then the same limits show in km/h and °C', async () => {
    await open('metric');
    expect(input('spraying.windMaxKmh').value).toBe('16.1');
    expect(cell('spraying.windMaxKmh', 'default')).toBe('16.1 km/h');
    expect(cell('seeding.soilMinC.barley', 'default')).toBe('3.0 °C');
    expect(cell('spraying.deltaTGoodMaxC', 'default')).toBe('8.0 °C');
    expect(cell('harrowing.rainMm', 'default')).toBe('0.2 mm');
  });

  it('when a US owner saves limits typed on a metric farm without changing them, then the very same SI numbers go back', async () => {
    await open('us', TYPED_IN_METRIC);
    // 15 km/h reads 9.3 mph; typing that same reading again marks the form changed.
    expect(input('spraying.windMaxKmh').value).toBe('9.3');
    await type('spraying.windMaxKmh', '9.3');
    // 4.3 °C reads 39.7 °F.
    expect(input('seeding.soilMinC.spring wheat').value).toBe('39.7');
    await type('seeding.soilMinC.spring wheat', '39.7');
    await save();
    const req = httpTesting.expectOne('/api/weather/limits');
    expect(req.request.method).toBe('PUT');
    // Not 9.3 mph × 1.609 344 = 14.967 km/h, nor 39.7 °F = 4.278 °C: nothing drifts.
    expect(req.request.body).toEqual(TYPED_IN_METRIC);
    req.flush(answer(TYPED_IN_METRIC));
    await settle();
  });

  it('when the owner changes the highest wind to 12 mph and saves, then only that number changes, to 12 × 1.609 344 km/h', async () => {
    await open('us');
    await type('spraying.windMaxKmh', '12');
    expect(resetButton('spraying.windMaxKmh').disabled).toBe(false);
    await save();
    const req = httpTesting.expectOne('/api/weather/limits');
    expect(req.request.method).toBe('PUT');
    const sent = req.request.body as WeatherLimits;
    // 12 mph = 19.312 128 km/h (1 mph = 1.609 344 km/h exactly), kept to 0.001 km/h.
    expect(sent.spraying.windMaxKmh).toBe(19.312);
    expect({ ...sent, spraying: { ...sent.spraying, windMaxKmh: DEFAULT_LIMITS.spraying.windMaxKmh } }).toEqual(DEFAULT_LIMITS);
    const saved = { ...DEFAULT_LIMITS, spraying: { ...DEFAULT_LIMITS.spraying, windMaxKmh: 19.312 } };
    req.flush(answer(saved));
    await settle();
    expect(snackText()).toContain('Weather limits saved.');
    // The answer fills the table again: 19.312 km/h reads 12 mph, and the form is unchanged again.
    expect(input('spraying.windMaxKmh').value).toBe('12');
    expect(saveButton()!.disabled).toBe(true);
  });

  it('when the owner resets a row to its default, then the box shows the default and the default goes back exactly', async () => {
    const changed = {
      ...DEFAULT_LIMITS,
      spraying: { ...DEFAULT_LIMITS.spraying, windMaxKmh: 20 },
      swathing: { ...DEFAULT_LIMITS.swathing },
    };
    await open('us', changed);
    expect(input('spraying.windMaxKmh').value).toBe('12.4');
    resetButton('spraying.windMaxKmh').click();
    await settle();
    expect(input('spraying.windMaxKmh').value).toBe('10');
    expect(resetButton('spraying.windMaxKmh').disabled).toBe(true);
    await save();
    const req = httpTesting.expectOne('/api/weather/limits');
    // The default itself (mphToKmh(10) = 16.093 44), not 10 mph converted back and rounded.
    expect((req.request.body as WeatherLimits).spraying.windMaxKmh).toBe(mphToKmh(10));
    expect(req.request.body).toEqual(DEFAULT_LIMITS);
    req.flush(answer(DEFAULT_LIMITS));
    await settle();
  });

  it('when the server refuses a number, then its message shows on that box and above the table, naming the box by its label', async () => {
    await open('us');
    await type('spraying.windMaxKmh', '30');
    await save();
    httpTesting.expectOne('/api/weather/limits').flush(
      {
        error: {
          code: 'invalid_input',
          message: 'Check the request body: spraying.windMaxKmh The highest wind for spraying must be at most 60 km/h',
          fields: { 'spraying.windMaxKmh': 'The highest wind for spraying must be at most 60 km/h' },
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await settle();
    expect(cell('spraying.windMaxKmh', 'value')).toContain('The highest wind for spraying must be at most 60 km/h');
    expect(input('spraying.windMaxKmh').getAttribute('aria-invalid')).toBe('true');
    expect(el.querySelector('.form-error')?.textContent?.trim()).toBe(
      'Check Highest wind (spraying): The highest wind for spraying must be at most 60 km/h',
    );
    expect(el.textContent).not.toContain('windMaxKmh');
    // Changing the box takes the refusal off it.
    await type('spraying.windMaxKmh', '20');
    expect(cell('spraying.windMaxKmh', 'value')).not.toContain('at most 60 km/h');
  });

  it('when a number is outside its range or the lowest wind is above the highest, then the box says so in mph and nothing is sent', async () => {
    await open('us');
    // The schema allows 1 to 60 km/h: 0.62 to 37.28 mph, shown inwards to 0.1 mph.
    await type('spraying.windMaxKmh', '40');
    expect(cell('spraying.windMaxKmh', 'value')).toContain('Use 0.7 to 37.2 mph');
    await type('spraying.windMaxKmh', '10');
    await type('spraying.windMinKmh', '11');
    expect(cell('spraying.windMaxKmh', 'value')).toContain('The lowest wind must be below the highest');
    await type('spraying.rainFreeHours', '2.5');
    expect(cell('spraying.rainFreeHours', 'value')).toContain('Use whole hours');
    await type('spraying.rainFreeHours', '');
    expect(cell('spraying.rainFreeHours', 'value')).toContain('Enter a number');
    await save();
    httpTesting.expectNone('/api/weather/limits');
    expect(el.querySelector('.form-error')?.textContent).toContain('Check Rain-free hours after spraying (spraying)');
  });

  it('when the owner makes spraying blocking, then the body says so and the other operations stay warnings', async () => {
    await open('us');
    const box = el.querySelector<HTMLInputElement>('section[data-operation="spraying"] .blocking input[type="checkbox"]')!;
    box.click();
    await settle();
    await save();
    const req = httpTesting.expectOne('/api/weather/limits');
    const sent = req.request.body as WeatherLimits;
    expect(sent.spraying.blocking).toBe(true);
    expect(sent.harrowing.blocking).toBe(false);
    req.flush(answer(sent));
    await settle();
  });

  it('when a member who is not the owner opens the table, then the numbers show but cannot be changed', async () => {
    await open('us', DEFAULT_LIMITS, 'operator');
    expect(input('spraying.windMaxKmh').value).toBe('10');
    expect(input('spraying.windMaxKmh').disabled).toBe(true);
    expect(saveButton()).toBeNull();
    expect(el.querySelector('.reset button')).toBeNull();
    expect(el.textContent).toContain("The farm's owner sets these limits.");
  });
});
