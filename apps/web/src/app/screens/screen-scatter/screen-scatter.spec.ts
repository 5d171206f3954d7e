import { TestBed } from '@angular/core/testing';
import type { ScreenResultRow } from '@gapwise/contracts';
import { PLOT_RATES } from '../result-columns';
import { ScreenScatter, robustRange, scatterPoints } from './screen-scatter';

const row = (i: number, over: Partial<ScreenResultRow> = {}): ScreenResultRow => ({
  rowNumber: i + 2,
  donor: `Med-${i}`,
  acceptor: `Med-${i + 60}`,
  solvent: 'acetonitrile',
  deltaGCs: -0.2 - i * 0.1,
  deltaGCr: -2.2 + i * 0.1,
  lambdaInner: 0.2,
  lambdaOuter: 0.8,
  lambdaTotal: 1,
  coupling: 0.005,
  temperature: 298.15,
  log10kCsMarcus: 9 + i * 0.1,
  log10kCrMarcus: 6 - i * 0.1,
  log10kCsMlj: null,
  log10kCrMlj: null,
  regimeCs: 'normal',
  regimeCr: i % 2 ? 'inverted' : 'normal',
  couplingRegime: 'nonadiabatic',
  warnings: [],
  score: i,
  ...over,
});

describe('ScreenScatter', () => {
  it('takes −ΔG° as x and the chosen rate as y, leaving out rows without a rate', () => {
    const pts = scatterPoints([row(0), row(1, { log10kCsMarcus: null })], PLOT_RATES[0], 'score');
    expect(pts).toHaveLength(1);
    expect(pts[0].x).toBeCloseTo(0.2, 12);
    expect(pts[0].y).toBe(9);
    const cr = scatterPoints([row(3)], PLOT_RATES[1], 'coupling');
    expect(cr[0].x).toBeCloseTo(1.9, 12);
    expect(cr[0].colourValue).toBeCloseTo(5, 12); // |H_AB| shown in meV
  });

  it('draws one mark per pair, labelled axes, a colour legend, and shapes per regime', async () => {
    const fixture = TestBed.createComponent(ScreenScatter);
    fixture.componentRef.setInput(
      'rows',
      Array.from({ length: 12 }, (_, i) => row(i)),
    );
    fixture.componentRef.setInput('rate', PLOT_RATES[0]);
    fixture.componentRef.setInput('colourBy', 'score');
    fixture.detectChanges();
    await fixture.whenStable();
    const svg: SVGSVGElement = fixture.nativeElement.querySelector('svg:not(mat-icon svg)');
    expect(svg.querySelectorAll('path.point')).toHaveLength(12);
    const labels = Array.from(svg.querySelectorAll('.axis-label')).map((t) => t.textContent);
    expect(labels).toEqual(['Driving force −ΔG°CS / eV', 'log₁₀(kCS / s⁻¹)']);
    expect(svg.querySelector('.legend')?.textContent).toContain('Colour: Ranking score');
    // Numeric colouring: different scores, different fills.
    const fills = new Set(
      Array.from(svg.querySelectorAll('path.point')).map((p) => p.getAttribute('fill')),
    );
    expect(fills.size).toBeGreaterThan(5);

    fixture.componentRef.setInput('colourBy', 'regimeCr');
    fixture.detectChanges();
    await fixture.whenStable();
    const shapes = new Set(
      Array.from(svg.querySelectorAll('path.point')).map((p) => p.getAttribute('d')),
    );
    expect(shapes.size).toBe(2); // normal and inverted: two shapes, not only two colours
    expect(svg.querySelector('.legend')?.textContent).toContain('inverted');
  });

  it('draws subscripts in the axis labels and the legend as SVG tspans, not raw markup', async () => {
    const fixture = TestBed.createComponent(ScreenScatter);
    fixture.componentRef.setInput('rows', [row(0), row(1)]);
    fixture.componentRef.setInput('rate', PLOT_RATES[0]);
    fixture.componentRef.setInput('colourBy', 'coupling');
    fixture.detectChanges();
    await fixture.whenStable();
    const svg: SVGSVGElement = fixture.nativeElement.querySelector('svg:not(mat-icon svg)');
    const subs = (el: Element | null) =>
      Array.from(el?.querySelectorAll('tspan.sub') ?? [], (t) => t.textContent);
    const [xLabel, yLabel] = Array.from(svg.querySelectorAll('.axis-label'));
    expect(subs(xLabel)).toEqual(['CS']);
    expect(subs(yLabel)).toEqual(['CS']);
    const legend = svg.querySelector('.legend')!;
    expect(legend.textContent).toContain('Colour: |HAB|');
    expect(subs(legend)).toEqual(['AB']);
    expect(svg.textContent).not.toContain('_');
  });
});

describe('robustRange', () => {
  it('keeps the whole range when nothing lies far out', () => {
    expect(robustRange([1, 2, 3, 4, 5, 6, 7, 8, 9])).toEqual([1, 9]);
    expect(robustRange([3, 1, 2])).toEqual([1, 3]);
    expect(robustRange([])).toBeNull();
  });

  it('stops at the outer fences (quartiles ∓ 3 IQR) when one value lies far out', () => {
    // Sorted: −87, 1, …, 9. Type-7 quartiles by hand: q1 at position 9 × 0.25 = 2.25 → 2.25,
    // q3 at 6.75 → 6.75; IQR = 4.5; lower fence 2.25 − 13.5 = −11.25; the upper fence 20.25
    // lies above the largest value, so the top stays at 9.
    const values = [1, 2, 3, 4, 5, 6, 7, 8, 9, -87];
    expect(robustRange(values)).toEqual([-11.25, 9]);
  });
});
