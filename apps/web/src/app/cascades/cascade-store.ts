import { DestroyRef, Injectable, computed, inject, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { HttpErrorResponse } from '@angular/common/http';
import { canReadAudit, type AuditEvent, type Pair } from '@gapwise/contracts';
import { catchError, debounceTime, firstValueFrom, map, of } from 'rxjs';
import { apiErrorOf } from '../session/api-errors';
import { AuditApi } from '../workspaces/audit/audit-api';
import { WorkspaceContext } from '../workspaces/workspace-context';
import {
  computeNetwork,
  monteCarloRequest,
  type MonteCarloResult,
  type NetworkAnswer,
} from './cascade-compute';
import {
  buildNetwork,
  emptyDesign,
  readDesign,
  type CascadeDesign,
  type LinkDesign,
  type PairSource,
  type StateDesign,
} from './cascade-design';
import { CascadesApi, type Cascade, type CascadeVersion } from './cascades-api';

/** Milliseconds between the last keystroke and the recompute (the core takes a few ms). */
export const RECOMPUTE_DEBOUNCE_MS = 120;
/** Monte Carlo waits a little longer: it solves 2,000 networks in the worker. */
export const MONTE_CARLO_DEBOUNCE_MS = 500;

/** A pair's parameters as a cascade takes them: ΔG°, λ and |H_AB| with σ and provenance. */
export function pairSource(pair: Pair): PairSource {
  const values: Record<string, { value: number; sigma: number | null }> = {};
  const provenance: PairSource['provenance'] = {};
  for (const p of pair.parameters) {
    if (p.kind !== 'deltaG0' && p.kind !== 'lambdaTotal' && p.kind !== 'coupling') continue;
    values[p.kind] = { value: p.value, sigma: p.uncertainty };
    (provenance as Record<string, unknown>)[p.kind] = p.provenance;
  }
  return { id: pair.id, name: pair.name, version: pair.version, values, provenance };
}

/**
 * State of one cascade page: the stored cascade, the design being edited, the live answer of the
 * core (debounced), the Monte Carlo intervals from the worker, saving with optimistic locking,
 * versions and audit events.
 */
@Injectable()
export class CascadeStore {
  private readonly api = inject(CascadesApi);
  private readonly auditApi = inject(AuditApi);
  private readonly workspace = inject(WorkspaceContext);

  readonly cascade = signal<Cascade | null>(null);
  readonly name = signal('');
  readonly notes = signal('');
  readonly design = signal<CascadeDesign>(emptyDesign());
  readonly saving = signal(false);
  readonly saveMessage = signal<{ kind: 'ok' | 'error' | 'conflict'; text: string } | null>(null);
  readonly versions = signal<CascadeVersion[]>([]);
  readonly audit = signal<AuditEvent[] | null>(null);
  readonly monteCarlo = signal<MonteCarloResult | 'running' | null>(null);

  /** The design as a request, at every keystroke (cheap: no solving). */
  readonly build = computed(() => buildNetwork(this.design()));

  /** The core's answer, recomputed `RECOMPUTE_DEBOUNCE_MS` after the last change. */
  readonly answer = toSignal(
    toObservable(this.build).pipe(
      debounceTime(RECOMPUTE_DEBOUNCE_MS),
      map((b): NetworkAnswer | null => (b.network ? computeNetwork(b.network) : null)),
    ),
    { initialValue: null },
  );

  /** The last answer that succeeded (the pictures stay while a field is being retyped). */
  private lastGood: NetworkAnswer | null = null;
  readonly shown = computed(() => {
    const a = this.answer();
    if (a?.ok) this.lastGood = a;
    return a?.ok ? a : this.lastGood?.ok ? this.lastGood : null;
  });

  private worker: Worker | null = null;
  private mcRequestId = 0;

  constructor() {
    inject(DestroyRef).onDestroy(() => this.worker?.terminate());
    toObservable(computed(() => buildNetwork(this.design(), true)))
      .pipe(debounceTime(MONTE_CARLO_DEBOUNCE_MS))
      .subscribe((b) => this.startMonteCarlo(b.network, b.uncertainInputs));
  }

  /** Loads a stored cascade (design from the stored design, or read from the bare network). */
  load(c: Cascade): void {
    this.cascade.set(c);
    this.name.set(c.name);
    this.notes.set(c.notes);
    this.design.set(readDesign(c.design, c.network));
    this.refreshHistory();
  }

  refreshHistory(): void {
    const c = this.cascade();
    if (!c) return;
    this.api
      .versions(c.id)
      .pipe(catchError(() => of([])))
      .subscribe((v) => this.versions.set(v));
    // Only owners and reviewers read the audit trail; others see the versions alone.
    if (!canReadAudit(this.workspace.role())) {
      this.audit.set(null);
      return;
    }
    this.auditApi
      .page(c.workspaceId, { cascadeId: c.id }, 0, 50)
      .pipe(
        map((p) => p.items),
        catchError(() => of(null)),
      )
      .subscribe((items) => this.audit.set(items));
  }

  updateState(i: number, patch: Partial<StateDesign>): void {
    this.design.update((d) => {
      const old = d.states[i];
      const states = d.states.map((s, j) => (j === i ? { ...s, ...patch } : s));
      let links = d.links;
      let initial = d.initial;
      // A renamed id follows into the links and the states that build on it.
      if (patch.id !== undefined && patch.id !== old.id) {
        const rename = (x: string) => (x === old.id ? patch.id! : x);
        links = links.map((l) => ({ ...l, from: rename(l.from), to: rename(l.to) }));
        for (let j = 0; j < states.length; j++)
          if (states[j].fromState === old.id) states[j] = { ...states[j], fromState: patch.id };
        initial = rename(initial);
      }
      return { ...d, states, links, initial };
    });
  }

  addState(state: StateDesign): void {
    this.design.update((d) => ({ ...d, states: [...d.states, state] }));
  }

  removeState(i: number): void {
    this.design.update((d) => {
      const id = d.states[i].id;
      return {
        ...d,
        states: d.states.filter((_, j) => j !== i),
        links: d.links.filter((l) => l.from !== id && l.to !== id),
        initial: d.initial === id ? '' : d.initial,
      };
    });
  }

  updateLink(i: number, patch: Partial<LinkDesign>): void {
    this.design.update((d) => ({
      ...d,
      links: d.links.map((l, j) => (j === i ? { ...l, ...patch } : l)),
    }));
  }

  addLink(link: LinkDesign): void {
    this.design.update((d) => ({ ...d, links: [...d.links, link] }));
  }

  removeLink(i: number): void {
    this.design.update((d) => ({ ...d, links: d.links.filter((_, j) => j !== i) }));
  }

  setDesign(patch: Partial<CascadeDesign>): void {
    this.design.update((d) => ({ ...d, ...patch }));
  }

  private startMonteCarlo(network: Record<string, unknown> | null, uncertain: number): void {
    const id = ++this.mcRequestId;
    if (!network || uncertain === 0 || typeof Worker === 'undefined') {
      this.monteCarlo.set(null);
      return;
    }
    if (!this.worker) {
      this.worker = new Worker(new URL('./cascade-mc.worker', import.meta.url), { type: 'module' });
      this.worker.onmessage = ({
        data,
      }: MessageEvent<{ id: number; result: MonteCarloResult }>) => {
        if (data.id === this.mcRequestId) this.monteCarlo.set(data.result);
      };
    }
    this.monteCarlo.set('running');
    this.worker.postMessage({ id, request: monteCarloRequest(network) });
  }

  /**
   * Saves: a new cascade in `wid`, or a new version of the loaded one from its version (409:
   * someone saved since — the message says so and the stored version can be reloaded).
   */
  async save(wid: string): Promise<Cascade | null> {
    const b = this.build();
    if (!b.network) {
      this.saveMessage.set({
        kind: 'error',
        text: `Not saved: ${b.errors.map((e) => e.message).join(' ')}`,
      });
      return null;
    }
    const body = {
      name: this.name().trim(),
      notes: this.notes(),
      network: b.network,
      design: this.design() as unknown as Record<string, unknown>,
    };
    if (!body.name) {
      this.saveMessage.set({ kind: 'error', text: 'Not saved: Name is required.' });
      return null;
    }
    this.saving.set(true);
    this.saveMessage.set(null);
    const current = this.cascade();
    try {
      const saved = await firstValueFrom(
        current
          ? this.api.update(current.id, { ...body, version: current.version })
          : this.api.create(wid, body),
      );
      this.cascade.set(saved);
      this.saveMessage.set({ kind: 'ok', text: `Saved as version ${saved.version}.` });
      this.refreshHistory();
      return saved;
    } catch (err) {
      const e = apiErrorOf(err);
      if (err instanceof HttpErrorResponse && err.status === 409) {
        this.saveMessage.set({
          kind: 'conflict',
          text: `${e.message} Your edit is kept here; reload the stored version to see it, or copy your values over.`,
        });
      } else {
        const fields = (e.fields ?? []).map((f) => f.message).join(' ');
        this.saveMessage.set({ kind: 'error', text: `Not saved: ${e.message} ${fields}`.trim() });
      }
      return null;
    } finally {
      this.saving.set(false);
    }
  }

  /**
   * An older version's inputs into the editor (saving then writes them as a new version; the
   * stored cascade is not touched until then).
   */
  loadVersion(v: CascadeVersion): void {
    const snap = v.snapshot as {
      name?: string;
      notes?: string;
      network?: Record<string, unknown>;
      design?: unknown;
    };
    this.name.set(snap.name ?? this.name());
    this.notes.set(snap.notes ?? '');
    this.design.set(readDesign(snap.design ?? null, snap.network ?? {}));
    this.saveMessage.set({
      kind: 'ok',
      text: `Version ${v.version} loaded into the editor; save to make it the current version.`,
    });
  }

  /** After a conflict: take the stored version (the edit is dropped). */
  async reload(): Promise<void> {
    const c = this.cascade();
    if (!c) return;
    this.load(await firstValueFrom(this.api.get(c.id)));
    this.saveMessage.set({ kind: 'ok', text: `Reloaded version ${this.cascade()!.version}.` });
  }
}
