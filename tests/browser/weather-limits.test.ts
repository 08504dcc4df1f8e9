import { DEMO_FARM_NAME } from '../../seeds/01_demo_farm';
import { mphToKmh } from '../../shared/units';
import { SPRAY_LABEL_CAUTION } from '../../shared/weather/limits';
import { demo, screenshot, seriousViolations, signIn, startRig, type BrowserRig } from '../support/browser';

describe('Weather limits in a real browser', () => {
  let rig: BrowserRig;
  let farmId: number;
  let saved: { limits: unknown } | undefined;
  let units: string;

  beforeAll(async () => {
    rig = await startRig();
    const farm = await rig.t.db('farms').where({ name: DEMO_FARM_NAME }).first('id', 'units');
    farmId = farm.id;
    units = farm.units;
    saved = await rig.t.db('weather_limits').where({ farm_id: farmId }).first('limits');
  });
  afterAll(async () => {
    // The demo farm is shared by every browser test: put its limits back as they were.
    if (saved)
      await rig.t
        .db('weather_limits')
        .where({ farm_id: farmId })
        .update({ limits: JSON.stringify(saved.limits) });
    else await rig.t.db('weather_limits').where({ farm_id: farmId }).delete();
    await rig.close();
  });

  it('when the owner changes the highest spraying wind and saves, then it is kept after a reload, with each default and its source shown', async () => {
    // The demo farm reads US units, so the wind is in mph (the screen follows the farm's units).
    expect(units).toBe('us');
    const page = await rig.newPage();
    await signIn(page, demo('owner'));
    await page.goto('/members');
    const form = page.getByRole('form', { name: 'Weather limits' });
    await form.waitFor();
    const spraying = form.getByRole('region', { name: 'Spraying' });
    await spraying.getByText(SPRAY_LABEL_CAUTION).waitFor();
    const windRow = spraying.locator('tr[data-limit="spraying.windMaxKmh"]');
    // The default and its source beside the number; other kinds of source on other rows.
    await windRow.getByText('published', { exact: true }).waitFor();
    await windRow.getByText(/National Pesticide Stewardship Alliance/).waitFor();
    await spraying.locator('tr[data-limit="spraying.deltaTGoodMaxC"]').getByText('from memory', { exact: true }).waitFor();
    await form
      .locator('tr[data-limit="harrowing.coldBelowC"]')
      .getByText('common practice, no published source', { exact: true })
      .waitFor();

    const wind = form.getByLabel('Highest wind (spraying)', { exact: true });
    await wind.fill('12');
    await form.getByRole('button', { name: 'Save weather limits' }).click();
    await page.getByText('Weather limits saved.').waitFor();
    // Stored in km/h: 12 mph × 1.609 344 = 19.312 128 km/h, kept to 0.001 km/h.
    const row = await rig.t.db('weather_limits').where({ farm_id: farmId }).first('limits');
    expect(row.limits.spraying.windMaxKmh).toBe(19.312);
    // The other numbers went back as they were (the lowest wind is still exactly 3 mph in km/h).
    expect(row.limits.spraying.windMinKmh).toBe(mphToKmh(3));

    await page.reload();
    const again = page.getByRole('form', { name: 'Weather limits' });
    await again.waitFor();
    const windAgain = again.getByLabel('Highest wind (spraying)', { exact: true });
    await expect(windAgain.inputValue()).resolves.toBe('12');
    await again.locator('tr[data-limit="spraying.windMaxKmh"]').getByText('10.0 mph', { exact: true }).waitFor();
    // The spraying table from its heading: the label caution, then the wind rows.
    await again.getByRole('heading', { name: 'Spraying' }).evaluate((h) => h.scrollIntoView({ block: 'start' }));
    await screenshot(page, 'weather-limits-saved');
    expect(await seriousViolations(page)).toEqual([]);
    expect(rig.outside).toEqual([]);
  });
});
