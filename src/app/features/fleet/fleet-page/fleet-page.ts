import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import type { Implement, Machine } from '@shared/schemas/fleet';
import { type Observable, filter, switchMap } from 'rxjs';
import { AuthStore } from '../../../core/auth/auth-store';
import { messageOf } from '../../../core/http/api-error';
import { ConfirmDialog, type ConfirmDialogData } from '../../../shared/ui/confirm-dialog/confirm-dialog';
import { FleetApi, IMPLEMENTS_URL, MACHINES_URL } from '../fleet-api';
import { ImplementForm, type ImplementFormData } from '../implement-form/implement-form';
import { ImplementsTable } from '../implements-table/implements-table';
import { MachineForm, type MachineFormData } from '../machine-form/machine-form';
import { MachinesTable } from '../machines-table/machines-table';

const byName = <T extends { name: string }>(list: readonly T[]): T[] => [...list].sort((a, b) => a.name.localeCompare(b.name));

/** The farm's machines and implements: everyone reads them, the owner keeps them. */
@Component({
  selector: 'app-fleet-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ImplementsTable, MachinesTable, MatButtonModule, MatIconModule, MatProgressBarModule],
  templateUrl: './fleet-page.html',
  styleUrl: './fleet-page.scss',
})
export class FleetPage {
  private readonly api = inject(FleetApi);
  private readonly auth = inject(AuthStore);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly isOwner = this.auth.isOwner;
  protected readonly machines = httpResource<Machine[]>(() => MACHINES_URL, { defaultValue: [] });
  protected readonly implements = httpResource<Implement[]>(() => IMPLEMENTS_URL, { defaultValue: [] });
  // value() throws while a resource is in error, so read it only when there is one.
  protected readonly machineRows = computed(() => (this.machines.hasValue() ? byName(this.machines.value()) : []));
  protected readonly implementRows = computed(() => (this.implements.hasValue() ? byName(this.implements.value()) : []));
  protected readonly machinesError = computed(() => {
    const error = this.machines.error();
    return error ? messageOf(error) : null;
  });
  protected readonly implementsError = computed(() => {
    const error = this.implements.error();
    return error ? messageOf(error) : null;
  });

  protected editMachine(machine: Machine | null): void {
    this.dialog
      .open<MachineForm, MachineFormData, Machine>(MachineForm, { data: { machine }, width: '36rem', maxWidth: '95vw' })
      .afterClosed()
      .pipe(filter((saved): saved is Machine => !!saved))
      .subscribe((saved) => {
        this.edit(this.machines, (list) => [...list.filter((m) => m.id !== saved.id), saved]);
        this.tell(`${saved.name} is saved.`);
      });
  }

  protected editImplement(implement: Implement | null): void {
    const data: ImplementFormData = { implement, machines: this.machineRows() };
    this.dialog
      .open<ImplementForm, ImplementFormData, Implement>(ImplementForm, { data, width: '40rem', maxWidth: '95vw' })
      .afterClosed()
      .pipe(filter((saved): saved is Implement => !!saved))
      .subscribe((saved) => {
        this.edit(this.implements, (list) => [...list.filter((i) => i.id !== saved.id), saved]);
        this.tell(`${saved.name} is saved.`);
      });
  }

  protected removeMachine(machine: Machine): void {
    this.confirmThen(
      machine.name,
      'It is taken off the implements set up for it.',
      () => this.api.deleteMachine(machine.id),
      () => this.edit(this.machines, (list) => list.filter((m) => m.id !== machine.id)),
    );
  }

  protected removeImplement(implement: Implement): void {
    this.confirmThen(
      implement.name,
      'It leaves the fleet list.',
      () => this.api.deleteImplement(implement.id),
      () => this.edit(this.implements, (list) => list.filter((i) => i.id !== implement.id)),
    );
  }

  private confirmThen(name: string, detail: string, remove: () => Observable<void>, removed: () => void): void {
    const data: ConfirmDialogData = {
      title: `Delete ${name}?`,
      message: `${detail} One with jobs on the work board or in the season log cannot be deleted.`,
      confirm: 'Delete',
    };
    this.dialog
      .open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data, autoFocus: 'dialog' })
      .afterClosed()
      .pipe(
        filter((confirmed) => confirmed === true),
        switchMap(remove),
      )
      .subscribe({
        next: () => {
          removed();
          this.tell(`${name} was deleted.`);
        },
        error: (err: unknown) => this.tell(messageOf(err)),
      });
  }

  /** Applies a saved change locally; after a failed load, asks the server again instead. */
  private edit<T>(
    resource: { hasValue(): boolean; update(fn: (v: T[]) => T[]): void; reload(): boolean },
    change: (list: T[]) => T[],
  ): void {
    if (resource.hasValue()) resource.update(change);
    else resource.reload();
  }

  private tell(message: string): void {
    this.snackBar.open(message, 'Close', { duration: 6000 });
  }
}
