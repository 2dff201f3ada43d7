import { Routes } from '@angular/router';
import { adminGuard } from './core/admin-guard';
import { authGuard } from './core/auth-guard';
import { Shell } from './core/shell';

export const routes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'projects' },
  // Sign-in, forgot and reset password: no shell, no guard.
  { path: '', loadChildren: () => import('./auth/auth.routes') },
  // The viewer takes the whole window (no shell), so it sits before the shell's routes.
  {
    path: 'projects/:projectId/images/:imageId/view',
    canActivate: [authGuard],
    loadChildren: () => import('./viewer/viewer.routes'),
  },
  {
    path: '',
    component: Shell,
    canActivate: [authGuard],
    children: [
      { path: 'projects', loadChildren: () => import('./projects/projects.routes') },
      // Samples, specimens and images under their project. After `projects`, which keeps the list and the
      // project page: a componentless route placed first would also match /projects/:id and show nothing.
      { path: 'projects/:projectId/figures', loadChildren: () => import('./figures/figures.routes') },
      { path: 'projects/:projectId', loadChildren: () => import('./archive/archive.routes') },
      // The measuring bench and the grain size summary (paths the archive's routes do not take).
      { path: 'projects/:projectId', loadChildren: () => import('./measurements/measurements.routes') },
      { path: 'review-queue', loadChildren: () => import('./reviews/reviews.routes') },
      { path: 'account', loadChildren: () => import('./auth/auth.routes').then((m) => m.accountRoutes) },
      { path: 'admin', canActivate: [adminGuard], loadChildren: () => import('./admin/admin.routes') },
    ],
  },
  { path: '**', title: 'Page not found · Etchfile', loadComponent: () => import('./core/not-found') },
];
