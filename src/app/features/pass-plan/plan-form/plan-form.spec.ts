import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import type { Implement } from '@shared/schemas/fleet';
import type { PlanSettings } from '../plan-settings';
import { PlanForm } from './plan-form';

const HARROW: Implement = {
  id: 4,
  name: '84 ft heavy harrow',
  kind: 'harrow',
  widthM: 25.6032,
  transportWidthM: null,
  operations: ['harrowing'],
  machineIds: [],
  minPowerHp: null,
  notes: null,
};

const SETTINGS: PlanSettings = {
  implementId: null,
  implementKind: 'harrow',
  width: 60,
  headlandPasses: 2,
  autoHeading: true,
  headingDeg: 0,
  speed: 8,
  efficiencyPct: 70,
  turnSeconds: 30,
  coverage: 'gaps-ok',
  edgeMarginPct: 3,
};

describe('PlanForm', () => {
  let fixture: ComponentFixture<PlanForm>;
  let form: HTMLElement;
  let changes: PlanSettings[];

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [{ provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } }] });
    fixture = TestBed.createComponent(PlanForm);
    form = fixture.nativeElement as HTMLElement;
    changes = [];
    fixture.componentRef.setInput('settings', SETTINGS);
    fixture.componentRef.setInput('operation', 'harrowing');
    fixture.componentRef.setInput('headingUsed', 87.4);
    fixture.componentInstance.settings.subscribe((s) => changes.push(s));
    await fixture.whenStable();
  });

  afterEach(() => document.querySelectorAll('.cdk-overlay-container').forEach((el) => (el.innerHTML = '')));

  const input = (name: string) => form.querySelector(`input[name="${name}"]`) as HTMLInputElement;

  it('when Auto is on, then the heading boxes are off and show the heading the planner chose', async () => {
    await fixture.whenStable();
    expect(input('heading').disabled).toBe(true);
    // Auto may run along an edge that is not a whole degree: the box shows it to 0.1°.
    expect(input('heading').value).toBe('87.4');
  });

  it('when Auto is switched off, then the heading starts from the one Auto chose', async () => {
    (form.querySelector('mat-slide-toggle button') as HTMLButtonElement).click();
    await fixture.whenStable();
    expect(changes.at(-1)).toMatchObject({ autoHeading: false, headingDeg: 87.4 });
  });

  it('when the slider moves, then the heading follows while dragging', async () => {
    fixture.componentRef.setInput('settings', { ...SETTINGS, autoHeading: false });
    await fixture.whenStable();
    const thumb = form.querySelector('input[matSliderThumb]') as HTMLInputElement;
    thumb.value = '120';
    thumb.dispatchEvent(new Event('input'));
    expect(changes.at(-1)?.headingDeg).toBe(120);
  });

  it('when a fleet implement is picked, then its kind, width and the kind defaults fill in', async () => {
    fixture.componentRef.setInput('implements', [HARROW]);
    await fixture.whenStable();
    (form.querySelector('mat-select .mat-mdc-select-trigger') as HTMLElement).click();
    await fixture.whenStable();
    const option = [...document.querySelectorAll('mat-option')].find((o) => o.textContent?.trim() === '84 ft heavy harrow') as HTMLElement;
    option.click();
    await fixture.whenStable();
    // ASABE D497.7 Table 3, from memory: spring-tooth harrow 7.0 mph, 85 %.
    expect(changes.at(-1)).toMatchObject({ implementId: 4, implementKind: 'harrow', width: 84, speed: 7, efficiencyPct: 85 });
  });

  it('when the defaults are asked for, then speed, efficiency and turn time come back with their source shown', async () => {
    expect(form.textContent).toContain('ASABE D497.7 Table 3, from memory (spring-tooth harrow)');
    expect(form.textContent).toContain('common practice, no published source');
    [...form.querySelectorAll('button')].find((b) => b.textContent?.trim() === 'Use the defaults')?.click();
    await fixture.whenStable();
    expect(changes.at(-1)).toMatchObject({ speed: 7, efficiencyPct: 85, turnSeconds: 20 });
  });

  it('when read-only, then the settings show as text with no inputs', async () => {
    fixture.componentRef.setInput('readonly', true);
    await fixture.whenStable();
    expect(form.querySelectorAll('input')).toHaveLength(0);
    const rows = Object.fromEntries(
      [...form.querySelectorAll('dt')].map((dt) => [dt.textContent?.trim(), dt.nextElementSibling?.textContent?.trim()]),
    );
    expect(rows).toMatchObject({
      // As every width and speed reads (shared/figures.ts): 0.1 ft, 0.1 mph.
      'Working width': '60.0 ft',
      Heading: '87.4° (auto: least field time, along an edge when nearly as fast)',
      Coverage: 'Gaps allowed',
      Speed: '8.0 mph',
    });
  });

  it('when the width typed is not the chosen implement width, then a warning says both', async () => {
    fixture.componentRef.setInput('implements', [HARROW]);
    fixture.componentRef.setInput('settings', { ...SETTINGS, implementId: 4, width: 60 });
    await fixture.whenStable();
    // 25.6032 m = 84 ft (1 ft = 0.3048 m exactly).
    expect(form.querySelector('.width-warning')?.textContent).toContain('84 ft heavy harrow works 84.0 ft; this plan uses 60.0 ft.');
    fixture.componentRef.setInput('settings', { ...SETTINGS, implementId: 4, width: 84 });
    await fixture.whenStable();
    expect(form.querySelector('.width-warning')).toBeNull();
  });

  it('when a saved plan is read-only and its width is not its implement width, then both show', async () => {
    fixture.componentRef.setInput('readonly', true);
    fixture.componentRef.setInput('settings', { ...SETTINGS, implementId: 4, width: 60 });
    fixture.componentRef.setInput('savedImplement', { name: 'Borrowed harrow', widthM: 21.336 });
    await fixture.whenStable();
    const width = [...form.querySelectorAll('dt')].find((dt) => dt.textContent?.trim() === 'Working width')?.nextElementSibling;
    expect(width?.textContent).toContain('60.0 ft');
    expect(width?.textContent).toContain('Borrowed harrow works 70.0 ft; this plan uses 60.0 ft.');
  });

  it('when a problem is given for the heading, then the heading box is marked with it as typed', async () => {
    fixture.componentRef.setInput('settings', { ...SETTINGS, autoHeading: false, headingDeg: 200 });
    fixture.componentRef.setInput('problems', { heading: 'Enter a heading from 0 to 179°' });
    await fixture.whenStable();
    expect(input('heading').getAttribute('aria-invalid')).toBe('true');
    expect(form.querySelector('.heading mat-error')?.textContent?.trim()).toBe('Enter a heading from 0 to 179°');
    expect(input('width').getAttribute('aria-invalid')).toBe('false');
  });

  it('when the best headings are offered, then each shows its time, passes and turns, and Use takes it', async () => {
    fixture.componentRef.setInput('headingUsed', 90);
    fixture.componentRef.setInput('candidates', [
      { headingDeg: 90, passCount: 84, segmentCount: 113, turns: 112, passLengthM: 1, hours: 17.952, alongEdge: true },
      { headingDeg: 80.5377, passCount: 97, segmentCount: 111, turns: 110, passLengthM: 1, hours: 17.901, alongEdge: false },
    ]);
    await fixture.whenStable();
    const rows = [...form.querySelectorAll('table.candidates tbody tr')].map((tr) =>
      [...tr.querySelectorAll('th, td')].map((c) => c.textContent?.replace(/\s+/g, ' ').trim()),
    );
    expect(rows).toEqual([
      ['90.0° along an edge auto', '18.0 h', '84', '112', 'In use'],
      ['80.5°', '17.9 h', '97', '110', 'Use'],
    ]);
    (form.querySelector('button[aria-label="Use heading 80.5°"]') as HTMLButtonElement).click();
    await fixture.whenStable();
    expect(changes.at(-1)).toMatchObject({ autoHeading: false, headingDeg: 80.5 });
  });
});
