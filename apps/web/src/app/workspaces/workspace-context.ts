import { Injectable, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { ActivatedRouteSnapshot, NavigationEnd, Router } from '@angular/router';
import { canEdit, canManageMembers } from '@gapwise/contracts';
import { filter, map, startWith } from 'rxjs';
import { Session } from '../session/session';

function findWorkspaceId(route: ActivatedRouteSnapshot | null): string | null {
  let r = route;
  let found: string | null = null;
  while (r) {
    found = r.paramMap.get('wid') ?? found;
    r = r.firstChild;
  }
  return found;
}

/** The workspace in the URL, the user's role in it and what that role may do. */
@Injectable({ providedIn: 'root' })
export class WorkspaceContext {
  private readonly router = inject(Router);
  private readonly session = inject(Session);

  readonly workspaceId = toSignal(
    this.router.events.pipe(
      filter((e) => e instanceof NavigationEnd),
      startWith(null),
      map(() => findWorkspaceId(this.router.routerState.snapshot.root)),
    ),
    { initialValue: null },
  );
  readonly workspaces = computed(() => this.session.memberships());
  readonly current = computed(
    () => this.workspaces().find((m) => m.workspaceId === this.workspaceId()) ?? null,
  );
  readonly role = computed(() => this.current()?.role ?? null);
  readonly canEdit = computed(() => canEdit(this.role()));
  readonly canManageMembers = computed(() => canManageMembers(this.role()));
}
