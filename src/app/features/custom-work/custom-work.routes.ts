import type { Routes } from '@angular/router';

export const CUSTOM_WORK_ROUTES: Routes = [
  {
    path: '',
    title: 'Custom work · Furlong',
    loadComponent: () => import('./custom-work-page/custom-work-page').then((m) => m.CustomWorkPage),
  },
];
