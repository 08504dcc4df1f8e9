import type { Routes } from '@angular/router';
import { providePlanWorker } from './provide-plan-worker';

export const PASS_PLAN_ROUTES: Routes = [
  {
    path: '',
    title: 'Pass plan · Furlong',
    providers: [providePlanWorker()],
    loadComponent: () => import('./pass-plan-page/pass-plan-page').then((m) => m.PassPlanPage),
  },
];
