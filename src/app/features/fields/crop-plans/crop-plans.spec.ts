import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import type { Me } from '@shared/schemas/auth';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { CropPlans } from './crop-plans';

const me: Me = {
  user: { id: 1, email: 'owner@example.test', name: 'Demo Owner' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units: 'us', timeZone: 'America/Chicago' },
  membershipId: 1,
  role: 'owner',
};

describe('CropPlans', () => {
  let fixture: ComponentFixture<CropPlans>;
  let http: HttpTestingController;
  let el: HTMLElement;
  let season: number;
  let changed: number;
  let scrolled: Element[];

  async function open(): Promise<void> {
    TestBed.configureTestingModule({
      imports: [CropPlans],
      providers: [
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    const auth = TestBed.inject(AuthStore);
    auth.signedInAs(me);
    season = auth.currentSeason();
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(CropPlans);
    fixture.componentRef.setInput('fieldId', 5);
    fixture.componentRef.setInput('crops', [{ season: season - 1, crop: 'canola', varietyNote: null }]);
    fixture.componentRef.setInput('canEdit', true);
    changed = 0;
    fixture.componentInstance.changed.subscribe(() => changed++);
    el = fixture.nativeElement as HTMLElement;
    await fixture.whenStable();
  }

  beforeEach(() => {
    // jsdom does not lay out or scroll: record which box the form asks to bring into view.
    scrolled = [];
    HTMLElement.prototype.scrollIntoView = function (this: HTMLElement) {
      scrolled.push(this);
    };
  });

  afterEach(() => {
    http.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((o) => (o.innerHTML = ''));
  });

  function field(label: RegExp): HTMLElement {
    const found = [...el.querySelectorAll('mat-form-field')].find((f) => label.test(f.querySelector('mat-label')?.textContent ?? ''));
    if (!found) throw new Error(`no field labelled ${label}`);
    return found as HTMLElement;
  }

  function type(label: RegExp, value: string): void {
    const input = field(label).querySelector('input') as HTMLInputElement;
    input.value = value;
    input.dispatchEvent(new Event('input'));
    input.dispatchEvent(new Event('blur'));
  }

  async function choose(label: RegExp, option: string): Promise<void> {
    (field(label).querySelector('.mat-mdc-select-trigger') as HTMLElement).click();
    await fixture.whenStable();
    const found = [...document.querySelectorAll('mat-option')].find((o) => o.textContent?.trim() === option);
    if (!found) throw new Error(`no option ${option}`);
    (found as HTMLElement).click();
    await fixture.whenStable();
  }

  const saveButton = () => [...el.querySelectorAll('button')].find((b) => b.textContent?.trim() === 'Save crop') as HTMLButtonElement;
  async function save(): Promise<void> {
    await fixture.whenStable();
    saveButton().click();
    await fixture.whenStable();
  }

  it('when the server refuses the variety note, then its message shows under Variety note, named by its label, and Save waits for a change', async () => {
    await open();
    await choose(/Crop/, 'Durum');
    type(/Variety note/, 'Certified seed, lot 7');
    await save();
    const put = http.expectOne({ method: 'PUT', url: `/api/fields/5/crops/${season}` });
    expect(put.request.body).toEqual({ crop: 'durum', varietyNote: 'Certified seed, lot 7' });
    put.flush(
      {
        error: {
          code: 'invalid_input',
          message: 'Check the body: varietyNote: Too big: expected string to have <=200 characters',
          fields: { varietyNote: 'Too big: expected string to have <=200 characters' },
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();

    const note = field(/Variety note/);
    expect(note.querySelector('mat-error')?.textContent).toContain('Too big: expected string to have <=200 characters');
    expect(note.querySelector('input')?.getAttribute('aria-invalid')).toBe('true');
    expect(el.querySelector('[role="alert"]')?.textContent).toContain('Check Variety note: Too big');
    expect(el.textContent).not.toContain('varietyNote');
    expect(scrolled).toContain(note.querySelector('input'));
    expect(saveButton().disabled).toBe(true);
    expect(changed).toBe(0);

    type(/Variety note/, 'Certified seed');
    await fixture.whenStable();
    expect(saveButton().disabled).toBe(false);
    await save();
    http
      .expectOne({ method: 'PUT', url: `/api/fields/5/crops/${season}` })
      .flush({ fieldId: 5, season, crop: 'durum', varietyNote: 'Certified seed' });
    await fixture.whenStable();
    expect(changed).toBe(1);
  });

  it('when no crop is chosen, then nothing is sent, Crop is named and marked, and Save stays off until one is chosen', async () => {
    await open();
    await save();
    http.expectNone(`/api/fields/5/crops/${season}`);
    expect(el.querySelector('[role="alert"]')?.textContent).toContain('Check Crop.');
    expect(field(/^Crop$/).textContent).toContain('Choose a crop');
    expect(field(/^Crop$/).querySelector('[aria-invalid="true"]')).not.toBeNull();
    expect(saveButton().disabled).toBe(true);

    await choose(/^Crop$/, 'Barley');
    expect(saveButton().disabled).toBe(false);
    expect(el.querySelector('[role="alert"]')).toBeNull();
  });
});
