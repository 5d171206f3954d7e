import { HttpClient, HttpContext } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { MaterialInput, MaterialResults } from '@gapwise/contracts';
import type { Observable } from 'rxjs';
import { QUIET_ERRORS } from '../session/api-errors';

/** A material case as the API answers it (apps/api/src/materials/material-use-case.ts). */
export interface Material extends MaterialInput {
  readonly id: string;
  readonly workspaceId: string;
  readonly notes: string;
  readonly results: MaterialResults | null;
  readonly mobility: number | null;
  readonly version: number;
  readonly createdAt: string;
  readonly updatedAt: string;
}

export type MaterialListItem = Omit<Material, 'neighbours' | 'results'> & {
  readonly neighbourCount: number;
};

/** The material-case endpoints (form errors are shown by the page: quiet). */
@Injectable({ providedIn: 'root' })
export class MaterialsApi {
  private readonly http = inject(HttpClient);
  private readonly quiet = { context: new HttpContext().set(QUIET_ERRORS, true) };

  list(workspaceId: string): Observable<MaterialListItem[]> {
    return this.http.get<MaterialListItem[]>(`/api/workspaces/${workspaceId}/materials`);
  }

  get(id: string): Observable<Material> {
    return this.http.get<Material>(`/api/materials/${id}`);
  }

  create(workspaceId: string, body: MaterialInput): Observable<Material> {
    return this.http.post<Material>(`/api/workspaces/${workspaceId}/materials`, body, this.quiet);
  }

  update(id: string, body: MaterialInput & { version: number }): Observable<Material> {
    return this.http.put<Material>(`/api/materials/${id}`, body, this.quiet);
  }

  compute(workspaceId: string, body: MaterialInput): Observable<MaterialResults> {
    return this.http.post<MaterialResults>(
      `/api/workspaces/${workspaceId}/materials/compute`,
      body,
      this.quiet,
    );
  }
}
