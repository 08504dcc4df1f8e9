import { type ComponentFixture, TestBed } from '@angular/core/testing';
import type { Machine } from '@shared/schemas/fleet';
import { MachinesTable } from './machines-table';

const machine = (over: Partial<Machine>): Machine => ({
  id: 1,
  name: 'Big four',
  kind: 'tractor-4wd',
  powerHp: 520,
  engineHours: 1000,
  serviceIntervalHours: 250,
  hoursAtLastService: 900,
  serviceDueInHours: 150,
  serviceWarning: null,
  notes: null,
  ...over,
});

describe('MachinesTable', () => {
  let fixture: ComponentFixture<MachinesTable>;
  let el: HTMLElement;

  async function show(machines: Machine[], editable = false): Promise<void> {
    fixture = TestBed.createComponent(MachinesTable);
    fixture.componentRef.setInput('machines', machines);
    fixture.componentRef.setInput('editable', editable);
    el = fixture.nativeElement as HTMLElement;
    await fixture.whenStable();
  }

  const serviceCell = (row: number) => el.querySelectorAll('tr.mat-mdc-row')[row].querySelector('.mat-column-service') as HTMLElement;

  it('when a machine is past its service hours, then an overdue warning chip shows the server words', async () => {
    await show([machine({ engineHours: 1160, serviceDueInHours: -10, serviceWarning: 'Service overdue by 10 h' })]);
    const chip = serviceCell(0).querySelector('.chip');
    expect(chip?.classList).toContain('overdue');
    expect(chip?.textContent).toContain('Service overdue by 10 h');
  });

  it('when a service is near, then a "soon" chip shows; when it is far, then plain hours show', async () => {
    await show([
      machine({ id: 1, serviceDueInHours: 12, serviceWarning: 'Service due in 12 h' }),
      machine({ id: 2, name: 'Row crop', serviceDueInHours: 150 }),
      machine({ id: 3, name: 'Old one', serviceIntervalHours: null, serviceDueInHours: null }),
    ]);
    expect(serviceCell(0).querySelector('.chip.soon')?.textContent).toContain('Service due in 12 h');
    expect(serviceCell(1).querySelector('.chip')).toBeNull();
    expect(serviceCell(1).textContent?.trim()).toBe('Service due in 150.0 h');
    expect(serviceCell(2).textContent?.trim()).toBe('No interval kept');
  });

  it('when the table is read-only, then there are no edit or delete buttons; when editable, then each row has them', async () => {
    await show([machine({})]);
    expect(el.querySelectorAll('button')).toHaveLength(0);
    expect(el.querySelector('.mat-column-power')?.textContent).toBeDefined();
    await show([machine({})], true);
    expect(el.querySelector('[aria-label="Edit Big four"]')).not.toBeNull();
    expect(el.querySelector('[aria-label="Delete Big four"]')).not.toBeNull();
  });
});
