import { Routes } from '@angular/router';

/** Pages for people who are not signed in; they sit outside the shell. */
const routes: Routes = [
  { path: 'sign-in', title: 'Sign in · Etchfile', loadComponent: () => import('./sign-in') },
  { path: 'forgot-password', title: 'Forgot password · Etchfile', loadComponent: () => import('./forgot-password') },
  { path: 'reset-password', title: 'Set a password · Etchfile', loadComponent: () => import('./reset-password') },
];
export default routes;

/** The signed-in user's own page, mounted at /account inside the shell. */
export const accountRoutes: Routes = [
  { path: '', title: 'Account · Etchfile', loadComponent: () => import('./account') },
];
