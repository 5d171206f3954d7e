import type { Routes } from '@angular/router';

/** Cascade pages under /w/:wid/cascades. */
export const cascadeRoutes: Routes = [
  {
    path: '',
    title: 'Cascades · Gapwise',
    loadComponent: () => import('./cascade-list/cascade-list').then((m) => m.CascadeList),
  },
  {
    path: 'new',
    title: 'New cascade · Gapwise',
    loadComponent: () => import('./cascade-page/cascade-page').then((m) => m.CascadePage),
  },
  {
    path: ':id',
    title: 'Cascade · Gapwise',
    loadComponent: () => import('./cascade-page/cascade-page').then((m) => m.CascadePage),
  },
];
