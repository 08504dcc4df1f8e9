import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { type MatSelect, MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import type { Member, Role } from '@shared/schemas/auth';
import { filter, switchMap } from 'rxjs';
import { AuthStore } from '../../../core/auth/auth-store';
import { messageOf } from '../../../core/http/api-error';
import { ConfirmDialog, type ConfirmDialogData } from '../../../shared/ui/confirm-dialog/confirm-dialog';
import { BackgroundJobs } from '../background-jobs/background-jobs';
import { FarmSettingsForm } from '../farm-settings/farm-settings';
import { InviteMember } from '../invite-member/invite-member';
import { MEMBERS_URL, MembersApi } from '../members-api';
import { ROLE_OPTIONS } from '../role-labels';
import { WeatherLimitsForm } from '../weather-limits/weather-limits';
import { WorkCostsForm } from '../work-costs/work-costs';

/** The owner's page for the farm: its settings, and who belongs to it (invite, change role, remove; history stays). */
@Component({
  selector: 'app-members-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    BackgroundJobs,
    FarmSettingsForm,
    InviteMember,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    MatSelectModule,
    MatTableModule,
    WeatherLimitsForm,
    WorkCostsForm,
  ],
  templateUrl: './members-page.html',
  styleUrl: './members-page.scss',
})
export class MembersPage {
  private readonly api = inject(MembersApi);
  private readonly auth = inject(AuthStore);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly members = httpResource<Member[]>(() => MEMBERS_URL, { defaultValue: [] });
  // value() throws while the resource is in error, so read it only when there is one.
  protected readonly rows = computed(() =>
    this.members.hasValue() ? [...this.members.value()].sort((a, b) => a.name.localeCompare(b.name)) : [],
  );
  protected readonly loadError = computed(() => {
    const error = this.members.error();
    return error ? messageOf(error) : null;
  });
  protected readonly myUserId = computed(() => this.auth.user()?.id ?? null);
  protected readonly roles = ROLE_OPTIONS;
  protected readonly columns = ['name', 'email', 'role', 'status', 'actions'];

  protected added(member: Member): void {
    this.edit((list) => [...list.filter((m) => m.id !== member.id), member]);
    this.tell(`Invitation sent to ${member.email}.`);
  }

  protected changeRole(member: Member, role: Role, select: MatSelect): void {
    if (role === member.role) return;
    this.api.changeRole(member.id, role).subscribe({
      next: (saved) => {
        this.replace(saved);
        this.tell(`${saved.name} is now ${saved.role === 'owner' ? 'an' : 'a'} ${saved.role}.`);
      },
      error: (err: unknown) => {
        select.value = member.role;
        this.tell(messageOf(err));
      },
    });
  }

  protected remove(member: Member): void {
    const data: ConfirmDialogData = {
      title: `Remove ${member.name}?`,
      message: `${member.name} will no longer sign in to this farm. The work they logged stays in the season's history.`,
      confirm: 'Remove',
    };
    this.dialog
      .open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data, autoFocus: 'dialog' })
      .afterClosed()
      .pipe(
        filter((confirmed) => confirmed === true),
        switchMap(() => this.api.remove(member.id)),
      )
      .subscribe({
        next: () => {
          this.edit((list) => list.filter((m) => m.id !== member.id));
          this.tell(`${member.name} was removed.`);
        },
        error: (err: unknown) => this.tell(messageOf(err)),
      });
  }

  private replace(saved: Member): void {
    this.edit((list) => list.map((m) => (m.id === saved.id ? saved : m)));
  }

  /** Applies a saved change locally; after a failed load, asks the server again instead. */
  private edit(change: (list: Member[]) => Member[]): void {
    if (this.members.hasValue()) this.members.update(change);
    else this.members.reload();
  }

  private tell(message: string): void {
    this.snackBar.open(message, 'Close', { duration: 6000 });
  }
}
