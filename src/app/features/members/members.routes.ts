import { type Routes } from '@angular/router';

export const MEMBERS_ROUTES: Routes = [
  {
    path: '',
    title: 'Members · Furlong',
    loadComponent: () => import('./members-page/members-page').then((m) => m.MembersPage),
  },
];
