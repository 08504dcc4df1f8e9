import { type ComponentFixture, TestBed } from '@angular/core/testing';
import type { Polygon } from 'geojson';
import * as L from 'leaflet';
import { localProjection } from '@shared/geo/local-projection';
import type { PlanInput } from '@shared/plan/types';
import type { RunSheetItem } from '@shared/schemas/run-sheet';
import { AuthStore } from '../../../core/auth/auth-store';
import { job } from '../../board/testing/board-fixtures';
import { JobPosition, passText } from './job-position';
import { GEOLOCATION, PLAN_PASSES, type PlanPasses } from './passes-source';

// A hand-made field in the plane of O (-99.9, 47.6): 60 m × 200 m, passes 10 m wide running north,
// pass k's centre line 10k − 5 m east of O; a power pole 60 m east, 50 m north, 15 m clearance.
const p = localProjection([-99.9, 47.6]);
const ll = (x: number, y: number) => p.inverse([x, y]);
const PASSES: PlanPasses = {
  type: 'FeatureCollection',
  features: [1, 2, 3, 4, 5, 6].map((k) => ({
    type: 'Feature',
    properties: { pass: k, segment: 1, headingDeg: 0, lengthM: 200 },
    geometry: { type: 'LineString', coordinates: [ll(10 * k - 5, 0), ll(10 * k - 5, 200)] },
  })),
};
// A headland strip 10 m wide along the south edge, standing in for the planner's ring.
const HEADLAND: Polygon = { type: 'Polygon', coordinates: [[ll(0, 0), ll(60, 0), ll(60, 10), ll(0, 10), ll(0, 0)]] };
const ITEM: RunSheetItem = job({
  field: {
    id: 107,
    name: 'North Quarter',
    acres: 3,
    boundary: { type: 'Polygon', coordinates: [[ll(0, 0), ll(60, 0), ll(60, 200), ll(0, 200), ll(0, 0)]] },
    hazards: {
      type: 'FeatureCollection',
      features: [
        {
          type: 'Feature',
          properties: { id: 9, fieldId: 107, kind: 'power', clearanceM: 15, note: null, status: 'confirmed' },
          geometry: { type: 'Point', coordinates: ll(60, 50) },
        },
      ],
    },
  },
  passPlan: {
    implementId: 1,
    widthM: 10,
    headlandPasses: 0,
    headingDeg: 0,
    coverage: 'gaps-ok',
    speedMps: 2.2352,
    efficiency: 0.75,
    turnSeconds: 20,
    summary: { passCount: 6 },
    updatedAt: '2026-05-01T00:00:00Z',
  },
});

/** A Geolocation that answers when the spec says, and records what was asked of it. */
class FakeGeolocation {
  watches = 0;
  cleared: number[] = [];
  private success: PositionCallback | null = null;
  private failure: PositionErrorCallback | null = null;
  watchPosition(success: PositionCallback, failure?: PositionErrorCallback | null): number {
    this.watches++;
    this.success = success;
    this.failure = failure ?? null;
    return 41;
  }
  clearWatch(id: number): void {
    this.cleared.push(id);
  }
  getCurrentPosition(): void {
    throw new Error('not used');
  }
  /** The phone reports it is at (x, y) m in the plane of O. */
  at(x: number, y: number, accuracy = 4): void {
    const [lon, lat] = ll(x, y);
    this.success?.({
      coords: { latitude: lat, longitude: lon, accuracy, heading: null, speed: null, altitude: null, altitudeAccuracy: null },
      timestamp: Date.now(),
    } as unknown as GeolocationPosition);
  }
  deny(): void {
    this.failure?.({ code: 1, message: 'denied', PERMISSION_DENIED: 1, POSITION_UNAVAILABLE: 2, TIMEOUT: 3 } as GeolocationPositionError);
  }
}

describe('JobPosition', () => {
  let fixture: ComponentFixture<JobPosition>;
  let el: HTMLElement;
  let geo: FakeGeolocation;
  let asked: PlanInput[];

  beforeEach(() => {
    geo = new FakeGeolocation();
    asked = [];
    TestBed.configureTestingModule({
      imports: [JobPosition],
      providers: [
        { provide: GEOLOCATION, useValue: geo },
        {
          provide: PLAN_PASSES,
          useValue: (input: PlanInput) => {
            asked.push(input);
            return Promise.resolve({ passes: PASSES, headland: HEADLAND });
          },
        },
      ],
    });
    TestBed.inject(AuthStore).signedInAs({
      user: { id: 2, email: 't@example.test', name: 'Tomas Reyes' },
      farm: { id: 1, name: 'F', units: 'metric', timeZone: 'America/Chicago' },
      membershipId: 1,
      role: 'operator',
    });
    fixture = TestBed.createComponent(JobPosition);
    fixture.componentRef.setInput('item', ITEM);
    el = fixture.nativeElement as HTMLElement;
    fixture.detectChanges();
  });
  afterEach(() => localStorage.clear());

  const text = () => el.textContent?.replace(/\s+/g, ' ') ?? '';
  const tap = async (name: RegExp) => {
    const button = [...el.querySelectorAll('button')].find((b) => name.test(b.textContent ?? ''))!;
    button.click();
    await fixture.whenStable();
    fixture.detectChanges();
  };
  const settle = async () => {
    await fixture.whenStable();
    fixture.detectChanges();
  };

  it('when the job is opened, then the phone is not asked for its position, and the screen says it is an aid that comes after the tractor and the eyes', () => {
    expect(geo.watches).toBe(0);
    expect(text()).toContain("An aid only: the tractor's own display and your own eyes come first. Do not handle the phone while driving.");
    expect(text()).toContain('Show where I am');
  });

  it('when the operator taps "Show where I am" and the phone is on pass 3, then pass 3 of 6 shows, the saved plan’s own settings were planned, and the next zone is the pole', async () => {
    await tap(/Show where I am/);
    expect(geo.watches).toBe(1);
    expect(asked).toEqual([expect.objectContaining({ widthM: 10, headlandPasses: 0, headingDeg: 0, boundary: ITEM.field.boundary })]);
    geo.at(23, 100);
    await settle();
    const pass = el.querySelector('.pass') as HTMLElement;
    expect(pass.dataset['pass']).toBe('3');
    expect(pass.textContent?.trim()).toBe('Pass 3 of 6');
    // √(37² + 50²) − 15 = 47.2 m to the pole's zone.
    expect(el.querySelector('.next-zone')?.textContent?.replace(/\s+/g, ' ').trim()).toBe('Power pole or line, 47 m to its clearance zone');
    expect(el.querySelector('.zone-warning')).toBeNull();
  });

  it('when the phone comes inside the pole’s clearance zone, then a warning is announced; moving out takes it away', async () => {
    await tap(/Show where I am/);
    geo.at(50, 60);
    await settle();
    const warning = el.querySelector('.zone-warning') as HTMLElement;
    expect(warning.getAttribute('role')).toBe('alert');
    expect(warning.textContent).toContain('Inside the clearance zone of the power pole or line.');
    expect(warning.textContent).toContain('Keep 15 m clear');
    geo.at(23, 100);
    await settle();
    expect(el.querySelector('.zone-warning')).toBeNull();
  });

  it('when the phone moves 20 m north-east, then the heading shows 45.0° (headings read to 0.1° everywhere) (no heading from the phone itself)', async () => {
    await tap(/Show where I am/);
    geo.at(20, 100);
    await settle();
    const heading = () => el.querySelector('.heading')?.textContent?.trim();
    expect(heading()).toBe('Shown once you move');
    geo.at(20 + 20 / Math.SQRT2, 100 + 20 / Math.SQRT2);
    await settle();
    expect(heading()).toBe('45.0°');
  });

  it('when the operator refuses the position, then the screen says how to allow it and stops asking', async () => {
    await tap(/Show where I am/);
    geo.deny();
    await settle();
    expect(el.querySelector('.form-error')?.textContent).toContain('Allow location for this site');
    expect(geo.cleared).toEqual([41]);
    expect(text()).toContain('Show where I am');
  });

  it('when the job’s map is made, then the saved plan is worked out with its own settings and drawn on it, passes and headland, without asking for the position', async () => {
    const host = document.createElement('div');
    document.body.append(host);
    const map = L.map(host).setView(ll(30, 100).reverse() as [number, number], 16);
    fixture.componentInstance.attach(map);
    await settle();
    expect(geo.watches).toBe(0);
    expect(asked).toEqual([expect.objectContaining({ widthM: 10, headlandPasses: 0, headingDeg: 0, boundary: ITEM.field.boundary })]);
    expect(el.querySelector('[data-plan-on-map]')?.textContent?.trim()).toBe(
      'On the map: the saved plan’s 6 passes (grey lines) and its headland (shaded).',
    );
    const drawn: string[] = [];
    map.eachLayer((layer) => {
      const cls = (layer as L.Path).options?.className;
      if (cls && layer instanceof L.Path) drawn.push(cls);
    });
    expect(drawn.filter((c) => c === 'jp-plan-pass')).toHaveLength(6);
    expect(drawn.filter((c) => c === 'jp-headland')).toHaveLength(1);
    // The position, tapped for later, plans nothing twice.
    await tap(/Show where I am/);
    expect(asked).toHaveLength(1);
    map.remove();
    host.remove();
  });

  it('when the operator taps "Stop showing where I am", then the phone stops being asked', async () => {
    await tap(/Show where I am/);
    geo.at(23, 100);
    await settle();
    await tap(/Stop showing where I am/);
    expect(geo.cleared).toEqual([41]);
    expect(el.querySelector('.pass')).toBeNull();
  });
});

describe('passText', () => {
  const length = (m: number) => `${Math.round(m)} m`;
  it('when off every pass, then the nearest and its distance are said, and where the phone is', () => {
    expect(
      passText({ pass: { pass: 4, segment: 1, offsetM: 12.4, under: false }, inField: true, insideZones: [], nextZone: null }, 40, length),
    ).toBe('In the headland or a gap; nearest pass 4 of 40, 12 m away');
    expect(
      passText({ pass: { pass: 1, segment: 1, offsetM: 80, under: false }, inField: false, insideZones: [], nextZone: null }, null, length),
    ).toBe('Outside the field; nearest pass 1, 80 m away');
    const zone = { index: 0, id: 9, kind: 'power', clearanceM: 15, distanceM: 8, toZoneM: 0, inside: true };
    expect(
      passText({ pass: { pass: 2, segment: 1, offsetM: 9, under: false }, inField: true, insideZones: [zone], nextZone: null }, 6, length),
    ).toBe('In a clearance zone; nearest pass 2 of 6, 9 m away');
  });
});
