import type { Routes } from '@angular/router';

export const INVOICES_ROUTES: Routes = [
  {
    path: '',
    title: 'Invoices · Furlong',
    loadComponent: () => import('./invoices-page/invoices-page').then((m) => m.InvoicesPage),
  },
  {
    path: ':id',
    title: 'Invoice · Furlong',
    loadComponent: () => import('./invoice-page/invoice-page').then((m) => m.InvoicePage),
  },
];
