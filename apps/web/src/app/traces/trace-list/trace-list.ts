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
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { Router, RouterLink } from '@angular/router';
import {
  TRACE_FILE_UNITS,
  type Trace,
  type TraceAnalysis,
  type TraceFileUnit,
  type TraceState,
} from '@gapwise/contracts';
import { catchError, forkJoin, last, map, of, switchMap, tap } from 'rxjs';
import { apiErrorOf } from '../../session/api-errors';
import { RichText } from '../../shared/rich-text/rich-text';
import { formatSignificant } from '../../units/number-format';
import { WorkspaceContext } from '../../workspaces/workspace-context';
import { TracesApi, type UploadStep } from '../traces-api';

/** A refused upload: which file, the message, and the listed bad lines. */
interface UploadProblem {
  readonly state: TraceState;
  readonly fileName: string;
  readonly message: string;
  readonly lines: string[];
}

function problemOf(state: TraceState, file: File, err: unknown): UploadProblem {
  const e = apiErrorOf(err);
  return {
    state,
    fileName: file.name,
    message: e.message,
    lines: (e.fields ?? []).map((f) =>
      f.field === 'file' ? f.message : `${f.field}: ${f.message}`,
    ),
  };
}

/** Human-readable byte count. */
export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  const units = ['kB', 'MB', 'GB'];
  let value = bytes / 1024;
  let i = 0;
  while (value >= 1024 && i < units.length - 1) {
    value /= 1024;
    i++;
  }
  return `${value.toFixed(value < 10 ? 1 : 0)} ${units[i]}`;
}

/**
 * The workspace's energy-gap traces and analyses; editors upload a reactant-state and a
 * product-state file (progress bars while they stream) and start an analysis of them.
 */
@Component({
  selector: 'gw-trace-list',
  imports: [
    GwDatePipe,
    DecimalPipe,
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    RichText,
  ],
  templateUrl: './trace-list.html',
  styleUrl: './trace-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class TraceList {
  private readonly api = inject(TracesApi);
  private readonly router = inject(Router);
  private readonly destroyRef = inject(DestroyRef);
  protected readonly workspace = inject(WorkspaceContext);

  /** Route parameter. */
  readonly wid = input.required<string>();

  protected readonly units = TRACE_FILE_UNITS;
  protected readonly states = ['reactant', 'product'] as const;
  protected readonly traces = signal<Trace[] | null>(null);
  protected readonly analyses = signal<TraceAnalysis[] | null>(null);
  protected readonly loadError = signal<string | null>(null);
  protected readonly files = signal<Record<TraceState, File | null>>({
    reactant: null,
    product: null,
  });
  protected readonly uploadProgress = signal<Record<TraceState, number> | null>(null);
  protected readonly problems = signal<UploadProblem[]>([]);
  protected readonly busy = signal(false);
  protected readonly startError = signal<string | null>(null);

  protected readonly uploadForm = new FormGroup({
    unit: new FormControl<TraceFileUnit>('eV', { nonNullable: true }),
    column: new FormControl('', { nonNullable: true }),
    skipBadLines: new FormControl(false, { nonNullable: true }),
    temperature: new FormControl<number | null>(300, {
      validators: [Validators.required, Validators.min(0.001)],
    }),
  });

  protected readonly analyseForm = new FormGroup({
    reactantTraceId: new FormControl('', { nonNullable: true, validators: Validators.required }),
    productTraceId: new FormControl('', { nonNullable: true, validators: Validators.required }),
    temperature: new FormControl<number | null>(300, {
      validators: [Validators.required, Validators.min(0.001)],
    }),
  });

  protected readonly reactantTraces = computed(() =>
    (this.traces() ?? []).filter((t) => t.state === 'reactant'),
  );
  protected readonly productTraces = computed(() =>
    (this.traces() ?? []).filter((t) => t.state === 'product'),
  );
  protected readonly traceNames = computed(
    () => new Map((this.traces() ?? []).map((t) => [t.id, t.fileName])),
  );
  protected readonly canUpload = computed(
    () => !!this.files().reactant && !!this.files().product && !this.busy(),
  );

  protected readonly formatBytes = formatBytes;
  protected readonly fmt = formatSignificant;

  constructor() {
    effect(() => this.reload(this.wid()));
  }

  protected reload(wid: string): void {
    this.loadError.set(null);
    forkJoin([this.api.list(wid), this.api.analyses(wid)])
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: ([traces, analyses]) => {
          this.traces.set(traces);
          this.analyses.set(analyses);
        },
        error: (err: unknown) => this.loadError.set(apiErrorOf(err).message),
      });
  }

  protected chooseFile(state: TraceState, event: Event): void {
    const file = (event.target as HTMLInputElement).files?.[0] ?? null;
    this.files.update((f) => ({ ...f, [state]: file }));
    this.problems.set([]);
  }

  /** Uploads both files at once (each with its progress bar), then queues their analysis. */
  protected uploadAndAnalyse(): void {
    const { reactant, product } = this.files();
    const v = this.uploadForm.getRawValue();
    if (!reactant || !product || this.uploadForm.invalid || v.temperature === null) return;
    const wid = this.wid();
    this.busy.set(true);
    this.problems.set([]);
    this.startError.set(null);
    this.uploadProgress.set({ reactant: 0, product: 0 });
    const settings = { unit: v.unit, column: v.column, skipBadLines: v.skipBadLines };
    const one = (state: TraceState, file: File) =>
      this.api.upload(wid, file, { ...settings, state }).pipe(
        tap((step: UploadStep) => {
          if (step.kind === 'progress')
            this.uploadProgress.update((p) => ({ ...p!, [state]: step.fraction }));
        }),
        last(),
      );
    // Each upload reports its own refusal; the analysis starts only when both were stored.
    const guard = (state: TraceState, file: File) =>
      one(state, file).pipe(
        map((step): Trace | UploadProblem =>
          step.kind === 'done' ? step.trace : problemOf(state, file, 'no answer'),
        ),
        catchError((err: unknown) => of(problemOf(state, file, err))),
      );
    forkJoin([guard('reactant', reactant), guard('product', product)])
      .pipe(
        switchMap(([r, p]) => {
          const refused = [r, p].filter((x): x is UploadProblem => 'lines' in x);
          if (refused.length) {
            this.problems.set(refused);
            throw new Error('refused');
          }
          return this.api.start(wid, {
            reactantTraceId: (r as Trace).id,
            productTraceId: (p as Trace).id,
            temperature: v.temperature!,
          });
        }),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe({
        next: (analysis) => void this.router.navigate(['/w', wid, 'trace-analyses', analysis.id]),
        error: (err: unknown) => {
          this.busy.set(false);
          this.uploadProgress.set(null);
          if (this.problems().length === 0) this.startError.set(apiErrorOf(err).message);
          this.reload(wid);
        },
      });
  }

  protected analyseExisting(): void {
    const v = this.analyseForm.getRawValue();
    if (this.analyseForm.invalid || v.temperature === null) return;
    this.startError.set(null);
    this.api
      .start(this.wid(), {
        reactantTraceId: v.reactantTraceId,
        productTraceId: v.productTraceId,
        temperature: v.temperature,
      })
      .subscribe({
        next: (analysis) =>
          void this.router.navigate(['/w', this.wid(), 'trace-analyses', analysis.id]),
        error: (err: unknown) => {
          const e = apiErrorOf(err);
          this.startError.set(
            [e.message, ...(e.fields ?? []).map((f) => `${f.field}: ${f.message}`)].join(' '),
          );
        },
      });
  }
}
