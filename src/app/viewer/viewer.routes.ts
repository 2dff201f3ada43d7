import { Routes } from '@angular/router';

/** Mounted at projects/:projectId/images/:imageId/view; the page sets a title with the file name once loaded. */
const routes: Routes = [{ path: '', title: 'Viewer · Etchfile', loadComponent: () => import('./viewer-page') }];
export default routes;
