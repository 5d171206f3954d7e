import { calculate } from '@gapwise/calc';
import { evaluate } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
  computePairResults,
  formatMeasured,
  lambdaParts,
  pairEffectDifferences,
  pairMonteCarloRequest,
  pairPlotInputs,
  pairRatesView,
  pairRateRequest,
  pairRecombinationRequest,
  ratioText,
  regimeOf,
  runPairMonteCarlo,
  withinLowerBound,
  type PairModelParameter,
  type PairRateSource,
} from './pair-model';

const p = (kind: string, value: number, uncertainty: number | null = null): PairModelParameter => ({
  kind,
  value,
  uncertainty,
});

/**
 * Classical nonadiabatic Marcus rate k = (2π/ħ)|H|²(4πλk_BT)^(−1/2) exp(−(ΔG°+λ)²/(4λk_BT))
 * (Marcus 1956; Marcus & Sutin 1985, eq. 3), evaluated by mathjs with CODATA 2018 ħ and k_B:
 * an independent computation of what the pair model must produce.
 */
function marcusByHand(deltaG0: number, lambda: number, coupling: number, t: number): number {
  return evaluate(
    '2 * pi / hbar * H^2 / sqrt(4 * pi * l * kB * T) * exp(-(dG + l)^2 / (4 * l * kB * T))',
    { hbar: 6.582119569e-16, kB: 8.617333262e-5, H: coupling, l: lambda, T: t, dG: deltaG0 },
  ) as number;
}

const split: PairRateSource = {
  temperature: 298.15,
  model: 'marcus',
  parameters: [
    p('deltaG0', -0.3, 0.05),
    p('deltaG0Recombination', -1.6),
    p('lambdaInner', 0.2, 0.03),
    p('lambdaOuter', 0.6, 0.04),
    p('coupling', 0.01),
  ],
};

describe('total λ', () => {
  it('is λᵢ + λₒ for entered parts, with σ = √(σᵢ² + σₒ²) (independent parts)', () => {
    const l = lambdaParts(split.parameters);
    expect(l.total).toBeCloseTo(0.8, 12);
    expect(l.entered).toBe('parts');
    // √(0.03² + 0.04²) = 0.05 exactly (3-4-5 triangle).
    expect(l.sigmaTotal).toBeCloseTo(0.05, 12);
  });

  it('takes an entered total over the parts and splits it when one part is known', () => {
    const l = lambdaParts([p('lambdaTotal', 0.9, 0.1), p('lambdaInner', 0.25)]);
    expect(l).toMatchObject({ total: 0.9, sigmaTotal: 0.1, inner: 0.25, entered: 'total' });
    expect(l.outer).toBeCloseTo(0.65, 12);
    expect(lambdaParts([p('lambdaTotal', 0.9)]).inner).toBeNull();
    expect(lambdaParts([]).total).toBeNull();
  });

  it('refuses negative λ by one bound rule and lets 0 through', () => {
    expect(withinLowerBound('lambdaTotal', -0.01)).toBe(false);
    expect(withinLowerBound('lambdaOuter', 0)).toBe(true);
    expect(withinLowerBound('hbarOmega', 0)).toBe(false);
    expect(withinLowerBound('deltaG0', -5)).toBe(true);
  });
});

describe('rate requests and results', () => {
  it('gives the Marcus k of a hand calculation for separation and recombination', () => {
    const r = computePairResults(split);
    expect(r.errors).toEqual([]);
    const kCs = marcusByHand(-0.3, 0.8, 0.01, 298.15);
    const kCr = marcusByHand(-1.6, 0.8, 0.01, 298.15);
    expect(r.k! / kCs).toBeCloseTo(1, 6);
    expect(r.regime).toBe('normal');
    expect(r.recombination?.model).toBe('marcus');
    expect(r.recombination!.k! / kCr).toBeCloseTo(1, 6);
    expect(r.recombination?.regime).toBe('inverted');
    expect(r.recombination?.note).toMatch(/classical Marcus because no ħω/);
    expect(r.log10Ratio).toBeCloseTo(Math.log10(kCs / kCr), 6);
  });

  it('uses an entered total λ the same as the equal split', () => {
    const total = computePairResults({
      ...split,
      parameters: [p('deltaG0', -0.3), p('lambdaTotal', 0.8), p('coupling', 0.01)],
    });
    expect(total.k! / marcusByHand(-0.3, 0.8, 0.01, 298.15)).toBeCloseTo(1, 6);
    expect(total.recombination).toBeNull();
    expect(total.log10Ratio).toBeNull();
  });

  it('runs recombination by MLJ when ħω is given, and says so', () => {
    const withMode = { ...split, parameters: [...split.parameters, p('hbarOmega', 0.18)] };
    const { model, note, request } = pairRecombinationRequest(withMode);
    expect(model).toBe('mlj');
    expect(note).toMatch(/Marcus–Levich–Jortner because ħω is given/);
    expect(request).toEqual({
      method: 'rate.mlj',
      inputs: {
        deltaG0: -1.6,
        lambdaSolvent: 0.6,
        lambdaVib: 0.2,
        hbarOmega: 0.18,
        coupling: 0.01,
        temperature: 298.15,
      },
    });
    // The result is the core's own MLJ answer for that request.
    const core = calculate(request as { method: 'rate.mlj'; inputs: unknown });
    expect(core.ok).toBe(true);
    const r = computePairResults(withMode);
    expect(r.recombination?.log10k).toBe(core.ok ? core.outputs.log10k : NaN);
    // Separation stays with the chosen (classical) model.
    expect(r.model).toBe('marcus');
  });

  it('names what is missing for the chosen model', () => {
    const r = pairRateRequest({ ...split, model: 'crossover' });
    expect(r).toEqual({ missing: ['tauL'] });
  });

  it('applies the regime rule of CALC-API.md (activationless within 1 % of λ)', () => {
    expect(regimeOf(-0.8, 0.8)).toBe('activationless');
    expect(regimeOf(-0.805, 0.8)).toBe('activationless');
    expect(regimeOf(-0.3, 0.8)).toBe('normal');
    expect(regimeOf(-1.2, 0.8)).toBe('inverted');
    expect(regimeOf(-0.3, 0)).toBeNull();
  });
});

describe('Monte Carlo request', () => {
  it('puts σ(λ) = √(σᵢ² + σₒ²) on total λ and uses one sample count and seed', () => {
    const mc = pairMonteCarloRequest(split);
    expect(mc).not.toBeNull();
    const inner = mc!.inputs as {
      method: string;
      samples: number;
      seed: number;
      inputs: Record<string, unknown>;
    };
    expect(inner.method).toBe('rate.marcus');
    expect(inner.inputs['deltaG0']).toEqual({ value: -0.3, sigma: 0.05 });
    const lambda = inner.inputs['lambda'] as { value: number; sigma: number };
    expect(lambda.value).toBeCloseTo(0.8, 12);
    expect(lambda.sigma).toBeCloseTo(0.05, 12);
    expect(inner.inputs['coupling']).toBe(0.01);
    // Page and report ask for the very same request: the same object, every time.
    expect(pairMonteCarloRequest(split)).toEqual(mc);
  });

  it('maps the λ parts onto λ_s and λ_vib for MLJ', () => {
    const mlj = {
      ...split,
      model: 'mlj' as const,
      parameters: [...split.parameters, p('hbarOmega', 0.18)],
    };
    const inner = pairMonteCarloRequest(mlj)!.inputs as { inputs: Record<string, unknown> };
    expect(inner.inputs['lambdaSolvent']).toEqual({ value: 0.6, sigma: 0.04 });
    expect(inner.inputs['lambdaVib']).toEqual({ value: 0.2, sigma: 0.03 });
    expect(inner.inputs['lambda']).toBeUndefined();
  });

  it('is not run without uncertainties, and brackets the nominal log k when run', () => {
    const bare = {
      ...split,
      parameters: split.parameters.map((x) => ({ ...x, uncertainty: null })),
    };
    expect(pairMonteCarloRequest(bare)).toBeNull();
    const run = runPairMonteCarlo(split);
    expect(run.status).toBe('done');
    if (run.status !== 'done') return;
    const nominal = computePairResults(split).log10k!;
    expect(run.p025).toBeLessThan(nominal);
    expect(run.p975).toBeGreaterThan(nominal);
  });
});

describe('plot inputs', () => {
  it('draw the MLJ curve whenever ħω and both parts are known, whatever the chosen model', () => {
    const withMode = { ...split, parameters: [...split.parameters, p('hbarOmega', 0.18)] };
    const plot = pairPlotInputs(withMode, 9.5);
    expect(plot).toMatchObject({
      lambdaSolvent: 0.6,
      lambdaVib: 0.2,
      hbarOmega: 0.18,
      pair: { deltaG0: -0.3, log10k: 9.5 },
    });
    expect(plot!.lambda).toBeCloseTo(0.8, 12);
    expect(pairPlotInputs(split, null)).toMatchObject({ hbarOmega: null, pair: null });
    expect(pairPlotInputs({ ...split, parameters: [p('deltaG0', -0.3)] }, null)).toBeNull();
  });
});

describe('what views show', () => {
  it('rounds a derived value to the digits its uncertainty supports', () => {
    expect(formatMeasured(-0.683425360906, 0.05, 'eV')).toBe('−0.683 ± 0.050 eV');
    expect(formatMeasured(-0.683425360906, 0.0123)).toBe('−0.683 ± 0.012');
    expect(formatMeasured(-0.683425360906)).toBe('−0.6834');
    expect(formatMeasured(12345.678, 23)).toBe('12346 ± 23');
    expect(formatMeasured(null)).toBe('—');
  });

  it('says which step is faster and by how much', () => {
    expect(ratioText(2.3)).toBe(
      'Separation outpaces recombination by 2.3 orders of magnitude (k_CS/k_CR = 2.0 × 10²)',
    );
    expect(ratioText(-1)).toMatch(/^Recombination outpaces separation by 1.0 orders/);
    expect(ratioText(null)).toBeNull();
  });

  it('prints both steps from one results object', () => {
    const v = pairRatesView(computePairResults(split));
    expect(v.separation.regime).toBe('Normal');
    expect(v.recombination?.regime).toBe('Inverted');
    expect(v.separation.rate).toMatch(/ s⁻¹$/);
    expect(v.ratio).toMatch(/outpaces/);
  });
});

describe('what a change did', () => {
  const source = (deltaG0: number, lambda: number, extra: PairModelParameter[] = []) => ({
    temperature: 298.15,
    model: 'marcus' as const,
    parameters: [p('deltaG0', deltaG0), p('lambdaTotal', lambda), p('coupling', 0.01), ...extra],
  });

  it('shows the shift in log k_CS computed by hand, and the regime crossing into inverted', () => {
    const rows = pairEffectDifferences(source(-0.3, 0.8), source(-1.2, 0.8));
    const log = rows.find((r) => r.field === 'log₁₀ k_CS')!;
    const before = Math.log10(marcusByHand(-0.3, 0.8, 0.01, 298.15));
    const after = Math.log10(marcusByHand(-1.2, 0.8, 0.01, 298.15));
    expect(log.left).toBe(before.toFixed(2));
    expect(log.right).toBe(after.toFixed(2));
    expect(Number(log.shift.replace('−', '-'))).toBeCloseTo(after - before, 2);
    expect(log.changed).toBe(true);
    const regime = rows.find((r) => r.field === 'Regime (separation)')!;
    expect([regime.left, regime.right]).toEqual(['Normal', 'Inverted']);
    // No ΔG°_CR on either side: no recombination rows.
    expect(rows.some((r) => r.field.includes('k_CR'))).toBe(false);
  });

  it('adds recombination, its model and the ratio; onlyChanged keeps what moved', () => {
    const parts = (extra: PairModelParameter[]) => ({
      temperature: 298.15,
      model: 'marcus' as const,
      parameters: [
        p('deltaG0', -0.3),
        p('lambdaInner', 0.2),
        p('lambdaOuter', 0.6),
        p('coupling', 0.01),
        p('deltaG0Recombination', -1.6),
        ...extra,
      ],
    });
    const withCr = parts([]);
    const withMode = parts([p('hbarOmega', 0.18)]);
    const rows = pairEffectDifferences(withCr, withMode, true);
    const fields = rows.map((r) => r.field);
    expect(fields).toContain('log₁₀ k_CR');
    expect(fields).toContain('Recombination model');
    expect(fields).toContain('log₁₀ (k_CS/k_CR)');
    // Separation does not use ħω under the classical model: unchanged, dropped.
    expect(fields).not.toContain('log₁₀ k_CS');
    const cr = rows.find((r) => r.field === 'log₁₀ k_CR')!;
    // MLJ opens the inverted-region channels: recombination gets faster.
    expect(cr.shift.startsWith('+')).toBe(true);
    const ratio = rows.find((r) => r.field === 'log₁₀ (k_CS/k_CR)')!;
    expect(ratio.shift.startsWith('−')).toBe(true);
  });

  it('names the missing input with its label when one side cannot be computed', () => {
    const rows = pairEffectDifferences(
      {
        temperature: 298.15,
        model: 'marcus',
        parameters: [p('deltaG0', -0.3), p('coupling', 0.01)],
      },
      source(-0.3, 0.8),
    );
    const warn = rows.find((r) => r.field === 'Warnings (separation)')!;
    expect(warn.left).toContain('Cannot compute: Outer reorganization energy λₒ is needed');
    expect(rows.find((r) => r.field === 'log₁₀ k_CS')!.shift).toBe('');
  });
});
