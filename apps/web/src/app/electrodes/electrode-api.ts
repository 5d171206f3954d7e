import { HttpClient, HttpContext } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Observable } from 'rxjs';
import { QUIET_ERRORS } from '../session/api-errors';

export type ElectrodeDirection = 'reduction' | 'oxidation';

export interface ElectrodePoint {
  readonly overpotentialV: number;
  readonly k: number;
  readonly direction: ElectrodeDirection;
}

/** An electrode case as `GET /api/electrode-cases/{id}` answers it. */
export interface ElectrodeCase {
  readonly id: string;
  readonly workspaceId: string;
  readonly name: string;
  readonly redoxCouple: string;
  readonly electrode: string;
  readonly lambdaEv: number;
  readonly temperatureK: number;
  readonly rateSource: 'k0' | 'coupling';
  readonly k0: number | null;
  readonly rateUnit: string;
  readonly couplingEv: number | null;
  readonly densityOfStatesPerEv: number | null;
  readonly provenance: string;
  readonly points: ElectrodePoint[];
  readonly dataNote: string;
  readonly notes: string;
  readonly version: number;
  readonly createdAt: string;
  readonly updatedAt: string;
}

export type ElectrodeCaseListItem = Omit<ElectrodeCase, 'points' | 'notes'> & {
  readonly pointCount: number;
};

/** One model of `fit.electrodeKinetics` (README, calculation methods). */
export interface ElectrodeModelFitOut {
  readonly lambda?: number;
  readonly lambdaStandardError?: number;
  readonly alpha?: number;
  readonly alphaStandardError?: number;
  readonly log10k0: number;
  readonly log10k0StandardError: number;
  readonly k0: number;
  readonly correlation: number;
  readonly residuals: number[];
  readonly rmsLog10Residual: number;
  readonly degreesOfFreedom: number;
  readonly aic: number;
  readonly aicc: number | null;
  readonly bic: number;
}

export interface ElectrodeFitResult {
  readonly outputs: {
    readonly mhc: ElectrodeModelFitOut;
    readonly butlerVolmer: ElectrodeModelFitOut;
    readonly deltaAic: number;
    readonly deltaBic: number;
    readonly mhcAkaikeWeight: number;
    readonly verdict: 'mhc' | 'butlerVolmer' | 'indistinguishable';
  };
  readonly warnings: { code: string; message: string }[];
  readonly pointCount: number;
}

/** The electrode-case endpoints (form errors are shown by the page: quiet). */
@Injectable({ providedIn: 'root' })
export class ElectrodeApi {
  private readonly http = inject(HttpClient);
  private readonly quiet = { context: new HttpContext().set(QUIET_ERRORS, true) };

  list(workspaceId: string): Observable<ElectrodeCaseListItem[]> {
    return this.http.get<ElectrodeCaseListItem[]>(`/api/workspaces/${workspaceId}/electrode-cases`);
  }

  get(id: string): Observable<ElectrodeCase> {
    return this.http.get<ElectrodeCase>(`/api/electrode-cases/${id}`);
  }

  fit(id: string, points: readonly ElectrodePoint[]): Observable<ElectrodeFitResult> {
    return this.http.post<ElectrodeFitResult>(
      `/api/electrode-cases/${id}/fit`,
      { points },
      this.quiet,
    );
  }

  applyFit(
    id: string,
    version: number,
    points: readonly ElectrodePoint[],
  ): Observable<ElectrodeCase> {
    return this.http.post<ElectrodeCase>(
      `/api/electrode-cases/${id}/apply-fit`,
      { version, points, model: 'mhc' },
      this.quiet,
    );
  }
}
