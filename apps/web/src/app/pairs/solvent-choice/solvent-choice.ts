import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import {
  pairSaveFieldLabel,
  formatNumber,
  pairSolventScan,
  PARAMETER_KINDS,
  sourceText,
  type Pair,
  type PairParameter,
  type SolventScanRow,
} from '@gapwise/contracts';
import { apiErrorOf } from '../../session/api-errors';
import { WorkspaceContext } from '../../workspaces/workspace-context';
import { PairsApi } from '../pairs-api';
import { solventChart } from './solvent-chart';

/**
 * Solvent choice of a pair (issue 18): k for charge separation and recombination in every solvent
 * of the built-in table, with ΔG° (Born/Weller) and λₒ (two-sphere) recomputed per solvent by the
 * pair model; "Use this solvent" saves a new pair version with provenance through the pairs API.
 */
@Component({
  selector: 'gw-solvent-choice',
  imports: [RouterLink, MatButtonModule, MatIconModule],
  templateUrl: './solvent-choice.html',
  styleUrl: './solvent-choice.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SolventChoice {
  private readonly api = inject(PairsApi);
  private readonly route = inject(ActivatedRoute);
  private readonly router = inject(Router);
  protected readonly workspace = inject(WorkspaceContext);
  protected readonly wid = signal('');
  protected readonly pair = signal<Pair | null>(null);
  protected readonly error = signal('');
  protected readonly busy = signal(false);

  protected readonly scan = computed(() => {
    const p = this.pair();
    return p ? pairSolventScan(p) : null;
  });
  protected readonly rows = computed(() =>
    (this.scan()?.rows ?? []).slice().sort((a, b) => b.pekar - a.pekar),
  );
  protected readonly chart = computed(() => solventChart(this.scan()?.rows ?? []));

  constructor() {
    this.route.paramMap.pipe(takeUntilDestroyed()).subscribe((p) => {
      this.wid.set(p.get('wid') ?? '');
      const id = p.get('pairId');
      if (id) this.api.get(id).subscribe((pair) => this.pair.set(pair));
    });
  }

  protected fmt(x: number | null, sig = 3): string {
    return formatNumber(x, sig);
  }

  protected fixed(x: number | null, decimals = 2): string {
    return x === null ? '—' : x.toFixed(decimals);
  }

  protected sources(row: SolventScanRow): string {
    const s = row.solvent.sources;
    return `ε_s: ${sourceText(s.epsilon)}; n: ${sourceText(s.refractiveIndex)}; viscosity: ${sourceText(s.viscosity)}`;
  }

  protected current(row: SolventScanRow): boolean {
    const eps = this.pair()?.parameters.find((p) => p.kind === 'epsilonStatic')?.value;
    return eps !== undefined && Math.abs(eps - row.solvent.epsilon) < 1e-9;
  }

  /** Saves the row's parameters as a new version of the pair (medium = the solvent). */
  protected use(row: SolventScanRow): void {
    const pair = this.pair();
    if (!pair || !row.parameters) return;
    const parameters: PairParameter[] = row.parameters.map((q) => {
      const old = pair.parameters.find((p) => p.kind === q.kind);
      const quantity = PARAMETER_KINDS[q.kind as keyof typeof PARAMETER_KINDS]?.quantity;
      return {
        kind: q.kind as PairParameter['kind'],
        value: q.value,
        unit: old?.unit ?? (quantity === 'energy' ? 'eV' : ''),
        uncertainty: q.uncertainty ?? null,
        provenance: q.provenance ?? old!.provenance,
      };
    });
    this.busy.set(true);
    this.error.set('');
    this.api
      .update(pair.id, {
        name: pair.name,
        donor: pair.donor,
        acceptor: pair.acceptor,
        medium: row.solvent.name,
        temperature: pair.temperature,
        temperatureUnit: pair.temperatureUnit,
        notes: pair.notes,
        status: pair.status,
        tags: pair.tags,
        model: pair.model,
        parameters,
        version: pair.version,
      })
      .subscribe({
        next: (saved) => {
          this.busy.set(false);
          void this.router.navigate(['/w', this.wid(), 'pairs', saved.id]);
        },
        error: (e) => {
          this.busy.set(false);
          const err = apiErrorOf(e);
          this.error.set(
            err.fields?.length
              ? err.fields
                  .map((f) => `${pairSaveFieldLabel(f.field, parameters)}: ${f.message}`)
                  .join('; ')
              : err.message,
          );
        },
      });
  }
}
