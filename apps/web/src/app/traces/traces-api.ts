import { HttpClient, HttpContext, HttpEventType, type HttpEvent } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  Pair,
  Trace,
  TraceAnalysis,
  TraceAnalysisRequest,
  TraceAttachRequest,
  TraceFileUnit,
  TraceState,
} from '@gapwise/contracts';
import { Observable, defer, filter, map, switchMap, takeWhile, timer } from 'rxjs';
import { QUIET_ERRORS } from '../session/api-errors';

export interface TraceUploadSettings {
  readonly state: TraceState;
  readonly unit: TraceFileUnit;
  /** Header name or 1-based column number; empty: the last column. */
  readonly column: string;
  readonly skipBadLines: boolean;
}

/** Upload progress (0…1 of the bytes sent), then the stored trace. */
export type UploadStep =
  | { readonly kind: 'progress'; readonly fraction: number }
  | { readonly kind: 'done'; readonly trace: Trace };

/** Status and progress of an analysis as the server reports them while it runs. */
export interface AnalysisProgress {
  readonly status: TraceAnalysis['status'];
  readonly progress: number;
}

const quiet = () => new HttpContext().set(QUIET_ERRORS, true);

/** The trace endpoints of the API. */
@Injectable({ providedIn: 'root' })
export class TracesApi {
  private readonly http = inject(HttpClient);

  list(workspaceId: string): Observable<Trace[]> {
    return this.http.get<Trace[]>(`/api/workspaces/${workspaceId}/traces`);
  }

  analyses(workspaceId: string): Observable<TraceAnalysis[]> {
    return this.http.get<TraceAnalysis[]>(`/api/workspaces/${workspaceId}/trace-analyses`);
  }

  analysis(id: string): Observable<TraceAnalysis> {
    return this.http.get<TraceAnalysis>(`/api/trace-analyses/${id}`);
  }

  /**
   * Uploads one file as multipart/form-data, the settings first (the server reads them before
   * the file streams through). Errors (a refused file lists its bad lines) are left to the caller.
   */
  upload(workspaceId: string, file: File, settings: TraceUploadSettings): Observable<UploadStep> {
    const form = new FormData();
    form.append('state', settings.state);
    form.append('unit', settings.unit);
    if (settings.column.trim()) form.append('column', settings.column.trim());
    form.append('skipBadLines', String(settings.skipBadLines));
    form.append('file', file, file.name);
    return this.http
      .post<Trace>(`/api/workspaces/${workspaceId}/traces`, form, {
        reportProgress: true,
        observe: 'events',
        context: quiet(),
      })
      .pipe(
        map((event: HttpEvent<Trace>): UploadStep | null => {
          if (event.type === HttpEventType.UploadProgress) {
            return { kind: 'progress', fraction: event.total ? event.loaded / event.total : 0 };
          }
          if (event.type === HttpEventType.Response && event.body)
            return { kind: 'done', trace: event.body };
          return null;
        }),
        filter((step): step is UploadStep => step !== null),
      );
  }

  start(workspaceId: string, body: TraceAnalysisRequest): Observable<TraceAnalysis> {
    return this.http.post<TraceAnalysis>(`/api/workspaces/${workspaceId}/trace-analyses`, body, {
      context: quiet(),
    });
  }

  /**
   * Status and progress until the analysis is done or failed: server-sent events when the browser
   * has EventSource, polling every 700 ms otherwise (or when the event stream breaks).
   */
  progress(id: string): Observable<AnalysisProgress> {
    const polling = timer(0, 700).pipe(
      switchMap(() => this.analysis(id)),
      map((a) => ({ status: a.status, progress: a.progress })),
      takeWhile((p) => p.status === 'queued' || p.status === 'running', true),
    );
    if (typeof EventSource === 'undefined') return polling;
    return defer(
      () =>
        new Observable<AnalysisProgress>((subscriber) => {
          const source = new EventSource(`/api/trace-analyses/${id}/events`, {
            withCredentials: true,
          });
          let finished = false;
          source.addEventListener('progress', (e) =>
            subscriber.next(JSON.parse((e as MessageEvent).data) as AnalysisProgress),
          );
          for (const end of ['done', 'failed'] as const) {
            source.addEventListener(end, () => {
              finished = true;
              source.close();
              subscriber.next({ status: end, progress: end === 'done' ? 1 : 0 });
              subscriber.complete();
            });
          }
          source.onerror = () => {
            if (finished) return;
            source.close();
            // Fall back to polling (the stream may be cut by a proxy or a restart).
            polling.subscribe(subscriber);
          };
          return () => source.close();
        }),
    );
  }

  attach(analysisId: string, body: TraceAttachRequest): Observable<Pair> {
    return this.http.post<Pair>(`/api/trace-analyses/${analysisId}/attach`, body, {
      context: quiet(),
    });
  }
}
