import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatDialog } from '@angular/material/dialog';
import { provideRouter } from '@angular/router';
import { computePairResults, type Pair, type PairInput } from '@gapwise/contracts';
import { of } from 'rxjs';
import { WorkspaceContext } from '../../workspaces/workspace-context';
import { typeQuantityText } from '../pair-form/quantity-control';
import { parameterSpec } from '../pair-form/pair-form';
import { PairEditorStore } from './pair-editor-store';

const settle = () => new Promise((resolve) => setTimeout(resolve, 20));

/** ΔG° derived by a helper (full precision stored), λₒ and |H_AB| assumed. */
const PAIR: Pair = {
  id: 'p1',
  workspaceId: 'w1',
  version: 3,
  name: 'D-A 1',
  donor: 'D',
  acceptor: 'A',
  medium: 'acetonitrile',
  temperature: 298.15,
  temperatureUnit: 'K',
  notes: '',
  status: 'draft',
  tags: [],
  model: 'marcus',
  parameters: [
    {
      kind: 'deltaG0',
      value: -0.683425360906,
      unit: 'eV',
      uncertainty: null,
      provenance: {
        kind: 'derived',
        methodId: 'drivingForce.rehmWeller',
        methodInputs: { donorOxidation: 1.1 },
      },
    },
    {
      kind: 'lambdaOuter',
      value: 0.8,
      unit: 'eV',
      uncertainty: 0.05,
      provenance: { kind: 'assumed' },
    },
    {
      kind: 'coupling',
      value: 0.005,
      unit: 'eV',
      uncertainty: null,
      provenance: { kind: 'assumed' },
    },
  ],
  results: null,
  createdAt: '2026-01-01T00:00:00.000Z',
  updatedAt: '2026-01-01T00:00:00.000Z',
  updatedBy: null,
};

function setup(pairId: string | undefined, choice?: 'reload' | 'overwrite') {
  const open = vi.fn(() => ({ afterClosed: () => of(choice) }));
  TestBed.configureTestingModule({
    providers: [
      provideRouter([]),
      provideHttpClient(),
      provideHttpClientTesting(),
      PairEditorStore,
      { provide: MatDialog, useValue: { open } },
      {
        provide: WorkspaceContext,
        useValue: {
          role: signal('editor'),
          canEdit: signal(true),
          canManageMembers: signal(false),
          workspaceId: signal('w1'),
          current: signal(null),
        },
      },
    ],
  });
  const store = TestBed.inject(PairEditorStore);
  const http = TestBed.inject(HttpTestingController);
  store.bind(signal('w1'), signal(pairId));
  TestBed.tick();
  return { store, http, open };
}

async function loaded(pairId = 'p1', choice?: 'reload' | 'overwrite') {
  const s = setup(pairId, choice);
  s.http.expectOne(`/api/pairs/${pairId}`).flush(PAIR);
  TestBed.tick();
  s.http.expectOne(`/api/pairs/${pairId}/series-points`).flush([]);
  await settle();
  TestBed.tick();
  return s;
}

describe('PairEditorStore', { timeout: 30_000 }, () => {
  it('waits for the route, loads the pair once and computes its results as the server would', async () => {
    const { store, http } = await loaded();
    expect(store.pair()?.id).toBe('p1');
    expect(store.isNew()).toBe(false);
    expect(store.dirty()).toBe(false);
    expect(store.hasUnsavedChanges()).toBe(false);
    const expected = computePairResults(PAIR);
    expect(store.results().log10k).toBeCloseTo(expected.log10k!, 12);
    expect(store.results().regime).toBe(expected.regime);
    // λ total of the pair model (λₒ only here) and the plot inputs derived from it.
    expect(store.plotLambda()).toBe(0.8);
    expect(store.plotDeltaG0()).toBe(-0.683425360906);
    expect(store.fileStem()).toBe('d-a-1');
    http.verify();
  });

  it('shows a derived value with the digits it supports and saves its full precision', async () => {
    const { store, http } = await loaded();
    const dg = store.form().controls.parameters.controls.deltaG0;
    expect(dg.controls.text.value).toBe('-0.6834');
    expect(dg.controls.value.value).toBe(-0.683425360906);
    // A typed value is kept as typed.
    expect(store.form().controls.parameters.controls.lambdaOuter.controls.text.value).toBe('0.8');
    store.form().controls.notes.setValue('checked');
    store.save();
    const req = http.expectOne('/api/pairs/p1');
    expect(req.request.method).toBe('PUT');
    const body = req.request.body as PairInput & { version: number };
    expect(body.version).toBe(3);
    expect(body.parameters.find((p) => p.kind === 'deltaG0')?.value).toBe(-0.683425360906);
    req.flush({ ...PAIR, version: 4, notes: 'checked', results: computePairResults(PAIR) });
    await settle();
    TestBed.tick();
    expect(store.pair()?.version).toBe(4);
    expect(store.serverAgrees()).toBe(true);
    expect(store.serverMismatch()).toBeNull();
    http.match(() => true);
  });

  it('refuses to save an empty new pair and names the missing fields, with no request', async () => {
    const { store, http } = setup(undefined);
    await settle();
    TestBed.tick();
    expect(store.isNew()).toBe(true);
    // Nothing is marked before the user touches the form or saves.
    expect(store.form().controls.name.touched).toBe(false);
    expect(store.calcErrors()).toEqual({});
    store.save();
    expect(store.formErrors()).toEqual([
      'Name is required.',
      'Donor is required.',
      'Acceptor is required.',
    ]);
    expect(store.form().controls.name.touched).toBe(true);
    http.expectNone('/api/workspaces/w1/pairs');
  });

  it('recomputes on every edit and runs the Monte Carlo once typing pauses', async () => {
    const { store } = await loaded();
    const omega = store.form().controls.parameters.controls.lambdaOuter;
    typeQuantityText(omega, parameterSpec('lambdaOuter'), '0.6');
    await settle();
    TestBed.tick();
    expect(store.dirty()).toBe(true);
    const edited = computePairResults({
      ...PAIR,
      parameters: PAIR.parameters.map((p) => (p.kind === 'lambdaOuter' ? { ...p, value: 0.6 } : p)),
    });
    expect(store.results().log10k).toBeCloseTo(edited.log10k!, 12);
    await new Promise((resolve) => setTimeout(resolve, 450));
    TestBed.tick();
    const mc = store.monteCarlo();
    expect(mc.status).toBe('done');
    if (mc.status === 'done') {
      expect(mc.p025).toBeLessThan(mc.median);
      expect(mc.p975).toBeGreaterThan(mc.median);
    }
  });

  it('on a version conflict opens the conflict dialog and reloads their version when asked', async () => {
    const { store, http, open } = await loaded('p1', 'reload');
    store.form().controls.name.setValue('Mine');
    store.save();
    const theirs: Pair = { ...PAIR, version: 5, name: 'Theirs' };
    http
      .expectOne('/api/pairs/p1')
      .flush(
        { error: { code: 'version-conflict', message: 'Changed meanwhile.', current: theirs } },
        { status: 409, statusText: 'Conflict' },
      );
    await settle();
    expect(open).toHaveBeenCalledTimes(1);
    const data = (open.mock.calls[0] as unknown as [unknown, { data: { theirs: Pair } }])[1].data;
    expect(data.theirs.version).toBe(5);
    expect(store.pair()?.name).toBe('Theirs');
    expect(store.form().controls.name.value).toBe('Theirs');
    expect(store.saving()).toBe(false);
  });
});
