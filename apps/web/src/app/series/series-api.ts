import { HttpClient, HttpContext } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Pair, Series, SeriesListItem, SeriesModel } from '@gapwise/contracts';
import type { Observable } from 'rxjs';
import { QUIET_ERRORS } from '../session/api-errors';

/** A point as the form sends it: ΔG° in the series unit, k or log10 k, σ of log10 k. */
export interface SeriesPointBody {
  readonly label: string;
  readonly deltaG0: number;
  readonly k?: number;
  readonly log10k?: number;
  readonly sigmaLog10k: number | null;
  readonly pairId?: string | null;
}

export interface SeriesBody {
  readonly name: string;
  readonly temperature: number;
  readonly temperatureUnit: 'K' | 'degC';
  readonly energyUnit: string;
  readonly notes: string;
  readonly points: SeriesPointBody[];
}

export interface FitBody {
  readonly model: SeriesModel;
  readonly hbarOmega?: number;
  readonly lambdaVib?: number;
}

/** The series endpoints of the API (form errors are shown by the page: quiet). */
@Injectable({ providedIn: 'root' })
export class SeriesApi {
  private readonly http = inject(HttpClient);
  private readonly quiet = { context: new HttpContext().set(QUIET_ERRORS, true) };

  list(workspaceId: string): Observable<SeriesListItem[]> {
    return this.http.get<SeriesListItem[]>(`/api/workspaces/${workspaceId}/series`);
  }

  get(id: string): Observable<Series> {
    return this.http.get<Series>(`/api/series/${id}`);
  }

  create(workspaceId: string, body: SeriesBody): Observable<Series> {
    return this.http.post<Series>(`/api/workspaces/${workspaceId}/series`, body, this.quiet);
  }

  update(id: string, version: number, body: SeriesBody): Observable<Series> {
    return this.http.put<Series>(`/api/series/${id}`, { ...body, version }, this.quiet);
  }

  fit(id: string, body: FitBody): Observable<Series> {
    return this.http.post<Series>(`/api/series/${id}/fit`, body, this.quiet);
  }

  apply(id: string, pairIds: readonly string[], model: SeriesModel): Observable<{ pairs: Pair[] }> {
    return this.http.post<{ pairs: Pair[] }>(
      `/api/series/${id}/apply`,
      { pairIds, model },
      this.quiet,
    );
  }
}
