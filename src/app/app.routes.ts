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
      // Later screens add their lazy route here and switch their entry on in nav-items.ts.
    ],
  },
  { path: '**', redirectTo: '' },
];
