import { CUSTOM_ELEMENTS_SCHEMA, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { ActivatedRoute, convertToParamMap, provideRouter } from '@angular/router';
import { of, throwError } from 'rxjs';
import type { ReportView } from '@gapwise/contracts';
import { DrivingForcePlot } from '../../plots/driving-force-plot/driving-force-plot';
import { ParabolaPlot } from '../../plots/parabola-plot/parabola-plot';
import { TemperaturePlot } from '../../plots/temperature-plot/temperature-plot';
import { Session } from '../../session/session';
import { WorkspaceContext } from '../../workspaces/workspace-context';
import { ReportsApi } from '../reports-api';
import { ReportViewPage } from './report-view';
import { DEMO_AUTHOR_ID, DEMO_REPORT } from './testing/demo-report';

const REVIEWER_ID = '00000000-0000-4000-8000-0000000000a1';

function setup(options: { role: string; userId: string; api?: Partial<ReportsApi> }) {
  const api = {
    get: () => of(DEMO_REPORT),
    pdfUrl: (id: string) => `/api/reports/${id}/pdf`,
    exportUrl: (id: string, format: string) => `/api/reports/${id}/export?format=${format}`,
    ...options.api,
  };
  TestBed.configureTestingModule({
    providers: [
      provideRouter([]),
      { provide: ReportsApi, useValue: api },
      { provide: Session, useValue: { user: signal({ id: options.userId }) } },
      { provide: WorkspaceContext, useValue: { role: signal(options.role) } },
      {
        provide: ActivatedRoute,
        useValue: { snapshot: { paramMap: convertToParamMap({ id: DEMO_REPORT.reportId }) } },
      },
    ],
  });
  // The plots have their own tests; here they stay unrendered elements.
  TestBed.overrideComponent(ReportViewPage, {
    remove: { imports: [ParabolaPlot, DrivingForcePlot, TemperaturePlot] },
    add: { schemas: [CUSTOM_ELEMENTS_SCHEMA] },
  });
  const fixture = TestBed.createComponent(ReportViewPage);
  fixture.detectChanges();
  const el = fixture.nativeElement as HTMLElement;
  const button = (text: string) =>
    Array.from(el.querySelectorAll('button')).find((b) => b.textContent?.trim() === text);
  return { fixture, el, button };
}

describe('ReportViewPage', () => {
  it('prints parameter labels and equations with subscripts, as the PDF does', () => {
    const { el } = setup({ role: 'reviewer', userId: REVIEWER_ID });
    const coupling = el.querySelector('tr[data-kind="coupling"] th')!;
    expect(coupling.querySelector('sub')?.textContent).toBe('AB');
    expect(coupling.textContent?.trim()).toBe('Electronic coupling |HAB|');
    const equations = Array.from(el.querySelectorAll('.equation'), (e) => e.textContent).join();
    expect(equations).toContain('kBT');
    expect(equations).not.toMatch(/_\{|_[A-Za-z]/);
  });

  it('shows derivation inputs by their labels, with units and subscripts, in the provenance column', () => {
    const { el } = setup({ role: 'reviewer', userId: REVIEWER_ID });
    const row = el.querySelector('tr[data-kind="lambdaOuter"]')!;
    const lambdaOuter = row.textContent!;
    expect(lambdaOuter).toContain('centre-to-centre distance R = 10.8 Å');
    // "donor radius a_D": the D is a subscript, as in the PDF.
    expect(lambdaOuter).toContain('donor radius aD = 5.5 Å');
    expect(Array.from(row.querySelectorAll('td sub'), (s) => s.textContent)).toContain('D');
    expect(lambdaOuter).not.toContain('radiusDonor');
    expect(lambdaOuter).toContain('Derived with the two-sphere continuum helper from');
  });

  it('writes a trace-derived value as a sentence naming the files, with a link to the analysis', () => {
    const analysisId = '5b9f3c1e-2a4d-4e8f-9b7a-6c5d4e3f2a1b';
    const traceId = '0e1d2c3b-4a59-4687-a5b4-c3d2e1f0a9b8';
    const pair = DEMO_REPORT.snapshot.pairs[0];
    const report: ReportView = {
      ...DEMO_REPORT,
      snapshot: {
        ...DEMO_REPORT.snapshot,
        pairs: [
          {
            ...pair,
            inputs: pair.inputs.map((i) =>
              i.kind !== 'lambdaOuter'
                ? i
                : {
                    ...i,
                    provenance: {
                      kind: 'derived',
                      methodId: 'reorg.gapSamples',
                      methodInputs: {
                        estimator: 'lambdaFromMeans',
                        temperature: 300,
                        reactantTraceId: traceId,
                        productTraceId: traceId,
                        reactantFileName: 'reactant_state.dat',
                        productFileName: 'product.dat',
                        reactantSha256: 'f'.repeat(64),
                      },
                      sources: [{ type: 'trace-analysis', id: analysisId }],
                    },
                  },
            ),
          },
        ],
      },
    };
    const { el } = setup({ role: 'reviewer', userId: REVIEWER_ID, api: { get: () => of(report) } });
    const cell = el.querySelector('tr[data-kind="lambdaOuter"] td:nth-of-type(4)')!;
    const text = cell.textContent!.replace(/\s+/g, ' ').trim();
    expect(text).toContain('reactant_state.dat (reactant state) and product.dat (product state)');
    expect(text).not.toContain(traceId);
    expect(text).not.toContain('ffff');
    expect(text).not.toContain('{');
    const link = cell.querySelector('a')!;
    expect(link.textContent!.trim()).toBe('trace analysis');
    expect(link.getAttribute('href')).toBe(
      `/w/${DEMO_REPORT.workspaceId}/trace-analyses/${analysisId}`,
    );
  });

  it('offers a reviewer who did not write the report both decisions', () => {
    const { button } = setup({ role: 'reviewer', userId: REVIEWER_ID });
    expect(button('Approve')).toBeTruthy();
    expect(button('Request changes')).toBeTruthy();
    expect(button('Submit for review')).toBeUndefined();
  });

  it('does not offer the author Approve, and says why', () => {
    const { el, button } = setup({ role: 'owner', userId: DEMO_AUTHOR_ID });
    expect(button('Approve')).toBeUndefined();
    expect(el.querySelector('.hint')?.textContent).toContain('another reviewer approves it');
  });

  it('shows a refusal as an error and a new snapshot as a plain confirmation', () => {
    const refused = throwError(() => ({
      error: { error: { message: 'A approved report cannot be approved.' } },
    }));
    const draft: ReportView = { ...DEMO_REPORT, status: 'draft' };
    const { fixture, el, button } = setup({
      role: 'editor',
      userId: DEMO_AUTHOR_ID,
      api: {
        get: () => of(draft),
        decide: () => refused,
        revise: () => of(draft),
      },
    });
    button('Submit for review')!.click();
    fixture.detectChanges();
    const error = el.querySelector('p.message')!;
    expect(error.textContent).toContain('cannot be approved');
    expect(error.classList.contains('error')).toBe(true);

    button('Revise from the pair')!.click();
    fixture.detectChanges();
    const done = el.querySelector('p.message')!;
    expect(done.textContent).toContain('New snapshot taken');
    expect(done.classList.contains('error')).toBe(false);
  });

  it('shows a derived input with the digits its σ supports and a typed one as typed', () => {
    const report = structuredClone(DEMO_REPORT) as ReportView;
    const inputs = report.snapshot.pairs[0]!.inputs as unknown as Array<Record<string, unknown>>;
    const dg = inputs.find((i) => i['kind'] === 'deltaG0')!;
    // A helper's result carries all its arithmetic digits; σ = 0.05 eV supports three decimals.
    Object.assign(dg, { value: -1.620473921, typedValue: -1.620473921, uncertainty: 0.05 });
    const t = inputs.find((i) => i['kind'] === 'temperature')!;
    Object.assign(t, { value: 298.15, typedValue: 298.15 });
    const { el } = setup({
      role: 'reviewer',
      userId: REVIEWER_ID,
      api: { get: () => of(report) },
    });
    const cells = (kind: string) =>
      Array.from(el.querySelectorAll(`tr[data-kind="${kind}"] td.num`), (c) =>
        c.textContent!.trim(),
      );
    expect(cells('deltaG0')).toEqual(['−1.620 eV', '−1.620 eV', '± 0.050 eV']);
    expect(el.textContent).not.toContain('1.62047');
    expect(cells('temperature').slice(0, 2)).toEqual(['298.15 K', '298.15 K']);
  });
});
