import { Routes } from '@angular/router';

/** Mounted at /admin behind adminGuard. */
const routes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'users' },
  { path: 'users', title: 'Users · Etchfile', loadComponent: () => import('./user-list') },
  { path: 'mail', title: 'Mail outbox · Etchfile', loadComponent: () => import('./mail-outbox') },
];
export default routes;
