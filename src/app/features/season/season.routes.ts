import { type Routes } from '@angular/router';
import { provideCharts, withDefaultRegisterables } from 'ng2-charts';

export const SEASON_ROUTES: Routes = [
  {
    path: '',
    title: 'Season · Furlong',
    // chart.js is registered here, so only the Season screen's bundle carries it.
    providers: [provideCharts(withDefaultRegisterables())],
    loadComponent: () => import('./season-page/season-page').then((m) => m.SeasonPage),
  },
];
