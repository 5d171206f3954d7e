import { HttpClient, HttpContext, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  Page,
  Pair,
  PairInput,
  PairListItem,
  PairSeriesPoint,
  PairStatus,
  PairUpdate,
  PairVersionSummary,
} from '@gapwise/contracts';
import { Observable, catchError, map, of } from 'rxjs';
import { QUIET_ERRORS } from '../session/api-errors';

export interface PairQuery {
  readonly offset: number;
  readonly limit: number;
  /** Column name, `-` prefix for descending. */
  readonly sort?: string;
  readonly q?: string;
  readonly regime?: string;
  readonly tag?: string;
  readonly status?: PairStatus | '';
}

/** A stored version: the API may send the pair itself or wrap it with its summary. */
export type PairVersion =
  Pair | (PairVersionSummary & { pair?: Pair; snapshot?: Pair; data?: Pair });

const quiet = () => new HttpContext().set(QUIET_ERRORS, true);

/** The pairs endpoints of the API. */
@Injectable({ providedIn: 'root' })
export class PairsApi {
  private readonly http = inject(HttpClient);

  list(workspaceId: string, query: PairQuery): Observable<Page<PairListItem>> {
    let params = new HttpParams().set('offset', query.offset).set('limit', query.limit);
    for (const key of ['sort', 'q', 'regime', 'tag', 'status'] as const) {
      const v = query[key];
      if (v) params = params.set(key, v);
    }
    return this.http.get<Page<PairListItem>>(`/api/workspaces/${workspaceId}/pairs`, { params });
  }

  get(id: string): Observable<Pair> {
    return this.http.get<Pair>(`/api/pairs/${id}`);
  }

  /** Create; field errors are left to the form (quiet). */
  create(workspaceId: string, body: PairInput): Observable<Pair> {
    return this.http.post<Pair>(`/api/workspaces/${workspaceId}/pairs`, body, { context: quiet() });
  }

  /** Full update with optimistic locking; a stale version answers 409 `version-conflict`. */
  update(id: string, body: PairUpdate): Observable<Pair> {
    return this.http.put<Pair>(`/api/pairs/${id}`, body, { context: quiet() });
  }

  archive(id: string): Observable<Pair> {
    return this.http.post<Pair>(`/api/pairs/${id}/archive`, {});
  }

  duplicate(id: string): Observable<Pair> {
    return this.http.post<Pair>(`/api/pairs/${id}/duplicate`, {});
  }

  /** Measured points of the series that link the pair; none when they cannot be read (quiet). */
  seriesPoints(id: string): Observable<PairSeriesPoint[]> {
    return this.http
      .get<PairSeriesPoint[]>(`/api/pairs/${id}/series-points`, { context: quiet() })
      .pipe(catchError(() => of([])));
  }

  versions(id: string): Observable<PairVersionSummary[]> {
    return this.http
      .get<PairVersionSummary[] | { items: PairVersionSummary[] }>(`/api/pairs/${id}/versions`)
      .pipe(map((body) => (Array.isArray(body) ? body : body.items)));
  }

  version(id: string, version: number): Observable<Pair> {
    return this.http
      .get<PairVersion>(`/api/pairs/${id}/versions/${version}`)
      .pipe(map((body) => unwrapVersion(body)));
  }
}

function unwrapVersion(body: PairVersion): Pair {
  if ('parameters' in body && Array.isArray(body.parameters)) return body as Pair;
  const wrapped = body as { pair?: Pair; snapshot?: Pair; data?: Pair };
  const pair = wrapped.pair ?? wrapped.snapshot ?? wrapped.data;
  if (!pair) throw new Error('The version answer carries no pair.');
  return pair;
}
