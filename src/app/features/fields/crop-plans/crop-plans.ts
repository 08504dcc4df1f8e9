import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { CROPS } from '@shared/schemas/fields';
import type { Observable } from 'rxjs';
import { messageOf } from '../../../core/http/api-error';
import type { CropPlan } from '@shared/schemas/fields';
import { FieldsApi } from '../fields-api';
import { seasonChoices } from '../seasons';
import { AuthStore } from '../../../core/auth/auth-store';

/** The crop planned on a field for each season; the owner sets or clears a season's crop. */
@Component({
  selector: 'app-crop-plans',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, ReactiveFormsModule],
  templateUrl: './crop-plans.html',
  styleUrl: './crop-plans.scss',
})
export class CropPlans {
  private readonly api = inject(FieldsApi);

  readonly fieldId = input.required<number>();
  readonly crops = input<readonly CropPlan[]>([]);
  readonly canEdit = input(false);
  /** Something was saved: the page reloads the field. */
  readonly changed = output<void>();

  protected readonly cropNames = CROPS;
  private readonly thisSeason = inject(AuthStore).currentSeason();
  protected readonly seasons = seasonChoices(this.thisSeason);
  protected readonly sorted = computed(() => [...this.crops()].sort((a, b) => b.season - a.season));
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);
  protected readonly form = new FormGroup({
    season: new FormControl(this.thisSeason, { nonNullable: true }),
    crop: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    varietyNote: new FormControl('', { nonNullable: true, validators: [Validators.maxLength(200)] }),
  });

  /** Picking a season that has a plan fills in its crop and note to edit. */
  protected pickSeason(season: number): void {
    const plan = this.crops().find((c) => c.season === season);
    this.form.patchValue({ crop: plan?.crop ?? '', varietyNote: plan?.varietyNote ?? '' });
  }

  protected save(): void {
    if (this.busy()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { season, crop, varietyNote } = this.form.getRawValue();
    this.run(this.api.setCrop(this.fieldId(), season, { crop, varietyNote: varietyNote.trim() || null }));
  }

  protected clear(plan: CropPlan): void {
    this.run(this.api.clearCrop(this.fieldId(), plan.season));
  }

  private run(request: Observable<unknown>): void {
    this.busy.set(true);
    this.error.set(null);
    request.subscribe({
      next: () => {
        this.busy.set(false);
        this.changed.emit();
      },
      error: (err: unknown) => {
        this.busy.set(false);
        this.error.set(messageOf(err));
      },
    });
  }
}
