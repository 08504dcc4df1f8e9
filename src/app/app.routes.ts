import { type Routes } from '@angular/router';
import { roleGuard, signedIn, signedOut } from './core/auth/auth-guards';
import { Shell } from './core/layout/shell/shell';

export const routes: Routes = [
  {
    path: 'sign-in',
    title: 'Sign in · Furlong',
    canActivate: [signedOut],
    loadComponent: () => import('./features/auth/sign-in/sign-in').then((m) => m.SignIn),
  },
  {
    path: 'forgot-password',
    title: 'Forgot password · Furlong',
    loadComponent: () => import('./features/auth/forgot-password/forgot-password').then((m) => m.ForgotPassword),
  },
  {
    path: 'accept-invitation',
    title: 'Accept invitation · Furlong',
    loadComponent: () => import('./features/auth/accept-invitation/accept-invitation').then((m) => m.AcceptInvitation),
  },
  {
    path: 'set-password',
    title: 'Set a new password · Furlong',
    loadComponent: () => import('./features/auth/set-password/set-password').then((m) => m.SetPassword),
  },
  {
    // Where the payment service sends a customer after paying an invoice: nobody is signed in.
    path: 'paid',
    title: 'Payment received · Furlong',
    loadComponent: () => import('./features/invoices/paid-page/paid-page').then((m) => m.PaidPage),
  },
  {
    path: '',
    component: Shell,
    canActivate: [signedIn],
    canActivateChild: [signedIn],
    children: [
      { path: '', pathMatch: 'full', redirectTo: 'home' },
      {
        path: 'home',
        title: 'Home · Furlong',
        loadComponent: () => import('./features/home/home').then((m) => m.Home),
      },
      {
        path: 'members',
        canActivate: [roleGuard(['owner'])],
        loadChildren: () => import('./features/members/members.routes').then((m) => m.MEMBERS_ROUTES),
      },
      {
        path: 'fields',
        loadChildren: () => import('./features/fields/fields.routes').then((m) => m.FIELDS_ROUTES),
      },
      {
        path: 'pass-plan',
        canActivate: [roleGuard(['owner', 'operator'])],
        loadChildren: () => import('./features/pass-plan/pass-plan.routes').then((m) => m.PASS_PLAN_ROUTES),
      },
      {
        path: 'board',
        canActivate: [roleGuard(['owner'])],
        loadChildren: () => import('./features/board/board.routes').then((m) => m.BOARD_ROUTES),
      },
      {
        path: 'run-sheet',
        canActivate: [roleGuard(['owner', 'operator'])],
        loadChildren: () => import('./features/run-sheet/run-sheet.routes').then((m) => m.RUN_SHEET_ROUTES),
      },
      {
        path: 'fleet',
        loadChildren: () => import('./features/fleet/fleet.routes').then((m) => m.FLEET_ROUTES),
      },
      {
        path: 'crew',
        canActivate: [roleGuard(['owner'])],
        loadChildren: () => import('./features/crew/crew.routes').then((m) => m.CREW_ROUTES),
      },
      {
        path: 'season',
        canActivate: [roleGuard(['owner', 'viewer'])],
        loadChildren: () => import('./features/season/season.routes').then((m) => m.SEASON_ROUTES),
      },
      {
        path: 'custom-work',
        canActivate: [roleGuard(['owner', 'viewer'])],
        loadChildren: () => import('./features/custom-work/custom-work.routes').then((m) => m.CUSTOM_WORK_ROUTES),
      },
      {
        path: 'invoices',
        canActivate: [roleGuard(['owner', 'viewer'])],
        loadChildren: () => import('./features/invoices/invoices.routes').then((m) => m.INVOICES_ROUTES),
      },
      {
        path: 'reports',
        title: 'Reports from the field · Furlong',
        canActivate: [roleGuard(['owner'])],
        loadComponent: () => import('./features/reports/reports-page/reports-page').then((m) => m.ReportsPage),
      },
      // Later screens add their lazy route here and switch their entry on in nav-items.ts.
    ],
  },
  { path: '**', redirectTo: '' },
];
