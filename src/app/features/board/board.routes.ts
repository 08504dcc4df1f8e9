import type { Routes } from '@angular/router';

export const BOARD_ROUTES: Routes = [
  {
    path: '',
    title: 'Work board · Furlong',
    loadComponent: () => import('./board-page/board-page').then((m) => m.BoardPage),
  },
];
