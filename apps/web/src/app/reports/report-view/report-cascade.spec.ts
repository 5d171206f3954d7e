import { TestBed } from '@angular/core/testing';
import type { ReportCascadeSnapshot } from '@gapwise/contracts';
import { ReportCascade, cascadeValueText } from './report-cascade';

/** A donor–acceptor triad as a report freezes it (invented demo numbers). */
const TRIAD: ReportCascadeSnapshot = {
  cascadeId: '00000000-0000-4000-8000-00000000c001',
  cascadeVersion: 3,
  name: 'Demo triad D–P–A',
  notes: 'Porphyrin-bridged triad.',
  temperatureK: 298.15,
  states: [
    { id: 'g', label: 'D-P-A', kind: 'ground', energyEv: 0, source: 'ground state, 0 eV' },
    {
      id: 'x',
      label: 'D-¹P*-A',
      kind: 'excited',
      energyEv: 2.1016,
      source: 'E₀₀ typed as 590 nm',
    },
    {
      id: 'cs',
      label: 'D⁺-P-A⁻',
      kind: 'chargeSeparated',
      energyEv: 1.234567,
      source: 'typed as 1.234567 eV',
    },
  ],
  steps: [
    {
      from: 'x',
      to: 'cs',
      type: 'electronTransfer',
      k: 8.98765e10,
      deltaG0Ev: -0.867033,
      regime: 'normal',
      couplingRegime: 'nonadiabatic',
      flux: 1.23456,
      source: 'Marcus rate from λ = 0.8 eV, |H_AB| = 20 cm⁻¹',
    },
    {
      from: 'x',
      to: 'g',
      type: 'fixed',
      k: 2e8,
      deltaG0Ev: null,
      regime: null,
      couplingRegime: null,
      flux: 0.0022,
      source: 'lifetime typed as 5 ns',
    },
  ],
  yields: [
    { label: 'Final yield of D⁺-P-A⁻', value: 0.997781, unit: '', low: 0.99123, high: 0.99912 },
  ],
  lifetimes: [
    { label: 'Lifetime of D-¹P*-A', value: 1.1101e-11, unit: 's', low: null, high: null },
  ],
  dominantPathway: ['D-¹P*-A', 'D⁺-P-A⁻'],
  times: [],
  populations: {},
  transitionStates: [],
  tree: { nodes: [], roots: [] },
  monteCarlo: { samples: 2000, seed: 1 },
  monteCarloNote: 'Intervals from 2000 Monte Carlo samples over the stated uncertainties.',
  warnings: [{ code: 'cascade.slow', message: 'Charge recombination k_CR was not given.' }],
};

function render(c: ReportCascadeSnapshot): HTMLElement {
  const fixture = TestBed.createComponent(ReportCascade);
  fixture.componentRef.setInput('cascade', c);
  fixture.detectChanges();
  return fixture.nativeElement as HTMLElement;
}

const rows = (el: HTMLElement, table: string) =>
  Array.from(el.querySelectorAll(`table[aria-label="${table}"] tbody tr`), (tr) =>
    Array.from(tr.children, (c) => c.textContent?.replace(/\s+/g, ' ').trim()),
  );

describe('ReportCascade', () => {
  it('prints yields and lifetimes with 3 significant figures and the Monte Carlo interval', () => {
    const el = render(TRIAD);
    expect(rows(el, 'Yields and lifetimes')).toEqual([
      ['Final yield of D⁺-P-A⁻', '0.998 (95 % interval 0.991 to 0.999)'],
      ['Lifetime of D-¹P*-A', '1.11 × 10⁻¹¹ s'],
    ]);
    expect(el.querySelector('[data-testid="dominant-pathway"]')?.textContent).toContain(
      'D-¹P*-A → D⁺-P-A⁻',
    );
    expect(el.textContent).toContain('2000 Monte Carlo samples');
  });

  it('lists states with their energy-source sentences and steps with rate, ΔG°, regime and source', () => {
    const el = render(TRIAD);
    expect(rows(el, 'States')[1]).toEqual(['D-¹P*-A', 'Excited', '2.10 eV', 'E₀₀ typed as 590 nm']);
    expect(rows(el, 'States')[2]?.[2]).toBe('1.23 eV');
    const [et, given] = rows(el, 'Steps');
    expect(et).toEqual([
      'D-¹P*-A → D⁺-P-A⁻',
      'ET',
      '8.99 × 10¹⁰ s⁻¹',
      '−0.867 eV',
      'Normal',
      '1.2',
      'Marcus rate from λ = 0.8 eV, |HAB| = 20 cm⁻¹',
    ]);
    // The subscript of |H_AB| is markup, not an underscore.
    expect(el.querySelector('table[aria-label="Steps"] sub')?.textContent).toBe('AB');
    expect(given).toEqual([
      'D-¹P*-A → D-P-A',
      'Given',
      '2.00 × 10⁸ s⁻¹',
      '—',
      '—',
      '0.0022',
      'lifetime typed as 5 ns',
    ]);
    // Flux above 1 is explained, not called a probability.
    expect(el.textContent).toContain('can exceed 1 when a step runs back and forth');
    expect(el.textContent).not.toMatch(/probability/i);
  });

  it('shows the warnings, or says there are none', () => {
    expect(render(TRIAD).querySelector('.warnings')?.textContent).toContain(
      'Charge recombination kCR was not given.',
    );
    const el = render({ ...TRIAD, warnings: [] });
    expect(el.querySelector('.warnings')).toBeNull();
    expect(el.textContent).toContain('No validity warnings for this cascade.');
  });

  it('leaves out the interval when no uncertainty was stated; a yield keeps its three figures', () => {
    expect(cascadeValueText({ label: 'y', value: 0.5, unit: '', low: null, high: null })).toBe(
      '0.500',
    );
    expect(cascadeValueText({ label: 'y', value: 0.99999, unit: '', low: null, high: null })).toBe(
      '1.00',
    );
  });
});
