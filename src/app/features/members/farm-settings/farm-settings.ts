import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, effect, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatAutocompleteModule } from '@angular/material/autocomplete';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import type { UnitSystem } from '@shared/schemas/auth';
import { type FarmSettings, timeZone } from '@shared/schemas/farm';
import { AuthStore } from '../../../core/auth/auth-store';
import { messageOf } from '../../../core/http/api-error';
import type { FormFields } from '../../../shared/forms/field-labels';
import { FormSubmission } from '../../../shared/forms/form-submission';
import { zodValidator } from '../../../shared/forms/zod-validator';
import { FARM_URL, FarmApi } from '../farm-api';
import { clockIn, timeZoneChoices } from './time-zones';
import { requiredText } from '../../../shared/forms/required-text';

/** Each key of the farm settings's API body and the box it is typed in, by its label. */
export const FARM_SETTINGS_FIELDS: FormFields = {
  name: { control: 'name', label: 'Farm name' },
  units: { control: 'units', label: 'Units' },
  dayHoursLimit: { control: 'dayHoursLimit', label: 'Hours in a working day' },
  timeZone: { control: 'timeZone', label: 'Time zone' },
};

/**
 * The owner's settings for the farm as a whole: its name, units, how many hours one person may be
 * planned for in a day (the board warns above it) and its time zone (which day is "tomorrow").
 */
@Component({
  selector: 'app-farm-settings',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatAutocompleteModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatSelectModule, ReactiveFormsModule],
  templateUrl: './farm-settings.html',
  styleUrl: './farm-settings.scss',
  host: { class: 'inline-form' },
})
export class FarmSettingsForm {
  private readonly api = inject(FarmApi);
  private readonly auth = inject(AuthStore);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly farm = httpResource<FarmSettings>(() => FARM_URL);
  protected readonly loadError = computed(() => {
    const error = this.farm.error();
    return error ? messageOf(error) : null;
  });

  protected readonly form = new FormGroup({
    name: new FormControl('', { nonNullable: true, validators: [requiredText, Validators.maxLength(160)] }),
    units: new FormControl<UnitSystem>('us', { nonNullable: true }),
    dayHoursLimit: new FormControl(12, { nonNullable: true, validators: [Validators.required, Validators.min(1), Validators.max(24)] }),
    timeZone: new FormControl('America/Chicago', { nonNullable: true, validators: [Validators.required, zodValidator(timeZone)] }),
  });
  private readonly submission = new FormSubmission(this.form, FARM_SETTINGS_FIELDS);
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;
  protected readonly blocked = this.submission.blocked;

  private readonly zones = timeZoneChoices();
  private readonly typedZone = toSignal(this.form.controls.timeZone.valueChanges, { initialValue: this.form.controls.timeZone.value });
  protected readonly zoneOptions = computed(() => {
    const typed = this.typedZone().trim().toLowerCase().replaceAll(' ', '_');
    const matches =
      typed && !this.zones.includes(this.typedZone()) ? this.zones.filter((z) => z.toLowerCase().includes(typed)) : this.zones;
    return matches.slice(0, 60);
  });
  protected readonly clock = computed(() => {
    const zone = this.typedZone();
    return this.form.controls.timeZone.valid ? `Now at the farm: ${clockIn(zone)}` : '';
  });

  constructor() {
    // Fill the form from the server each time the settings are (re)loaded.
    effect(() => {
      if (!this.farm.hasValue()) return;
      const f = this.farm.value();
      this.form.reset({ name: f.name, units: f.units, dayHoursLimit: f.dayHoursLimit, timeZone: f.timeZone });
    });
  }

  protected submit(): void {
    if (!this.submission.ready()) return;
    const v = this.form.getRawValue();
    const patch = { name: v.name.trim(), units: v.units, dayHoursLimit: Number(v.dayHoursLimit), timeZone: v.timeZone.trim() };
    this.submission.send(this.api.save(patch), (saved) => {
      this.farm.set(saved);
      this.auth.farmChanged(saved);
      this.snackBar.open('Farm settings saved.', 'OK', { duration: 4000 });
    });
  }
}
