import { HttpErrorResponse } from '@angular/common/http';
import {
  DestroyRef,
  Injectable,
  computed,
  effect,
  inject,
  signal,
  type Signal,
} from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatDialog } from '@angular/material/dialog';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import {
  PARAMETER_KINDS,
  SOLVENTS,
  computePairResults,
  mixedReferenceWarning,
  pairPlotInputs,
  pairRateRequest,
  splitPotentialUnit,
  totalLambdaEv,
  type Pair,
  type PairInput,
  type PairResults,
  type PairSeriesPoint,
  type ParameterKind,
} from '@gapwise/contracts';
import { BOLTZMANN_EV_PER_K } from '@gapwise/calc';
import type { DrivingForceInputs } from '@gapwise/plots';
import {
  asapScheduler,
  debounceTime,
  distinctUntilChanged,
  filter,
  map,
  of,
  startWith,
  switchMap,
} from 'rxjs';
import { apiErrorOf } from '../../session/api-errors';
import { WorkspaceContext } from '../../workspaces/workspace-context';
import { formatSignificant } from '../../units/number-format';
import { unitLabel, unitsFor } from '../../units/units';
import {
  ConflictDialog,
  type ConflictChoice,
  type ConflictDialogData,
} from '../conflict/conflict-dialog';
import {
  DerivationDialog,
  type DerivationDialogData,
  type DerivationResult,
} from '../derivation/derivation-dialog';
import { derivationById, derivationsFor } from '../derivation/derivations';
import { NormalModesDialog, type NormalModesDialogData } from '../normal-modes/normal-modes-dialog';
import {
  createPairForm,
  pairInputOf,
  parameterSpec,
  parametersOf,
  rateSourceOf,
  snapshotOf,
  TEMPERATURE_SPEC,
  type PairForm,
} from '../pair-form/pair-form';
import {
  setCanonicalQuantity,
  confirmQuantity,
  quantityWarning,
  switchQuantityUnit,
  typeQuantityText,
  type UnitChange,
} from '../pair-form/quantity-control';
import { PairsApi } from '../pairs-api';
import { monteCarloLog10k, type MonteCarloState } from '../results-panel/monte-carlo';
import { applySaveErrors } from './save-errors';
import type { HoldsUnsavedChanges } from './unsaved-changes-guard';

export const RATE_KINDS: ParameterKind[] = [
  'deltaG0',
  'lambdaTotal',
  'lambdaInner',
  'lambdaOuter',
  'coupling',
  'hbarOmega',
  'tauL',
  'deltaG0Recombination',
];
export const CONTEXT_KINDS: ParameterKind[] = [
  'distance',
  'edgeDistance',
  'radiusDonor',
  'radiusAcceptor',
  'donorOxidation',
  'acceptorReduction',
  'epsilonMeasurement',
  'excitationEnergy',
  'epsilonStatic',
  'refractiveIndex',
];

/** Calculation field names that point at a pair parameter. */
const CALC_FIELD_TO_KIND: Record<string, ParameterKind> = {
  deltaG0: 'deltaG0',
  lambda: 'lambdaOuter',
  lambdaSolvent: 'lambdaOuter',
  lambdaVib: 'lambdaInner',
  coupling: 'coupling',
  hbarOmega: 'hbarOmega',
  tauL: 'tauL',
};

const EDIT_MARK = 'gw-edit';
export const REDRAW_MEASURE = 'gw-keystroke-to-redraw';

/**
 * State and actions of the pair page: the form, the live results computed in the browser on
 * every keystroke, the Monte Carlo run when typing pauses, plot inputs, loading, saving and
 * version conflicts. Provided by the page; the presentational parts only get what it computes.
 */
@Injectable()
export class PairEditorStore implements HoldsUnsavedChanges {
  private readonly api = inject(PairsApi);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  private readonly snackBar = inject(MatSnackBar);
  private readonly destroyRef = inject(DestroyRef);
  readonly workspace = inject(WorkspaceContext);

  /** The page's route parameters (`pairId` absent on /pairs/new), bound by `bind`. */
  private readonly route = signal<{
    readonly wid: Signal<string>;
    readonly pairId: Signal<string | undefined>;
  } | null>(null);
  readonly wid = computed(() => this.route()?.wid() ?? '');
  readonly pairId = computed(() => this.route()?.pairId());

  readonly rateKinds = RATE_KINDS;
  readonly contextKinds = CONTEXT_KINDS;
  readonly kindLabels = PARAMETER_KINDS;
  readonly unitLabel = unitLabel;
  readonly temperatureUnits = unitsFor('temperature');

  readonly pair = signal<Pair | null>(null);
  readonly form = signal<PairForm>(createPairForm(null));
  readonly loading = signal(false);
  readonly loadError = signal<string | null>(null);
  readonly saving = signal(false);
  readonly formErrors = signal<string[]>([]);
  readonly serverMismatch = signal<string | null>(null);
  readonly serverAgrees = signal(false);
  private readonly baseline = signal('');
  private editMarked = false;

  readonly readOnly = computed(() => !this.workspace.canEdit());
  readonly isNew = computed(() => !this.pairId());

  /**
   * Every edit. The several control updates of one keystroke arrive in one burst and are
   * coalesced in a microtask, so the browser recomputes once per keystroke and draws in the
   * same frame; the heavier Monte Carlo run waits until typing pauses (below).
   */
  private readonly edits = toSignal(
    toObservable(this.form).pipe(
      switchMap((f) =>
        f.valueChanges.pipe(
          startWith(null),
          map(() => f),
        ),
      ),
      debounceTime(0, asapScheduler),
      map((f) => ({
        form: f,
        source: rateSourceOf(f),
        parameters: parametersOf(f),
        snapshot: snapshotOf(f),
      })),
    ),
  );
  readonly results = computed<PairResults>(() => {
    const e = this.edits();
    if (e) {
      const start = performance.now();
      const results = computePairResults(e.source);
      performance.measure('gw-recompute', { start, end: performance.now() });
      return results;
    }
    return {
      model: 'marcus',
      k: null,
      log10k: null,
      activationFreeEnergy: null,
      regime: null,
      warnings: [],
      errors: [],
    };
  });
  readonly dirty = computed(() => {
    const e = this.edits();
    return !!e && e.snapshot !== this.baseline();
  });

  /** Monte Carlo is heavier: it waits until typing pauses. */
  readonly monteCarlo = toSignal(
    toObservable(this.edits).pipe(
      debounceTime(350),
      map((e): MonteCarloState => (e ? monteCarloLog10k(e.source) : { status: 'none' })),
    ),
    { initialValue: { status: 'none' } as MonteCarloState },
  );

  private value(kind: ParameterKind): number | null {
    return this.edits()?.parameters.find((p) => p.kind === kind)?.value ?? null;
  }

  /**
   * SCIENCE.md §4: the donor and acceptor potentials on different references or in different
   * solvents (or one without a reference) are flagged beside them.
   */
  readonly referenceWarning = computed(() => {
    const params = this.edits()?.parameters ?? [];
    const side = (kind: 'donorOxidation' | 'acceptorReduction') => {
      const p = params.find((x) => x.kind === kind);
      return p
        ? { label: PARAMETER_KINDS[kind].label, code: splitPotentialUnit(p.unit).code }
        : null;
    };
    return mixedReferenceWarning(side('donorOxidation'), side('acceptorReduction'));
  });

  readonly temperatureK = computed(() => this.edits()?.source.temperature ?? null);

  /**
   * SCIENCE.md §2: the T = 0 MLJ sum needs ħω ≳ 4 k_BT; below, offer the finite-temperature
   * (thermal) form, which tends to classical Marcus with λ_s + λ_v for ħω ≪ k_BT.
   */
  readonly thermalMljHint = computed(() => {
    const e = this.edits();
    const omega = this.value('hbarOmega');
    const t = this.temperatureK();
    if (!e || e.source.model !== 'mlj' || omega === null || !t || !(t > 0)) return null;
    const fourKT = 4 * BOLTZMANN_EV_PER_K * t;
    if (!(omega < fourKT)) return null;
    return (
      `ħω = ${formatSignificant(omega, 3)} eV is below 4 k_BT = ${formatSignificant(fourKT, 3)} eV: ` +
      'the one-mode sum assumes the mode frozen in its ground level and comes out too narrow. ' +
      'Thermal MLJ sums over thermally populated levels.'
    );
  });

  useThermalMlj(): void {
    this.form().controls.model.setValue('mljThermal');
    this.markEdit();
  }
  readonly plotDeltaG0 = computed(() => this.value('deltaG0'));
  readonly plotLambda = computed(() =>
    this.edits() ? totalLambdaEv(this.edits()!.parameters) : null,
  );
  readonly plotCoupling = computed(() => this.value('coupling'));
  /** Measured points of the series that link this pair (none for a new pair). */
  readonly seriesPoints = toSignal(
    toObservable(this.pairId).pipe(
      distinctUntilChanged(),
      switchMap((id) => (id ? this.api.seriesPoints(id) : of([] as PairSeriesPoint[]))),
    ),
    { initialValue: [] as PairSeriesPoint[] },
  );
  readonly drivingInputs = computed<DrivingForceInputs | null>(() => {
    const e = this.edits();
    if (!e) return null;
    // The pair model's plot inputs: the report draws the very same curves.
    const inputs = pairPlotInputs(e.source, this.results().log10k);
    return inputs ? { ...inputs, measured: this.seriesPoints() } : null;
  });
  readonly rateRequest = computed(() => {
    const e = this.edits();
    if (!e || this.results().errors.length) return null;
    const r = pairRateRequest(e.source);
    return 'missing' in r ? null : r;
  });
  readonly calcErrors = computed(() => {
    const byKind: Partial<Record<ParameterKind, string>> = {};
    for (const e of this.results().errors) {
      const kind = (e.field in PARAMETER_KINDS ? e.field : CALC_FIELD_TO_KIND[e.field]) as
        ParameterKind | undefined;
      if (!kind || byKind[kind]) continue;
      // "is needed" under a field the user has not touched yet reads as a mistake on a new,
      // empty form: the results panel lists what is missing instead.
      const text = this.form().controls.parameters.controls[kind].controls.text;
      if (e.message.startsWith('is needed') && text.pristine && !text.touched) continue;
      byKind[kind] = `${PARAMETER_KINDS[kind].label} ${e.message}`;
    }
    return byKind;
  });
  readonly fileStem = computed(() =>
    (this.pair()?.name ?? 'new-pair').replace(/[^\w.-]+/g, '-').toLowerCase(),
  );

  constructor() {
    // Waits for the page to bind its route, so an existing pair never flashes as a new one.
    toObservable(computed(() => (this.route() ? { id: this.pairId() } : null)))
      .pipe(
        filter((r) => r !== null),
        switchMap(({ id }) => (id ? this.api.get(id) : [null])),
      )
      .subscribe({
        next: (pair) => this.show(pair),
        error: (err: unknown) => {
          this.loading.set(false);
          this.loadError.set(apiErrorOf(err).message);
        },
      });
    effect(() => {
      const f = this.form();
      if (this.readOnly()) f.disable({ emitEvent: false });
      else f.enable({ emitEvent: false });
    });
    this.destroyRef.onDestroy(() => performance.clearMarks(EDIT_MARK));
  }

  private show(pair: Pair | null): void {
    this.pair.set(pair);
    const f = createPairForm(pair);
    this.baseline.set(snapshotOf(f));
    this.form.set(f);
    this.loading.set(false);
    this.formErrors.set([]);
  }

  /** Called once by the page with its route inputs. */
  bind(wid: Signal<string>, pairId: Signal<string | undefined>): void {
    this.route.set({ wid, pairId });
  }

  hasUnsavedChanges(): boolean {
    return !this.readOnly() && snapshotOf(this.form()) !== this.baseline();
  }

  /** Marks the keystroke; the next plot redraw closes the measurement. */
  markEdit(): void {
    performance.mark(EDIT_MARK);
    this.editMarked = true;
  }

  plotRedrawn(): void {
    if (!this.editMarked) return;
    this.editMarked = false;
    performance.measure(REDRAW_MEASURE, EDIT_MARK);
  }

  /** What the last temperature unit change did (shown for a moment, with Undo). */
  readonly temperatureUnitChange = signal<UnitChange | null>(null);

  readonly solvents = SOLVENTS;

  /** The measurement solvent picked for the potentials (kept in the ε field's note). */
  measurementSolvent(): string | null {
    const note =
      this.form().controls.parameters.controls.epsilonMeasurement.controls.provenance.controls.note
        .value;
    const name = /^Measurement solvent: (.+)$/.exec(note)?.[1];
    return SOLVENTS.find((s) => s.name === name)?.key ?? null;
  }

  /** Picking a solvent fills its ε with the table's citation; the value stays editable. */
  pickMeasurementSolvent(key: string): void {
    const solvent = SOLVENTS.find((s) => s.key === key);
    if (!solvent) return;
    const g = this.form().controls.parameters.controls.epsilonMeasurement;
    setCanonicalQuantity(g, parameterSpec('epsilonMeasurement'), solvent.epsilon);
    const prov = g.controls.provenance.controls;
    prov.kind.setValue('literature');
    prov.citation.setValue(solvent.source);
    prov.note.setValue(`Measurement solvent: ${solvent.name}`);
    this.markEdit();
  }

  typeTemperature(text: string): void {
    typeQuantityText(this.form().controls.temperature, TEMPERATURE_SPEC, text);
    this.temperatureUnitChange.set(null);
    this.markEdit();
  }

  confirmTemperature(): void {
    confirmQuantity(this.form().controls.temperature);
  }

  switchTemperatureUnit(unit: string): void {
    this.temperatureUnitChange.set(
      switchQuantityUnit(this.form().controls.temperature, TEMPERATURE_SPEC, unit),
    );
    this.markEdit();
  }

  /** B8: below 150 K or above 500 K the value is kept and flagged. */
  temperatureWarning(): string | null {
    return quantityWarning(this.form().controls.temperature, TEMPERATURE_SPEC);
  }

  derivationsOf(kind: ParameterKind) {
    return derivationsFor(kind).map((d) => ({ id: d.id, label: d.label }));
  }

  openDerivation(id: string): void {
    const derivation = derivationById(id);
    if (!derivation) return;
    if (derivation.dialog === 'normal-modes') {
      this.dialog
        .open<NormalModesDialog, NormalModesDialogData, DerivationResult>(NormalModesDialog, {
          data: { temperatureK: this.temperatureK() },
          width: '640px',
          maxWidth: 'calc(100vw - 16px)',
          autoFocus: 'first-tabbable',
          restoreFocus: `gw-parameter-field[data-kind="${derivation.target}"] button.derive`,
        })
        .afterClosed()
        .subscribe((result) => result && this.applyDerivation(result));
      return;
    }
    const params = this.form().controls.parameters.controls;
    const prefill: Record<string, { value: number; unit: string; reference?: string }> = {};
    for (const [input, kind] of Object.entries(derivation.prefill)) {
      const g = params[kind];
      if (g.controls.value.value !== null && g.controls.text.value.trim() !== '') {
        const reference = g.controls.reference.value;
        prefill[input] = {
          value: g.controls.value.value,
          unit: g.controls.unit.value,
          ...(reference ? { reference } : {}),
        };
      }
    }
    const data: DerivationDialogData = {
      derivation,
      prefill,
      targetUnit: params[derivation.target].controls.unit.value,
    };
    this.dialog
      .open<DerivationDialog, DerivationDialogData, DerivationResult>(DerivationDialog, {
        data,
        width: '640px',
        maxWidth: 'calc(100vw - 16px)',
        autoFocus: 'first-tabbable',
        // The helper is opened from a menu item that is gone when the dialog closes: send focus
        // back to the field's derive button, the control that opened the menu.
        restoreFocus: `gw-parameter-field[data-kind="${derivation.target}"] button.derive`,
      })
      .afterClosed()
      .subscribe((result) => result && this.applyDerivation(result));
  }

  /** Fills the derived parameters and records how: provenance `derived` with method and inputs. */
  applyDerivation(result: DerivationResult): void {
    const params = this.form().controls.parameters.controls;
    for (const { kind, value } of result.values) {
      const g = params[kind];
      setCanonicalQuantity(g, parameterSpec(kind), value);
      g.controls.provenance.patchValue({
        kind: 'derived',
        methodId: result.methodId,
        methodInputs: result.methodInputs,
        // A helper run replaces whatever record the value came from before.
        sources: null,
      });
    }
    this.markEdit();
  }

  save(): void {
    const f = this.form();
    f.markAllAsTouched();
    if (f.invalid) {
      this.formErrors.set(this.invalidFieldNames(f));
      return;
    }
    this.formErrors.set([]);
    const body = pairInputOf(f);
    this.saving.set(true);
    const current = this.pair();
    const request = current
      ? this.api.update(current.id, { ...body, version: current.version })
      : this.api.create(this.wid(), body);
    request.subscribe({
      next: (saved) => this.afterSave(saved, !current),
      error: (err: unknown) => this.saveFailed(err, body),
    });
  }

  private afterSave(saved: Pair, created: boolean): void {
    this.saving.set(false);
    this.show(saved);
    this.checkServerResults(saved);
    this.snackBar.open(`Saved as version ${saved.version}.`, undefined, { duration: 3000 });
    if (created)
      void this.router.navigate(['/w', this.wid(), 'pairs', saved.id], { replaceUrl: true });
  }

  /** The server recomputes on save with the same dispatcher; say so if the answers ever differ. */
  private checkServerResults(saved: Pair): void {
    const browser = computePairResults(saved);
    const server = saved.results;
    this.serverAgrees.set(false);
    if (!server) {
      this.serverMismatch.set(null);
      return;
    }
    const close = (a: number | null, b: number | null) =>
      a === b ||
      (a !== null && b !== null && Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b)));
    const agree =
      close(browser.log10k, server.log10k) &&
      close(browser.activationFreeEnergy, server.activationFreeEnergy) &&
      browser.regime === server.regime;
    if (agree) {
      this.serverMismatch.set(null);
      this.serverAgrees.set(true);
    } else {
      this.serverMismatch.set(
        `Browser and server disagree: log10 k ${browser.log10k?.toFixed(4) ?? '—'} here, ${server.log10k?.toFixed(4) ?? '—'} on the server` +
          ` (regime ${browser.regime ?? '—'} / ${server.regime ?? '—'}). Report this: the two should run the same code.`,
      );
    }
  }

  private saveFailed(err: unknown, body: PairInput): void {
    this.saving.set(false);
    const error = apiErrorOf(err);
    if (
      err instanceof HttpErrorResponse &&
      err.status === 409 &&
      error.code === 'version-conflict'
    ) {
      const theirs = (error as { current?: Pair }).current;
      if (theirs) {
        this.resolveConflict(body, theirs);
        return;
      }
    }
    const rest = applySaveErrors(this.form(), body, error);
    this.formErrors.set(error.fields?.length ? rest : [error.message]);
    if (error.fields?.length && rest.length === 0)
      this.formErrors.set([`${error.message} See the marked fields.`]);
  }

  private resolveConflict(mine: PairInput, theirs: Pair): void {
    this.dialog
      .open<ConflictDialog, ConflictDialogData, ConflictChoice>(ConflictDialog, {
        data: { mine, theirs },
        width: '760px',
      })
      .afterClosed()
      .subscribe((choice) => {
        if (choice === 'reload') {
          this.show(theirs);
        } else if (choice === 'overwrite') {
          this.saving.set(true);
          this.api.update(theirs.id, { ...mine, version: theirs.version }).subscribe({
            next: (saved) => this.afterSave(saved, false),
            error: (err: unknown) => this.saveFailed(err, mine),
          });
        }
      });
  }

  private invalidFieldNames(f: PairForm): string[] {
    const names: string[] = [];
    for (const key of ['name', 'donor', 'acceptor'] as const) {
      if (f.controls[key].invalid)
        names.push(`${key[0].toUpperCase()}${key.slice(1)} is required.`);
    }
    if (f.controls.temperature.invalid) names.push('Temperature needs a valid value.');
    for (const [kind, g] of Object.entries(f.controls.parameters.controls)) {
      if (g.invalid)
        names.push(`${PARAMETER_KINDS[kind as ParameterKind].label} needs a valid value.`);
    }
    return names;
  }
}
