import { TestBed } from '@angular/core/testing';
import type { PairResults } from '@gapwise/contracts';
import { ResultsPanel } from './results-panel';

const results: PairResults = {
  model: 'marcus',
  k: 2.31e11,
  log10k: 11.36,
  activationFreeEnergy: 0.021,
  regime: 'normal',
  warnings: [
    {
      code: 'low-frequency-mode',
      message: 'Low-frequency mode (ħω = 0.05 eV < 4k_BT): use thermal MLJ or include it in λ_s.',
    },
  ],
  errors: [],
};

function render(coupling: number, extra: Partial<PairResults> = {}): HTMLElement {
  const fixture = TestBed.createComponent(ResultsPanel);
  fixture.componentRef.setInput('results', { ...results, ...extra });
  fixture.componentRef.setInput('temperature', 298.15);
  fixture.componentRef.setInput('coupling', coupling);
  fixture.detectChanges();
  return fixture.nativeElement as HTMLElement;
}

const subs = (el: Element | null) =>
  Array.from(el?.querySelectorAll('sub') ?? [], (s) => s.textContent);

/** Text as read, without the icons. */
function shownText(el: HTMLElement): string {
  const copy = el.cloneNode(true) as HTMLElement;
  copy.querySelectorAll('mat-icon').forEach((i) => i.remove());
  return copy.textContent ?? '';
}

describe('ResultsPanel', () => {
  it('writes the regime sentences and warnings with subscripts, never the raw markup', () => {
    const el = render(0.0056);
    const regime = el.querySelector('.regime p')!;
    expect(regime.textContent).toContain('Nonadiabatic: |HAB| is well below kBT.');
    expect(subs(regime)).toEqual(['AB', 'B']);
    const warning = el.querySelector('.warnings li')!;
    expect(warning.textContent).toContain(' Low-frequency mode (ħω = 0.05 eV < 4kBT)');
    expect(warning.querySelector('mat-icon[data-mat-icon-name="warning"] svg')).not.toBeNull();
    expect(subs(warning)).toEqual(['B', 's']);
    expect(shownText(el)).not.toContain('_');
  });

  it('shows the coupling regime beside the driving-force regime', () => {
    const el = render(0.05, { couplingRegime: 'intermediate' });
    const chips = Array.from(el.querySelectorAll('.regime-chip'), (c) => c.textContent?.trim());
    expect(chips).toEqual(['normal', 'intermediate']);
    expect(el.querySelector('[data-coupling-regime="intermediate"]')).not.toBeNull();
    // Results stored before the core reported it show only the driving-force regime.
    expect(render(0.0056).querySelectorAll('.regime-chip').length).toBe(1);
  });

  it('says so in words with subscripts when |H_AB| exceeds k_BT', () => {
    const el = render(0.05, { model: 'crossover', warnings: [] });
    const regime = el.querySelector('.regime p')!;
    expect(regime.textContent).toContain('Adiabatic side (|HAB| > kBT)');
    expect(shownText(el)).not.toContain('_');
  });

  it('names the field of a calculation error by its label, with its subscript', () => {
    const el = render(0.0056, {
      k: null,
      log10k: null,
      errors: [{ field: 'tauL', message: 'is needed for this rate model.' }],
    });
    const item = el.querySelector('.errors li')!;
    expect(item.textContent).toMatch(/Longitudinal relaxation time τL\s+is needed/);
    expect(subs(item)).toEqual(['L']);
  });

  it('draws the Monte Carlo distribution with both axes: log10 k ticks and the share of samples', () => {
    const fixture = TestBed.createComponent(ResultsPanel);
    fixture.componentRef.setInput('results', results);
    fixture.componentRef.setInput('temperature', 298.15);
    fixture.componentRef.setInput('coupling', 0.0056);
    // 4 bins over log10 k 10–12 holding 10, 30, 40 and 20 of 100 samples.
    fixture.componentRef.setInput('monteCarlo', {
      status: 'done',
      median: 11,
      p025: 10.6,
      p975: 11.4,
      samples: 100,
      warnings: [],
      histogram: { edges: [10, 10.5, 11, 11.5, 12], counts: [10, 30, 40, 20] },
    });
    fixture.detectChanges();
    const svg = (fixture.nativeElement as HTMLElement).querySelector('svg.hist')!;
    const ticks = (cls: string) =>
      Array.from(svg.querySelectorAll(`text.tick.${cls}`), (t) => t.textContent?.trim());
    expect(ticks('x')).toEqual(['10', '10.5', '11', '11.5', '12']);
    // The tallest bin holds 40 % of the samples: the share axis runs past 40.
    const shares = ticks('y').map((t) => Number(t));
    expect(shares[0]).toBe(0);
    expect(Math.max(...shares)).toBeGreaterThanOrEqual(40);
    const titles = Array.from(svg.querySelectorAll('text.axis-title'), (t) =>
      t.textContent?.trim(),
    );
    expect(titles).toEqual(['log10 (k / s⁻¹)', '% of samples']);
    expect(svg.querySelectorAll('rect').length).toBe(4);
    expect(svg.querySelectorAll('rect.inside').length).toBe(2);
    expect(svg.querySelector('line.median')).not.toBeNull();
  });
});
