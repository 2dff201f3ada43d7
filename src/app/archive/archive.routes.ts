import { Routes } from '@angular/router';

/** Mounted at projects/:projectId; pages set a title with the code once loaded. */
const routes: Routes = [
  { path: 'samples/new', title: 'New sample · Etchfile', loadComponent: () => import('./sample-editor') },
  { path: 'samples/:sampleId', title: 'Sample · Etchfile', loadComponent: () => import('./sample-page') },
  { path: 'samples/:sampleId/edit', title: 'Edit sample · Etchfile', loadComponent: () => import('./sample-editor') },
  { path: 'specimens/:specimenId', title: 'Specimen · Etchfile', loadComponent: () => import('./specimen-page') },
  { path: 'images', title: 'Images · Etchfile', loadComponent: () => import('./image-search') },
  { path: 'images/:imageId', title: 'Image · Etchfile', loadComponent: () => import('./image-page') },
];
export default routes;
