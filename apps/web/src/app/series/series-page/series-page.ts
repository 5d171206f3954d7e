import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import {
  FormArray,
  FormControl,
  FormGroup,
  NonNullableFormBuilder,
  ReactiveFormsModule,
  Validators,
  type AbstractControl,
  type ValidationErrors,
} from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import type { Pair, Series, SeriesModel, SeriesPoint } from '@gapwise/contracts';
import { filter, map, switchMap } from 'rxjs';
import { apiErrorOf } from '../../session/api-errors';
import { RichText } from '../../shared/rich-text/rich-text';
import { displayOf, unitLabel } from '../../units/units';
import { editableText, parseStrictNumber } from '../../units/number-format';
import { WorkspaceContext } from '../../workspaces/workspace-context';
import { ApplyDialog, type ApplyDialogData } from '../apply-dialog/apply-dialog';
import { FitTable } from '../fit-table/fit-table';
import { SeriesApi, type SeriesBody } from '../series-api';
import { SeriesPlot } from '../series-plot/series-plot';
import { parsePastedPoints, pointBody, type PointText, type RateKind } from '../series-points';

type PointGroup = FormGroup<{
  label: FormControl<string>;
  deltaG0: FormControl<string>;
  rate: FormControl<string>;
  sigma: FormControl<string>;
}>;

const required = (c: AbstractControl<string>): ValidationErrors | null =>
  parseStrictNumber(c.value) === null ? { number: true } : null;
const optional = (c: AbstractControl<string>): ValidationErrors | null =>
  c.value.trim() === '' || (parseStrictNumber(c.value) ?? -1) >= 0 ? null : { number: true };
const optionalPositive = (c: AbstractControl<string>): ValidationErrors | null =>
  c.value.trim() === '' || (parseStrictNumber(c.value) ?? -1) > 0 ? null : { number: true };

export const ENERGY_UNITS = ['eV', 'meV', 'kJ/mol', 'kcal/mol', 'cm-1'] as const;

/**
 * A driving-force series: the data table (typed or pasted), the fit of λ and |H_AB| by
 * classical Marcus and MLJ with a fixed mode, the plot, the parameter table, and "apply to pairs".
 */
@Component({
  selector: 'gw-series-page',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    FitTable,
    RichText,
    SeriesPlot,
  ],
  templateUrl: './series-page.html',
  styleUrl: '../series.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SeriesPage {
  private readonly api = inject(SeriesApi);
  private readonly route = inject(ActivatedRoute);
  private readonly router = inject(Router);
  private readonly dialog = inject(MatDialog);
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly workspace = inject(WorkspaceContext);

  protected readonly units = ENERGY_UNITS;
  protected readonly unitLabel = unitLabel;
  protected readonly wid = toSignal(this.route.paramMap.pipe(map((p) => p.get('wid') ?? '')), {
    initialValue: '',
  });
  protected readonly series = signal<Series | null>(null);
  protected readonly error = signal<string | null>(null);
  protected readonly pasteProblems = signal<string[]>([]);
  protected readonly busy = signal(false);
  protected readonly applied = signal<Pair[] | null>(null);

  protected readonly form = this.fb.group({
    name: this.fb.control('', [Validators.required, Validators.maxLength(200)]),
    temperature: this.fb.control('298.15', required),
    temperatureUnit: this.fb.control<'K' | 'degC'>('K'),
    energyUnit: this.fb.control<string>('eV'),
    rateKind: this.fb.control<RateKind>('k'),
    notes: this.fb.control(''),
    points: this.fb.array<PointGroup>([]),
    paste: this.fb.control(''),
    model: this.fb.control<SeriesModel>('marcus'),
    hbarOmega: this.fb.control('', optionalPositive),
    lambdaVib: this.fb.control('', optional),
  });

  /** The points as last saved (canonical), for the plot. */
  protected readonly savedPoints = computed<readonly SeriesPoint[]>(
    () => this.series()?.points ?? [],
  );
  protected readonly fit = computed(() => this.series()?.fit ?? null);

  constructor() {
    this.route.paramMap
      .pipe(
        map((p) => p.get('id')),
        filter((id): id is string => !!id && id !== 'new'),
        // After "save" of a new series the page navigates to its id with the series already
        // loaded: fetching it again could land after a fit and wipe the fit from the page.
        filter((id) => id !== this.series()?.id),
        switchMap((id) => this.api.get(id)),
        takeUntilDestroyed(),
      )
      .subscribe((s) => this.load(s));
    if (!this.route.snapshot.paramMap.get('id')) {
      for (let i = 0; i < 3; i++) this.addPoint();
    }
  }

  protected get points(): FormArray<PointGroup> {
    return this.form.controls.points;
  }

  protected addPoint(p: PointText = { label: '', deltaG0: '', rate: '', sigma: '' }): void {
    this.points.push(
      this.fb.group({
        label: this.fb.control(p.label),
        deltaG0: this.fb.control(p.deltaG0, required),
        rate: this.fb.control(p.rate, required),
        sigma: this.fb.control(p.sigma, optional),
      }),
    );
  }

  protected removePoint(i: number): void {
    this.points.removeAt(i);
  }

  /** Reads the pasted rows into the table (replacing empty rows). */
  protected readPaste(): void {
    const { rows, problems } = parsePastedPoints(this.form.controls.paste.value);
    this.pasteProblems.set(problems);
    if (!rows.length) return;
    for (let i = this.points.length - 1; i >= 0; i--) {
      const v = this.points.at(i).getRawValue();
      if (!v.label && !v.deltaG0 && !v.rate && !v.sigma) this.points.removeAt(i);
    }
    rows.forEach((r) => this.addPoint(r));
    this.form.controls.paste.setValue('');
  }

  protected save(then?: (s: Series, done: () => void) => void): void {
    this.form.markAllAsTouched();
    if (this.form.invalid) {
      this.error.set('Some cells are not numbers: they are marked in the table.');
      return;
    }
    const v = this.form.getRawValue();
    const body: SeriesBody = {
      name: v.name.trim(),
      temperature: parseStrictNumber(v.temperature) as number,
      temperatureUnit: v.temperatureUnit,
      energyUnit: v.energyUnit,
      notes: v.notes,
      points: v.points.map((p) => pointBody(p, v.rateKind)),
    };
    const current = this.series();
    this.busy.set(true);
    this.error.set(null);
    const call = current
      ? this.api.update(current.id, current.version, body)
      : this.api.create(this.wid(), body);
    call.subscribe({
      next: (s) => {
        this.busy.set(false);
        this.load(s);
        // A new series moves to its own address only after any follow-up (the fit) is done:
        // the page at the new address may be a new component that loads the series afresh.
        const goToSaved = () => {
          if (!current)
            void this.router.navigate(['/w', this.wid(), 'series', s.id], { replaceUrl: true });
        };
        if (then) then(s, goToSaved);
        else goToSaved();
      },
      error: (err: unknown) => this.fail(err),
    });
  }

  /** Saves when changed, then fits (both models when the mode is given). */
  protected fitNow(): void {
    // The mode as typed now (saving reloads the form from the stored series).
    const v = this.form.getRawValue();
    const run = (s: Series, done: () => void = () => undefined) => {
      const hbarOmega = parseStrictNumber(v.hbarOmega);
      const lambdaVib = parseStrictNumber(v.lambdaVib);
      const mode = hbarOmega !== null && lambdaVib !== null ? { hbarOmega, lambdaVib } : {};
      if (v.model === 'mlj' && !('hbarOmega' in mode)) {
        this.error.set('MLJ needs the fixed mode: give ħω and λ_v in eV.');
        done();
        return;
      }
      this.busy.set(true);
      this.error.set(null);
      this.api.fit(s.id, { model: v.model, ...mode }).subscribe({
        next: (fitted) => {
          this.busy.set(false);
          this.series.set(fitted);
          done();
        },
        error: (err: unknown) => {
          this.fail(err);
          done();
        },
      });
    };
    const s = this.series();
    if (s && this.form.pristine) run(s);
    else this.save(run);
  }

  protected openApply(): void {
    const s = this.series();
    const fit = s?.fit;
    if (!s || !fit) return;
    const models = (['marcus', 'mlj'] as const)
      .filter((m) => fit.fits[m])
      .map((m) => ({ model: m, lambda: fit.fits[m]!.lambda, coupling: fit.fits[m]!.coupling }));
    const data: ApplyDialogData = {
      seriesId: s.id,
      workspaceId: this.wid(),
      models,
      preferred: fit.model,
      linkedPairIds: [...new Set(s.points.map((p) => p.pairId).filter((id): id is string => !!id))],
    };
    this.dialog
      .open<ApplyDialog, ApplyDialogData, Pair[]>(ApplyDialog, { data, width: '640px' })
      .afterClosed()
      .subscribe((pairs) => {
        if (pairs) this.applied.set(pairs);
      });
  }

  private load(s: Series): void {
    this.series.set(s);
    const unit = s.energyUnit;
    const opts = s.modelOptions as { model?: SeriesModel; hbarOmega?: number; lambdaVib?: number };
    this.points.clear();
    for (const p of s.points) {
      this.addPoint({
        label: p.label,
        deltaG0: editableText(displayOf(p.deltaG0, unit, 'energy')),
        // log10 k converted from a typed k: six significant figures (≪ any measured σ).
        rate: editableText(Number(p.log10k.toPrecision(6))),
        sigma: editableText(p.sigmaLog10k),
      });
    }
    this.form.patchValue({
      name: s.name,
      temperature: editableText(s.temperature),
      temperatureUnit: 'K',
      energyUnit: unit,
      rateKind: 'log10k',
      notes: s.notes,
    });
    // The fit settings stay as typed unless the series stores its own.
    const hbarOmega = opts.hbarOmega ?? s.fit?.hbarOmega;
    const lambdaVib = opts.lambdaVib ?? s.fit?.lambdaVib;
    if (opts.model ?? s.fit?.model) this.form.patchValue({ model: opts.model ?? s.fit?.model });
    if (
      hbarOmega !== undefined &&
      hbarOmega !== null &&
      lambdaVib !== undefined &&
      lambdaVib !== null
    ) {
      this.form.patchValue({
        hbarOmega: editableText(hbarOmega),
        lambdaVib: editableText(lambdaVib),
      });
    }
    this.form.markAsPristine();
  }

  private fail(err: unknown): void {
    this.busy.set(false);
    const e = apiErrorOf(err);
    const fields = (e.fields ?? []).map((f) => `${f.field}: ${f.message}`);
    this.error.set([e.message, ...fields].join(' '));
  }
}
