import { TestBed } from '@angular/core/testing';
import { MonteCarloPanel } from './monte-carlo-panel';

describe('MonteCarloPanel', () => {
  function render(state: unknown) {
    const fixture = TestBed.createComponent(MonteCarloPanel);
    fixture.componentRef.setInput('state', state);
    fixture.detectChanges();
    return fixture.nativeElement as HTMLElement;
  }

  it('prints the median and 95 % interval of log10 k and draws the distribution', () => {
    const el = render({
      status: 'done',
      median: 11.0234,
      p025: 10.6123,
      p975: 11.3987,
      samples: 4000,
      warnings: ['2 samples had λ ≤ 0 and were dropped.'],
      histogram: { edges: [10, 10.5, 11, 11.5, 12], counts: [10, 30, 40, 20] },
    });
    expect(el.querySelector('h3')?.textContent).toBe('Uncertainty (Monte Carlo, 4000 samples)');
    const strong = [...el.querySelectorAll('p strong')].map((s) => s.textContent?.trim());
    expect(strong).toEqual(['11.02', '10.61 … 11.40']);
    const svg = el.querySelector('svg.hist')!;
    expect(svg.getAttribute('aria-label')).toBe(
      'Distribution of log10 k: 95% of samples from 10.61 to 11.40, median 11.02',
    );
    expect(svg.querySelectorAll('rect').length).toBe(4);
    expect(el.querySelector('.mc-warning')?.textContent).toMatch(/2 samples had λ ≤ 0/);
  });

  it('says why it was not run, and shows nothing without uncertainties', () => {
    expect(render({ status: 'refused', message: 'no uncertainty given' }).textContent).toMatch(
      /Monte Carlo not run: no uncertainty given/,
    );
    TestBed.resetTestingModule();
    expect(render({ status: 'none' }).textContent?.trim()).toBe('');
  });
});
