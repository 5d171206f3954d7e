import { GwDatePipe } from '../../shared/date/gw-date';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import {
  PARAMETER_KINDS,
  pairEffectDifferences,
  type Pair,
  type PairVersionSummary,
} from '@gapwise/contracts';
import { catchError, combineLatest, filter, forkJoin, of, switchMap, tap } from 'rxjs';
import { RichText } from '../../shared/rich-text/rich-text';
import { pairDifferences } from '../pair-diff';
import { PairsApi } from '../pairs-api';

/** The versions of one pair and a side-by-side comparison of any two. */
@Component({
  selector: 'gw-version-history',
  imports: [
    GwDatePipe,
    RouterLink,
    MatButtonModule,
    MatIconModule,
    MatFormFieldModule,
    MatSelectModule,
    MatCheckboxModule,
    RichText,
  ],
  templateUrl: './version-history.html',
  styleUrl: './version-history.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class VersionHistory {
  private readonly api = inject(PairsApi);
  readonly wid = input.required<string>();
  readonly pairId = input.required<string>();

  protected readonly from = signal<number | null>(null);
  protected readonly to = signal<number | null>(null);
  protected readonly onlyChanged = signal(true);

  protected readonly versions = toSignal(
    toObservable(this.pairId).pipe(
      switchMap((id) => this.api.versions(id).pipe(catchError(() => of<PairVersionSummary[]>([])))),
      tap((list) => {
        const sorted = [...list].sort((a, b) => b.version - a.version);
        this.to.set(sorted[0]?.version ?? null);
        this.from.set(sorted[1]?.version ?? sorted[0]?.version ?? null);
      }),
    ),
    { initialValue: [] as PairVersionSummary[] },
  );
  protected readonly sortedVersions = computed(() =>
    [...this.versions()].sort((a, b) => b.version - a.version),
  );

  private readonly pairs = toSignal(
    combineLatest([toObservable(this.pairId), toObservable(this.from), toObservable(this.to)]).pipe(
      filter(([, a, b]) => a !== null && b !== null),
      switchMap(([id, a, b]) =>
        forkJoin([this.api.version(id, a as number), this.api.version(id, b as number)]).pipe(
          catchError(() => of<[Pair, Pair] | null>(null)),
        ),
      ),
    ),
  );
  protected readonly rows = computed(() => {
    const p = this.pairs();
    return p ? pairDifferences(p[0], p[1], this.onlyChanged()) : [];
  });
  /** What the change did to the results, computed in the browser through the pair model. */
  protected readonly effects = computed(() => {
    const p = this.pairs();
    if (!p) return [];
    const [a, b] = p;
    return pairEffectDifferences(
      { temperature: a.temperature, model: a.model, parameters: a.parameters },
      { temperature: b.temperature, model: b.model, parameters: b.parameters },
      this.onlyChanged(),
    );
  });
  /**
   * A version's summary with the labels the user sees: versions saved before summaries were
   * written with labels name parameters by their stored kind ("parameters: lambdaOuter").
   */
  protected summaryText(summary: string): string {
    return summary.replace(/\b[a-zA-Z][a-zA-Z0-9]*\b/g, (word) =>
      Object.hasOwn(PARAMETER_KINDS, word)
        ? PARAMETER_KINDS[word as keyof typeof PARAMETER_KINDS].label
        : word,
    );
  }
  protected readonly current = computed(() => this.pairs()?.[1] ?? null);
}
