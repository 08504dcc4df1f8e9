import type { Routes } from '@angular/router';
import { unsavedChangesGuard } from '../../shared/forms/unsaved-changes.guard';
import { providePlanWorker } from './provide-plan-worker';

export const PASS_PLAN_ROUTES: Routes = [
  {
    path: '',
    title: 'Pass plan · Furlong',
    providers: [providePlanWorker()],
    canDeactivate: [unsavedChangesGuard],
    loadComponent: () => import('./pass-plan-page/pass-plan-page').then((m) => m.PassPlanPage),
  },
];
