import type { Implement } from '@shared/schemas/fleet';
import { FIELD, savedPlan } from './plan-fixtures';
import { planPreviewBody } from '@shared/schemas/plans';
import { placeServerErrors } from '../../shared/forms/field-labels';
import { ApiError } from '../../core/http/api-error';
import {
  PASS_PLAN_FIELDS,
  type PlanSettings,
  defaultSettings,
  sameAsSaved,
  settingsBody,
  settingsFromSaved,
  settingsInUnits,
  settingsProblems,
  toPlanInput,
} from './plan-settings';

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

const US: PlanSettings = {
  implementId: null,
  implementKind: 'harrow',
  width: 60,
  headlandPasses: 2,
  autoHeading: false,
  headingDeg: 35,
  speed: 7,
  efficiencyPct: 85,
  turnSeconds: 20,
  coverage: 'gaps-ok',
  edgeMarginPct: 3,
};

describe('plan settings', () => {
  it('when the farm uses feet and mph, then the input is in metres, metres per second and a fraction', () => {
    // 1 ft = 0.3048 m exactly (NIST & NOAA/NGS, 85 FR 62698); 1 mph = 0.447 04 m/s exactly (NIST
    // Handbook 44, Appendix C: 1 mile = 1,609.344 m).
    const input = toPlanInput(US, FIELD, 'us');
    expect(input.widthM).toBeCloseTo(18.288, 9);
    expect(input.speedMps).toBeCloseTo(3.12928, 12);
    expect(input.efficiency).toBeCloseTo(0.85, 12);
    expect(input.headingDeg).toBe(35);
    expect(input.headlandPasses).toBe(2);
    expect(input.implementKind).toBe('harrow');
    expect(input.coverage).toBe('gaps-ok');
    expect(input.boundary).toBe(FIELD.boundary);
    expect(input.hazards).toBe(FIELD.hazards);
    expect(input.fieldName).toBe('Home Quarter');
    expect('implementId' in input).toBe(false);
  });

  it('when the farm is metric, then metres stay metres and km/h become metres per second', () => {
    // 1 km/h = 1,000 m / 3,600 s, so 12 km/h = 3.333… m/s.
    const body = settingsBody({ ...US, width: 12, speed: 12, autoHeading: true }, 'metric');
    expect(body.widthM).toBe(12);
    expect(body.speedMps).toBeCloseTo(12_000 / 3_600, 12);
    expect(body.headingDeg).toBe('auto');
  });

  it('when a box is empty, then the error names it in the farm units', () => {
    expect(() => toPlanInput({ ...US, width: null }, FIELD, 'us')).toThrow('Enter the working width in feet.');
    expect(() => settingsBody({ ...US, width: null }, 'metric')).toThrow('Enter the working width in metres.');
    expect(() => settingsBody({ ...US, speed: null }, 'metric')).toThrow('Enter the working speed in km/h.');
    expect(() => settingsBody({ ...US, headlandPasses: null }, 'us')).toThrow(/headland passes/);
  });

  it('when out-of-range values are typed, then they pass through for the planner to explain', () => {
    expect(settingsBody({ ...US, width: -5, headingDeg: 200 }, 'us')).toMatchObject({ widthM: -5 * 0.3048, headingDeg: 200 });
  });

  it('when an operation is chosen on a farm with a fleet, then its implement, width and the coverage rule are the defaults', () => {
    const s = defaultSettings('harrowing', [HARROW], 'us');
    expect(s).toMatchObject({
      implementId: 4,
      implementKind: 'harrow',
      width: 84,
      coverage: 'gaps-ok',
      autoHeading: true,
      headlandPasses: 2,
    });
    // ASABE D497.7 Table 3, from memory: spring-tooth harrow 7.0 mph, 85 %.
    expect(s).toMatchObject({ speed: 7, efficiencyPct: 85, turnSeconds: 20 });
  });

  it('when there is no fleet implement for it, then the kind comes from the operation and the width is empty', () => {
    const s = defaultSettings('seeding', [HARROW], 'metric');
    expect(s).toMatchObject({ implementId: null, implementKind: 'air-drill', width: null, coverage: 'full' });
    // 5 mph = 8.04672 km/h.
    expect(s.speed).toBe(8);
  });

  it('when a plan is saved, then the form reads it back and matches it', () => {
    const saved = savedPlan({ headingDeg: null, implementId: 4 });
    const s = settingsFromSaved(saved, [HARROW], 'us');
    expect(s).toMatchObject({
      implementId: 4,
      implementKind: 'harrow',
      width: 84,
      autoHeading: true,
      headingDeg: 90,
      speed: 7,
      efficiencyPct: 85,
    });
    expect(sameAsSaved(s, saved, 'us')).toBe(true);
    expect(sameAsSaved({ ...s, autoHeading: false }, saved, 'us')).toBe(false);
    expect(sameAsSaved({ ...s, width: 80 }, saved, 'us')).toBe(false);
    expect(sameAsSaved({ ...s, width: null }, saved, 'us')).toBe(false);
  });

  it('when the API body has a key, then the form maps it to a box and its label (so a refusal never shows the key)', () => {
    for (const key of Object.keys(planPreviewBody.shape)) {
      expect(PASS_PLAN_FIELDS[key]?.label).toMatch(/^[A-Z][a-z ]+$/);
    }
  });

  it('when the server names keys, then the boxes get the messages and the sentence names the labels only', () => {
    const err = new ApiError(400, 'invalid_input', 'Check the form: widthM: too wide', {
      widthM: 'Too wide',
      headingDeg: 'Enter a heading from 0 to 179°',
    });
    const placed = placeServerErrors(err, PASS_PLAN_FIELDS);
    expect(placed.byControl).toEqual({ width: 'Too wide', heading: 'Enter a heading from 0 to 179°' });
    expect(placed.message).toBe('Check Working width and Heading.');
    const unknown = placeServerErrors(
      new ApiError(400, 'invalid_input', 'Check the form: colour: no', { colour: 'No such thing' }),
      PASS_PLAN_FIELDS,
    );
    expect(unknown).toEqual({ byControl: {}, message: 'No such thing' });
  });

  it('when the heading typed is outside 0 to 179, then the heading box says so, in plain words', () => {
    expect(settingsProblems({ ...US, headingDeg: 180 }, 'us').byControl).toEqual({ heading: 'Enter a heading from 0 to 179°' });
    expect(settingsProblems({ ...US, headingDeg: -1 }, 'us').message).toBe('Check Heading: Enter a heading from 0 to 179°');
    expect(settingsProblems({ ...US, autoHeading: true, headingDeg: 400 }, 'us').byControl).toEqual({});
    expect(settingsProblems({ ...US, width: null }, 'metric')).toEqual({
      byControl: { width: 'Enter the working width in metres' },
      message: 'Fill in Working width.',
    });
  });

  describe('units switched on a saved plan', () => {
    // 1 ft = 0.3048 m and 1 mile = 1,609.344 m exactly (NIST Handbook 44, Appendix C): 84 ft is
    // 25.6032 m; 5.3 mph is 2.369 312 m/s and 8.529 523 2 km/h, which the box shows as 8.5.
    const saved = savedPlan({ widthM: 25.6032, speedMps: 2.369312 });

    it('when a saved plan is shown in metric and saved untouched, then its stored width and speed go back unchanged', () => {
      const metric = settingsFromSaved(saved, [], 'metric');
      expect([metric.width, metric.speed]).toEqual([25.6, 8.5]);
      const body = settingsBody(metric, 'metric');
      expect([body.widthM, body.speedMps]).toEqual([25.6032, 2.369312]);
    });

    it('when the units switch imperial → metric → imperial, then the stored width and speed never change', () => {
      const us = settingsFromSaved(saved, [], 'us');
      const metric = settingsInUnits(us, 'us', 'metric');
      const back = settingsInUnits(metric, 'metric', 'us');
      for (const [s, system] of [
        [us, 'us'],
        [metric, 'metric'],
        [back, 'us'],
      ] as const) {
        const body = settingsBody(s, system);
        expect({ system, widthM: body.widthM, speedMps: body.speedMps }).toEqual({ system, widthM: 25.6032, speedMps: 2.369312 });
      }
      expect([us.speed, metric.speed, back.speed]).toEqual([5.3, 8.5, 5.3]);
      expect([back.width, back.speed]).toEqual([us.width, us.speed]);
      expect(sameAsSaved(metric, saved, 'metric')).toBe(true);
    });

    it('when a box is typed after a switch, then the typed value is what is saved, in the units it was typed in', () => {
      const metric = settingsInUnits(settingsFromSaved(saved, [], 'us'), 'us', 'metric');
      const body = settingsBody({ ...metric, width: 24, speed: 10 }, 'metric');
      expect(body.widthM).toBe(24);
      expect(body.speedMps).toBeCloseTo(10 / 3.6, 12);
      // And a typed value survives a switch back: 24 m = 78.74 ft → 78.7 in the box, 24 m stored.
      const back = settingsInUnits({ ...metric, width: 24 }, 'metric', 'us');
      expect(back.width).toBe(78.7);
      expect(settingsBody(back, 'us').widthM).toBe(24);
    });
  });
});
