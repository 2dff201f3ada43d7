import { Routes } from '@angular/router';

const routes: Routes = [
  { path: '', title: 'Projects · Etchfile', loadComponent: () => import('./project-list') },
  // The page sets a title with the project's name once it has loaded.
  { path: ':projectId', title: 'Project · Etchfile', loadComponent: () => import('./project-page') },
];
export default routes;
