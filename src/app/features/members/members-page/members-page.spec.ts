import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { Me, Member } from '@shared/schemas/auth';
import { DEFAULT_LIMITS, LIMIT_SOURCES } from '@shared/weather/limits';
import { AuthStore } from '../../../core/auth/auth-store';
import { errorInterceptor } from '../../../core/http/error.interceptor';
import { MembersPage } from './members-page';

const OWNER: Me = {
  user: { id: 1, email: 'ingrid@example.test', name: 'Ingrid Sorensen' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units: 'us', timeZone: 'America/Chicago' },
  membershipId: 1,
  role: 'owner',
};

const MEMBERS: Member[] = [
  { id: 11, userId: 1, name: 'Ingrid Sorensen', email: 'ingrid@example.test', role: 'owner', status: 'active', invitedAt: null },
  { id: 12, userId: 2, name: 'Tomas Reyes', email: 'tomas@example.test', role: 'operator', status: 'active', invitedAt: null },
  {
    id: 13,
    userId: 5,
    name: 'Walt Sorensen',
    email: 'walt@example.test',
    role: 'viewer',
    status: 'invited',
    invitedAt: '2026-03-01T12:00:00Z',
  },
];

describe('MembersPage', () => {
  let fixture: ComponentFixture<MembersPage>;
  let httpTesting: HttpTestingController;
  let page: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [MembersPage],
      providers: [
        provideRouter([]),
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        // The dialog then closes at once instead of waiting for an animation jsdom never plays.
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    TestBed.inject(AuthStore).signedInAs(OWNER);
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(MembersPage);
    page = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
    // The farm's settings load beside the list (their own spec tests them).
    httpTesting
      .expectOne('/api/farm')
      .flush({ id: 1, name: 'Tamarack Ridge Farm', units: 'us', dayHoursLimit: 12, timeZone: 'America/Chicago' });
    // So does the list of failed e-mails (background-jobs.spec.ts tests it).
    httpTesting.expectOne('/api/background/failed').flush({ jobs: [] });
    // And the weather limits (weather-limits.spec.ts tests them): the defaults, as the server answers.
    httpTesting.expectOne('/api/weather/limits').flush({ limits: DEFAULT_LIMITS, defaults: DEFAULT_LIMITS, sources: LIMIT_SOURCES });
    // And the costs of the farm's own work (work-costs.spec.ts tests them).
    httpTesting.expectOne('/api/costs').flush({ fuelPriceCents: null, fuel: [], machines: [], people: [] });
  });

  afterEach(() => {
    httpTesting.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((el) => (el.innerHTML = ''));
  });

  async function loadMembers(members: Member[] = MEMBERS): Promise<void> {
    const req = httpTesting.expectOne('/api/members');
    expect(req.request.method).toBe('GET');
    req.flush(members);
    await fixture.whenStable();
  }

  function rows(): string[][] {
    return [...page.querySelectorAll('tr.mat-mdc-row:not(.empty)')].map((tr) =>
      [...tr.querySelectorAll('td')].map((td) => td.textContent?.trim() ?? ''),
    );
  }

  function type(label: string, value: string): void {
    const field = [...page.querySelectorAll('mat-form-field')].find((f) => f.querySelector('mat-label')?.textContent?.trim() === label);
    const input = field?.querySelector('input');
    if (!input) throw new Error(`no field labelled ${label}`);
    input.value = value;
    input.dispatchEvent(new Event('input'));
  }

  function button(text: string, root: ParentNode = page): HTMLButtonElement {
    const found = [...root.querySelectorAll('button')].find((b) => b.textContent?.trim() === text);
    if (!found) throw new Error(`no button ${text}`);
    return found;
  }

  it('then it has one h1 and a row per member with name, e-mail, role and status', async () => {
    await loadMembers();
    expect(page.querySelectorAll('h1')).toHaveLength(1);
    expect(page.querySelector('h1')?.textContent).toBe('Members');

    const table = rows();
    expect(table.map((cells) => cells[0])).toEqual(['Ingrid Sorensen (you)', 'Tomas Reyes', 'Walt Sorensen']);
    expect(table[1][1]).toBe('tomas@example.test');
    expect(table[1][2]).toContain('Operator');
    expect(table[2][3]).toBe('invited');
    expect(page.querySelector('[aria-label="Remove Tomas Reyes"]')).not.toBeNull();
  });

  it('when the list cannot be loaded, then the server message shows', async () => {
    httpTesting
      .expectOne('/api/members')
      .flush({ error: { code: 'forbidden', message: 'Only an owner can see members.' } }, { status: 403, statusText: 'Forbidden' });
    await fixture.whenStable();
    expect(page.querySelector('[role="alert"]')?.textContent).toContain('Only an owner can see members.');
  });

  it('when the owner invites someone, then it posts name, e-mail and role and adds the row', async () => {
    await loadMembers();
    type('Name', '  Ada Lindqvist ');
    type('E-mail', 'Ada@Example.test');
    button('Send invitation').click();

    const req = httpTesting.expectOne('/api/members/invite');
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({ name: 'Ada Lindqvist', email: 'ada@example.test', role: 'operator' });
    req.flush(
      {
        id: 14,
        userId: 6,
        name: 'Ada Lindqvist',
        email: 'ada@example.test',
        role: 'operator',
        status: 'invited',
        invitedAt: '2026-04-01T08:00:00Z',
      },
      { status: 201, statusText: 'Created' },
    );
    await fixture.whenStable();

    expect(rows().map((cells) => cells[0])).toContain('Ada Lindqvist');
  });

  it('when the invitation is refused, then the server message shows beside the form', async () => {
    await loadMembers();
    type('Name', 'Tomas Reyes');
    type('E-mail', 'tomas@example.test');
    button('Send invitation').click();
    httpTesting
      .expectOne('/api/members/invite')
      .flush({ error: { code: 'conflict', message: 'tomas@example.test is already a member.' } }, { status: 409, statusText: 'Conflict' });
    await fixture.whenStable();
    expect(page.querySelector('form [role="alert"]')?.textContent).toContain('tomas@example.test is already a member.');
  });

  it('when the invite form is incomplete, then nothing is posted', async () => {
    await loadMembers();
    type('Name', 'Milo Sorensen');
    type('E-mail', 'not-an-address');
    button('Send invitation').click();
    await fixture.whenStable();
    httpTesting.expectNone('/api/members/invite');
    expect(page.textContent).toContain('Enter a valid e-mail address');
  });

  it('when the owner picks another role in a row, then it patches that member with the role', async () => {
    await loadMembers();
    const trigger = page.querySelector('[aria-label="Role of Tomas Reyes"] .mat-mdc-select-trigger') as HTMLElement;
    trigger.click();
    await fixture.whenStable();
    const option = [...document.querySelectorAll('mat-option')].find((o) => o.textContent?.trim() === 'Viewer');
    (option as HTMLElement).click();
    await fixture.whenStable();

    const req = httpTesting.expectOne('/api/members/12');
    expect(req.request.method).toBe('PATCH');
    expect(req.request.body).toEqual({ role: 'viewer' });
    req.flush({ ...MEMBERS[1], role: 'viewer' });
    await fixture.whenStable();
    expect(document.querySelector('mat-snack-bar-container')?.textContent).toContain('Tomas Reyes is now a viewer.');
  });

  it('when the owner confirms a removal, then it deletes the member and drops the row', async () => {
    await loadMembers();
    (page.querySelector('[aria-label="Remove Tomas Reyes"]') as HTMLButtonElement).click();
    await fixture.whenStable();

    const dialog = document.querySelector('mat-dialog-container');
    expect(dialog?.textContent).toContain('Remove Tomas Reyes?');
    button('Remove', dialog as ParentNode).click();
    await fixture.whenStable();

    const req = httpTesting.expectOne('/api/members/12');
    expect(req.request.method).toBe('DELETE');
    req.flush(null, { status: 204, statusText: 'No Content' });
    await fixture.whenStable();
    expect(rows().map((cells) => cells[0])).not.toContain('Tomas Reyes');
  });

  it('when the server refuses a removal (last owner), then its message shows and the row stays', async () => {
    await loadMembers();
    (page.querySelector('[aria-label="Remove Ingrid Sorensen"]') as HTMLButtonElement).click();
    await fixture.whenStable();
    button('Remove', document.querySelector('mat-dialog-container') as ParentNode).click();
    await fixture.whenStable();
    httpTesting
      .expectOne('/api/members/11')
      .flush({ error: { code: 'last_owner', message: 'The farm needs at least one owner.' } }, { status: 409, statusText: 'Conflict' });
    await fixture.whenStable();
    expect(document.querySelector('mat-snack-bar-container')?.textContent).toContain('The farm needs at least one owner.');
    expect(rows().map((cells) => cells[0])).toContain('Ingrid Sorensen (you)');
  });
});
