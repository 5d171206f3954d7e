import type { Routes } from '@angular/router';

/** Electrode pages under /w/:wid/electrodes (issue 18). */
export const electrodeRoutes: Routes = [
  {
    path: '',
    title: 'Electrodes · Gapwise',
    loadComponent: () => import('./electrode-list').then((m) => m.ElectrodeList),
  },
  {
    path: ':id',
    title: 'Electrode case · Gapwise',
    loadComponent: () => import('./electrode-page').then((m) => m.ElectrodePage),
  },
];
