import { HttpClient, HttpContext } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Observable } from 'rxjs';
import { QUIET_ERRORS } from '../session/api-errors';

const quiet = () => new HttpContext().set(QUIET_ERRORS, true);

/** A cascade as the API answers it (apps/api/src/cascades). */
export interface Cascade {
  readonly id: string;
  readonly workspaceId: string;
  readonly name: string;
  readonly notes: string;
  readonly network: Record<string, unknown>;
  readonly design: Record<string, unknown> | null;
  readonly results: Record<string, unknown> | null;
  readonly warnings: unknown[];
  readonly longLivedYield: number | null;
  readonly longLivedLifetimeS: number | null;
  readonly version: number;
  readonly createdAt: string;
  readonly updatedAt: string;
}

export type CascadeListItem = Omit<Cascade, 'network' | 'design' | 'results' | 'warnings'>;

export interface CascadeBody {
  readonly name: string;
  readonly notes: string;
  readonly network: Record<string, unknown>;
  readonly design: Record<string, unknown>;
}

export interface CascadeVersion {
  readonly version: number;
  readonly summary: string;
  readonly createdAt: string;
  readonly snapshot: Record<string, unknown>;
}

/** The cascades routes of the API. */
@Injectable({ providedIn: 'root' })
export class CascadesApi {
  private readonly http = inject(HttpClient);

  list(wid: string): Observable<CascadeListItem[]> {
    return this.http.get<CascadeListItem[]>(`/api/workspaces/${wid}/cascades`);
  }

  get(id: string): Observable<Cascade> {
    return this.http.get<Cascade>(`/api/cascades/${id}`);
  }

  /** Create; the page shows field errors itself (quiet). */
  create(wid: string, body: CascadeBody): Observable<Cascade> {
    return this.http.post<Cascade>(`/api/workspaces/${wid}/cascades`, body, { context: quiet() });
  }

  /** Save a new version from `version`; a stale version answers 409 (quiet). */
  update(id: string, body: CascadeBody & { version: number }): Observable<Cascade> {
    return this.http.put<Cascade>(`/api/cascades/${id}`, body, { context: quiet() });
  }

  versions(id: string): Observable<CascadeVersion[]> {
    return this.http.get<CascadeVersion[]>(`/api/cascades/${id}/versions`);
  }
}
