import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import type { Me } from '@shared/schemas/auth';
import type { FarmSettings } from '@shared/schemas/farm';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { FarmSettingsForm } from './farm-settings';
import { clockIn, timeZoneChoices } from './time-zones';

const OWNER: Me = {
  user: { id: 1, email: 'ingrid@example.test', name: 'Ingrid Sorensen' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units: 'us', timeZone: 'America/Chicago' },
  membershipId: 1,
  role: 'owner',
};
const SETTINGS: FarmSettings = { id: 1, name: 'Tamarack Ridge Farm', units: 'us', dayHoursLimit: 12, timeZone: 'America/Chicago' };

describe('FarmSettingsForm', () => {
  let fixture: ComponentFixture<FarmSettingsForm>;
  let httpTesting: HttpTestingController;
  let el: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [FarmSettingsForm],
      providers: [
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    TestBed.inject(AuthStore).signedInAs(OWNER);
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(FarmSettingsForm);
    el = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
    httpTesting.expectOne('/api/farm').flush(SETTINGS);
    await fixture.whenStable();
  });

  afterEach(() => {
    httpTesting.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((o) => (o.innerHTML = ''));
  });

  const input = (label: string): HTMLInputElement => {
    const field = [...el.querySelectorAll('mat-form-field')].find((f) => f.querySelector('mat-label')?.textContent?.trim() === label);
    const found = field?.querySelector('input');
    if (!found) throw new Error(`no input labelled ${label}`);
    return found;
  };
  const type = async (label: string, value: string) => {
    const i = input(label);
    i.value = value;
    i.dispatchEvent(new Event('input'));
    i.dispatchEvent(new Event('blur'));
    fixture.detectChanges();
    await fixture.whenStable();
  };
  const save = () => [...el.querySelectorAll('button')].find((b) => b.textContent?.trim() === 'Save farm settings')!;

  it("when it opens, then it shows the farm's settings and nothing to save yet", () => {
    expect(input('Farm name').value).toBe('Tamarack Ridge Farm');
    expect(input('Hours in a working day').value).toBe('12');
    expect(input('Time zone').value).toBe('America/Chicago');
    expect(el.textContent).toContain('Now at the farm:');
    expect(save().disabled).toBe(true);
  });

  it('when a time zone is misspelt, then the field says so and nothing is sent', async () => {
    await type('Time zone', 'America/Chicgo');
    expect(el.textContent).toContain('That is not a time zone we know');
    save().click();
    fixture.detectChanges();
    httpTesting.expectNone('/api/farm');
  });

  it('when the owner saves a new zone and hours, then they are sent and the signed-in farm follows', async () => {
    await type('Hours in a working day', '10');
    await type('Time zone', 'America/Denver');
    save().click();
    const req = httpTesting.expectOne('/api/farm');
    expect(req.request.method).toBe('PATCH');
    expect(req.request.body).toEqual({ name: 'Tamarack Ridge Farm', units: 'us', dayHoursLimit: 10, timeZone: 'America/Denver' });
    req.flush({ ...SETTINGS, dayHoursLimit: 10, timeZone: 'America/Denver' });
    await fixture.whenStable();
    expect(TestBed.inject(AuthStore).farm()?.timeZone).toBe('America/Denver');
    expect(document.body.textContent).toContain('Farm settings saved.');
  });

  it('when the server refuses a value, then its message shows on that field', async () => {
    await type('Farm name', 'Tamarack Ridge');
    save().click();
    httpTesting
      .expectOne('/api/farm')
      .flush(
        { error: { code: 'invalid', message: 'Check the marked fields', fields: { name: 'That name is taken' } } },
        { status: 400, statusText: 'Bad Request' },
      );
    fixture.detectChanges();
    await fixture.whenStable();
    expect(el.textContent).toContain('That name is taken');
  });
});

describe('time zone helpers', () => {
  it('then North American zones come first and the list is the platform’s own', () => {
    const zones = timeZoneChoices();
    expect(zones[0].startsWith('America/')).toBe(true);
    expect(zones).toContain('America/Chicago');
    expect(zones).toContain('Europe/Berlin');
  });

  it('then the clock reads the zone, not the machine (CDT is UTC−5 in July, IANA tz database)', () => {
    expect(clockIn('America/Chicago', new Date('2026-07-01T03:30:00Z'))).toBe('Tue 22:30');
    expect(clockIn('UTC', new Date('2026-07-01T03:30:00Z'))).toBe('Wed 03:30');
  });
});
