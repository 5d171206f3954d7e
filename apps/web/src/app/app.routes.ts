import { Routes } from '@angular/router';
import { NotFound } from './not-found';
import { signedInGuard } from './session/signed-in-guard';
import { Shell } from './shell/shell';
import { homeRedirect } from './workspaces/home-redirect';

export const routes: Routes = [
  {
    path: 'sign-in',
    title: 'Sign in · Gapwise',
    loadComponent: () => import('./session/sign-in/sign-in').then((m) => m.SignIn),
  },
  {
    path: 'register',
    title: 'Create an account · Gapwise',
    loadComponent: () => import('./session/register/register').then((m) => m.Register),
  },
  {
    path: 'confirm/:token',
    title: 'Confirm your account · Gapwise',
    loadComponent: () => import('./session/confirm/confirm').then((m) => m.Confirm),
  },
  {
    path: 'forgot-password',
    title: 'Forgot password · Gapwise',
    loadComponent: () =>
      import('./session/forgot-password/forgot-password').then((m) => m.ForgotPassword),
  },
  {
    path: 'reset-password/:token',
    title: 'Choose a new password · Gapwise',
    loadComponent: () =>
      import('./session/reset-password/reset-password').then((m) => m.ResetPassword),
  },
  {
    path: 'invitations/:token',
    title: 'Invitation · Gapwise',
    loadComponent: () =>
      import('./session/invitation/invitation-accept').then((m) => m.InvitationAccept),
  },
  {
    path: '',
    component: Shell,
    canActivate: [signedInGuard],
    children: [
      {
        path: '',
        pathMatch: 'full',
        canActivate: [homeRedirect],
        title: 'Gapwise',
        loadComponent: () =>
          import('./workspaces/no-workspace/no-workspace').then((m) => m.NoWorkspace),
      },
      {
        path: 'w/:wid',
        children: [
          { path: '', pathMatch: 'full', redirectTo: 'pairs' },
          {
            path: 'pairs',
            title: 'Pairs · Gapwise',
            loadComponent: () => import('./pairs/pair-table/pair-table').then((m) => m.PairTable),
          },
          {
            path: 'pairs/new',
            title: 'New pair · Gapwise',
            loadChildren: () =>
              import('./pairs/pair-editor/pair-editor.routes').then((m) => m.editorRoutes),
          },
          {
            path: 'pairs/:pairId',
            title: 'Pair · Gapwise',
            loadChildren: () =>
              import('./pairs/pair-editor/pair-editor.routes').then((m) => m.editorRoutes),
          },
          {
            path: 'pairs/:pairId/history',
            title: 'Version history · Gapwise',
            loadComponent: () =>
              import('./pairs/version-history/version-history').then((m) => m.VersionHistory),
          },
          {
            path: 'pairs/:pairId/solvents',
            title: 'Solvent choice · Gapwise',
            loadComponent: () =>
              import('./pairs/solvent-choice/solvent-choice').then((m) => m.SolventChoice),
          },
          {
            path: 'reports',
            title: 'Reports · Gapwise',
            loadComponent: () =>
              import('./reports/report-list/report-list').then((m) => m.ReportList),
          },
          {
            path: 'reports/new',
            title: 'New report · Gapwise',
            loadComponent: () =>
              import('./reports/create-report/create-report').then((m) => m.CreateReport),
          },
          {
            path: 'reports/:id',
            title: 'Report · Gapwise',
            loadComponent: () =>
              import('./reports/report-view/report-view').then((m) => m.ReportViewPage),
          },
          {
            path: 'traces',
            title: 'Traces · Gapwise',
            loadComponent: () => import('./traces/trace-list/trace-list').then((m) => m.TraceList),
          },
          {
            path: 'trace-analyses/:aid',
            title: 'Trace analysis · Gapwise',
            loadComponent: () =>
              import('./traces/trace-analysis/trace-analysis').then((m) => m.TraceAnalysisPage),
          },
          {
            path: 'screens',
            loadChildren: () => import('./screens/screens.routes').then((m) => m.screenRoutes),
          },
          {
            path: 'cascades',
            loadChildren: () => import('./cascades/cascades.routes').then((m) => m.cascadeRoutes),
          },
          {
            path: 'series',
            loadChildren: () => import('./series/series.routes').then((m) => m.seriesRoutes),
          },
          {
            path: 'electrodes',
            loadChildren: () =>
              import('./electrodes/electrodes.routes').then((m) => m.electrodeRoutes),
          },
          {
            path: 'materials',
            loadChildren: () =>
              import('./materials/materials.routes').then((m) => m.materialRoutes),
          },
          {
            path: 'members',
            title: 'Members · Gapwise',
            loadComponent: () => import('./workspaces/members/members').then((m) => m.Members),
          },
          {
            path: 'audit',
            title: 'Audit trail · Gapwise',
            loadComponent: () => import('./workspaces/audit/audit-trail').then((m) => m.AuditTrail),
          },
        ],
      },
      {
        path: 'account',
        title: 'Your account · Gapwise',
        loadComponent: () =>
          import('./account/account-page/account-page').then((m) => m.AccountPage),
      },
      {
        path: 'reviews',
        title: 'Reviews waiting · Gapwise',
        loadComponent: () =>
          import('./reports/reviews-waiting/reviews-waiting').then((m) => m.ReviewsWaiting),
      },
      { path: '**', component: NotFound, title: 'Not found · Gapwise' },
    ],
  },
];
