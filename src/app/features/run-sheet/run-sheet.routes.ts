import type { Routes } from '@angular/router';

export const RUN_SHEET_ROUTES: Routes = [
  {
    path: '',
    title: 'Run sheet · Furlong',
    loadComponent: () => import('./run-sheet-page/run-sheet-page').then((m) => m.RunSheetPage),
  },
];
