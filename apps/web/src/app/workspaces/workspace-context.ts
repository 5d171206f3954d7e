import { Injectable, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { ActivatedRouteSnapshot, NavigationEnd, Router } from '@angular/router';
import { canEdit, canManageMembers } from '@gapwise/contracts';
import { filter, map, scan, startWith } from 'rxjs';
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

/**
 * The workspace in the URL, the user's role in it and what that role may do. On pages outside any
 * workspace (Account, Reviews) the last workspace stays current, so the app bar keeps its name and
 * sections instead of "Choose a workspace".
 */
@Injectable({ providedIn: 'root' })
export class WorkspaceContext {
  private readonly router = inject(Router);
  private readonly session = inject(Session);

  /** The workspace of the URL, else the last one a URL named. */
  private readonly lastWorkspaceId = toSignal(
    this.router.events.pipe(
      filter((e) => e instanceof NavigationEnd),
      startWith(null),
      map(() => findWorkspaceId(this.router.routerState.snapshot.root)),
      map((id) => ({ id, inUrl: id !== null })),
      scan(
        (last: { id: string | null; inUrl: boolean }, now) =>
          now.id !== null ? now : { id: last.id, inUrl: false },
        { id: null as string | null, inUrl: false },
      ),
    ),
    { initialValue: { id: null, inUrl: false } },
  );
  /** A remembered workspace counts only while the signed-in user is still a member of it. */
  readonly workspaceId = computed(() => {
    const { id, inUrl } = this.lastWorkspaceId();
    if (id === null || inUrl) return id;
    return this.session.memberships().some((m) => m.workspaceId === id) ? id : null;
  });
  readonly workspaces = computed(() => this.session.memberships());
  readonly current = computed(
    () => this.workspaces().find((m) => m.workspaceId === this.workspaceId()) ?? null,
  );
  readonly role = computed(() => this.current()?.role ?? null);
  readonly canEdit = computed(() => canEdit(this.role()));
  readonly canManageMembers = computed(() => canManageMembers(this.role()));
}
