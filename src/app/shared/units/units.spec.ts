import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideHttpClient } from '@angular/common/http';
import type { Me } from '@shared/schemas/auth';
import { AuthStore } from '../../core/auth/auth-store';
import { AreaPipe } from './area-pipe';
import { LengthPipe } from './length-pipe';
import { formatArea, formatLength, lengthToMetres, metresToLength } from './units';

const me = (units: 'us' | 'metric'): Me => ({
  user: { id: 1, email: 'ingrid@example.test', name: 'Ingrid Sorensen' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units, timeZone: 'America/Chicago' },
  membershipId: 1,
  role: 'owner',
});

describe('units', () => {
  it('when the farm uses US units, then areas show in acres and lengths in feet', () => {
    expect(formatArea(159.64, 'us')).toBe('159.6 ac');
    expect(formatArea(1234.56, 'us')).toBe('1,234.6 ac');
    expect(formatLength(30.48, 'us')).toBe('100 ft');
  });

  it('when the farm uses metric, then areas show in hectares and lengths in metres', () => {
    expect(formatArea(640, 'metric')).toBe('259.0 ha');
    expect(formatArea(1, 'metric')).toBe('0.4 ha');
    expect(formatLength(30.48, 'metric')).toBe('30 m');
  });

  it('when there is no number, then a dash shows', () => {
    expect(formatArea(null, 'us')).toBe('—');
    expect(formatLength(undefined, 'metric')).toBe('—');
    expect(formatArea(Number.NaN, 'us')).toBe('—');
  });

  it('when a clearance is typed in feet, then metres go to the API and come back as the same feet', () => {
    expect(lengthToMetres(100, 'us')).toBe(30.48);
    expect(metresToLength(30.48, 'us')).toBe(100);
    expect(lengthToMetres(25, 'metric')).toBe(25);
    expect(metresToLength(12.34, 'metric')).toBe(12.3);
  });

  @Component({
    changeDetection: ChangeDetectionStrategy.OnPush,
    imports: [AreaPipe, LengthPipe],
    template: `<span class="a">{{ acres() | area }}</span> <span class="l">{{ metres() | length }}</span>`,
  })
  class Host {
    readonly acres = signal(100);
    readonly metres = signal(15.24);
  }

  it('when the farm switches units, then the pipes follow without other changes', async () => {
    TestBed.configureTestingModule({ imports: [Host], providers: [provideHttpClient()] });
    const auth = TestBed.inject(AuthStore);
    auth.signedInAs(me('us'));
    const fixture = TestBed.createComponent(Host);
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelector('.a')?.textContent).toBe('100.0 ac');
    expect(el.querySelector('.l')?.textContent).toBe('50 ft');

    auth.signedInAs(me('metric'));
    await fixture.whenStable();
    expect(el.querySelector('.a')?.textContent).toBe('40.5 ha');
    expect(el.querySelector('.l')?.textContent).toBe('15 m');
  });
});
