import { type ComponentFixture, TestBed } from '@angular/core/testing';
import type { Feature } from 'geojson';
import type * as L from 'leaflet';
import { MapConfig } from '../map-config';
import type { HazardFeature, MapField } from '../map-types';
import { FieldMap } from './field-map';

const MARKUP = '<img src=x onerror=alert(1)>';
const square = (lon: number, lat: number): MapField['boundary'] => ({
  type: 'Polygon',
  coordinates: [
    [
      [lon, lat],
      [lon + 0.01, lat],
      [lon + 0.01, lat + 0.01],
      [lon, lat + 0.01],
      [lon, lat],
    ],
  ],
});

describe('FieldMap', () => {
  let fixture: ComponentFixture<FieldMap>;
  let map: L.Map;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [FieldMap],
      providers: [{ provide: MapConfig, useValue: { tiles: () => Promise.resolve({ mapTileUrl: null, mapTileAttribution: null }) } }],
    });
    fixture = TestBed.createComponent(FieldMap);
    const ready = new Promise<L.Map>((resolve) => fixture.componentInstance.ready.subscribe(resolve));
    fixture.detectChanges();
    map = await ready;
  });
  afterEach(() => fixture.destroy());

  const host = (): HTMLElement => fixture.nativeElement as HTMLElement;

  it('when a field is named with markup, then its label shows the name as text and makes no element', async () => {
    fixture.componentRef.setInput('fields', [{ id: 1, name: MARKUP, boundary: square(-99.5, 47.2) }]);
    await fixture.whenStable();
    const label = host().querySelector('.fm-label');
    expect(label).not.toBeNull();
    expect(label!.textContent).toBe(MARKUP);
    expect(host().querySelector('img')).toBeNull();
    expect(map).toBeDefined();
  });

  it('when an extra layer tooltip carries markup, then it is text too', async () => {
    const feature: Feature = {
      type: 'Feature',
      properties: { label: MARKUP },
      geometry: {
        type: 'LineString',
        coordinates: [
          [-99.5, 47.2],
          [-99.49, 47.2],
        ],
      },
    };
    fixture.componentRef.setInput('layers', [
      { id: 'x', data: { type: 'FeatureCollection', features: [feature] }, tooltip: (f: Feature) => String(f.properties?.['label']) },
    ]);
    await fixture.whenStable();
    let content: unknown;
    map.eachLayer((layer) => {
      const tip = layer.getTooltip?.();
      if (tip) content = tip.getContent();
    });
    expect(content).toBeInstanceOf(HTMLElement);
    expect((content as HTMLElement).textContent).toBe(MARKUP);
    expect((content as HTMLElement).querySelector('img')).toBeNull();
  });

  it('when a hazard kind is not one Furlong knows, then its symbol is the plain "other" one and the text goes nowhere', async () => {
    const hazard: HazardFeature = {
      type: 'Feature',
      geometry: { type: 'Point', coordinates: [-99.5, 47.2] },
      properties: { id: 5, fieldId: 1, kind: `"><img src=x onerror=alert(1)>`, clearanceM: 0, note: null, status: 'confirmed' },
    };
    fixture.componentRef.setInput('hazards', [hazard]);
    await fixture.whenStable();
    const icon = host().querySelector('.fm-hazard');
    expect(icon).not.toBeNull();
    expect(icon!.querySelector('svg.hz-other')).not.toBeNull();
    expect(host().querySelector('img:not(.leaflet-marker-icon)')).toBeNull();
  });
});
