import { HttpClient, HttpContext, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  Pair,
  Screen,
  ScreenNumericColumn,
  ScreenResultPage,
  ScreenScoreKind,
} from '@gapwise/contracts';
import { Observable, map, switchMap, takeWhile, timer } from 'rxjs';
import { QUIET_ERRORS } from '../session/api-errors';

/** Everything the results table and its CSV export filter by (server-side). */
export interface ResultFilter {
  readonly sort: string;
  readonly offset: number;
  readonly limit: number;
  readonly ranges: Partial<
    Record<ScreenNumericColumn, { min?: number | null; max?: number | null }>
  >;
  readonly regimeCs?: string;
  readonly regimeCr?: string;
  readonly warnings?: readonly string[];
  readonly noWarnings?: boolean;
  readonly q?: string;
  /** A custom score: Σ weight × column, computed and sortable on the server. */
  readonly custom?: ReadonlyArray<{ column: ScreenNumericColumn; weight: number }>;
}

export interface ScreenOptions {
  readonly solvents: ReadonlyArray<{ key: string; name: string; source: string }>;
  readonly scores: Record<ScreenScoreKind, string>;
  readonly warnings: readonly string[];
}

export interface UploadSettings {
  readonly name: string;
  readonly score: ScreenScoreKind;
  readonly floorEv?: number | null;
  /** ħω (eV) the score assumes for an inverted step whose row gives none. */
  readonly assumedHbarOmegaEv?: number | null;
  readonly runGoodRows?: boolean;
  readonly badRowChoice?: 'fixed' | 'none';
}

/** Query parameters of /results and /results.csv for a filter (empty values left out). */
export function resultParams(f: ResultFilter, paged = true): HttpParams {
  let p = new HttpParams().set('sort', f.sort);
  if (paged) p = p.set('offset', f.offset).set('limit', f.limit);
  for (const [column, range] of Object.entries(f.ranges)) {
    if (range?.min !== null && range?.min !== undefined) p = p.set(`${column}Min`, range.min);
    if (range?.max !== null && range?.max !== undefined) p = p.set(`${column}Max`, range.max);
  }
  if (f.regimeCs) p = p.set('regimeCs', f.regimeCs);
  if (f.regimeCr) p = p.set('regimeCr', f.regimeCr);
  if (f.warnings?.length) p = p.set('warning', f.warnings.join(','));
  if (f.noWarnings) p = p.set('noWarnings', 'true');
  if (f.q?.trim()) p = p.set('q', f.q.trim());
  if (f.custom?.length)
    p = p.set('custom', f.custom.map((t) => `${t.column}:${t.weight}`).join(','));
  return p;
}

export const isActive = (s: Screen) => s.status === 'running' || s.status === 'uploaded';

/** The screen endpoints of the API. */
@Injectable({ providedIn: 'root' })
export class ScreensApi {
  private readonly http = inject(HttpClient);
  readonly templateUrl = '/api/screens/template.csv';

  options(): Observable<ScreenOptions> {
    return this.http.get<ScreenOptions>('/api/screens/options');
  }

  list(workspaceId: string): Observable<Screen[]> {
    return this.http.get<Screen[]>(`/api/workspaces/${workspaceId}/screens`);
  }

  get(id: string): Observable<Screen> {
    return this.http.get<Screen>(`/api/screens/${id}`);
  }

  /**
   * The screen now and every `periodMs` while it runs; completes after the first reading that
   * is no longer running (so the page shows the final state).
   */
  watch(id: string, periodMs = 1000): Observable<Screen> {
    return timer(0, periodMs).pipe(
      switchMap(() => this.get(id)),
      takeWhile((s) => isActive(s), true),
    );
  }

  /** Uploads a file (multipart) or pasted text; bad rows come back as a quiet 400. */
  upload(workspaceId: string, source: File | string, s: UploadSettings): Observable<Screen> {
    let params = new HttpParams().set('name', s.name).set('score', s.score);
    if (s.floorEv !== null && s.floorEv !== undefined) params = params.set('floorEv', s.floorEv);
    if (s.assumedHbarOmegaEv !== null && s.assumedHbarOmegaEv !== undefined)
      params = params.set('assumedHbarOmegaEv', s.assumedHbarOmegaEv);
    if (s.runGoodRows) params = params.set('runGoodRows', 'true');
    if (s.badRowChoice) params = params.set('badRowChoice', s.badRowChoice);
    const url = `/api/workspaces/${workspaceId}/screens`;
    const context = new HttpContext().set(QUIET_ERRORS, true);
    if (typeof source === 'string') {
      return this.http.post<Screen>(url, { csv: source }, { params, context });
    }
    const body = new FormData();
    body.append('file', source, source.name);
    return this.http.post<Screen>(url, body, { params, context });
  }

  cancel(id: string): Observable<Screen> {
    return this.http.post<Screen>(`/api/screens/${id}/cancel`, {});
  }

  run(id: string): Observable<Screen> {
    return this.http
      .post<{ screen: Screen; reused: boolean }>(`/api/screens/${id}/run`, {})
      .pipe(map((r) => r.screen));
  }

  results(id: string, filter: ResultFilter): Observable<ScreenResultPage> {
    return this.http.get<ScreenResultPage>(`/api/screens/${id}/results`, {
      params: resultParams(filter),
    });
  }

  /** Download address of the filtered rows as CSV (the cookie session authorises it). */
  csvUrl(id: string, filter: ResultFilter): string {
    const query = resultParams(filter, false).toString();
    return `/api/screens/${id}/results.csv${query ? `?${query}` : ''}`;
  }

  openAsPair(id: string, line: number): Observable<Pair> {
    return this.http.post<Pair>(`/api/screens/${id}/results/${line}/open-as-pair`, {});
  }
}
