import { Routes } from '@angular/router';
import { leaveGuard } from './leave-guard';

/** Mounted at projects/:projectId/figures; pages set a title with the project code once loaded. */
const routes: Routes = [
  { path: '', title: 'Figures · Etchfile', loadComponent: () => import('./figure-list') },
  { path: 'new', title: 'New figure · Etchfile', canDeactivate: [leaveGuard], loadComponent: () => import('./figure-composer') },
  { path: ':figureId', title: 'Figure · Etchfile', canDeactivate: [leaveGuard], loadComponent: () => import('./figure-composer') },
];
export default routes;
