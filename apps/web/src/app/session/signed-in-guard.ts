import { inject } from '@angular/core';
import { CanActivateFn, Router } from '@angular/router';
import { map } from 'rxjs';
import { Session } from './session';

/** Lets signed-in users through; others go to sign-in and come back afterwards. */
export const signedInGuard: CanActivateFn = (_route, state) => {
  const router = inject(Router);
  return inject(Session)
    .ensureLoaded()
    .pipe(
      map((info) =>
        info ? true : router.createUrlTree(['/sign-in'], { queryParams: { returnUrl: state.url } }),
      ),
    );
};
