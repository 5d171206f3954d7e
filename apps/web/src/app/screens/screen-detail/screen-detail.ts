import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  signal,
  viewChild,
} from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule, type PageEvent } from '@angular/material/paginator';
import { MatSelectModule } from '@angular/material/select';
import { MatSortModule, type Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import {
  plainText,
  type Pair,
  type Screen,
  type ScreenNumericColumn,
  type ScreenResultRow,
} from '@gapwise/contracts';
import { catchError, concatMap, filter, from, map, of, switchMap, toArray } from 'rxjs';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatInputModule } from '@angular/material/input';
import { RichText } from '../../shared/rich-text/rich-text';
import { RichTooltip } from '../../shared/rich-tooltip/rich-tooltip';
import { formatFixed, formatSignificant } from '../../units/number-format';
import { WorkspaceContext } from '../../workspaces/workspace-context';
import {
  COLOUR_BY,
  PLOT_RATES,
  RESULT_COLUMNS,
  REGIME_LABELS,
  WARNING_LABELS,
  shownValue,
  type ColourBy,
  type PlotRate,
} from '../result-columns';
import { ResultFilters } from '../result-filters/result-filters';
import { ScreenProgress, STATUS_ICONS, STATUS_LABELS } from '../screen-progress/screen-progress';
import { PLOT_LIMIT, ScreenResultsStore, type BrushBox } from '../screen-results-store';
import { ScreenScatter } from '../screen-scatter/screen-scatter';
import { ScreensApi, isActive } from '../screens-api';

/** One screen: live progress, cancel, filters, scatter plot with brush, results table, CSV. */
@Component({
  selector: 'gw-screen-detail',
  imports: [
    FormsModule,
    RouterLink,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatInputModule,
    MatIconModule,
    MatPaginatorModule,
    MatSelectModule,
    MatSortModule,
    MatTableModule,
    ResultFilters,
    RichText,
    RichTooltip,
    ScreenProgress,
    ScreenScatter,
  ],
  providers: [ScreenResultsStore],
  templateUrl: './screen-detail.html',
  styleUrl: './screen-detail.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ScreenDetail {
  private readonly api = inject(ScreensApi);
  private readonly route = inject(ActivatedRoute);
  private readonly router = inject(Router);
  protected readonly store = inject(ScreenResultsStore);
  protected readonly workspace = inject(WorkspaceContext);

  protected readonly wid = toSignal(this.route.paramMap.pipe(map((p) => p.get('wid') ?? '')), {
    initialValue: '',
  });
  protected readonly screen = signal<Screen | null>(null);
  protected readonly statusLabel = STATUS_LABELS;
  protected readonly statusIcon = STATUS_ICONS;
  protected readonly rates = PLOT_RATES;
  protected readonly colours = COLOUR_BY;
  protected readonly regimeLabel = REGIME_LABELS;
  protected readonly couplingRegimeHelp = [
    'Coupling regime from the Landau–Zener γ with ν_n = 10¹³ s⁻¹ (a screen has no τ_L):',
    'nonadiabatic γ < 0.1, intermediate, adiabatic γ > 10.',
  ];
  protected readonly warningLabel = WARNING_LABELS;
  protected readonly plotLimit = PLOT_LIMIT;
  protected readonly rate = signal<PlotRate>(PLOT_RATES[0]);
  protected readonly colourBy = signal<ColourBy>('score');
  protected readonly colourName = computed(
    () => COLOUR_BY.find((c) => c.key === this.colourBy())?.name ?? '',
  );
  protected readonly opening = signal<number | null>(null);
  protected readonly fmt = formatFixed;
  protected readonly sig = formatSignificant;
  protected readonly shown = shownValue;
  protected readonly active = computed(() => {
    const s = this.screen();
    return s !== null && isActive(s);
  });
  /** The score (and a custom score) right after the pair, so they are in view at 1440 px. */
  protected readonly columns = computed(() => [
    ...(this.workspace.canEdit() ? ['select'] : []),
    'rowNumber',
    'pair',
    'score',
    ...(this.store.custom().length ? ['custom'] : []),
    'deltaGCs',
    'deltaGCr',
    'lambdaTotal',
    'coupling',
    'log10kCsMarcus',
    'log10kCrMarcus',
    'log10kCsMlj',
    'log10kCrMlj',
    'regimeCs',
    'regimeCr',
    'couplingRegime',
    'warnings',
    'open',
  ]);
  /** What each score means and which model it ranks with (from the API). */
  protected readonly scoreWords = toSignal(
    this.api.options().pipe(
      map((o) => o.scores),
      catchError(() => of(null)),
    ),
    { initialValue: null },
  );

  /** Columns a custom score may weigh (as the API allows: not the line, not the score). */
  protected readonly customColumns = RESULT_COLUMNS.filter(
    (c) => c.key !== 'rowNumber' && c.key !== 'score',
  );
  /** The custom score being edited: up to three weighted columns. */
  protected readonly customDraft = signal<
    Array<{ column: ScreenNumericColumn | ''; weight: number | null }>
  >([
    { column: 'log10kCsMlj', weight: 1 },
    { column: 'log10kCrMlj', weight: -1 },
    { column: '', weight: null },
  ]);
  protected readonly customProblem = signal<string | null>(null);
  protected readonly customText = computed(() =>
    this.store
      .custom()
      .map((t, i) => {
        const label = this.customColumns.find((c) => c.key === t.column)?.header ?? t.column;
        const sign = t.weight < 0 ? '−' : i === 0 ? '' : '+';
        const w = Math.abs(t.weight);
        return `${sign} ${w === 1 ? '' : `${w} × `}${label}`.trim();
      })
      .join(' '),
  );

  /** Lines picked in the table to save as pairs. */
  protected readonly selected = signal<ReadonlySet<number>>(new Set());
  protected readonly saving = signal(false);
  protected readonly saved = signal<Pair[]>([]);
  protected readonly saveProblem = signal<string | null>(null);
  protected readonly rows = computed(() => this.store.tablePage()?.items ?? []);
  protected readonly total = computed(() => this.store.tablePage()?.total ?? 0);
  protected readonly plotRows = computed(() => this.store.plotPage()?.items ?? []);
  protected readonly plotTotal = computed(() => this.store.plotPage()?.total ?? 0);

  private readonly scatter = viewChild(ScreenScatter);

  constructor() {
    this.route.paramMap
      .pipe(
        map((p) => p.get('id')),
        filter((id): id is string => !!id),
        switchMap((id) => {
          this.store.screenId.set(id);
          return this.api.watch(id, 1000);
        }),
        takeUntilDestroyed(),
      )
      .subscribe((s) => {
        const before = this.screen();
        this.screen.set(s);
        // More finished rows (or a status change): query the table and the plot again.
        if (
          before &&
          (before.progress.rowsDone !== s.progress.rowsDone || before.status !== s.status)
        ) {
          this.store.generation.update((g) => g + 1);
        }
      });
    effect(() => {
      const s = this.screen();
      if (s) document.title = `${s.name} · Screens · Gapwise`;
    });
  }

  protected cancel(): void {
    const s = this.screen();
    if (!s) return;
    this.api.cancel(s.id).subscribe((next) => this.screen.set(next));
  }

  protected runAgain(): void {
    const s = this.screen();
    if (!s) return;
    this.api.run(s.id).subscribe(() => {
      this.api.watch(s.id, 1000).subscribe((next) => {
        this.screen.set(next);
        this.store.generation.update((g) => g + 1);
      });
    });
  }

  protected sortBy(sort: Sort): void {
    const key = sort.active === 'pair' ? 'donor' : sort.active;
    this.store.setSort(
      sort.direction === '' ? '-score' : `${sort.direction === 'desc' ? '-' : ''}${key}`,
    );
  }

  protected page(event: PageEvent): void {
    this.store.setPage(event.pageIndex * event.pageSize, event.pageSize);
  }

  protected brushed(box: BrushBox | null): void {
    this.store.setBrush(box);
  }

  protected clearBrush(): void {
    this.scatter()?.clearBrush();
    this.store.setBrush(null);
  }

  protected brushText(b: BrushBox): string {
    const xName = b.x === 'deltaGCs' ? '−ΔG°CS' : '−ΔG°CR';
    return `${xName} ${formatFixed(-b.xMax, 2)} to ${formatFixed(-b.xMin, 2)} eV, log₁₀ k ${formatFixed(b.yMin, 1)} to ${formatFixed(b.yMax, 1)}`;
  }

  protected setCustomTerm(index: number, part: 'column' | 'weight', value: string): void {
    this.customDraft.update((terms) =>
      terms.map((t, i) =>
        i !== index
          ? t
          : part === 'column'
            ? { ...t, column: value as ScreenNumericColumn | '' }
            : { ...t, weight: value.trim() === '' ? null : Number(value) },
      ),
    );
  }

  /** Ranks by the custom score (checked here with the labels shown, then on the server). */
  protected applyCustom(): void {
    const terms: Array<{ column: ScreenNumericColumn; weight: number }> = [];
    for (const [i, t] of this.customDraft().entries()) {
      if (t.column === '' && t.weight === null) continue;
      if (t.column === '') {
        this.customProblem.set(`Term ${i + 1}: pick a column for the weight ${t.weight}.`);
        return;
      }
      if (t.weight === null || !Number.isFinite(t.weight)) {
        const label = this.customColumns.find((c) => c.key === t.column)?.header ?? t.column;
        this.customProblem.set(`Term ${i + 1}: the weight of ${label} must be a number.`);
        return;
      }
      terms.push({ column: t.column, weight: t.weight });
    }
    if (!terms.length) {
      this.customProblem.set('Pick at least one column and its weight.');
      return;
    }
    this.customProblem.set(null);
    this.store.setCustom(terms);
  }

  protected clearCustom(): void {
    this.customProblem.set(null);
    this.store.setCustom([]);
  }

  protected toggleRow(line: number, on: boolean): void {
    this.selected.update((set) => {
      const next = new Set(set);
      if (on) next.add(line);
      else next.delete(line);
      return next;
    });
  }

  protected readonly pageAllSelected = computed(() => {
    const rows = this.rows();
    return rows.length > 0 && rows.every((r) => this.selected().has(r.rowNumber));
  });

  protected togglePage(on: boolean): void {
    for (const r of this.rows()) this.toggleRow(r.rowNumber, on);
  }

  /** Saves every selected line as a pair, one after another; units of the upload survive. */
  protected saveSelected(): void {
    const s = this.screen();
    const lines = [...this.selected()].sort((a, b) => a - b);
    if (!s || !lines.length || this.saving()) return;
    this.saving.set(true);
    this.saveProblem.set(null);
    from(lines)
      .pipe(
        concatMap((line) =>
          this.api.openAsPair(s.id, line).pipe(
            map((pair) => ({ line, pair }) as const),
            catchError(() => of({ line, pair: null })),
          ),
        ),
        toArray(),
      )
      .subscribe((outcomes) => {
        this.saving.set(false);
        const made = outcomes.flatMap((o) => (o.pair ? [o.pair] : []));
        const failed = outcomes.filter((o) => !o.pair).map((o) => o.line);
        this.saved.set(made);
        this.selected.set(new Set(failed));
        if (failed.length) {
          this.saveProblem.set(
            `Line${failed.length === 1 ? '' : 's'} ${failed.join(', ')} could not be saved; they stay selected.`,
          );
        }
      });
  }

  protected openAsPair(row: ScreenResultRow): void {
    const s = this.screen();
    if (!s) return;
    this.opening.set(row.rowNumber);
    this.api.openAsPair(s.id, row.rowNumber).subscribe({
      next: (pair) => void this.router.navigate(['/w', this.wid(), 'pairs', pair.id]),
      error: () => this.opening.set(null),
    });
  }

  /** The row's warnings in words, with subscript markup (for the tooltip). */
  protected warningLines(row: ScreenResultRow): string[] {
    return row.warnings.map((w) => this.warningLabel[w] ?? w);
  }

  /** The same as plain text (for the aria-label). */
  protected warningText(row: ScreenResultRow): string {
    // Each warning may end with a full stop; joined, that read ".;".
    return plainText(
      this.warningLines(row)
        .map((w) => w.replace(/\.$/, ''))
        .join('; '),
    );
  }

  protected choiceText(s: Screen): string {
    if (s.badRowChoice === 'run-good') return 'chosen: run the good rows';
    if (s.badRowChoice === 'fixed') return 'the file was fixed after a bad-row report';
    return '';
  }
}
