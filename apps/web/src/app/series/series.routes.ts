import type { Routes } from '@angular/router';

/** Series pages under /w/:wid/series. */
export const seriesRoutes: Routes = [
  {
    path: '',
    title: 'Series fits · Gapwise',
    loadComponent: () => import('./series-list/series-list').then((m) => m.SeriesList),
  },
  {
    path: 'new',
    title: 'New series · Gapwise',
    loadComponent: () => import('./series-page/series-page').then((m) => m.SeriesPage),
  },
  {
    path: ':id',
    title: 'Series · Gapwise',
    loadComponent: () => import('./series-page/series-page').then((m) => m.SeriesPage),
  },
];
