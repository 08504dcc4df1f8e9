import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { OPERATION_INFO, OPERATIONS, type Operation } from '@shared/operations';
import { type CostSettingsAnswer, fuelCostBody } from '@shared/schemas/costs';
import { AuthStore } from '../../../core/auth/auth-store';
import { API } from '../../../core/http/api-paths';
import { messageOf } from '../../../core/http/api-error';
import type { FormFields } from '../../../shared/forms/field-labels';
import { FormSubmission } from '../../../shared/forms/form-submission';
import { amountValidator, boxProblem, centsOf, dollarsText, gallonsOf } from '../cost-amounts';
import { HourlyCostRow, type HourlyCostKind } from '../hourly-cost-row/hourly-cost-row';

const label = (op: Operation) => OPERATION_INFO[op].label;

/**
 * Each key of the fuel body and the box it is typed in, by its label: one box per operation
 * (`galPerAcre` itself has no box of its own; it is named through its operations).
 */
export const FUEL_COST_FIELDS: FormFields = {
  fuelPriceCents: { control: 'fuelPrice', label: 'Diesel price' },
  ...Object.fromEntries(OPERATIONS.map((op) => [`galPerAcre.${op}`, { control: `galPerAcre.${op}`, label: `${label(op)} fuel` }])),
};

/** One list of hourly costs (machines or people): the same rows, the same form. */
interface HourlyGroup {
  kind: HourlyCostKind;
  heading: string;
  empty: string | null;
  rows: Array<{ id: number; name: string; cents: number | null }>;
}

/**
 * What the farm's own work costs: the diesel price, fuel per acre for each operation (a published
 * default, with its source, unless the owner changed it), and an hourly cost per machine and per
 * person. The owner edits; others who may see money read. Amounts are typed in dollars and sent
 * as whole cents; each box is checked with the route's own schema before anything is sent.
 */
@Component({
  selector: 'app-work-costs',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [HourlyCostRow, MatButtonModule, ReactiveFormsModule],
  templateUrl: './work-costs.html',
  styleUrl: './work-costs.scss',
})
export class WorkCostsForm {
  private readonly http = inject(HttpClient);
  protected readonly isOwner = inject(AuthStore).isOwner;

  protected readonly settings = signal<CostSettingsAnswer | null>(null);
  protected readonly loadError = signal<string | null>(null);
  protected readonly saved = signal<string | null>(null);
  protected readonly label = label;
  protected readonly boxProblem = boxProblem;

  protected readonly fuel = new FormGroup({
    fuelPrice: new FormControl('', {
      nonNullable: true,
      validators: [amountValidator(centsOf, fuelCostBody.shape.fuelPriceCents, 'Type the fuel price in dollars and cents, such as 3.85')],
    }),
    galPerAcre: new FormGroup(
      Object.fromEntries(
        OPERATIONS.map((op) => [
          op,
          new FormControl('', {
            nonNullable: true,
            validators: [
              amountValidator(
                gallonsOf,
                fuelCostBody.shape.galPerAcre.shape[op],
                `Type the fuel use for ${label(op).toLowerCase()} in gallons per acre, such as 0.35`,
              ),
            ],
          }),
        ]),
      ) as Record<Operation, FormControl<string>>,
    ),
  });
  private readonly fuelSubmission = new FormSubmission(this.fuel, FUEL_COST_FIELDS);
  protected readonly fuelError = this.fuelSubmission.error;
  protected readonly fuelBusy = this.fuelSubmission.busy;
  protected readonly fuelBlocked = this.fuelSubmission.blocked;

  /** Machines and people: one list each, drawn by the same rows. */
  protected readonly hourly = computed<HourlyGroup[]>(() => {
    const s = this.settings();
    if (!s) return [];
    return [
      {
        kind: 'machine',
        heading: 'Machines ($ per engine hour, ownership and operating, fuel apart)',
        empty: 'No machines in the fleet yet.',
        rows: s.machines.map((m) => ({ id: m.machineId, name: m.name, cents: m.hourlyCents })),
      },
      {
        kind: 'person',
        heading: 'People ($ per hour worked)',
        empty: null,
        rows: s.people.map((p) => ({ id: p.membershipId, name: p.name, cents: p.hourlyCents })),
      },
    ];
  });

  constructor() {
    this.http.get<CostSettingsAnswer>(API.costs).subscribe({
      next: (s) => this.show(s),
      error: (e: unknown) => this.loadError.set(messageOf(e)),
    });
  }

  protected galControl(op: Operation): FormControl<string> {
    return this.fuel.controls.galPerAcre.controls[op];
  }

  /** Saves the fuel price and every operation's gallons per acre together. */
  protected saveFuel(): void {
    if (!this.fuelSubmission.ready()) return;
    const v = this.fuel.getRawValue();
    const body = {
      fuelPriceCents: centsOf(v.fuelPrice) ?? null,
      galPerAcre: Object.fromEntries(OPERATIONS.map((op) => [op, gallonsOf(v.galPerAcre[op])])),
    };
    this.saved.set(null);
    this.fuelSubmission.send(this.http.put<CostSettingsAnswer>(API.costsFuel, body), (s) => {
      this.show(s);
      this.saved.set('Fuel saved.');
    });
  }

  protected resetFuel(op: Operation, value: number): void {
    const control = this.galControl(op);
    control.setValue(String(value));
    control.markAsDirty();
  }

  protected hourlySaved(answer: CostSettingsAnswer, name: string): void {
    this.settings.set(answer);
    this.saved.set(`${name}: saved.`);
  }

  /** Shows the costs as saved; the fuel boxes take the saved figures. */
  private show(s: CostSettingsAnswer): void {
    this.settings.set(s);
    this.fuel.reset({
      fuelPrice: dollarsText(s.fuelPriceCents),
      galPerAcre: Object.fromEntries(s.fuel.map((f) => [f.operation, String(f.galPerAcre)])),
    });
  }
}
