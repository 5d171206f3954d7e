import { TestBed } from '@angular/core/testing';
import { drivingForceCurves, type DrivingForceInputs } from '@gapwise/plots';
import { DrivingForcePlot } from './driving-force-plot';

const CLASSICAL: DrivingForceInputs = {
  lambda: 0.8,
  coupling: 0.005,
  temperature: 298.15,
  pair: { deltaG0: -0.3, log10k: 9.42 },
};

function render(inputs: DrivingForceInputs | null, model = '') {
  const fixture = TestBed.createComponent(DrivingForcePlot);
  fixture.componentRef.setInput('inputs', inputs);
  fixture.componentRef.setInput('model', model);
  const redrawn = vi.fn();
  fixture.componentInstance.redrawn.subscribe(redrawn);
  fixture.detectChanges();
  TestBed.tick();
  fixture.detectChanges();
  return { fixture, el: fixture.nativeElement as HTMLElement, redrawn };
}

describe('DrivingForcePlot', () => {
  it('asks for the missing inputs and draws nothing without them', () => {
    const { el, redrawn } = render(null);
    expect(el.querySelector('.empty')?.textContent).toMatch(
      /Enter λ, \|H\s*AB\| and the temperature/,
    );
    expect(el.querySelector('svg[preserveAspectRatio]')!.children.length).toBe(0);
    expect(el.querySelector('.legend')).toBeNull();
    expect(redrawn).toHaveBeenCalled();
  });

  it('draws the classical curve, shades the inverted region from −ΔG° = λ and marks the pair', () => {
    const { el } = render(CLASSICAL, 'marcus');
    const svg = el.querySelector('svg[preserveAspectRatio]')!;
    expect(svg.querySelector('path.curve.marcus')?.getAttribute('d')).toMatch(/^M[\d.]+,[\d.]+L/);
    expect(svg.querySelector('path.curve.mlj')).toBeNull();
    expect(svg.querySelector('rect.inverted')).not.toBeNull();
    const texts = [...svg.querySelectorAll('text')].map((t) => t.textContent);
    expect(texts).toContain('inverted region');
    expect(texts).toContain('normal region');
    expect(texts).toContain('this pair (marcus): 9.42');
    expect(svg.querySelector('path.pair-mark')).not.toBeNull();
    // Where the shading starts is said in the accessible title: λ = 0.8 eV.
    expect(svg.textContent).toMatch(/inverted region beyond −ΔG° = 0\.8 eV/);
    // Without the MLJ inputs the legend says how to get its curve.
    expect(el.querySelector('.legend')?.textContent).not.toMatch(/Levich/);
    expect(el.querySelector('.note')?.textContent).toMatch(/Give ħω and both λᵢ and λₒ/);
  });

  it('adds the dashed MLJ curve when ħω and both parts of λ are given', () => {
    const inputs = { ...CLASSICAL, lambdaSolvent: 0.5, lambdaVib: 0.3, hbarOmega: 0.18 };
    expect(drivingForceCurves(inputs).hasMlj).toBe(true);
    const { el } = render(inputs);
    expect(el.querySelector('path.curve.mlj')?.getAttribute('stroke-dasharray')).toBe('6 4');
    expect(el.querySelector('.legend')?.textContent).toMatch(/Marcus–Levich–Jortner/);
    expect(el.querySelector('.note')).toBeNull();
  });

  it('redraws when the inputs change and clears when they go', () => {
    const { fixture, el, redrawn } = render(CLASSICAL);
    const before = el.querySelector('path.curve.marcus')!.getAttribute('d');
    const calls = redrawn.mock.calls.length;
    fixture.componentRef.setInput('inputs', { ...CLASSICAL, lambda: 1.2 });
    fixture.detectChanges();
    TestBed.tick();
    expect(el.querySelector('path.curve.marcus')!.getAttribute('d')).not.toBe(before);
    expect(redrawn.mock.calls.length).toBeGreaterThan(calls);
    fixture.componentRef.setInput('inputs', null);
    fixture.detectChanges();
    TestBed.tick();
    expect(el.querySelector('svg[preserveAspectRatio]')!.children.length).toBe(0);
  });
});
