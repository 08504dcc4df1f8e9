import { FormControl, FormGroup, type ValidationErrors, type ValidatorFn, Validators } from '@angular/forms';
import { newPassword } from '@shared/schemas/auth';
import type { FormFields } from '../../shared/forms/field-labels';
import { zodValidator } from '../../shared/forms/zod-validator';

export type PasswordPair = FormGroup<{
  password: FormControl<string>;
  confirm: FormControl<string>;
}>;

/** Marks the confirmation field when the two entries differ. */
export const passwordsMatch: ValidatorFn = (group): ValidationErrors | null => {
  const password = group.get('password')?.value;
  const confirm = group.get('confirm');
  if (!confirm) return null;
  const mismatch = !!confirm.value && password !== confirm.value;
  const { mismatch: _old, ...others } = confirm.errors ?? {};
  confirm.setErrors(mismatch ? { ...others, mismatch: true } : Object.keys(others).length ? others : null);
  return mismatch ? { mismatch: true } : null;
};

/** A new password typed twice, checked by the same rule the server applies (at least 10 characters). */
export function passwordPair(): PasswordPair {
  return new FormGroup(
    {
      password: new FormControl('', {
        nonNullable: true,
        validators: [Validators.required, zodValidator(newPassword)],
      }),
      confirm: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    },
    { validators: passwordsMatch },
  );
}

/** Each key of the set-password body (new password, invitation) and the box it is typed in, by its label. */
export const SET_PASSWORD_FIELDS: FormFields = {
  token: { control: 'token', label: 'The link from your e-mail' },
  password: { control: 'passwords.password', label: 'New password' },
  name: { control: 'name', label: 'Your name' },
};
