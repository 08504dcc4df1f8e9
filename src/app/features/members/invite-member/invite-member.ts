import { ChangeDetectionStrategy, Component, inject, output } from '@angular/core';
import { type FormGroupDirective, FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { Member, Role } from '@shared/schemas/auth';
import { email } from '@shared/schemas/common';
import type { FormFields } from '../../../shared/forms/field-labels';
import { FormSubmission } from '../../../shared/forms/form-submission';
import { zodValidator } from '../../../shared/forms/zod-validator';
import { MembersApi } from '../members-api';
import { ROLE_OPTIONS } from '../role-labels';
import { requiredText } from '../../../shared/forms/required-text';

/** Each key of the invitation's API body and the box it is typed in, by its label. */
export const INVITE_FIELDS: FormFields = {
  name: { control: 'name', label: 'Name' },
  email: { control: 'email', label: 'E-mail' },
  role: { control: 'role', label: 'Role' },
};

/** Invites a person by e-mail; the server mails them a link to /accept-invitation. */
@Component({
  selector: 'app-invite-member',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatFormFieldModule, MatInputModule, MatSelectModule, ReactiveFormsModule],
  templateUrl: './invite-member.html',
  host: { class: 'inline-form' },
})
export class InviteMember {
  private readonly api = inject(MembersApi);

  readonly invited = output<Member>();

  protected readonly roles = ROLE_OPTIONS;
  protected readonly form = new FormGroup({
    name: new FormControl('', {
      nonNullable: true,
      validators: [requiredText, Validators.maxLength(120)],
    }),
    email: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, zodValidator(email)],
    }),
    role: new FormControl<Role>('operator', { nonNullable: true }),
  });
  private readonly submission = new FormSubmission(this.form, INVITE_FIELDS);
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;
  protected readonly blocked = this.submission.blocked;

  protected hintFor(role: Role): string {
    return this.roles.find((option) => option.value === role)?.hint ?? '';
  }

  protected submit(directive: FormGroupDirective): void {
    if (!this.submission.ready()) return;
    const { name, email: address, role } = this.form.getRawValue();
    this.submission.send(this.api.invite({ name: name.trim(), email: address.trim().toLowerCase(), role }), (member) => {
      directive.resetForm({ name: '', email: '', role: 'operator' });
      this.invited.emit(member);
    });
  }
}
