import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { Me } from '@shared/schemas/auth';
import type { CrewMember } from '@shared/schemas/fleet';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { CrewPage } from './crew-page';

const OWNER: Me = {
  user: { id: 1, email: 'ingrid@example.test', name: 'Ingrid Sorensen' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units: 'us', timeZone: 'America/Chicago' },
  membershipId: 1,
  role: 'owner',
};

const CREW: CrewMember[] = [
  { membershipId: 14, name: 'Tomas Reyes', role: 'operator', skills: { harrowing: 'mentor', seeding: 'qualified' } },
  { membershipId: 11, name: 'Ingrid Sorensen', role: 'owner', skills: { spraying: 'qualified' } },
  { membershipId: 16, name: 'Milo Sorensen', role: 'operator', skills: {} },
  { membershipId: 17, name: 'Walt Sorensen', role: 'viewer', skills: {} },
];

describe('CrewPage', () => {
  let fixture: ComponentFixture<CrewPage>;
  let httpTesting: HttpTestingController;
  let page: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [CrewPage],
      providers: [
        provideRouter([]),
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    TestBed.inject(AuthStore).signedInAs(OWNER);
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(CrewPage);
    page = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
    httpTesting.expectOne('/api/crew').flush(CREW);
    await fixture.whenStable();
  });

  afterEach(() => {
    httpTesting.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((el) => (el.innerHTML = ''));
  });

  const cell = (label: string) => page.querySelector(`[aria-label="${label}"]`) as HTMLElement;

  async function pick(label: string, option: string): Promise<void> {
    (cell(label).querySelector('.mat-mdc-select-trigger') as HTMLElement).click();
    await fixture.whenStable();
    ([...document.querySelectorAll('mat-option')].find((o) => o.textContent?.trim() === option) as HTMLElement).click();
    await fixture.whenStable();
  }

  it('then there is a row per owner and operator (no viewers), a column per operation, and the legend', async () => {
    const names = [...page.querySelectorAll('tr.mat-mdc-row .person')].map((th) => th.firstChild?.textContent?.trim());
    expect(names).toEqual(['Ingrid Sorensen', 'Milo Sorensen', 'Tomas Reyes']);
    const headers = [...page.querySelectorAll('th.mat-mdc-header-cell')].map((th) => th.textContent?.trim());
    expect(headers).toEqual(['Person', 'Harrowing', 'Disking / tillage', 'Seeding', 'Spraying', 'Swathing', 'Combining', 'Baling']);
    expect(cell('Harrowing — Tomas Reyes').textContent).toContain('Mentor');
    expect(cell('Harrowing — Milo Sorensen').textContent).toContain('None');
    expect(page.textContent).toContain('A learner may be assigned an operation only with a mentor on the same day and field.');
    expect(page.querySelectorAll('h1')).toHaveLength(1);
  });

  it('when the owner sets Milo to learning harrowing, then it PUTs that level and confirms', async () => {
    await pick('Harrowing — Milo Sorensen', 'Learning');
    const req = httpTesting.expectOne('/api/crew/16/skills/harrowing');
    expect(req.request.method).toBe('PUT');
    expect(req.request.body).toEqual({ level: 'learning' });
    req.flush({ ...CREW[2], skills: { harrowing: 'learning' } });
    await fixture.whenStable();
    expect(document.querySelector('mat-snack-bar-container')?.textContent).toContain('Milo Sorensen is now learning harrowing.');
    expect(cell('Harrowing — Milo Sorensen').textContent).toContain('Learning');
  });

  it('when a level is cleared, then it PUTs none', async () => {
    await pick('Seeding — Tomas Reyes', 'None');
    const req = httpTesting.expectOne('/api/crew/14/skills/seeding');
    expect(req.request.body).toEqual({ level: 'none' });
    req.flush({ ...CREW[0], skills: { harrowing: 'mentor' } });
    await fixture.whenStable();
    expect(document.querySelector('mat-snack-bar-container')?.textContent).toContain('Tomas Reyes is no longer set for seeding.');
  });

  it('when the server refuses, then its message shows and the cell goes back to what was saved', async () => {
    await pick('Baling — Ingrid Sorensen', 'Mentor');
    httpTesting
      .expectOne('/api/crew/11/skills/baling')
      .flush(
        { error: { code: 'forbidden', message: 'Your role on this farm does not allow that' } },
        { status: 403, statusText: 'Forbidden' },
      );
    await fixture.whenStable();
    expect(document.querySelector('mat-snack-bar-container')?.textContent).toContain('Your role on this farm does not allow that');
    expect(cell('Baling — Ingrid Sorensen').textContent).toContain('None');
  });
});
