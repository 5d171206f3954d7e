import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  ReportAction,
  ReportCommentCreate,
  ReportListItem,
  ReportStatus,
  ReportView,
} from '@gapwise/contracts';
import type { Observable } from 'rxjs';

export interface ReportFilter {
  readonly status?: ReportStatus | '';
  readonly author?: string;
  readonly pairId?: string;
}

/** The report and review endpoints of the API. */
@Injectable({ providedIn: 'root' })
export class ReportsApi {
  private readonly http = inject(HttpClient);

  list(workspaceId: string, filter: ReportFilter): Observable<ReportListItem[]> {
    let params = new HttpParams();
    for (const key of ['status', 'author', 'pairId'] as const) {
      const v = filter[key];
      if (v) params = params.set(key, v);
    }
    return this.http.get<ReportListItem[]>(`/api/workspaces/${workspaceId}/reports`, { params });
  }

  waiting(): Observable<ReportListItem[]> {
    return this.http.get<ReportListItem[]>('/api/reviews/waiting');
  }

  get(id: string): Observable<ReportView> {
    return this.http.get<ReportView>(`/api/reports/${id}`);
  }

  create(workspaceId: string, pairIds: readonly string[]): Observable<ReportView> {
    const body = pairIds.length === 1 ? { pairId: pairIds[0] } : { pairIds };
    return this.http.post<ReportView>(`/api/workspaces/${workspaceId}/reports`, body);
  }

  /** A cascade report: the cascade's current version frozen with its yields and lifetimes. */
  createForCascade(workspaceId: string, cascadeId: string): Observable<ReportView> {
    const body = { cascadeId };
    return this.http.post<ReportView>(`/api/workspaces/${workspaceId}/reports`, body);
  }

  decide(id: string, action: ReportAction, note: string): Observable<ReportView> {
    return this.http.post<ReportView>(`/api/reports/${id}/${action}`, note.trim() ? { note } : {});
  }

  revise(id: string): Observable<ReportView> {
    return this.http.post<ReportView>(`/api/reports/${id}/revise`, {});
  }

  comment(id: string, body: ReportCommentCreate): Observable<ReportView> {
    return this.http.post<ReportView>(`/api/reports/${id}/comments`, body);
  }

  remove(id: string): Observable<void> {
    return this.http.delete<void>(`/api/reports/${id}`);
  }

  pdfUrl(id: string): string {
    return `/api/reports/${id}/pdf`;
  }

  exportUrl(id: string, format: 'csv' | 'json'): string {
    return `/api/reports/${id}/export?format=${format}`;
  }
}
