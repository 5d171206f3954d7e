import { TestBed } from '@angular/core/testing';
import { ActivatedRoute, convertToParamMap, provideRouter } from '@angular/router';
import { calculate } from '@gapwise/calc';
import type { Pair } from '@gapwise/contracts';
import { of } from 'rxjs';
import { WorkspaceContext } from '../../workspaces/workspace-context';
import { PairsApi } from '../pairs-api';
import { SolventChoice } from './solvent-choice';

const rw = {
  donorOxidation: 1.0,
  acceptorReduction: -0.9,
  excitationEnergy: 2.5,
  distance: 7,
  epsilon: 35.94,
  radiusDonor: 3.5,
  radiusAcceptor: 3.5,
  epsilonReference: 35.94,
};
const ts = {
  radiusDonor: 3.5,
  radiusAcceptor: 3.5,
  distance: 7,
  epsilon: 35.94,
  refractiveIndex: 1.3442,
};

function pair(model = 'marcus', extra: { kind: string; value: number }[] = []): Pair {
  const dg = calculate({ method: 'drivingForce.rehmWeller', inputs: rw });
  const lo = calculate({ method: 'reorg.twoSphere', inputs: ts });
  if (!dg.ok || !lo.ok) throw new Error('fixture');
  const prov = (methodId: string, methodInputs: Record<string, unknown>) => ({
    kind: 'derived' as const,
    methodId,
    methodInputs,
  });
  const par = (kind: string, value: number, provenance: object = { kind: 'assumed' }) => ({
    kind,
    value,
    unit: '',
    uncertainty: null,
    provenance,
  });
  return {
    id: 'p1',
    workspaceId: 'w1',
    name: 'DA-test',
    donor: 'D',
    acceptor: 'A',
    medium: 'Acetonitrile',
    temperature: 298.15,
    version: 3,
    status: 'active',
    tags: [],
    model,
    results: null,
    createdAt: '',
    updatedAt: '',
    updatedBy: null,
    parameters: [
      par('deltaG0', dg.outputs['deltaG0CS'] as number, prov('drivingForce.rehmWeller', rw)),
      par(
        'deltaG0Recombination',
        dg.outputs['deltaG0CR'] as number,
        prov('drivingForce.rehmWeller', rw),
      ),
      par('lambdaOuter', lo.outputs['lambdaOuter'] as number, prov('reorg.twoSphere', ts)),
      par('lambdaInner', 0.2),
      par('coupling', 0.005),
      par('epsilonStatic', 35.94),
      par('refractiveIndex', 1.3442),
      ...extra.map((e) => par(e.kind, e.value)),
    ],
  } as unknown as Pair;
}

describe('SolventChoice', () => {
  it('lists every solvent with both rates, marks the current one and saves a new version', async () => {
    const updates: unknown[] = [];
    TestBed.configureTestingModule({
      imports: [SolventChoice],
      providers: [
        provideRouter([{ path: '**', children: [] }]),
        {
          provide: ActivatedRoute,
          useValue: { paramMap: of(convertToParamMap({ wid: 'w1', pairId: 'p1' })) },
        },
        {
          provide: PairsApi,
          useValue: {
            get: () => of(pair()),
            update: (_id: string, body: unknown) => {
              updates.push(body);
              return of({ ...pair(), version: 4 });
            },
          },
        },
        { provide: WorkspaceContext, useValue: { canEdit: () => true } },
      ],
    });
    const fixture = TestBed.createComponent(SolventChoice);
    fixture.detectChanges();
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    const rows = el.querySelectorAll('table.solvent-table tbody tr');
    expect(rows.length).toBeGreaterThan(10);
    const mecn = el.querySelector('tr[data-solvent="acetonitrile"]')!;
    expect(mecn.textContent).toContain('(current)');
    expect(mecn.querySelector('button')).toBeNull();
    expect(el.querySelectorAll('svg.chart polyline').length).toBe(2);
    const dcm = el.querySelector<HTMLButtonElement>('button[aria-label="Use Dichloromethane"]')!;
    dcm.click();
    expect(updates.length).toBe(1);
    const body = updates[0] as {
      medium: string;
      version: number;
      parameters: { kind: string; value: number }[];
    };
    expect(body.medium).toBe('Dichloromethane');
    expect(body.version).toBe(3);
    expect(body.parameters.find((p) => p.kind === 'epsilonStatic')!.value).toBe(8.93);
  });

  it('says in plain words why n-hexane has no Marcus–Levich–Jortner rate, with no field code', async () => {
    TestBed.configureTestingModule({
      imports: [SolventChoice],
      providers: [
        provideRouter([{ path: '**', children: [] }]),
        {
          provide: ActivatedRoute,
          useValue: { paramMap: of(convertToParamMap({ wid: 'w1', pairId: 'p1' })) },
        },
        {
          provide: PairsApi,
          useValue: { get: () => of(pair('mlj', [{ kind: 'hbarOmega', value: 0.18 }])) },
        },
        { provide: WorkspaceContext, useValue: { canEdit: () => true } },
      ],
    });
    const fixture = TestBed.createComponent(SolventChoice);
    fixture.detectChanges();
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    const hexane = el.querySelector('tr[data-solvent="n-hexane"]')!;
    expect(hexane.querySelector('.errors')!.textContent).toContain(
      'outer reorganization energy λₒ is zero in this non-polar solvent',
    );
    expect(el.textContent).not.toMatch(/lambdaSolvent|must be a positive number/);
    // Every value cell carries its column label for the stacked phone layout.
    for (const td of Array.from(hexane.querySelectorAll('td:not(.action)'))) {
      expect(td.getAttribute('data-label')).toBeTruthy();
    }
  });
});
