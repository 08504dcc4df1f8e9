import { TestBed } from '@angular/core/testing';
import { AuthStore } from '../../../core/auth/auth-store';
import type { HazardFeature } from '../../../shared/map/map-types';
import { HazardList } from './hazard-list';

const ROCK: HazardFeature = {
  type: 'Feature',
  geometry: { type: 'Point', coordinates: [-99.9, 47.6] },
  properties: { id: 5, fieldId: 7, kind: 'rock', clearanceM: 15.24, note: null, status: 'reported' },
};

describe('HazardList', () => {
  function render(canEdit: boolean) {
    TestBed.inject(AuthStore).signedInAs({
      user: { id: 1, email: 'i@example.test', name: 'Ingrid' },
      farm: { id: 1, name: 'F', units: 'us', timeZone: 'America/Chicago' },
      membershipId: 1,
      role: canEdit ? 'owner' : 'operator',
    });
    const fixture = TestBed.createComponent(HazardList);
    fixture.componentRef.setInput('hazards', [ROCK]);
    fixture.componentRef.setInput('canEdit', canEdit);
    fixture.detectChanges();
    return fixture;
  }
  const button = (el: HTMLElement, label: string) => el.querySelector(`button[aria-label="${label}"]`) as HTMLButtonElement | null;

  it('when the owner presses Redraw, Edit, Remove or Confirm, then the list asks for that with the hazard', () => {
    const fixture = render(true);
    const el = fixture.nativeElement as HTMLElement;
    const asked: string[] = [];
    fixture.componentInstance.redraw.subscribe((h) => asked.push(`redraw ${h.properties.id}`));
    fixture.componentInstance.edit.subscribe((h) => asked.push(`edit ${h.properties.id}`));
    fixture.componentInstance.remove.subscribe((h) => asked.push(`remove ${h.properties.id}`));
    fixture.componentInstance.confirm.subscribe((h) => asked.push(`confirm ${h.properties.id}`));
    button(el, 'Redraw Rock on the map')!.click();
    button(el, 'Edit Rock')!.click();
    button(el, 'Remove Rock')!.click();
    [...el.querySelectorAll('button')].find((b) => b.textContent?.trim() === 'Confirm')!.click();
    expect(asked).toEqual(['redraw 5', 'edit 5', 'remove 5', 'confirm 5']);
  });

  it('when someone else reads the list, then it has no buttons', () => {
    const el = render(false).nativeElement as HTMLElement;
    expect(el.querySelectorAll('button')).toHaveLength(0);
    expect(el.textContent).toContain('Reported from the field, not yet confirmed');
  });
});
