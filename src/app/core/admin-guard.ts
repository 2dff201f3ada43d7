import { inject } from '@angular/core';
import { CanActivateFn, Router } from '@angular/router';
import { SessionStore } from './session-store';

/** Site administration pages; members are sent to their projects instead. */
export const adminGuard: CanActivateFn = () => {
  const session = inject(SessionStore);
  return session.isAdmin() || inject(Router).createUrlTree(['/projects']);
};
