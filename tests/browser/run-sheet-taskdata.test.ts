// The operator takes a job's task data to the tractor from the run sheet on a 390×844 phone: the
// link downloads a zip that holds TASKDATA/TASKDATA.XML (ISO 11783-10: a TASKDATA folder holding
// TASKDATA.XML), read back with jszip.
import fs from 'node:fs';
import JSZip from 'jszip';
import { freeBoardDay, screenshot, signIn, startRig, type BrowserRig } from '../support/browser';
import { createPhoneJob, type PhoneJob } from '../support/phone-job';

const PHONE = { width: 390, height: 844 };

describe("A job's task data from the run sheet in a real browser", () => {
  let rig: BrowserRig;
  let job: PhoneJob;

  beforeAll(async () => {
    rig = await startRig();
    job = await createPhoneJob(rig, { day: await freeBoardDay(rig), name: 'Ansel Varga', corner: [-97.8, 46.8], engineHours: 1200 });
  });
  afterAll(async () => {
    await job?.remove();
    await rig.close();
  });

  it("when the job's operator taps Task data on a phone, then the browser downloads that job's zip holding TASKDATA/TASKDATA.XML", async () => {
    const page = await rig.newPage();
    // Signed in at a desktop width (the sign-in helper waits for the side navigation), then a phone.
    await signIn(page, job.person);
    await page.setViewportSize(PHONE);
    await page.goto(`/run-sheet?date=${job.day}`);
    const panel = page.locator('mat-expansion-panel').filter({ hasText: job.fieldName });
    const link = panel.getByRole('link', { name: /Task data \(ISO 11783-10\)/ });
    await link.waitFor();
    await link.scrollIntoViewIfNeeded();
    await page.screenshot({ path: await screenshot(page, 'run-sheet-phone-task-data'), fullPage: false });
    expect(await panel.getByText("This job for the tractor's display.").count()).toBe(1);

    const [download] = await Promise.all([page.waitForEvent('download'), link.click()]);
    expect(download.suggestedFilename()).toBe(`TASKDATA-${job.day}-job-${job.jobId}.zip`);
    const file = await download.path();
    const zip = await JSZip.loadAsync(fs.readFileSync(file));
    expect(Object.keys(zip.files).filter((n) => !n.endsWith('/'))).toEqual(['TASKDATA/TASKDATA.XML']);
    const xml = await zip.file('TASKDATA/TASKDATA.XML')!.async('string');
    // ISO 11783-10: the root element and version 4; the job's field as a partfield (PFD@C, its designator).
    expect(xml).toMatch(/<ISO11783_TaskData[^>]*VersionMajor="4"/);
    expect(xml).toMatch(new RegExp(`<PFD [^>]*C="${job.fieldName}"`));
  });
});
