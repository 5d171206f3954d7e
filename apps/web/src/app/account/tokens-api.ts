import { HttpClient, HttpContext } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { ApiToken, CreateApiTokenRequest, CreatedApiToken } from '@gapwise/contracts';
import type { Observable } from 'rxjs';
import { QUIET_ERRORS } from '../session/api-errors';

/** The signed-in person's API tokens (`/api/tokens`). */
@Injectable({ providedIn: 'root' })
export class TokensApi {
  private readonly http = inject(HttpClient);

  list(): Observable<ApiToken[]> {
    return this.http.get<ApiToken[]>('/api/tokens');
  }

  /** The secret is in this answer only. */
  create(body: CreateApiTokenRequest): Observable<CreatedApiToken> {
    return this.http.post<CreatedApiToken>('/api/tokens', body, {
      context: new HttpContext().set(QUIET_ERRORS, true),
    });
  }

  revoke(id: string): Observable<void> {
    return this.http.delete<void>(`/api/tokens/${id}`);
  }
}
