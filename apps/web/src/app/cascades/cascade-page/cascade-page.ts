import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import {
  formatMeasured,
  formatNumber,
  formatScientific,
  regimeLabel,
  type Provenance,
} from '@gapwise/contracts';
import { catchError, firstValueFrom, map, of, switchMap } from 'rxjs';
import { PairsApi } from '../../pairs/pairs-api';
import { ProvenanceSentence } from '../../shared/provenance-sentence/provenance-sentence';
import { actionWords } from '../../workspaces/audit/audit-words';
import { WorkspaceContext } from '../../workspaces/workspace-context';
import type { Interval } from '../cascade-compute';
import {
  COUPLING_UNITS,
  E00_UNITS,
  emptyDesign,
  ENERGY_MODES,
  ENERGY_UNITS,
  newLink,
  newState,
  STATE_KINDS,
  TIME_UNITS,
  type EnergyMode,
  type LinkDesign,
  type LinkType,
  type StateDesign,
  type StateKind,
} from '../cascade-design';
import { LandscapeTree } from '../cascade-plots/landscape-tree';
import { PopulationPlot } from '../cascade-plots/population-plot';
import { StateEnergyDiagram, type DiagramState } from '../cascade-plots/state-energy-diagram';
import { CascadeStore, pairSource } from '../cascade-store';
import { CascadesApi } from '../cascades-api';

const COUPLING_REGIMES: Record<string, string> = {
  nonadiabatic: 'Nonadiabatic',
  intermediate: 'Intermediate',
  adiabatic: 'Adiabatic',
};

/**
 * One cascade: states and steps edited in place, results computed live in the browser by the
 * calculation core, Monte Carlo intervals from a worker, the state-energy diagram, the energy
 * landscape tree and the populations, saved as versions with their audit events.
 */
@Component({
  selector: 'gw-cascade-page',
  imports: [
    DatePipe,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    ProvenanceSentence,
    StateEnergyDiagram,
    LandscapeTree,
    PopulationPlot,
  ],
  providers: [CascadeStore],
  templateUrl: './cascade-page.html',
  styleUrl: './cascade-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CascadePage {
  protected readonly store = inject(CascadeStore);
  private readonly api = inject(CascadesApi);
  private readonly pairsApi = inject(PairsApi);
  private readonly route = inject(ActivatedRoute);
  private readonly router = inject(Router);
  protected readonly workspace = inject(WorkspaceContext);

  protected readonly kinds = Object.entries(STATE_KINDS).map(([value, k]) => ({
    value,
    label: k.label,
  }));
  protected readonly modes = Object.entries(ENERGY_MODES).map(([value, label]) => ({
    value,
    label,
  }));
  protected readonly energyUnits = ENERGY_UNITS;
  protected readonly e00Units = E00_UNITS;
  protected readonly couplingUnits = COUPLING_UNITS;
  protected readonly timeUnits = TIME_UNITS;
  protected readonly linkTypes: { value: LinkType; label: string }[] = [
    { value: 'et', label: 'Electron-transfer step' },
    { value: 'rate', label: 'Decay: fixed rate k' },
    { value: 'lifetime', label: 'Decay: lifetime τ' },
  ];

  protected readonly wid = toSignal(this.route.paramMap.pipe(map(() => this.findWid())), {
    initialValue: this.findWid(),
  });
  protected readonly loadError = toSignal(
    this.route.paramMap.pipe(
      switchMap((p) => {
        const id = p.get('id');
        if (!id) {
          this.store.design.set(emptyDesign());
          this.store.name.set('');
          return of(null);
        }
        return this.api.get(id).pipe(
          map((c) => {
            this.store.load(c);
            return null;
          }),
          catchError(() => of('This cascade could not be opened.')),
        );
      }),
      takeUntilDestroyed(),
    ),
    { initialValue: null },
  );

  protected readonly pairs = toSignal(
    this.pairsApi.list(this.findWid(), { offset: 0, limit: 200, sort: 'name' }).pipe(
      map((p) => p.items),
      catchError(() => of([])),
    ),
    { initialValue: [] },
  );

  private findWid(): string {
    let r: ActivatedRoute | null = this.route;
    while (r) {
      const w = r.snapshot.paramMap.get('wid');
      if (w) return w;
      r = r.parent;
    }
    return '';
  }

  protected readonly design = this.store.design;
  protected readonly build = this.store.build;
  protected readonly outputs = computed(() => this.store.shown()?.outputs ?? null);
  protected readonly warnings = computed(() => {
    const a = this.store.shown();
    return a?.ok ? a.warnings : [];
  });
  protected readonly coreErrors = computed(() => {
    const a = this.store.answer();
    return a && !a.ok ? a.errors : [];
  });

  /** States of the pictures: the ones the shown answer was computed for, coloured by kind. */
  protected readonly diagramStates = computed<DiagramState[]>(() => {
    const out = this.outputs();
    if (!out) return [];
    const kinds = new Map(this.design().states.map((s) => [s.id, s.kind]));
    return out.landscape.minima.map((m) => ({
      id: m.id,
      label: m.label,
      energyEv: m.energy,
      kind:
        kinds.get(m.id) ??
        (m.kind === 'excited' ? 'singlet' : m.kind === 'chargeSeparated' ? 'csFinal' : 'ground'),
    }));
  });

  protected readonly stateNames = computed(
    () => new Map(this.design().states.map((s) => [s.id, s.label.trim() || s.id])),
  );

  /** Per link: its forward and reverse rate, regime and coupling regime from the answer. */
  protected readonly linkRates = computed(() => {
    const out = this.outputs();
    return this.design().links.map((_, i) => {
      const rates = out?.rates.filter((r) => r.link === i) ?? [];
      const forward = rates.find((r) => r.source !== 'detailedBalance');
      const reverse = rates.find((r) => r.source === 'detailedBalance');
      return {
        k: forward ? `${formatScientific(forward.k, 3)} s⁻¹` : '—',
        reverse: reverse ? `${formatScientific(reverse.k, 3)} s⁻¹` : null,
        regime: forward?.regime ? regimeLabel(forward.regime) : null,
        coupling: forward?.couplingRegime ? COUPLING_REGIMES[forward.couplingRegime] : null,
        deltaG0: forward?.deltaG0 !== undefined ? `${formatNumber(forward.deltaG0, 3)} eV` : null,
      };
    });
  });

  protected readonly finalYields = computed(() => {
    const out = this.outputs();
    if (!out) return [];
    const mc = this.mcIntervals();
    return Object.entries(out.yields).map(([id, value]) => ({
      id,
      name: this.stateNames().get(id) ?? id,
      value: formatNumber(value, 3),
      interval: this.interval(mc?.[`yields.${id}`]),
    }));
  });

  protected readonly longLived = computed(() => {
    const out = this.outputs();
    if (!out?.longLived) return null;
    const mc = this.mcIntervals();
    const l = out.longLived;
    return {
      name: this.stateNames().get(l.state) ?? l.state,
      formationYield: formatNumber(l.formationYield, 3),
      yieldInterval: this.interval(mc?.['longLived.formationYield']),
      lifetime: `${formatScientific(l.lifetime, 3)} s`,
      lifetimeInterval: this.interval(mc?.['longLived.lifetime'], true),
    };
  });

  protected readonly pathway = computed(() => {
    const out = this.outputs();
    if (!out) return null;
    const names = this.stateNames();
    return {
      text: out.dominantPathway.states.map((id) => names.get(id) ?? id).join(' → '),
      bottleneck: formatNumber(out.dominantPathway.bottleneckFlux, 3),
    };
  });

  protected readonly sensitivity = computed(() => {
    const out = this.outputs();
    if (!out?.sensitivity) return null;
    const names = this.stateNames();
    return {
      target: names.get(out.sensitivity.target) ?? out.sensitivity.target,
      entries: out.sensitivity.entries.map((e) => ({
        step: `${names.get(e.from) ?? e.from} → ${names.get(e.to) ?? e.to}`,
        parameter: e.parameter === 'lambda' ? 'λ' : '|H_AB|',
        value:
          e.parameter === 'lambda'
            ? `${formatNumber(e.value, 3)} eV`
            : `${formatScientific(e.value, 3)} eV`,
        d: formatMeasured(e.dYieldDLn),
        magnitude: Math.abs(e.dYieldDLn),
      })),
    };
  });

  protected readonly mcIntervals = computed(() => {
    const mc = this.store.monteCarlo();
    return mc && mc !== 'running' && mc.ok ? mc.intervals : null;
  });
  protected readonly mcState = computed(() => {
    const mc = this.store.monteCarlo();
    if (mc === 'running') return 'Monte Carlo over the inputs with σ is running…';
    if (mc && !mc.ok) return `Monte Carlo failed: ${mc.message}`;
    if (mc && mc.ok)
      return `95 % intervals from ${mc.samplesUsed} Monte Carlo samples over every input with σ.`;
    return 'Give a σ to any energy, λ, |H_AB|, rate or lifetime for 95 % intervals (Monte Carlo).';
  });

  private interval(i: Interval | undefined, scientific = false): string | null {
    if (!i) return null;
    const f = (x: number) => (scientific ? formatScientific(x, 2) : formatNumber(x, 2));
    return `95 % ${f(i.p025)}–${f(i.p975)}`;
  }

  protected errorsAt(prefix: string): string[] {
    return this.build()
      .errors.filter((e) => e.field === prefix || e.field.startsWith(`${prefix}.`))
      .map((e) => e.message);
  }

  protected resolvedEnergy(i: number): string {
    const r = this.build().states[i];
    return r ? formatMeasured(r.energyEv, r.sigmaEv, 'eV') : '—';
  }

  protected resolvedHow(i: number): string {
    return this.build().states[i]?.how ?? '';
  }

  // ——— editing ———————————————————————————————————————————————————————————————

  protected num(event: Event): number | null {
    const text = (event.target as HTMLInputElement).value.trim().replace('−', '-');
    if (text === '') return null;
    const n = Number(text);
    return Number.isFinite(n) ? n : null;
  }

  protected text(event: Event): string {
    return (event.target as HTMLInputElement).value;
  }

  protected v(x: number | null): string {
    return x === null ? '' : String(x);
  }

  protected setState<K extends keyof StateDesign>(i: number, key: K, value: StateDesign[K]): void {
    this.store.updateState(i, { [key]: value } as Partial<StateDesign>);
  }

  protected setKind(i: number, kind: StateKind): void {
    this.store.updateState(i, { kind });
  }

  protected setMode(i: number, mode: EnergyMode): void {
    this.store.updateState(i, { mode });
  }

  protected setLink<K extends keyof LinkDesign>(i: number, key: K, value: LinkDesign[K]): void {
    this.store.updateLink(i, { [key]: value } as Partial<LinkDesign>);
  }

  protected addState(): void {
    const ids = new Set(this.design().states.map((s) => s.id));
    let n = this.design().states.length;
    while (ids.has(`X${n}`)) n++;
    this.store.addState(newState(`X${n}`));
  }

  protected addLink(): void {
    const states = this.design().states;
    this.store.addLink(newLink(states[1]?.id ?? '', states[0]?.id ?? ''));
  }

  protected async pickStatePair(i: number, pairId: string): Promise<void> {
    if (!pairId) return this.store.updateState(i, { pair: null });
    const pair = await firstValueFrom(this.pairsApi.get(pairId));
    this.store.updateState(i, { pair: pairSource(pair) });
  }

  protected async pickLinkPair(i: number, pairId: string): Promise<void> {
    if (!pairId) return this.store.updateLink(i, { pair: null });
    const pair = await firstValueFrom(this.pairsApi.get(pairId));
    this.store.updateLink(i, { pair: pairSource(pair) });
  }

  protected pairValue(
    source: { values: Readonly<Record<string, { value: number; sigma: number | null }>> } | null,
    kind: string,
  ): string {
    const v = source?.values[kind];
    return v ? formatMeasured(v.value, v.sigma, 'eV') : 'not on this pair';
  }

  protected provenanceOf(
    source: { provenance: Readonly<Record<string, Provenance>> } | null,
    kind: string,
  ): Provenance | null {
    return source?.provenance[kind] ?? null;
  }

  protected async save(): Promise<void> {
    const wasNew = !this.store.cascade();
    const saved = await this.store.save(this.wid());
    if (saved && wasNew) {
      await this.router.navigate(['/w', this.wid(), 'cascades', saved.id], { replaceUrl: true });
    }
  }

  protected actionWords = actionWords;
}
