import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Feature, Polygon } from 'geojson';
import type { Locator, Page } from 'playwright-core';
import { demo, screenshot, seriousViolations, signIn, startRig, type BrowserRig } from '../support/browser';

// tokml ships no types: GeoJSON in, KML text out.
// eslint-disable-next-line @typescript-eslint/no-require-imports
const tokml = require('tokml') as (geojson: unknown, options?: { name?: string }) => string;

/** Names no demo field or other test uses. */
const tag = `T${Date.now().toString(36).slice(-5)}${Math.floor(Math.random() * 1296).toString(36)}`;
const drawnName = `${tag} Drawn quarter`;
const kmlNames = [`${tag} North forty`, `${tag} Slough strip`, `${tag} Home half`];

/** A lon/lat rectangle as a GeoJSON polygon feature. */
function rectangle(name: string, lon: number, lat: number, dLon: number, dLat: number): Feature<Polygon> {
  const ring = [
    [lon, lat],
    [lon + dLon, lat],
    [lon + dLon, lat + dLat],
    [lon, lat + dLat],
    [lon, lat],
  ];
  return { type: 'Feature', properties: { name }, geometry: { type: 'Polygon', coordinates: [ring] } };
}

/** Zooms the map in until its scale bar reads 1,000 ft or less (about zoom 15 here). */
async function zoomToFieldScale(page: Page, map: Locator): Promise<void> {
  for (let i = 0; i < 16; i++) {
    const scale = (await map.locator('.leaflet-control-scale-line').first().innerText()).trim();
    const feet = /^(\d+) ft$/.exec(scale);
    if (feet && Number(feet[1]) <= 1000) return;
    await map.getByRole('button', { name: 'Zoom in' }).click();
    await page.waitForTimeout(350);
  }
  throw new Error('the map would not zoom in to field scale');
}

/** Clicks a ring of points (offsets from the map's centre, px) and closes it on the first. */
async function clickRing(page: Page, map: Locator, points: Array<[number, number]>): Promise<void> {
  const box = await map.boundingBox();
  if (!box) throw new Error('map has no box');
  const cx = box.x + box.width / 2;
  const cy = box.y + box.height / 2;
  for (const [dx, dy] of [...points, points[0]]) {
    await page.mouse.click(cx + dx, cy + dy);
    await page.waitForTimeout(120);
  }
}

/** The shell scrolls its content pane, not the window: back to the top before a screenshot. */
const toTop = (page: Page) => page.locator('mat-sidenav-content').evaluate((el) => el.scrollTo(0, 0));

/** PATCH from inside the page, with the page's own XSRF token, so only the role can refuse it. */
async function patchFromPage(page: Page, id: number): Promise<{ status: number; code: string }> {
  return page.evaluate(async (fieldId) => {
    const token = decodeURIComponent(
      document.cookie
        .split('; ')
        .find((c) => c.startsWith('XSRF-TOKEN='))
        ?.split('=')[1] ?? '',
    );
    const res = await fetch(`/api/fields/${fieldId}`, {
      method: 'PATCH',
      headers: { 'Content-Type': 'application/json', 'X-XSRF-TOKEN': token },
      body: JSON.stringify({ name: 'Renamed by an operator' }),
    });
    const body = (await res.json()) as { error?: { code?: string } };
    return { status: res.status, code: body.error?.code ?? '' };
  }, id);
}

describe('Fields in a real browser', () => {
  let rig: BrowserRig;
  const cspErrors: string[] = [];
  let drawnId = 0;

  beforeAll(async () => {
    rig = await startRig();
  });
  afterAll(() => rig.close());

  async function pageFor(role: 'owner' | 'operator'): Promise<Page> {
    const page = await rig.newPage();
    page.on('console', (m) => {
      if (m.type() === 'error' && /Content Security Policy|Refused to/i.test(m.text())) cspErrors.push(m.text());
    });
    await signIn(page, demo(role));
    return page;
  }

  it('when the owner draws a field with a hole, then its acres show live and it saves', async () => {
    const page = await pageFor('owner');
    await page.goto('/fields/new');
    const map = page.locator('app-field-map');
    await map.locator('.leaflet-container').waitFor();
    await page.waitForLoadState('networkidle');
    await zoomToFieldScale(page, map);

    await page
      .getByRole('radio', { name: 'Draw a part' })
      .or(page.getByRole('button', { name: 'Draw a part' }))
      .first()
      .click();
    await clickRing(page, map, [
      [-130, -100],
      [140, -110],
      [150, 110],
      [-120, 120],
    ]);
    await page.getByText('1 part, 0 holes').waitFor();
    const whole = (await page.getByTestId('live-area').innerText()).trim();
    expect(whole).toMatch(/^[\d,]+\.\d ac$/);
    await screenshot(page, 'fields-1-drawn-part');

    await page
      .getByRole('radio', { name: 'Cut a hole' })
      .or(page.getByRole('button', { name: 'Cut a hole' }))
      .first()
      .click();
    await clickRing(page, map, [
      [-40, -30],
      [40, -30],
      [40, 30],
      [-40, 30],
    ]);
    await page.getByText('1 part, 1 hole').waitFor();
    const holed = (await page.getByTestId('live-area').innerText()).trim();
    const acres = (s: string) => Number(s.replace(/[^\d.]/g, ''));
    expect(acres(holed)).toBeLessThan(acres(whole));
    expect(acres(holed)).toBeGreaterThan(acres(whole) * 0.8);
    expect(await page.locator('.problem').count()).toBe(0);

    await page.getByLabel('Field name').fill(drawnName);
    await screenshot(page, 'fields-2-drawn-with-hole');
    await page.getByRole('button', { name: 'Save field' }).click();
    await page.waitForURL(/\/fields\/\d+$/);
    drawnId = Number(new URL(page.url()).pathname.split('/').pop());
    await page.getByRole('heading', { level: 1, name: drawnName }).waitFor();
    expect((await page.locator('.summary .acres').innerText()).trim()).toBe(holed);

    // Mark a rock with 150 ft clearance by clicking the map: the form opens beside the map, and
    // saving leaves the page where it was, so the next hazard can be marked at once.
    await page.getByRole('button', { name: 'Point' }).click();
    const box = await map.boundingBox();
    await page.mouse.click(box!.x + box!.width / 2 + 90, box!.y + box!.height / 2 - 60);
    await page.getByRole('heading', { name: /New hazard/ }).waitFor();
    const viewport = page.viewportSize()!;
    const inView = (b: { x: number; y: number; width: number; height: number } | null) =>
      !!b && b.y >= 0 && b.y + b.height <= viewport.height && b.x >= 0 && b.x + b.width <= viewport.width;
    const form = page.locator('app-hazard-form');
    const mapAtForm = await map.boundingBox();
    expect(inView(await form.boundingBox())).toBe(true);
    expect((await form.boundingBox())!.x).toBeGreaterThanOrEqual(mapAtForm!.x + mapAtForm!.width);
    expect(inView(mapAtForm)).toBe(true);
    await page.getByRole('combobox', { name: 'Kind' }).click();
    await page.getByRole('option', { name: 'Rock' }).click();
    await page.getByLabel('Clearance (ft)').fill('150');
    await screenshot(page, 'fields-2b-hazard-form-beside-map');
    const scrollBefore = await page.locator('mat-sidenav-content').evaluate((el) => el.scrollTop);
    await page.getByRole('button', { name: 'Save hazard' }).click();
    await page.getByText('Clearance 150 ft').waitFor();
    await map.locator('.fm-hazard').first().waitFor();
    expect(await map.locator('path.fm-zone').count()).toBe(1);
    await form.waitFor({ state: 'detached' });
    expect(await page.locator('mat-sidenav-content').evaluate((el) => el.scrollTop)).toBe(scrollBefore);
    expect(inView(await map.boundingBox())).toBe(true);
    expect(await page.getByRole('button', { name: 'Point' }).evaluate((el) => el === document.activeElement)).toBe(true);
    await screenshot(page, 'fields-2c-after-hazard-saved');

    // And a power line along the south side, finished with Enter, with a 100 ft band either side.
    await page.getByRole('button', { name: 'Line' }).click();
    await toTop(page);
    const at = (await map.boundingBox())!;
    await page.mouse.click(at.x + at.width / 2 - 150, at.y + at.height / 2 + 130);
    await page.waitForTimeout(150);
    await page.mouse.click(at.x + at.width / 2 + 150, at.y + at.height / 2 + 120);
    await page.waitForTimeout(150);
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: /New hazard \(line\)/ }).waitFor();
    await page.getByRole('combobox', { name: 'Kind' }).click();
    await page.getByRole('option', { name: 'Power pole or line' }).click();
    await page.getByLabel('Clearance (ft)').fill('100');
    await page.getByRole('button', { name: 'Save hazard' }).click();
    await page.getByText('Clearance 100 ft').waitFor();
    await page.waitForFunction(() => document.querySelectorAll('app-field-map path.fm-zone').length === 2);
    expect(await page.getByText('look up for power lines', { exact: false }).count()).toBeGreaterThan(0);
    expect(await seriousViolations(page)).toEqual([]);
    await toTop(page);
    await screenshot(page, 'fields-3-field-page-owner');
  });

  it('when the owner redraws the rock where it really is, then its point moves and its kind, clearance and note stay', async () => {
    expect(drawnId).toBeGreaterThan(0);
    const before = await rig.t.db('hazards').where({ field_id: drawnId, kind: 'rock' }).first();
    const page = await pageFor('owner');
    await page.goto(`/fields/${drawnId}`);
    const map = page.locator('app-field-map');
    await map.locator('.fm-hazard').first().waitFor();
    await page.getByRole('button', { name: 'Redraw Rock on the map' }).click();
    await page.getByText('Redrawing the rock: the old shape stays until you finish.').waitFor();
    await toTop(page);
    const box = (await map.boundingBox())!;
    await page.mouse.click(box.x + box.width / 2 - 100, box.y + box.height / 2 + 40);
    await page.getByText('The rock was redrawn.').waitFor();
    const after = await rig.t.db('hazards').where({ id: before.id }).first();
    expect(after.geometry.type).toBe('Point');
    expect(after.geometry.coordinates).not.toEqual(before.geometry.coordinates);
    expect({ kind: after.kind, clearance: after.clearance_m, note: after.note }).toEqual({
      kind: before.kind,
      clearance: before.clearance_m,
      note: before.note,
    });
  });

  it('when the owner uploads a KML of three fields and unticks one, then the other two are saved and listed', async () => {
    const features = [
      rectangle(kmlNames[0], -99.95, 47.62, 0.008, 0.0045),
      rectangle(kmlNames[1], -99.94, 47.62, 0.004, 0.0045),
      rectangle(kmlNames[2], -99.935, 47.62, 0.008, 0.009),
    ];
    const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'furlong-kml-')), `${tag}.kml`);
    fs.writeFileSync(file, tokml({ type: 'FeatureCollection', features }, { name: 'name' }));

    const page = await pageFor('owner');
    await page.goto('/fields');
    await page.getByRole('link', { name: 'Upload boundaries' }).click();
    await page.getByRole('heading', { level: 1, name: 'Upload boundaries' }).waitFor();
    await page.setInputFiles('#boundary-file', file);
    await page.getByRole('heading', { name: '2. Choose the fields to save' }).waitFor();
    const names = page.locator('input.name');
    expect(await names.evaluateAll((inputs) => inputs.map((i) => (i as HTMLInputElement).value))).toEqual(kmlNames);
    await page.locator('app-field-map .fm-label').first().waitFor();
    await screenshot(page, 'fields-4-upload-preview');

    await page.getByRole('checkbox', { name: `Save feature 2 ${kmlNames[1]}` }).uncheck();
    const save = page.getByRole('button', { name: 'Save 2 fields' });
    await save.waitFor();
    expect(await seriousViolations(page)).toEqual([]);
    await save.click();
    await page.waitForURL((u) => u.pathname === '/fields');
    const table = page.getByRole('table');
    // The farm may hold many fields (the demo's, other runs'): filter to this run's.
    await page.getByLabel('Filter by name or crop').fill(tag);
    await table.getByRole('link', { name: kmlNames[0] }).waitFor();
    await table.getByRole('link', { name: kmlNames[2] }).waitFor();
    expect(await table.getByRole('link', { name: kmlNames[1] }).count()).toBe(0);
    expect(await table.locator('tr.mat-mdc-row:not(.empty)').count()).toBe(drawnId ? 3 : 2);
    expect(await seriousViolations(page)).toEqual([]);
    await toTop(page);
    await screenshot(page, 'fields-5-list-after-upload');
  });

  it('when a file holds a name the farm has and a field over a farm field, then the preview fits the file, renames, warns and saves', async () => {
    // A demo field, read from the database: its name is taken and its land is overlapped.
    const farmId = (await rig.t.db('farms').where({ name: 'Tamarack Ridge Farm' }).first('id')).id as number;
    const demoFields = (await rig.t.db('fields').where({ farm_id: farmId }).orderBy('id').select('name', 'boundary')) as Array<{
      name: string;
      boundary: Polygon;
    }>;
    const [taken, other] = demoFields.filter((f) => f.boundary.type === 'Polygon' && !f.name.startsWith('T'));
    const ring = taken.boundary.coordinates[0];
    const lons = ring.map((p) => p[0]);
    const lats = ring.map((p) => p[1]);
    const [w, s, e, n] = [Math.min(...lons), Math.min(...lats), Math.max(...lons), Math.max(...lats)];
    const fresh = `${tag} Renamed strip`;
    const overName = `${tag} Over the fence`;
    const features = [
      // About a mile west of the demo farm's fields, under a name the farm already has.
      rectangle(taken.name, w - 0.03, s, 0.006, 0.004),
      // Over the south-west corner of that demo field: a third of it each way.
      rectangle(overName, w - (e - w) / 3, s - (n - s) / 3, (2 * (e - w)) / 3, (2 * (n - s)) / 3),
    ];
    const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'furlong-kml-')), `${tag}-taken.kml`);
    fs.writeFileSync(file, tokml({ type: 'FeatureCollection', features }, { name: 'name' }));

    const page = await pageFor('owner');
    await page.goto('/fields/upload');
    await page.setInputFiles('#boundary-file', file);
    await page.getByRole('heading', { name: '2. Choose the fields to save' }).waitFor();
    // The file's size in a form a farmer reads (bytes under 1 kB, else kB).
    expect(await page.locator('.chosen').innerText()).toMatch(/ · (\d+ bytes|\d+(\.\d)? kB)$/);

    // The map fits the features found: both labels show and the scale is a field's, not a region's.
    const map = page.locator('app-field-map');
    await map.locator('.fm-label').first().waitFor();
    await page.waitForTimeout(400);
    const scale = (await map.locator('.leaflet-control-scale-line').first().innerText()).trim();
    expect(scale).toMatch(/^(\d+ ft|[1-5] mi)$/);
    const labels = await map.locator('.fm-label').allInnerTexts();
    expect(labels.map((l) => l.trim()).sort()).toEqual([taken.name, overName].sort());

    // The taken name: unticked, but both the tick box and the name can be used, as the message advises.
    const box = page.getByRole('checkbox', { name: `Save feature 1 ${taken.name}` });
    expect(await box.isChecked()).toBe(false);
    expect(await box.isDisabled()).toBe(false);
    const nameInput = page.getByRole('textbox', { name: 'Name of feature 1' });
    expect(await nameInput.isDisabled()).toBe(false);
    // Another name the farm has is caught at once; a free one ticks the row.
    await nameInput.fill(other.name);
    await page.locator('tbody tr').first().getByText(`A field called "${other.name}" already exists on this farm`).waitFor();
    expect(await page.getByRole('checkbox', { name: `Save feature 1 ${other.name}` }).isChecked()).toBe(false);
    await nameInput.fill(fresh);
    await page.getByRole('checkbox', { name: `Save feature 1 ${fresh}` }).waitFor();
    expect(await page.getByRole('checkbox', { name: `Save feature 1 ${fresh}` }).isChecked()).toBe(true);

    // The overlapping feature carries a warning naming the demo field, and can still be saved.
    const warning = page.locator('tbody tr').nth(1).getByTestId('overlap-warning');
    // (Earlier runs of this file left their own fields there too: the demo field is one of those named.)
    expect(await warning.innerText()).toMatch(new RegExp(`Overlaps (.+, )?${taken.name} by [\\d.,]+ ac`));
    await screenshot(page, 'fields-4b-upload-renamed-and-overlap');
    expect(await seriousViolations(page)).toEqual([]);
    await page.getByRole('button', { name: 'Save 2 fields' }).click();
    await page.waitForURL((u) => u.pathname === '/fields');
    const saved = await rig.t.db('fields').where({ farm_id: farmId }).whereIn('name', [fresh, overName]).select('id', 'name');
    expect(saved.map((f) => f.name).sort()).toEqual([fresh, overName].sort());

    // Editing that field's boundary and saving it shows the overlap warning above its map.
    const overId = saved.find((f) => f.name === overName)!.id as number;
    await page.goto(`/fields/${overId}`);
    await page.getByRole('button', { name: 'Edit boundary' }).click();
    await page.getByRole('button', { name: 'Save boundary' }).click();
    const note = page.getByTestId('overlap-warning');
    await note.waitFor();
    expect(await note.innerText()).toMatch(new RegExp(`Overlaps (.+, )?${taken.name} by [\\d.,]+ ac`));
    await toTop(page);
    await screenshot(page, 'fields-4c-field-page-overlap-warning');
  });

  it('when the owner opens the fields map, then fields are coloured by crop with a key, names do not collide and hover shows any hidden name', async () => {
    const page = await pageFor('owner');
    await page.goto('/fields');
    const map = page.locator('app-field-map');
    await map.locator('path.fm-field').first().waitFor();
    await page.waitForLoadState('networkidle');
    await page.waitForTimeout(500);
    const list = (await page.evaluate(async () => (await fetch('/api/fields')).json())) as Array<{
      id: number;
      name: string;
      crop: string | null;
    }>;

    // Colour by crop: as many distinct fills as crops planned, and a key naming each crop present.
    const fills = await map.locator('path.fm-field.fm-coloured').evaluateAll((paths) => paths.map((p) => getComputedStyle(p).fill));
    const crops = new Set(list.map((f) => f.crop).filter((c): c is string => !!c));
    expect(crops.size).toBeGreaterThan(1);
    expect(fills).toHaveLength(list.filter((f) => f.crop).length);
    expect(new Set(fills).size).toBe(crops.size);
    const key = page.getByRole('list', { name: /^Crops \d{4}$/ });
    for (const crop of crops) expect(await key.getByText(crop, { exact: false }).count()).toBeGreaterThan(0);

    // Labels shown at the default zoom never overlap one another.
    const shown = await map.locator('.fm-label').evaluateAll((els) =>
      els.map((el) => {
        const r = el.getBoundingClientRect();
        return { text: (el.textContent ?? '').trim(), x: r.x, y: r.y, w: r.width, h: r.height };
      }),
    );
    for (const [i, a] of shown.entries())
      for (const b of shown.slice(i + 1))
        expect(a.x + a.w <= b.x || b.x + b.w <= a.x || a.y + a.h <= b.y || b.y + b.h <= a.y ? '' : `${a.text} covers ${b.text}`).toBe('');

    // Every other name shows when its field is pointed at, with the field highlighted. A field
    // wholly under another (two runs of this file drew the same quarter) cannot be pointed at.
    // Found afresh before each hover: a hovered field is lifted above its neighbours.
    const spotOf = (id: number) =>
      map.locator(`path.fm-field[data-field-id="${id}"]`).evaluate((p) => {
        const r = p.getBoundingClientRect();
        for (let fy = 0.5; fy < 1; fy += 0.1)
          for (const f of [0, 1, -1, 2, -2, 3, -3, 4, -4]) {
            const x = r.x + r.width * (0.5 + f * 0.1);
            for (const y of [r.y + r.height * fy, r.y + r.height * (1 - fy)]) if (document.elementFromPoint(x, y) === p) return { x, y };
          }
        return null;
      });
    const seen = new Set(shown.map((l) => l.text));
    let shot = false;
    const covered: string[] = [];
    for (const f of list) {
      const spot = await spotOf(f.id);
      if (!spot) {
        covered.push(f.name);
        continue;
      }
      await page.mouse.move(spot.x, spot.y);
      const hovered = map.locator('.fm-label.fm-label-hover');
      await hovered.waitFor();
      expect(await map.locator('path.fm-field.fm-hover').count()).toBe(1);
      const text = (await hovered.innerText()).trim();
      expect(text).toBe(f.name);
      if (!seen.has(text) && !shot) {
        shot = true;
        await screenshot(page, 'fields-9b-map-hover-hidden-name');
      }
      seen.add(text);
    }
    await page.mouse.move(0, 0);
    // Every demo field (names without this file's run tag) can be read.
    expect(covered.filter((name) => !/^T[0-9a-z]{6,8} /.test(name))).toEqual([]);
    for (const f of list) expect(seen.has(f.name) || covered.includes(f.name) ? '' : `${f.name} never shown`).toBe('');
    expect(await seriousViolations(page)).toEqual([]);
    await toTop(page);
    await screenshot(page, 'fields-9-map-by-crop');
  });

  it('when an operator opens Fields, then everything is read-only and a direct PATCH is refused', async () => {
    const page = await pageFor('operator');
    await page.goto('/fields');
    await page.getByLabel('Filter by name or crop').fill(tag);
    await page.getByRole('table').getByRole('link', { name: drawnName }).waitFor();
    for (const name of ['New field', 'Upload boundaries', "Copy last season's crops"])
      expect(await page.getByRole('link', { name }).or(page.getByRole('button', { name })).count()).toBe(0);
    expect(await page.getByRole('link', { name: 'Download GeoJSON' }).count()).toBe(1);
    expect(await seriousViolations(page)).toEqual([]);
    await screenshot(page, 'fields-6-list-operator');

    await page.getByRole('table').getByRole('link', { name: drawnName }).click();
    await page.getByRole('heading', { level: 1, name: drawnName }).waitFor();
    await page.getByText('Clearance 150 ft').waitFor();
    for (const name of [
      'Edit boundary',
      'Point',
      'Line',
      'Area',
      'Save crop',
      'Save name and notes',
      'Delete field',
      'Edit Rock',
      'Remove Rock',
    ])
      expect(await page.getByRole('button', { name, exact: true }).count()).toBe(0);
    expect(await page.locator('input, textarea, mat-select').count()).toBe(0);
    expect(await seriousViolations(page)).toEqual([]);
    await screenshot(page, 'fields-7-field-page-operator');

    // Night work in a cab: the dark theme keeps the map and hazards readable.
    await page.getByRole('button', { name: 'Switch to dark theme' }).click();
    expect(await seriousViolations(page)).toEqual([]);
    await toTop(page);
    await screenshot(page, 'fields-8-field-page-operator-dark');

    expect(await patchFromPage(page, drawnId)).toEqual({ status: 403, code: 'forbidden' });
  });

  it('when every page above loaded, then nothing broke the content policy and no request left 127.0.0.1', () => {
    expect(cspErrors).toEqual([]);
    expect(rig.outside).toEqual([]);
  });
});
