import { TestBed } from '@angular/core/testing';
import type { SeriesFit, SeriesModelFit, SeriesPoint } from '@gapwise/contracts';
import { FitTable } from '../fit-table/fit-table';
import { SeriesPlot } from './series-plot';

const grid = Array.from({ length: 21 }, (_, i) => -2 + i * 0.1);
const curve = (lambda: number): SeriesModelFit => ({
  model: 'marcus',
  lambda,
  coupling: 0.0004,
  standardErrors: { lambda: 0.03, coupling: 0.00004 },
  correlation: 0.42,
  covariance: [
    [1, 0],
    [0, 1],
  ],
  rmsLog10Residual: 0.08,
  residuals: [],
  aic: -20.9,
  bic: -20.7,
  band: {
    deltaG0: grid,
    log10k: grid.map((g) => 10 - (g + lambda) ** 2),
    lower: grid.map((g) => 9.8 - (g + lambda) ** 2),
    upper: grid.map((g) => 10.2 - (g + lambda) ** 2),
  },
  warnings: [],
});
const fit: SeriesFit = {
  model: 'marcus',
  hbarOmega: 0.18,
  lambdaVib: 0.25,
  fits: {
    marcus: curve(0.97),
    mlj: {
      ...curve(0.77),
      model: 'mlj',
      aic: -11.9,
      warnings: [{ code: 'normal-only', message: 'No point beyond −ΔG° = λ.' }],
    },
  },
  preferred: 'marcus',
  fittedAt: '2026-12-01T00:00:00Z',
};
const points: SeriesPoint[] = [
  { label: 'DA-1', deltaG0: -0.4, log10k: 9.2, sigmaLog10k: 0.15, pairId: null },
  { label: 'DA-2', deltaG0: -1.0, log10k: 9.9, sigmaLog10k: null, pairId: null },
];

describe('SeriesPlot and FitTable', () => {
  it('draws the points with error bars, both curves, the band and the inverted region', async () => {
    const fixture = TestBed.createComponent(SeriesPlot);
    fixture.componentRef.setInput('points', points);
    fixture.componentRef.setInput('fit', fit);
    fixture.detectChanges();
    await fixture.whenStable();
    const svg: SVGSVGElement = fixture.nativeElement.querySelector('svg:not(mat-icon svg)');
    expect(svg.querySelectorAll('circle')).toHaveLength(2);
    expect(svg.querySelectorAll('line.error-bar')).toHaveLength(1); // only DA-1 has σ
    expect(svg.querySelector('path.curve.marcus')?.getAttribute('d')).toMatch(/^M/);
    expect(svg.querySelector('path.curve.mlj')?.getAttribute('stroke-dasharray')).toBe('7 4');
    expect(svg.querySelector('path.band')?.getAttribute('d')).toMatch(/Z$/);
    expect(svg.querySelector('rect.inverted')).not.toBeNull();
    expect(svg.textContent).toContain('inverted (λ = 0.97 eV)');
    expect(fixture.nativeElement.querySelector('.legend')?.textContent).toContain(
      '95 % confidence',
    );
  });

  it('lists λ and |H_AB| with SEs, correlation, AIC/BIC and marks the preferred model', () => {
    const fixture = TestBed.createComponent(FitTable);
    fixture.componentRef.setInput('fit', fit);
    fixture.componentRef.setInput('temperature', 298.15);
    fixture.detectChanges();
    const rows = Array.from<HTMLElement>(fixture.nativeElement.querySelectorAll('tbody tr'));
    expect(rows).toHaveLength(2);
    expect(rows[0].textContent).toContain('0.970 ± 0.030');
    expect(rows[0].textContent).toContain('0.400 ± 0.040'); // meV
    expect(rows[0].textContent).toContain('lower AIC');
    expect(rows[0].classList).toContain('primary');
    expect(fixture.nativeElement.querySelector('.warnings')?.textContent).toContain(
      'No point beyond',
    );
  });

  it('writes fit warnings with subscripts (λ_s, k_BT), not the raw markup', () => {
    const warned: SeriesFit = {
      ...fit,
      fits: {
        ...fit.fits,
        mlj: {
          ...fit.fits.mlj!,
          warnings: [{ code: 'low-frequency-mode', message: 'ħω below 4k_BT: fold it into λ_s.' }],
        },
      },
    };
    const fixture = TestBed.createComponent(FitTable);
    fixture.componentRef.setInput('fit', warned);
    fixture.componentRef.setInput('temperature', 298.15);
    fixture.detectChanges();
    const list = fixture.nativeElement.querySelector('.warnings') as HTMLElement;
    expect(list.textContent).toContain('ħω below 4kBT: fold it into λs.');
    expect(Array.from(list.querySelectorAll('sub'), (e) => e.textContent)).toEqual(['B', 's']);
  });
});
