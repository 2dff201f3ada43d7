import { Routes } from '@angular/router';

/** Mounted at projects/:projectId beside the archive; the pages set their titles once loaded. */
const routes: Routes = [
  { path: 'images/:imageId/measure', title: 'Measure · Etchfile', loadComponent: () => import('./measure-page') },
  { path: 'specimens/:specimenId/grain-size', title: 'Grain size summary · Etchfile', loadComponent: () => import('./grain-size-page') },
];
export default routes;
