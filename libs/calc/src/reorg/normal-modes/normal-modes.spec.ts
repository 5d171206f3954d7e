import { evaluate } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { computeOk, computeRefused, numberOutput } from '../../methods/testing/answers';

const CM1_PER_EV = 8065.543937;

describe('reorg.normalModes', () => {
  const modes = [
    { hbarOmega: { value: 1600, unit: 'cm-1' }, huangRhys: 0.4 },
    { hbarOmega: { value: 1200, unit: 'cm-1' }, displacement: 0.6 },
    { hbarOmega: { value: 400, unit: 'cm-1' }, huangRhys: 0.3 },
  ];

  it('sums λ_v, the λ-weighted ħω_eff and ΣS as mathjs does (S = Δ²/2)', () => {
    const answer = computeOk('reorg.normalModes', { modes });
    const scope = {
      w: [1600 / CM1_PER_EV, 1200 / CM1_PER_EV, 400 / CM1_PER_EV],
      s: [0.4, 0.6 ** 2 / 2, 0.3],
    };
    const lambdaVib = evaluate('dot(s, w)', scope) as number;
    const effective = evaluate('sum(s .* w .* w) / dot(s, w)', scope) as number;
    expect(numberOutput(answer, 'lambdaVib')).toBeCloseTo(lambdaVib, 14);
    expect(numberOutput(answer, 'effectiveHbarOmega')).toBeCloseTo(effective, 14);
    expect(numberOutput(answer, 'huangRhysTotal')).toBeCloseTo(0.88, 14);
    expect(numberOutput(answer, 'huangRhysEffective')).toBeCloseTo(lambdaVib / effective, 14);
    expect(answer.outputs['modeLambdas']).toHaveLength(3);
  });

  it('reduces to the mode itself for one mode, and to the mean for two modes of equal λ_j', () => {
    const one = computeOk('reorg.normalModes', { modes: [{ hbarOmega: 0.18, huangRhys: 1.5 }] });
    expect(numberOutput(one, 'effectiveHbarOmega')).toBe(0.18);
    expect(numberOutput(one, 'lambdaVib')).toBeCloseTo(0.27, 15);
    expect(numberOutput(one, 'huangRhysEffective')).toBeCloseTo(1.5, 14);
    // λ_1 = λ_2 = 0.1 eV at 0.1 and 0.2 eV: ħω_eff = 0.15 eV, S_eff = 0.2/0.15.
    const two = computeOk('reorg.normalModes', {
      modes: [
        { hbarOmega: 0.1, huangRhys: 1 },
        { hbarOmega: 0.2, huangRhys: 0.5 },
      ],
    });
    expect(numberOutput(two, 'effectiveHbarOmega')).toBeCloseTo(0.15, 15);
    expect(numberOutput(two, 'huangRhysEffective')).toBeCloseTo(0.2 / 0.15, 14);
    // A mode with S = 0 adds nothing.
    const withIdle = computeOk('reorg.normalModes', {
      modes: [
        { hbarOmega: 0.18, huangRhys: 1.5 },
        { hbarOmega: 0.01, huangRhys: 0 },
      ],
    });
    expect(numberOutput(withIdle, 'effectiveHbarOmega')).toBe(0.18);
  });

  it('warns low-frequency-mode (B6) for a displaced mode below 4 k_BT when T is given', () => {
    const answer = computeOk('reorg.normalModes', { modes, temperature: 298.15 });
    const warning = answer.warnings.find((w) => w.code === 'low-frequency-mode');
    expect(warning?.message).toContain('modes[2]');
    expect(computeOk('reorg.normalModes', { modes }).warnings).toEqual([]);
  });

  it('refuses bad modes naming the field', () => {
    const fields = (inputs: unknown) =>
      computeRefused('reorg.normalModes', inputs).map((e) => e.field);
    expect(fields({ modes: [] })).toContain('modes');
    expect(fields({ modes: [{ hbarOmega: 0, huangRhys: 1 }] })).toContain('modes[0].hbarOmega');
    expect(fields({ modes: [{ hbarOmega: 0.1, huangRhys: -1 }] })).toContain('modes[0].huangRhys');
    expect(fields({ modes: [{ hbarOmega: 0.1 }] })).toContain('modes[0].huangRhys');
    expect(fields({ modes: [{ hbarOmega: 0.1, huangRhys: 1, displacement: 1 }] })).toContain(
      'modes[0].displacement',
    );
    expect(fields({ modes: [{ hbarOmega: 0.1, huangRhys: 0 }] })).toContain('modes');
    expect(fields({ modes: [{ hbarOmega: { value: 500, unit: 'nm' }, huangRhys: 1 }] })).toContain(
      'modes[0].hbarOmega',
    );
  });
});
