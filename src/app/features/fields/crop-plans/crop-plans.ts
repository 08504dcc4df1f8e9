import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { CROPS } from '@shared/schemas/fields';
import { CropPipe } from '../../../shared/units/crop-pipe';
import { messageOf } from '../../../core/http/api-error';
import type { CropPlan } from '@shared/schemas/fields';
import type { FormFields } from '../../../shared/forms/field-labels';
import { FormSubmission } from '../../../shared/forms/form-submission';
import { FieldsApi } from '../fields-api';
import { seasonChoices } from '../seasons';
import { AuthStore } from '../../../core/auth/auth-store';

/** Each key of the crop plan's API body and the box it is typed in, by its label (the season is in the address). */
export const CROP_PLAN_FIELDS: FormFields = {
  crop: { control: 'crop', label: 'Crop' },
  varietyNote: { control: 'varietyNote', label: 'Variety note' },
};

/** The crop planned on a field for each season; the owner sets or clears a season's crop. */
@Component({
  selector: 'app-crop-plans',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [CropPipe, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, ReactiveFormsModule],
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
  protected readonly form = new FormGroup({
    season: new FormControl(this.thisSeason, { nonNullable: true }),
    crop: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    varietyNote: new FormControl('', { nonNullable: true, validators: [Validators.maxLength(200)] }),
  });
  private readonly submission = new FormSubmission(this.form, CROP_PLAN_FIELDS);
  protected readonly blocked = this.submission.blocked;
  protected readonly error = this.submission.error;
  /** A season's crop being cleared from the table, and why that failed. */
  private readonly clearing = signal(false);
  protected readonly clearError = signal<string | null>(null);
  protected readonly busy = computed(() => this.submission.busy() || this.clearing());

  /** Picking a season that has a plan fills in its crop and note to edit. */
  protected pickSeason(season: number): void {
    const plan = this.crops().find((c) => c.season === season);
    this.form.patchValue({ crop: plan?.crop ?? '', varietyNote: plan?.varietyNote ?? '' });
  }

  protected save(): void {
    if (this.clearing() || !this.submission.ready()) return;
    const { season, crop, varietyNote } = this.form.getRawValue();
    this.submission.send(this.api.setCrop(this.fieldId(), season, { crop, varietyNote: varietyNote.trim() || null }), () =>
      this.changed.emit(),
    );
  }

  protected clear(plan: CropPlan): void {
    this.clearing.set(true);
    this.clearError.set(null);
    this.api.clearCrop(this.fieldId(), plan.season).subscribe({
      next: () => {
        this.clearing.set(false);
        this.changed.emit();
      },
      error: (err: unknown) => {
        this.clearing.set(false);
        this.clearError.set(messageOf(err));
      },
    });
  }
}
