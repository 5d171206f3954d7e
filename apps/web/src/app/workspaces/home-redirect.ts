import { inject } from '@angular/core';
import { CanActivateFn, Router } from '@angular/router';
import { map } from 'rxjs';
import { Session } from '../session/session';

/** `/` opens the first workspace's pairs; with no workspace the page offers to create one. */
export const homeRedirect: CanActivateFn = () => {
  const router = inject(Router);
  return inject(Session)
    .ensureLoaded()
    .pipe(
      map((info) => {
        const first = info?.memberships[0];
        return first ? router.createUrlTree(['/w', first.workspaceId, 'pairs']) : true;
      }),
    );
};
