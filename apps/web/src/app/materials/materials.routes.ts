import type { Routes } from '@angular/router';

/** Material-case pages under /w/:wid/materials (charge transport, issue 18). */
export const materialRoutes: Routes = [
  {
    path: '',
    title: 'Materials · Gapwise',
    loadComponent: () => import('./material-list/material-list').then((m) => m.MaterialList),
  },
  {
    path: 'new',
    title: 'New material · Gapwise',
    loadComponent: () => import('./material-page/material-page').then((m) => m.MaterialPage),
  },
  {
    path: ':id',
    title: 'Material · Gapwise',
    loadComponent: () => import('./material-page/material-page').then((m) => m.MaterialPage),
  },
];
