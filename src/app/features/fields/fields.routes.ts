import { type Routes } from '@angular/router';
import { roleGuard } from '../../core/auth/auth-guards';

export const FIELDS_ROUTES: Routes = [
  {
    path: '',
    title: 'Fields · Furlong',
    loadComponent: () => import('./fields-page/fields-page').then((m) => m.FieldsPage),
  },
  {
    path: 'new',
    title: 'New field · Furlong',
    canActivate: [roleGuard(['owner'])],
    loadComponent: () => import('./new-field/new-field').then((m) => m.NewField),
  },
  {
    path: 'upload',
    title: 'Upload boundaries · Furlong',
    canActivate: [roleGuard(['owner'])],
    loadComponent: () => import('./upload-boundaries/upload-boundaries').then((m) => m.UploadBoundaries),
  },
  {
    path: ':id',
    title: 'Field · Furlong',
    loadComponent: () => import('./field-page/field-page').then((m) => m.FieldPage),
  },
];
