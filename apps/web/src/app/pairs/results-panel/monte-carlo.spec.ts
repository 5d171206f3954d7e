import { PAIR_MONTE_CARLO_SAMPLES } from '@gapwise/contracts';
import { monteCarloLog10k } from './monte-carlo';

describe('monteCarloLog10k', () => {
  const parameters = [
    {
      kind: 'deltaG0',
      value: -0.3,
      unit: 'eV',
      uncertainty: null,
      provenance: { kind: 'assumed' },
    },
    {
      kind: 'lambdaOuter',
      value: 0.8,
      unit: 'eV',
      uncertainty: 0.05,
      provenance: { kind: 'assumed' },
    },
    {
      kind: 'coupling',
      value: 0.01,
      unit: 'eV',
      uncertainty: null,
      provenance: { kind: 'assumed' },
    },
  ] as const;
  const source = { temperature: 298.15, model: 'marcus' as const, parameters };

  it('gives the interval and a histogram holding every accepted sample', () => {
    const state = monteCarloLog10k(source);
    expect(state.status).toBe('done');
    if (state.status !== 'done') return;
    expect(state.p025).toBeLessThan(state.median);
    expect(state.median).toBeLessThan(state.p975);
    expect(state.histogram).not.toBeNull();
    const total = state.histogram!.counts.reduce((a, b) => a + b, 0);
    expect(total).toBe(state.samples);
    // The report's sample count: one Monte Carlo request for page and PDF.
    expect(state.samples).toBe(PAIR_MONTE_CARLO_SAMPLES);
    expect(state.histogram!.edges.length).toBe(state.histogram!.counts.length + 1);
  });

  it('is not run when no parameter has an uncertainty', () => {
    const bare = parameters.map((p) => ({ ...p, uncertainty: null }));
    expect(monteCarloLog10k({ ...source, parameters: bare }).status).toBe('none');
  });
});
