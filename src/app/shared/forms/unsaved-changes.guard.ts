import { inject } from '@angular/core';
import { MatDialog } from '@angular/material/dialog';
import type { CanDeactivateFn } from '@angular/router';
import { map, type Observable } from 'rxjs';
import { ConfirmDialog, type ConfirmDialogData } from '../ui/confirm-dialog/confirm-dialog';

/** A page that can hold changes not saved yet. */
export interface HasUnsavedChanges {
  hasUnsavedChanges(): boolean;
}

/**
 * Asks before leaving a page with unsaved changes (route `canDeactivate`). Closing or reloading the
 * tab is the page's own `beforeunload` (the browser asks in its own words there).
 *
 * @example { path: '', loadComponent: …, canDeactivate: [unsavedChangesGuard] }
 */
export const unsavedChangesGuard: CanDeactivateFn<HasUnsavedChanges> = (page): boolean | Observable<boolean> => {
  if (!page?.hasUnsavedChanges()) return true;
  const data: ConfirmDialogData = {
    title: 'Leave without saving?',
    message: 'Your changes on this page are not saved. If you leave now they are lost.',
    confirm: 'Leave without saving',
    cancel: 'Stay on this page',
  };
  return inject(MatDialog)
    .open(ConfirmDialog, { data })
    .afterClosed()
    .pipe(map((leave: unknown) => leave === true));
};
