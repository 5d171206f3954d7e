import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import {
  formatNumber,
  parseNeighbourCsv,
  type MaterialInput,
  type MaterialNeighbour,
  type MaterialResults,
} from '@gapwise/contracts';
import { WorkspaceContext } from '../../workspaces/workspace-context';
import { apiErrorOf } from '../../session/api-errors';
import { MaterialsApi } from '../materials-api';
import { contributionBars, headline, mobilityCurve } from './material-view';

/** One neighbour row as typed (text, so a half-typed number is not lost). */
interface NeighbourRow {
  label: string;
  distance: string;
  x: string;
  y: string;
  z: string;
  coupling: string;
  sigma: string;
  deltaG0: string;
}

const blankRow = (label: string): NeighbourRow => ({
  label,
  distance: '',
  x: '',
  y: '',
  z: '',
  coupling: '',
  sigma: '',
  deltaG0: '',
});

const text = (v: number | null | undefined) =>
  v === null || v === undefined || !Number.isFinite(v) ? '' : String(v);

function rowOf(n: MaterialNeighbour): NeighbourRow {
  const v = n.vectorAngstrom ?? null;
  return {
    label: n.label,
    distance: v ? '' : text(n.distanceAngstrom),
    x: v ? text(v[0]) : '',
    y: v ? text(v[1] ?? 0) : '',
    z: v ? text(v[2] ?? 0) : '',
    coupling: text(n.couplingEv),
    sigma: text(n.couplingSigmaEv),
    deltaG0: text(n.deltaG0Ev),
  };
}

/**
 * A material case: λ, temperature, lattice dimension and the neighbours of a site (typed, pasted
 * or uploaded as CSV). Computes in the API's compute pool; shows rates, D, μ (tensor and principal
 * values with vectors), the per-neighbour contributions, μ(T) and the Monte Carlo interval.
 */
@Component({
  selector: 'gw-material-page',
  imports: [
    FormsModule,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
  ],
  templateUrl: './material-page.html',
  styleUrl: '../materials.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MaterialPage {
  private readonly api = inject(MaterialsApi);
  private readonly route = inject(ActivatedRoute);
  private readonly router = inject(Router);
  protected readonly workspace = inject(WorkspaceContext);

  protected readonly wid = signal('');
  protected readonly id = signal<string | null>(null);
  protected readonly version = signal(0);
  protected name = '';
  protected notes = '';
  protected lambda = '';
  protected lambdaSigma = '';
  protected temperature = '300';
  protected dimensions: 1 | 2 | 3 = 3;
  protected readonly rows = signal<NeighbourRow[]>([blankRow('a'), blankRow('b')]);
  protected csvText = '';
  protected readonly errors = signal<string[]>([]);
  protected readonly status = signal('');
  protected readonly busy = signal(false);
  protected readonly results = signal<MaterialResults | null>(null);
  /** Labels of the neighbours the shown results belong to. */
  private readonly resultLabels = signal<string[]>([]);
  private readonly resultTemperature = signal(300);

  protected readonly headline = computed(() => {
    const r = this.results();
    return r ? headline(r) : null;
  });
  protected readonly bars = computed(() => {
    const r = this.results();
    return r ? contributionBars(this.resultLabels(), r) : [];
  });
  protected readonly curve = computed(() => {
    const r = this.results();
    return r ? mobilityCurve(r, this.resultTemperature()) : null;
  });
  protected readonly labels = computed(() => this.resultLabels());

  constructor() {
    this.route.paramMap.pipe(takeUntilDestroyed()).subscribe((p) => {
      this.wid.set(p.get('wid') ?? '');
      const id = p.get('id');
      this.id.set(id);
      if (id) {
        this.api.get(id).subscribe((m) => {
          this.name = m.name;
          this.notes = m.notes;
          this.lambda = text(m.lambdaEv);
          this.lambdaSigma = text(m.lambdaSigmaEv);
          this.temperature = text(m.temperatureK);
          this.dimensions = m.dimensions;
          this.version.set(m.version);
          this.rows.set(m.neighbours.map(rowOf));
          this.resultLabels.set(m.neighbours.map((n) => n.label));
          this.resultTemperature.set(m.temperatureK);
          this.results.set(m.results);
        });
      }
    });
  }

  protected addRow(): void {
    this.rows.update((r) => [...r, blankRow(`n${r.length + 1}`)]);
  }

  protected removeRow(i: number): void {
    this.rows.update((r) => r.filter((_, j) => j !== i));
  }

  protected touch(): void {
    this.rows.update((r) => [...r]);
  }

  protected useCsv(): void {
    const parsed = parseNeighbourCsv(this.csvText);
    this.errors.set(parsed.errors);
    if (parsed.neighbours.length && !parsed.errors.length) {
      this.rows.set(parsed.neighbours.map(rowOf));
      this.status.set(`${parsed.neighbours.length} neighbours read from the CSV.`);
    }
  }

  protected async upload(event: Event): Promise<void> {
    const file = (event.target as HTMLInputElement).files?.[0];
    if (!file) return;
    this.csvText = await file.text();
    this.useCsv();
  }

  /** The typed form as the API body, or the messages naming what is wrong. */
  private body(): MaterialInput | string[] {
    const problems: string[] = [];
    const num = (s: string, label: string, required: boolean): number | null => {
      const t = s.trim().replace('−', '-');
      if (t === '') {
        if (required) problems.push(`${label} is required.`);
        return null;
      }
      const v = Number(t);
      if (!Number.isFinite(v)) {
        problems.push(`${label}: '${s}' is not a number.`);
        return null;
      }
      return v;
    };
    if (!this.name.trim()) problems.push('Name is required.');
    const lambdaEv = num(this.lambda, 'Reorganization energy λ', true);
    const lambdaSigmaEv = num(this.lambdaSigma, 'σ of λ', false);
    const temperatureK = num(this.temperature, 'Temperature', true);
    const neighbours: MaterialNeighbour[] = [];
    this.rows().forEach((r, i) => {
      const which = `Neighbour ${i + 1}`;
      const couplingEv = num(r.coupling, `${which} coupling J`, true);
      const couplingSigmaEv = num(r.sigma, `${which} σ of J`, false);
      const deltaG0Ev = num(r.deltaG0, `${which} ΔG°`, false);
      const hasVector = [r.x, r.y, r.z].some((c) => c.trim() !== '');
      const label = r.label.trim() || `n${i + 1}`;
      if (hasVector) {
        const v = [
          num(r.x, `${which} x`, false) ?? 0,
          num(r.y, `${which} y`, false) ?? 0,
          num(r.z, `${which} z`, false) ?? 0,
        ];
        if (couplingEv !== null)
          neighbours.push({ label, vectorAngstrom: v, couplingEv, couplingSigmaEv, deltaG0Ev });
      } else {
        const d = num(r.distance, `${which} distance`, true);
        if (couplingEv !== null && d !== null)
          neighbours.push({ label, distanceAngstrom: d, couplingEv, couplingSigmaEv, deltaG0Ev });
      }
    });
    if (!this.rows().length) problems.push('Neighbours: give at least one neighbour.');
    if (problems.length || lambdaEv === null || temperatureK === null) return problems;
    return {
      name: this.name.trim(),
      notes: this.notes,
      lambdaEv,
      lambdaSigmaEv,
      temperatureK,
      dimensions: this.dimensions,
      neighbours,
    };
  }

  private show(results: MaterialResults, body: MaterialInput): void {
    this.results.set(results);
    this.resultLabels.set(body.neighbours.map((n) => n.label));
    this.resultTemperature.set(body.temperatureK);
  }

  private fail(err: unknown): void {
    this.busy.set(false);
    const e = apiErrorOf(err);
    this.errors.set(e.fields?.length ? e.fields.map((f) => f.message) : [e.message]);
    this.status.set('');
  }

  protected compute(): void {
    const body = this.body();
    if (Array.isArray(body)) return this.errors.set(body);
    this.errors.set([]);
    this.busy.set(true);
    this.status.set('Computing…');
    this.api.compute(this.wid(), body).subscribe({
      next: (r) => {
        this.busy.set(false);
        this.status.set('Computed (not saved).');
        this.show(r, body);
      },
      error: (e) => this.fail(e),
    });
  }

  protected save(): void {
    const body = this.body();
    if (Array.isArray(body)) return this.errors.set(body);
    this.errors.set([]);
    this.busy.set(true);
    const id = this.id();
    const request = id
      ? this.api.update(id, { ...body, version: this.version() })
      : this.api.create(this.wid(), body);
    request.subscribe({
      next: (m) => {
        this.busy.set(false);
        this.version.set(m.version);
        this.status.set(`Saved as version ${m.version}.`);
        if (m.results) this.show(m.results, body);
        if (!id) void this.router.navigate(['/w', this.wid(), 'materials', m.id]);
      },
      error: (e) => this.fail(e),
    });
  }

  protected fmt(x: number | null | undefined, sig = 3): string {
    return formatNumber(x ?? null, sig);
  }

  protected axis(v: number[]): string {
    return `(${v.map((c) => formatNumber(Math.abs(c) < 1e-12 ? 0 : c, 3)).join(', ')})`;
  }
}
