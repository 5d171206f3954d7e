import { Injectable, computed, inject, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import type { ScreenNumericColumn, ScreenResultPage } from '@gapwise/contracts';
import { catchError, debounceTime, map, of, switchMap } from 'rxjs';
import { ScreensApi, type ResultFilter } from './screens-api';

export type RangeMap = ResultFilter['ranges'];

/** The filters of the form (everything but sorting, paging and the plot's brush). */
export interface FormFilter {
  readonly ranges: RangeMap;
  readonly regimeCs?: string;
  readonly regimeCr?: string;
  readonly warnings?: readonly string[];
  readonly noWarnings?: boolean;
  readonly q?: string;
}

/** A rectangle brushed on the scatter plot, in stored units (ΔG° in eV, log10 k). */
export interface BrushBox {
  readonly x: ScreenNumericColumn;
  readonly xMin: number;
  readonly xMax: number;
  readonly y: ScreenNumericColumn;
  readonly yMin: number;
  readonly yMax: number;
}

/** Rows the plot draws at most (the best by score when more match). */
export const PLOT_LIMIT = 1000;

/** Intersection of two range maps (the tighter bound wins on each side). */
export function intersectRanges(a: RangeMap, b: RangeMap): RangeMap {
  const out: Record<string, { min?: number | null; max?: number | null }> = { ...a };
  for (const [key, r] of Object.entries(b)) {
    const cur = out[key] ?? {};
    const pick = (
      x: number | null | undefined,
      y: number | null | undefined,
      f: typeof Math.max,
    ) => (x === null || x === undefined ? y : y === null || y === undefined ? x : f(x, y));
    out[key] = { min: pick(cur.min, r?.min, Math.max), max: pick(cur.max, r?.max, Math.min) };
  }
  return out as RangeMap;
}

export function brushRanges(b: BrushBox | null): RangeMap {
  if (!b) return {};
  return intersectRanges(
    { [b.x]: { min: b.xMin, max: b.xMax } },
    { [b.y]: { min: b.yMin, max: b.yMax } },
  );
}

/**
 * State of one screen's results: the form's filters, the brush, sorting and paging, and the rows
 * the table and the plot show (both fetched from the server, which filters and sorts in SQL).
 */
@Injectable()
export class ScreenResultsStore {
  private readonly api = inject(ScreensApi);

  readonly screenId = signal<string | null>(null);
  readonly form = signal<FormFilter>({ ranges: {} });
  readonly brush = signal<BrushBox | null>(null);
  readonly sort = signal('-score');
  /** The custom score's terms (empty: none). */
  readonly custom = signal<ReadonlyArray<{ column: ScreenNumericColumn; weight: number }>>([]);
  readonly offset = signal(0);
  readonly limit = signal(25);
  /** Bumped when the screen has more finished rows, so both queries run again. */
  readonly generation = signal(0);

  /** What the table, its CSV export and its pager use: the form, the brush, sort and page. */
  readonly tableFilter = computed<ResultFilter>(() => {
    const f = this.form();
    return {
      ...f,
      ranges: intersectRanges(f.ranges, brushRanges(this.brush())),
      sort: this.sort(),
      offset: this.offset(),
      limit: this.limit(),
      custom: this.custom(),
    };
  });

  /** What the plot draws: the form's filters (not the brush), best scores first. */
  readonly plotFilter = computed<ResultFilter>(() => ({
    ...this.form(),
    sort: '-score',
    offset: 0,
    limit: PLOT_LIMIT,
  }));

  readonly tablePage = toSignal(
    this.fetch(() => this.tableFilter()),
    { initialValue: null },
  );
  readonly plotPage = toSignal(
    this.fetch(() => this.plotFilter()),
    { initialValue: null },
  );
  readonly loading = computed(() => this.tablePage() === null);

  readonly csvUrl = computed(() => {
    const id = this.screenId();
    return id ? this.api.csvUrl(id, this.tableFilter()) : '';
  });

  setForm(filter: FormFilter): void {
    this.form.set(filter);
    this.offset.set(0);
  }

  setBrush(box: BrushBox | null): void {
    this.brush.set(box);
    this.offset.set(0);
  }

  /** Sets the custom score and ranks by it (best first); an empty list goes back to the score. */
  setCustom(terms: ReadonlyArray<{ column: ScreenNumericColumn; weight: number }>): void {
    this.custom.set(terms);
    this.sort.set(terms.length ? '-custom' : '-score');
    this.offset.set(0);
  }

  setSort(sort: string): void {
    this.sort.set(sort);
    this.offset.set(0);
  }

  setPage(offset: number, limit: number): void {
    this.offset.set(offset);
    this.limit.set(limit);
  }

  private fetch(filter: () => ResultFilter) {
    const key = computed(() => ({ id: this.screenId(), filter: filter(), g: this.generation() }));
    return toObservable(key).pipe(
      debounceTime(120),
      switchMap(({ id, filter: f }) =>
        id
          ? this.api.results(id, f).pipe(
              map((page): ScreenResultPage | null => page),
              catchError(() => of({ items: [], total: 0, offset: 0, limit: f.limit })),
            )
          : of(null),
      ),
    );
  }
}
