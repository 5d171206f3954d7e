import { GwDatePipe } from '../../shared/date/gw-date';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  signal,
} from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginatorModule, PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSortModule, Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { MatTooltipModule } from '@angular/material/tooltip';
import { Router, RouterLink } from '@angular/router';
import {
  ratioText,
  regimeLabel,
  type Page,
  type PairListItem,
  type PairStatus,
} from '@gapwise/contracts';
import {
  catchError,
  combineLatest,
  debounceTime,
  distinctUntilChanged,
  map,
  of,
  startWith,
  switchMap,
  tap,
} from 'rxjs';
import { formatFixed, formatSignificant } from '../../units/number-format';
import { WorkspaceContext } from '../../workspaces/workspace-context';
import { downloadText, pairsToCsv } from '../pair-csv';
import { PairsApi } from '../pairs-api';

interface Filters {
  q: string;
  regime: string;
  tag: string;
  status: PairStatus | '';
}

/** The workspace's pairs: server-side sort, filter and pagination; create, duplicate, archive, CSV. */
@Component({
  selector: 'gw-pair-table',
  imports: [
    GwDatePipe,
    ReactiveFormsModule,
    RouterLink,
    MatTableModule,
    MatSortModule,
    MatPaginatorModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatButtonModule,
    MatIconModule,
    MatMenuModule,
    MatProgressBarModule,
    MatTooltipModule,
  ],
  templateUrl: './pair-table.html',
  styleUrl: './pair-table.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PairTable {
  private readonly api = inject(PairsApi);
  private readonly router = inject(Router);
  protected readonly workspace = inject(WorkspaceContext);

  /** Route parameter. */
  readonly wid = input.required<string>();

  protected readonly columns = [
    'name',
    'donor',
    'acceptor',
    'deltaG0',
    'lambda',
    'coupling',
    'log10k',
    'regime',
    'log10kCr',
    'regimeCr',
    'ratio',
    'updatedAt',
    'updatedBy',
    'actions',
  ];
  protected readonly filters = new FormGroup({
    q: new FormControl('', { nonNullable: true }),
    regime: new FormControl('', { nonNullable: true }),
    tag: new FormControl('', { nonNullable: true }),
    status: new FormControl<PairStatus | ''>('', { nonNullable: true }),
  });
  protected readonly sort = signal<Sort>({ active: 'updatedAt', direction: 'desc' });
  protected readonly page = signal({ offset: 0, limit: 25 });
  private readonly reloads = signal(0);
  protected readonly loading = signal(false);
  protected readonly failed = signal(false);
  protected readonly fmt = formatSignificant;
  protected readonly fmtLog = formatFixed;
  /** "Inverted", as the pair page and the PDF print a regime. */
  protected readonly regime = regimeLabel;
  protected readonly ratioText = ratioText;

  private readonly filters$ = this.filters.valueChanges.pipe(
    startWith(this.filters.getRawValue()),
    map(() => this.filters.getRawValue() as Filters),
    debounceTime(250),
    distinctUntilChanged((a, b) => JSON.stringify(a) === JSON.stringify(b)),
    tap(() => this.page.update((p) => ({ ...p, offset: 0 }))),
  );

  private readonly result = toSignal(
    combineLatest([
      toObservable(this.wid),
      this.filters$,
      toObservable(this.sort),
      toObservable(this.page),
      toObservable(this.reloads),
    ]).pipe(
      debounceTime(0),
      tap(() => {
        this.loading.set(true);
        this.failed.set(false);
      }),
      switchMap(([wid, f, sort, page]) =>
        this.api
          .list(wid, {
            ...page,
            ...f,
            sort: sort.direction
              ? `${sort.direction === 'desc' ? '-' : ''}${sort.active}`
              : undefined,
          })
          .pipe(
            catchError(() => {
              this.failed.set(true);
              return of<Page<PairListItem> | null>(null);
            }),
          ),
      ),
      tap(() => this.loading.set(false)),
    ),
    { initialValue: null },
  );

  protected readonly rows = computed(() => this.result()?.items ?? []);
  protected readonly total = computed(() => this.result()?.total ?? 0);

  constructor() {
    // A new workspace starts on the first page.
    effect(() => {
      this.wid();
      this.page.update((p) => ({ ...p, offset: 0 }));
    });
  }

  protected changeSort(sort: Sort): void {
    this.sort.set(sort);
    this.page.update((p) => ({ ...p, offset: 0 }));
  }

  protected changePage(event: PageEvent): void {
    this.page.set({ offset: event.pageIndex * event.pageSize, limit: event.pageSize });
  }

  protected clearFilters(): void {
    this.filters.reset();
  }

  protected duplicate(row: PairListItem): void {
    this.api
      .duplicate(row.id)
      .subscribe((copy) => void this.router.navigate(['/w', this.wid(), 'pairs', copy.id]));
  }

  protected archive(row: PairListItem): void {
    this.api.archive(row.id).subscribe(() => this.reloads.update((n) => n + 1));
  }

  protected exportCsv(): void {
    const name = (this.workspace.current()?.workspaceName ?? 'pairs').replace(/[^\w.-]+/g, '-');
    downloadText(pairsToCsv(this.rows()), `${name}-pairs.csv`, 'text/csv;charset=utf-8');
  }
}
