import { DEMO_FARM_NAME } from '../../seeds/01_demo_farm';
import { demo, screenshot, seriousViolations, signIn, startRig, type BrowserRig } from '../support/browser';

/** The day after `now` at a time zone, as the board's heading writes it ("Thursday, May 15, 2031"). */
function tomorrowLabel(timeZone: string, now = new Date()): string {
  const parts = new Intl.DateTimeFormat('en-US', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).formatToParts(now);
  const part = (type: string) => Number(parts.find((p) => p.type === type)!.value);
  const day = new Date(Date.UTC(part('year'), part('month') - 1, part('day') + 1, 12));
  return new Intl.DateTimeFormat('en-US', { timeZone: 'UTC', weekday: 'long', month: 'long', day: 'numeric', year: 'numeric' }).format(day);
}

describe('Farm settings in a real browser', () => {
  let rig: BrowserRig;
  let farmId: number;
  let saved: { time_zone: string; day_hours_limit: number };

  beforeAll(async () => {
    rig = await startRig();
    const farm = await rig.t.db('farms').where({ name: DEMO_FARM_NAME }).first('id', 'time_zone', 'day_hours_limit');
    farmId = farm.id;
    saved = { time_zone: farm.time_zone, day_hours_limit: farm.day_hours_limit };
  });
  afterAll(async () => {
    // The demo farm is shared by every browser test: put its settings back.
    await rig.t.db('farms').where({ id: farmId }).update(saved);
    await rig.close();
  });

  it("when the owner sets the farm's time zone and working day, then they are saved and the board opens on the farm's tomorrow", async () => {
    const page = await rig.newPage();
    await signIn(page, demo('owner'));
    await page.goto('/members');
    const form = page.getByRole('form', { name: 'This farm' });
    await form.waitFor();
    await form.getByLabel('Hours in a working day').fill('11');
    const zone = form.getByRole('combobox', { name: 'Time zone' });
    await zone.fill('Pacific/Chat');
    await page.getByRole('option', { name: 'Pacific/Chatham' }).click();
    await form.getByText('Now at the farm:').waitFor();
    await form.getByRole('button', { name: 'Save farm settings' }).click();
    await page.getByText('Farm settings saved.').waitFor();
    await screenshot(page, 'farm-settings-saved');
    expect(await seriousViolations(page)).toEqual([]);
    expect(await rig.t.db('farms').where({ id: farmId }).first('time_zone', 'day_hours_limit')).toEqual({
      time_zone: 'Pacific/Chatham',
      day_hours_limit: 11,
    });

    // Chatham is 12¾–13¾ hours ahead of UTC: its tomorrow is often another day than the machine's.
    await page.goto('/board');
    await page.getByText(tomorrowLabel('Pacific/Chatham')).waitFor();
    await screenshot(page, 'farm-settings-board-tomorrow');
  });

  it('when the owner types a time zone that does not exist, then the field says so and nothing is saved', async () => {
    const page = await rig.newPage();
    await signIn(page, demo('owner'));
    await page.goto('/members');
    const form = page.getByRole('form', { name: 'This farm' });
    await form.waitFor();
    const before = await rig.t.db('farms').where({ id: farmId }).first('time_zone');
    await form.getByRole('combobox', { name: 'Time zone' }).fill('Prairie/Nowhere');
    await form.getByRole('button', { name: 'Save farm settings' }).click();
    await form.getByText('That is not a time zone we know').waitFor();
    await screenshot(page, 'farm-settings-bad-zone');
    expect(await rig.t.db('farms').where({ id: farmId }).first('time_zone')).toEqual(before);
  });
});
