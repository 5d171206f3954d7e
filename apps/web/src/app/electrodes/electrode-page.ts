import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { ActivatedRoute, RouterLink } from '@angular/router';
import { HttpErrorResponse } from '@angular/common/http';
import { calculate } from '@gapwise/calc';
import { formatMeasured } from '@gapwise/contracts';
import { electrodeCurves, type ElectrodeCurves } from '@gapwise/plots';
import { map, switchMap, tap } from 'rxjs';
import { WorkspaceContext } from '../workspaces/workspace-context';
import {
  ElectrodeApi,
  type ElectrodeCase,
  type ElectrodeFitResult,
  type ElectrodeModelFitOut,
  type ElectrodePoint,
} from './electrode-api';
import { ElectrodePlot, type PlotCurve, type PlotMarker } from './electrode-plot';
import { parseElectrodeCsv, pointsToCsv } from './electrode-points';

const TEAL = '#006a6a';
const TEAL_LIGHT = '#4f9e9e';
const AMBER = '#9a6400';
const INK = '#1f2b2b';

/** log10 k⁰ of a case: k⁰ itself, or the absolute MHC k⁰ from |H| and ρ_M (electrode.mhcAbsolute). */
export function caseLog10k0(c: ElectrodeCase): number | null {
  if (c.rateSource === 'k0') return c.k0 !== null && c.k0 > 0 ? Math.log10(c.k0) : null;
  const answer = calculate({
    method: 'electrode.mhcAbsolute',
    inputs: {
      lambda: c.lambdaEv,
      overpotential: 0,
      temperature: c.temperatureK,
      coupling: c.couplingEv,
      densityOfStates: c.densityOfStatesPerEv,
    },
  });
  if (!answer.ok) return null;
  const k0 = (answer.outputs as Record<string, unknown>)['k0'];
  return typeof k0 === 'number' && k0 > 0 ? Math.log10(k0) : null;
}

/** The log10 k of a measured point, as plotted. */
const log10 = (p: ElectrodePoint) => Math.log10(p.k);

/** One electrode case: MHC and Butler–Volmer curves, Tafel plot, α(η), fit of measured k(η). */
@Component({
  selector: 'gw-electrode-page',
  imports: [
    RouterLink,
    FormsModule,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatInputModule,
    ElectrodePlot,
  ],
  templateUrl: './electrode-page.html',
  styleUrl: './electrodes.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ElectrodePage {
  private readonly api = inject(ElectrodeApi);
  private readonly route = inject(ActivatedRoute);
  protected readonly workspace = inject(WorkspaceContext);

  protected readonly wid = toSignal(this.route.paramMap.pipe(map((p) => p.get('wid') ?? '')), {
    initialValue: '',
  });
  protected readonly current = signal<ElectrodeCase | null>(null);
  protected readonly csv = signal('');
  protected readonly currentMode = signal(false);
  protected readonly coverage = signal<number | null>(null);
  protected readonly fit = signal<ElectrodeFitResult | null>(null);
  protected readonly fitErrors = signal<string[]>([]);
  protected readonly busy = signal(false);
  protected readonly appliedNote = signal('');

  private readonly loaded = toSignal(
    this.route.paramMap.pipe(
      switchMap((p) => this.api.get(p.get('id') ?? '')),
      tap((c) => this.show(c)),
    ),
  );

  protected readonly parsed = computed(() =>
    parseElectrodeCsv(this.csv(), {
      currentMode: this.currentMode(),
      coverageMolPerCm2: this.coverage() ?? undefined,
    }),
  );

  protected readonly log10k0 = computed(() => {
    const c = this.current();
    return c ? caseLog10k0(c) : null;
  });

  protected readonly absoluteK0 = computed(() => {
    const l = this.log10k0();
    return l === null ? '—' : `${formatMeasured(10 ** l)} s⁻¹`;
  });

  /** Curves at the case's λ, T and k⁰; Butler–Volmer with the fitted α once there is a fit. */
  protected readonly curves = computed<ElectrodeCurves | null>(() => {
    const c = this.current();
    const k0 = this.log10k0();
    if (!c || k0 === null) return null;
    const etas = this.parsed().points.map((p) => Math.abs(p.overpotentialV));
    const span = Math.max(c.lambdaEv + 0.3, ...etas.map((e) => e + 0.05));
    return electrodeCurves({
      lambdaEv: c.lambdaEv,
      temperatureK: c.temperatureK,
      log10k0: k0,
      alpha: this.fit()?.outputs.butlerVolmer.alpha ?? 0.5,
      etaRangeV: [-span, span],
      steps: 121,
    });
  });

  protected readonly bvAlpha = computed(() => this.fit()?.outputs.butlerVolmer.alpha ?? 0.5);

  protected readonly rateCurves = computed<PlotCurve[]>(() => {
    const c = this.curves();
    if (!c) return [];
    const pts = c.points;
    const a = formatMeasured(this.bvAlpha());
    return [
      {
        label: 'MHC k_red (integral)',
        colour: TEAL,
        dash: null,
        points: pts.map((p) => ({ x: p.etaV, y: p.mhcRed })),
      },
      {
        label: 'MHC k_ox (integral)',
        colour: INK,
        dash: null,
        points: pts.map((p) => ({ x: p.etaV, y: p.mhcOx })),
      },
      {
        label: 'MHC k_red (closed form)',
        colour: TEAL_LIGHT,
        dash: '6 4',
        points: pts.map((p) => ({ x: p.etaV, y: p.closedRed })),
      },
      {
        label: 'MHC k_ox (closed form)',
        colour: '#6a7777',
        dash: '6 4',
        points: pts.map((p) => ({ x: p.etaV, y: p.closedOx })),
      },
      {
        label: `BV k_red (α = ${a})`,
        colour: AMBER,
        dash: '2 3',
        points: pts.map((p) => ({ x: p.etaV, y: p.bvRed })),
      },
      {
        label: `BV k_ox (α = ${a})`,
        colour: '#c07a00',
        dash: '2 3',
        points: pts.map((p) => ({ x: p.etaV, y: p.bvOx })),
      },
    ];
  });

  /** Rate-plot y range: from the lowest curve value to 2 decades above the MHC limit. */
  protected readonly rateClip = computed<[number, number] | undefined>(() => {
    const c = this.curves();
    if (!c) return undefined;
    const low = Math.min(...c.points.map((p) => Math.min(p.mhcRed, p.mhcOx)));
    return [low, c.log10Limit + 2];
  });

  protected readonly tafelCurves = computed<PlotCurve[]>(() => {
    const c = this.curves();
    if (!c) return [];
    const fav = c.points.filter((p) => p.etaV <= 0);
    const a = this.bvAlpha();
    return [
      {
        label: 'MHC (integral)',
        colour: TEAL,
        dash: null,
        points: fav.map((p) => ({ x: -p.etaV, y: p.mhcRed })),
      },
      {
        label: `BV (α = ${formatMeasured(a)})`,
        colour: AMBER,
        dash: '2 3',
        points: fav.map((p) => ({ x: -p.etaV, y: p.bvRed })),
      },
      {
        label: 'MHC limit at large |η|',
        colour: '#7a4f00',
        dash: '8 3',
        points: fav.map((p) => ({ x: -p.etaV, y: c.log10Limit })),
      },
    ];
  });

  protected readonly alphaCurves = computed<PlotCurve[]>(() => {
    const c = this.curves();
    if (!c) return [];
    return [
      {
        label: 'MHC apparent α(η)',
        colour: TEAL,
        dash: null,
        points: c.points.map((p) => ({ x: p.etaV, y: p.apparentAlpha })),
      },
      {
        label: 'Butler–Volmer α',
        colour: AMBER,
        dash: '2 3',
        points: c.points.map((p) => ({ x: p.etaV, y: this.bvAlpha() })),
      },
    ];
  });

  protected readonly measured = computed<PlotMarker[]>(() =>
    this.parsed().points.map((p) => ({
      x: p.overpotentialV,
      y: log10(p),
      colour: p.direction === 'reduction' ? TEAL : INK,
      title: `η = ${p.overpotentialV} V, log₁₀ k = ${formatMeasured(log10(p))} (${p.direction})`,
    })),
  );

  protected readonly tafelMeasured = computed<PlotMarker[]>(() =>
    this.parsed()
      .points.filter((p) => p.direction === 'reduction' && p.overpotentialV <= 0)
      .map((p) => ({
        x: -p.overpotentialV,
        y: log10(p),
        colour: INK,
        title: `−η = ${-p.overpotentialV} V, log₁₀ k_red = ${formatMeasured(log10(p))}`,
      })),
  );

  /** α and curvature at three overpotentials (η = −λ/4, −λ/2, −λ) for the table under the plot. */
  protected readonly alphaRows = computed(() => {
    const c = this.current();
    const k0 = this.log10k0();
    if (!c || k0 === null) return [];
    return [0.25, 0.5, 1].map((f) => {
      const eta = -f * c.lambdaEv;
      const p = electrodeCurves({
        lambdaEv: c.lambdaEv,
        temperatureK: c.temperatureK,
        log10k0: k0,
        etaRangeV: [eta, eta],
        steps: 1,
      }).points[0];
      return { eta, alpha: p.apparentAlpha, curvature: p.curvature, log10k: p.mhcRed };
    });
  });

  /** The zero line of the residual plot. */
  protected readonly residualCurves = computed<PlotCurve[]>(() => {
    const pts = this.fittedPoints();
    if (!pts?.length) return [];
    const xs = pts.map((p) => p.overpotentialV);
    return [
      {
        label: 'zero',
        colour: '#6a7777',
        dash: '4 3',
        points: [
          { x: Math.min(...xs), y: 0 },
          { x: Math.max(...xs), y: 0 },
        ],
      },
    ];
  });
  protected readonly residualMarkers = computed<PlotMarker[]>(() => {
    const f = this.fit();
    const pts = this.fittedPoints();
    if (!f || !pts) return [];
    return [
      ...f.outputs.mhc.residuals.map((r, i) => ({
        x: pts[i].overpotentialV,
        y: r,
        colour: TEAL,
        title: `MHC residual at η = ${pts[i].overpotentialV} V: ${formatMeasured(r)}`,
      })),
      ...f.outputs.butlerVolmer.residuals.map((r, i) => ({
        x: pts[i].overpotentialV,
        y: r,
        colour: AMBER,
        title: `BV residual at η = ${pts[i].overpotentialV} V: ${formatMeasured(r)}`,
      })),
    ];
  });
  private readonly fittedPoints = signal<ElectrodePoint[] | null>(null);

  protected readonly verdictText = computed(() => {
    const f = this.fit();
    if (!f) return '';
    const d = f.outputs.deltaAic;
    const w = formatMeasured(f.outputs.mhcAkaikeWeight);
    if (f.outputs.verdict === 'mhc')
      return `Marcus–Hush–Chidsey fits better: ΔAIC (BV − MHC) = ${d.toFixed(1)}, Akaike weight of MHC ${w}.`;
    if (f.outputs.verdict === 'butlerVolmer')
      return `Butler–Volmer fits better: ΔAIC (BV − MHC) = ${d.toFixed(1)}, Akaike weight of MHC ${w}.`;
    return `The two models fit equally well (|ΔAIC| = ${Math.abs(d).toFixed(1)} < 2); the data do not choose.`;
  });

  private show(c: ElectrodeCase): void {
    this.current.set(c);
    this.csv.set(pointsToCsv(c.points));
    this.fit.set(null);
    this.fittedPoints.set(null);
  }

  protected fmt(value: number | null | undefined, se?: number | null, unit = ''): string {
    return formatMeasured(value ?? null, se, unit);
  }

  protected modelRows(
    f: ElectrodeFitResult,
  ): { name: string; parameter: string; m: ElectrodeModelFitOut }[] {
    return [
      {
        name: 'Marcus–Hush–Chidsey',
        parameter: `λ = ${formatMeasured(f.outputs.mhc.lambda ?? null, f.outputs.mhc.lambdaStandardError, 'eV')}`,
        m: f.outputs.mhc,
      },
      {
        name: 'Butler–Volmer',
        parameter: `α = ${formatMeasured(f.outputs.butlerVolmer.alpha ?? null, f.outputs.butlerVolmer.alphaStandardError)}`,
        m: f.outputs.butlerVolmer,
      },
    ];
  }

  protected onFile(event: Event): void {
    const file = (event.target as HTMLInputElement).files?.[0];
    if (!file) return;
    void file.text().then((text) => this.csv.set(text));
  }

  protected runFit(): void {
    const c = this.current();
    const parsed = this.parsed();
    if (!c) return;
    if (parsed.errors.length) {
      this.fitErrors.set(parsed.errors);
      return;
    }
    this.busy.set(true);
    this.fitErrors.set([]);
    this.api.fit(c.id, parsed.points).subscribe({
      next: (f) => {
        this.fit.set(f);
        this.fittedPoints.set(parsed.points);
        this.busy.set(false);
      },
      error: (e: unknown) => this.failed(e),
    });
  }

  protected apply(): void {
    const c = this.current();
    const pts = this.fittedPoints();
    if (!c || !pts) return;
    this.busy.set(true);
    this.api.applyFit(c.id, c.version, pts).subscribe({
      next: (saved) => {
        const f = this.fit();
        this.show(saved);
        this.fit.set(f);
        this.fittedPoints.set(pts);
        this.appliedNote.set(`Saved as version ${saved.version}.`);
        this.busy.set(false);
      },
      error: (e: unknown) => this.failed(e),
    });
  }

  private failed(e: unknown): void {
    this.busy.set(false);
    const body = e instanceof HttpErrorResponse ? e.error : null;
    const fields = (body?.error?.fields ?? []) as { field: string; message: string }[];
    this.fitErrors.set(
      fields.length
        ? fields.map((f) => `${f.field}: ${f.message}`)
        : [body?.error?.message ?? 'The request failed.'],
    );
  }

  /** For the template: the case has loaded (keeps the subscription alive). */
  protected readonly ready = computed(() => this.loaded() !== undefined);
}
