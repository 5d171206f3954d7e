import { HttpClient, HttpContext } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Invitation, Member, Role } from '@gapwise/contracts';
import { Observable, map } from 'rxjs';
import { QUIET_ERRORS } from '../../session/api-errors';

type ListBody<T> = T[] | { items: T[] };
const items = <T>(body: ListBody<T>): T[] => (Array.isArray(body) ? body : body.items);

/** Members and invitations of a workspace. */
@Injectable({ providedIn: 'root' })
export class MembersApi {
  private readonly http = inject(HttpClient);

  members(wid: string): Observable<Member[]> {
    return this.http.get<ListBody<Member>>(`/api/workspaces/${wid}/members`).pipe(map(items));
  }

  invitations(wid: string): Observable<Invitation[]> {
    return this.http
      .get<ListBody<Invitation>>(`/api/workspaces/${wid}/invitations`)
      .pipe(map(items));
  }

  invite(wid: string, email: string, role: Role): Observable<Invitation> {
    const context = new HttpContext().set(QUIET_ERRORS, true);
    return this.http.post<Invitation>(
      `/api/workspaces/${wid}/invitations`,
      { email, role },
      { context },
    );
  }

  revoke(wid: string, invitationId: string): Observable<unknown> {
    return this.http.delete(`/api/workspaces/${wid}/invitations/${invitationId}`);
  }

  changeRole(wid: string, userId: string, role: Role): Observable<Member> {
    return this.http.patch<Member>(`/api/workspaces/${wid}/members/${userId}`, { role });
  }

  remove(wid: string, userId: string): Observable<unknown> {
    return this.http.delete(`/api/workspaces/${wid}/members/${userId}`);
  }
}
