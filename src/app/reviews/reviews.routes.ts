import { Routes } from '@angular/router';

/** The reviewer's queue, mounted at /review-queue inside the shell. */
const routes: Routes = [{ path: '', title: 'Review queue · Etchfile', loadComponent: () => import('./review-queue') }];
export default routes;
