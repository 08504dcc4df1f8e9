import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { planResult } from '../plan-fixtures';
import { PlanSummary } from './plan-summary';

describe('PlanSummary', () => {
  let fixture: ComponentFixture<PlanSummary>;
  let card: HTMLElement;

  beforeEach(async () => {
    fixture = TestBed.createComponent(PlanSummary);
    card = fixture.nativeElement as HTMLElement;
    await fixture.whenStable();
  });

  const figure = (key: string) => card.querySelector(`[data-key="${key}"] .value`)?.textContent?.trim();

  it('when there is no plan yet, then it says where the figures will be', () => {
    expect(card.textContent).toContain('The figures show here once the plan is worked out.');
  });

  it('when a plan arrives, then its figures and warnings show in the farm units', async () => {
    fixture.componentRef.setInput('result', planResult({ warnings: ['The headland takes 8 % of the field'] }));
    fixture.componentRef.setInput('system', 'metric');
    await fixture.whenStable();
    expect(figure('field')).toBe('64.6 ha');
    expect(figure('passes')).toBe('31');
    expect(figure('capacity')).toBe('20.8 ha/h');
    expect(card.querySelector('[aria-label="Warnings"]')?.textContent).toContain('The headland takes 8 % of the field');
  });

  it('when the planner refuses the settings, then its message shows in place of the numbers', async () => {
    fixture.componentRef.setInput('result', planResult());
    fixture.componentRef.setInput('error', "The working width of 3000 ft is wider than field 'Home Quarter'");
    await fixture.whenStable();
    expect(card.querySelector('[role="alert"]')?.textContent).toContain("The working width of 3000 ft is wider than field 'Home Quarter'");
    expect(card.querySelector('.figures')).toBeNull();
    expect(card.textContent).not.toContain('NaN');
  });

  it('when a newer plan is computing, then the card says so', async () => {
    fixture.componentRef.setInput('result', planResult());
    fixture.componentRef.setInput('computing', true);
    await fixture.whenStable();
    expect(card.querySelector('h2')?.textContent).toContain('working out');
    expect(card.querySelector('section')?.getAttribute('aria-busy')).toBe('true');
  });
});
