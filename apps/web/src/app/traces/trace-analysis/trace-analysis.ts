import { GwDatePipe } from '../../shared/date/gw-date';
import { DecimalPipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  effect,
  inject,
  input,
  signal,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import { formatMeasured, type Pair, type Trace, type TraceAnalysis } from '@gapwise/contracts';
import { filter, finalize, switchMap } from 'rxjs';
import { apiErrorOf } from '../../session/api-errors';
import { RichText } from '../../shared/rich-text/rich-text';
import { formatSignificant, measuredParts } from '../../units/number-format';
import { WorkspaceContext } from '../../workspaces/workspace-context';
import { AttachDialog, type AttachDialogData } from '../attach-dialog/attach-dialog';
import type { GapOutputs } from '../gap-outputs';
import { BlockPlot } from '../plots/block-plot';
import { FreeEnergyPlot } from '../plots/free-energy-plot';
import { GapHistogramPlot } from '../plots/gap-histogram-plot';
import { TracesApi } from '../traces-api';

/** One row of the numbers table: value ± error (eV), and where it comes from. */
interface NumberRow {
  readonly label: string;
  readonly value: number;
  readonly error: number | null;
  readonly note: string;
  readonly key: string;
}

/**
 * One analysis: its progress while queued or running (server-sent events), then the numbers with
 * error bars, warnings, histograms, free-energy curves and block analysis, and "use as λ of pair".
 */
@Component({
  selector: 'gw-trace-analysis',
  imports: [
    GwDatePipe,
    DecimalPipe,
    RouterLink,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    GapHistogramPlot,
    FreeEnergyPlot,
    BlockPlot,
    RichText,
  ],
  templateUrl: './trace-analysis.html',
  styleUrl: './trace-analysis.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class TraceAnalysisPage {
  private readonly api = inject(TracesApi);
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);
  private readonly router = inject(Router);
  private readonly destroyRef = inject(DestroyRef);
  protected readonly workspace = inject(WorkspaceContext);

  /** Route parameters. */
  readonly wid = input.required<string>();
  readonly aid = input.required<string>();

  protected readonly analysis = signal<TraceAnalysis | null>(null);
  protected readonly traces = signal<Trace[]>([]);
  protected readonly loadError = signal<string | null>(null);
  protected readonly attachedPair = signal<Pair | null>(null);

  protected readonly outputs = computed<GapOutputs | null>(
    () => this.analysis()?.result?.outputs ?? null,
  );
  protected readonly result = computed(() => this.analysis()?.result ?? null);
  protected readonly fileOf = computed(() => new Map(this.traces().map((t) => [t.id, t])));

  protected readonly rows = computed<NumberRow[]>(() => {
    const o = this.outputs();
    if (!o) return [];
    const se = o.standardErrors;
    return [
      {
        key: 'lambda',
        label: 'λ from means, (⟨ΔE⟩_R − ⟨ΔE⟩_P)/2',
        value: o.lambdaFromMeans,
        error: se.lambdaFromMeans,
        note: 'block-averaged SE',
      },
      {
        key: 'deltaG0',
        label: 'ΔG° from means, (⟨ΔE⟩_R + ⟨ΔE⟩_P)/2',
        value: o.deltaG0FromMeans,
        error: se.deltaG0FromMeans,
        note: 'block-averaged SE',
      },
      {
        key: 'lambdaVarR',
        label: 'λ from the reactant variance, σ_R²/(2k_BT)',
        value: o.lambdaFromVarianceReactant,
        error: null,
        note: '',
      },
      {
        key: 'lambdaVarP',
        label: 'λ from the product variance, σ_P²/(2k_BT)',
        value: o.lambdaFromVarianceProduct,
        error: null,
        note: '',
      },
      {
        key: 'ratio',
        label: 'Linear-response ratio (mean variance λ ÷ λ from means)',
        value: o.linearResponseRatio,
        error: null,
        note: '1 in linear response',
      },
      {
        key: 'barrier',
        label: 'ΔG‡ = G_R(0) − min G_R',
        value: o.activationFreeEnergy,
        error: null,
        note: o.activationFreeEnergySource.replace(/-/g, ' '),
      },
      {
        key: 'meanR',
        label: '⟨ΔE⟩_R',
        value: o.meanReactant,
        error: se.meanReactant,
        note: `naive SE ${formatSignificant(o.naiveStandardErrors.meanReactant, 2)}`,
      },
      {
        key: 'meanP',
        label: '⟨ΔE⟩_P',
        value: o.meanProduct,
        error: se.meanProduct,
        note: `naive SE ${formatSignificant(o.naiveStandardErrors.meanProduct, 2)}`,
      },
      {
        key: 'cumR',
        label: 'ΔG° (2nd cumulant, reactant)',
        value: o.deltaG0CumulantReactant,
        error: null,
        note: '',
      },
      {
        key: 'cumP',
        label: 'ΔG° (2nd cumulant, product)',
        value: o.deltaG0CumulantProduct,
        error: null,
        note: '',
      },
      {
        key: 'parR',
        label: 'λ from the parabola fit (reactant)',
        value: o.lambdaFromParabolaReactant,
        error: null,
        note: 'bins with ≥ 10 samples',
      },
      {
        key: 'parP',
        label: 'λ from the parabola fit (product)',
        value: o.lambdaFromParabolaProduct,
        error: null,
        note: 'bins with ≥ 10 samples',
      },
    ];
  });

  protected readonly fmt = formatSignificant;
  /** Value and σ with the digits σ supports (the one rule of contracts' `formatMeasured`). */
  protected readonly measured = measuredParts;
  protected readonly measuredText = (v: number, s: number | null) => formatMeasured(v, s);

  constructor() {
    effect(() => this.load(this.wid(), this.aid()));
  }

  private load(wid: string, aid: string): void {
    this.api
      .list(wid)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({ next: (t) => this.traces.set(t), error: () => undefined });
    this.api
      .analysis(aid)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (a) => {
          this.analysis.set(a);
          if (a.status === 'queued' || a.status === 'running') this.follow(aid);
        },
        error: (err: unknown) => this.loadError.set(apiErrorOf(err).message),
      });
  }

  /** Follows progress over server-sent events, then reloads the finished analysis. */
  private follow(aid: string): void {
    this.api
      .progress(aid)
      .pipe(
        finalize(() => undefined),
        filter((p) => {
          this.analysis.update((a) => (a ? { ...a, status: p.status, progress: p.progress } : a));
          return p.status === 'done' || p.status === 'failed';
        }),
        switchMap(() => this.api.analysis(aid)),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe({
        next: (a) => this.analysis.set(a),
        error: (err: unknown) => this.loadError.set(apiErrorOf(err).message),
      });
  }

  protected openAttach(): void {
    const a = this.analysis();
    const o = this.outputs();
    if (!a || !o) return;
    const data: AttachDialogData = {
      workspaceId: this.wid(),
      analysisId: a.id,
      lambda: o.lambdaFromMeans,
      deltaG0: o.deltaG0FromMeans,
      temperatureK: a.temperatureK,
    };
    this.dialog
      .open<AttachDialog, AttachDialogData, Pair>(AttachDialog, { data, width: '560px' })
      .afterClosed()
      .subscribe((pair) => {
        if (!pair) return;
        this.attachedPair.set(pair);
        this.snack
          .open(`Saved on ${pair.name} (version ${pair.version}).`, 'Open pair', { duration: 8000 })
          .onAction()
          .subscribe(() => void this.router.navigate(['/w', this.wid(), 'pairs', pair.id]));
      });
  }
}
