import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { AuditEvent, Page } from '@gapwise/contracts';
import type { Observable } from 'rxjs';

/** Filters of the audit trail; days are `YYYY-MM-DD` (UTC, both ends inclusive). */
export interface AuditFilters {
  readonly actorId?: string;
  readonly pairId?: string;
  /** One cascade's events (`entityType=cascade&entityId=…`). */
  readonly cascadeId?: string;
  readonly from?: string;
  readonly to?: string;
}

/** Query parameters of the trail and its CSV export (a pair is `entityType=pair&entityId=…`). */
export function auditParams(filters: AuditFilters): HttpParams {
  let params = new HttpParams();
  if (filters.actorId) params = params.set('actorId', filters.actorId);
  if (filters.pairId) params = params.set('entityType', 'pair').set('entityId', filters.pairId);
  if (filters.cascadeId)
    params = params.set('entityType', 'cascade').set('entityId', filters.cascadeId);
  if (filters.from) params = params.set('from', filters.from);
  if (filters.to) params = params.set('to', filters.to);
  return params;
}

/** The workspace's audit trail (owner and reviewer). */
@Injectable({ providedIn: 'root' })
export class AuditApi {
  private readonly http = inject(HttpClient);

  page(
    wid: string,
    filters: AuditFilters,
    offset: number,
    limit: number,
  ): Observable<Page<AuditEvent>> {
    const params = auditParams(filters).set('offset', offset).set('limit', limit);
    return this.http.get<Page<AuditEvent>>(`/api/workspaces/${wid}/audit`, { params });
  }

  /** Address of the CSV export with the same filters (a plain download link). */
  exportUrl(wid: string, filters: AuditFilters): string {
    const query = auditParams(filters).toString();
    return `/api/workspaces/${wid}/audit/export.csv${query ? `?${query}` : ''}`;
  }
}
