import type { Routes } from '@angular/router';

/** Screen pages under /w/:wid/screens. */
export const screenRoutes: Routes = [
  {
    path: '',
    title: 'Screens · Gapwise',
    loadComponent: () => import('./screen-list/screen-list').then((m) => m.ScreenList),
  },
  {
    path: 'new',
    title: 'New screen · Gapwise',
    loadComponent: () => import('./new-screen/new-screen').then((m) => m.NewScreen),
  },
  {
    path: ':id',
    title: 'Screen · Gapwise',
    loadComponent: () => import('./screen-detail/screen-detail').then((m) => m.ScreenDetail),
  },
];
