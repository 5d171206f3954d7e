import { TestBed } from '@angular/core/testing';
import { parabolaGeometry } from '@gapwise/plots';
import { ParabolaPlot } from './parabola-plot';

async function render(deltaG0: number, lambda: number, coupling: number) {
  const fixture = TestBed.createComponent(ParabolaPlot);
  fixture.componentRef.setInput('deltaG0', deltaG0);
  fixture.componentRef.setInput('lambda', lambda);
  fixture.componentRef.setInput('coupling', coupling);
  fixture.detectChanges();
  await fixture.whenStable();
  return fixture.nativeElement as HTMLElement;
}

/** Numbers of an SVG path `M x,y L x,y …` as points. */
function pointsOf(d: string): Array<[number, number]> {
  return [...d.matchAll(/[ML]([-\d.e]+),([-\d.e]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);
}

describe('ParabolaPlot', () => {
  it('draws the diabats crossing where ΔE = 0', async () => {
    const el = await render(-0.3, 0.8, 0.05);
    const reactant = pointsOf(el.querySelector('path.curve.reactant')!.getAttribute('d')!);
    const product = pointsOf(el.querySelector('path.curve.product')!.getAttribute('d')!);
    const g = parabolaGeometry({ deltaG0: -0.3, lambda: 0.8, coupling: 0.05 });
    const i = g.points.findIndex((p) => p.gap === 0);
    // Both paths are sampled on the same grid: at the ΔE = 0 sample they share the point.
    expect(reactant[i][0]).toBeCloseTo(product[i][0], 6);
    expect(reactant[i][1]).toBeCloseTo(product[i][1], 6);
    // And that x is the axis position of ΔE = 0 (the dashed rule drawn there).
    const dot = el.querySelector('g.overlay circle')!;
    expect(Number(dot.getAttribute('cx'))).toBeCloseTo(reactant[i][0], 2);
    expect(Number(dot.getAttribute('cy'))).toBeCloseTo(reactant[i][1], 2);
    // Away from the crossing they differ.
    expect(Math.abs(reactant[i + 10][1] - product[i + 10][1])).toBeGreaterThan(1);
  });

  it('splits the adiabatic surfaces at the crossing by 2|H_AB| in plot units', async () => {
    const H = 0.05;
    const el = await render(-0.3, 0.8, H);
    const lower = pointsOf(el.querySelector('path.adiabatic.lower')!.getAttribute('d')!);
    const upper = pointsOf(el.querySelector('path.adiabatic.upper')!.getAttribute('d')!);
    const g = parabolaGeometry({ deltaG0: -0.3, lambda: 0.8, coupling: H });
    const i = g.points.findIndex((p) => p.gap === 0);
    const [top, bottom] = g.energyDomain.slice().reverse();
    const pxPerEv = (380 - 16 - 48) / (top - bottom);
    expect(lower[i][1] - upper[i][1]).toBeCloseTo(2 * H * pxPerEv, 1);
    expect(el.textContent).toContain('ΔG‡ = 0.0781 eV');
    // 2|H_AB| is drawn with an SVG subscript, never with the raw underscore.
    const splitting = el.querySelector('text.arrow-label.splitting')!;
    expect(splitting.textContent).toBe('2|HAB| = 0.1 eV');
    expect(Array.from(splitting.querySelectorAll('tspan.sub'), (t) => t.textContent)).toEqual([
      'AB',
    ]);
    expect(el.querySelector('svg')!.textContent).not.toContain('_');
  });

  it('keeps the ΔG‡ and 2|H_AB| labels off the curves and apart, even for a tiny barrier', async () => {
    // The demo pair DA-1: ΔG° = −0.71 eV, λ = 1.0 eV, |H_AB| = 45 cm⁻¹ = 0.00558 eV; ΔG‡ is
    // (ΔG° + λ)²/(4λ) = 0.021 eV, an arrow of a few pixels at the crossing.
    const el = await render(-0.71, 1.0, 45 / 8065.543937);
    const curves = Array.from(el.querySelectorAll('path.curve'), (p) =>
      pointsOf(p.getAttribute('d')!),
    );
    const boxes = ['activation', 'splitting'].map((id) => {
      const t = el.querySelector(`text.arrow-label.${id}`)!;
      // jsdom lays nothing out: the plot falls back to 7.2 units a character (subscripts 0.72).
      const chars = Array.from(t.childNodes).reduce(
        (n, c) =>
          n + (c.textContent?.length ?? 0) * ((c as Element).classList?.contains('sub') ? 0.72 : 1),
        0,
      );
      const width = Math.ceil(chars * 7.2);
      const end = t.getAttribute('text-anchor') === 'end';
      const x = Number(t.getAttribute('x')) - (end ? width : 0);
      const y = Number(t.getAttribute('y')) - 12;
      return { x, y, width, height: 17 };
    });
    const inside = (p: [number, number], b: (typeof boxes)[number]) =>
      p[0] >= b.x && p[0] <= b.x + b.width && p[1] >= b.y && p[1] <= b.y + b.height;
    for (const b of boxes) {
      for (const points of curves) expect(points.some((p) => inside(p, b))).toBe(false);
    }
    const [a, s] = boxes;
    const apart =
      a.x + a.width <= s.x ||
      s.x + s.width <= a.x ||
      a.y + a.height <= s.y ||
      s.y + s.height <= a.y;
    expect(apart).toBe(true);
    // Far from their short arrows, each label is tied to it by a leader line.
    expect(el.querySelectorAll('line.leader').length).toBeGreaterThanOrEqual(1);
  });

  it('hides the adiabatic surfaces when toggled off and labels curves in words', async () => {
    const fixture = TestBed.createComponent(ParabolaPlot);
    fixture.componentRef.setInput('deltaG0', -0.3);
    fixture.componentRef.setInput('lambda', 0.8);
    fixture.componentRef.setInput('coupling', 0.05);
    fixture.detectChanges();
    await fixture.whenStable();
    (fixture.nativeElement as HTMLElement)
      .querySelector<HTMLButtonElement>('.adiabatic-toggle button')!
      .click();
    fixture.detectChanges();
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelector('path.adiabatic')).toBeNull();
    expect(el.textContent).toContain('reactant (D–A)');
    expect(el.textContent).toContain('product (D⁺–A⁻)');
  });
});
