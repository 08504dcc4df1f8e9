import type { Routes } from '@angular/router';

export const CREW_ROUTES: Routes = [
  {
    path: '',
    title: 'Crew · Furlong',
    loadComponent: () => import('./crew-page/crew-page').then((m) => m.CrewPage),
  },
];
