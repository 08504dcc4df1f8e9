import type { Routes } from '@angular/router';

export const FLEET_ROUTES: Routes = [
  {
    path: '',
    title: 'Fleet · Furlong',
    loadComponent: () => import('./fleet-page/fleet-page').then((m) => m.FleetPage),
  },
];
