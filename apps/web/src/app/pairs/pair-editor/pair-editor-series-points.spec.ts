import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatDialog } from '@angular/material/dialog';
import { MatTabGroupHarness } from '@angular/material/tabs/testing';
import { provideRouter } from '@angular/router';
import type { Pair, PairSeriesPoint } from '@gapwise/contracts';
import { WorkspaceContext } from '../../workspaces/workspace-context';
import { PairEditor } from './pair-editor';

const settle = () => new Promise((resolve) => setTimeout(resolve, 40));

const PAIR: Pair = {
  id: 'p1',
  workspaceId: 'w1',
  version: 1,
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
      value: -0.5,
      unit: 'eV',
      uncertainty: null,
      provenance: { kind: 'measured' },
    },
    {
      kind: 'lambdaOuter',
      value: 0.8,
      unit: 'eV',
      uncertainty: null,
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

const POINTS: PairSeriesPoint[] = [
  {
    seriesId: 's1',
    seriesName: 'Dyads A',
    label: 'a',
    deltaG0: -0.3,
    log10k: 8.2,
    sigmaLog10k: 0.2,
    pairId: null,
  },
  {
    seriesId: 's1',
    seriesName: 'Dyads A',
    label: 'b',
    deltaG0: -0.7,
    log10k: 9.1,
    sigmaLog10k: 0.3,
    pairId: 'p1',
  },
  {
    seriesId: 's2',
    seriesName: 'Dyads B',
    label: 'c',
    deltaG0: -1.1,
    log10k: 8.7,
    sigmaLog10k: null,
    pairId: 'p1',
  },
];

describe('PairEditor: measured series points', { timeout: 40_000 }, () => {
  it('fetches the series points of the pair and draws them on the driving-force plot', async () => {
    TestBed.configureTestingModule({
      providers: [
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MatDialog, useValue: { open: vi.fn() } },
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
    const http = TestBed.inject(HttpTestingController);
    const fixture = TestBed.createComponent(PairEditor);
    fixture.componentRef.setInput('wid', 'w1');
    fixture.componentRef.setInput('pairId', 'p1');
    fixture.detectChanges();
    await fixture.whenStable();
    http.expectOne('/api/pairs/p1').flush(PAIR);
    http.expectOne('/api/pairs/p1/series-points').flush(POINTS);
    await settle();
    fixture.detectChanges();
    await fixture.whenStable();

    const loader = TestbedHarnessEnvironment.loader(fixture);
    const tabs = await loader.getAllHarnesses(MatTabGroupHarness);
    let selected = false;
    for (const group of tabs) {
      const [tab] = await group.getTabs({ label: 'Rate vs driving force' });
      if (tab) {
        await tab.select();
        selected = true;
      }
    }
    expect(selected).toBe(true);
    await settle();
    fixture.detectChanges();
    await fixture.whenStable();

    const el: HTMLElement = fixture.nativeElement;
    const plot = el.querySelector('gw-driving-force-plot')!;
    const points = plot.querySelectorAll('g.measured-point');
    expect(points.length).toBe(3);
    // Open markers, a different shape per series, error bars only where σ is known.
    const markers = [...points].map((p) => p.querySelector('path.marker')!);
    expect(markers.every((m) => m.closest('g')!.getAttribute('fill') === 'none')).toBe(true);
    expect(markers[0].classList.contains('circle')).toBe(true);
    expect(markers[2].classList.contains('square')).toBe(true);
    expect(points[0].querySelector('path.error-bar')).not.toBeNull();
    expect(points[2].querySelector('path.error-bar')).toBeNull();
    const legend = [...plot.querySelectorAll('.legend .key.measured')].map((k) =>
      k.textContent!.trim(),
    );
    expect(legend).toEqual(['○ measured (Dyads A)', '□ measured (Dyads B)']);
    http.verify();
  });
});
