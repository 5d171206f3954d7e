import { evaluate } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { calculate } from '../../methods/calculate';
import { computeRefused } from '../../methods/testing/answers';

const expectRefusal = (inputs: Record<string, unknown>, field: string) =>
  expect(computeRefused('quench.sternVolmer', inputs).map((e) => e.field)).toContain(field);

const ok = (inputs: Record<string, unknown>) => {
  const answer = calculate({ method: 'quench.sternVolmer', inputs });
  if (!answer.ok) throw new Error(JSON.stringify(answer.errors));
  return answer;
};

describe('quench.sternVolmer', () => {
  it('K_SV = k_q τ₀ and back from I₀/I at [Q] (Ru(bpy)₃²⁺*-like numbers, exact algebra)', () => {
    // τ₀ = 600 ns, k_q = 2e9 M⁻¹ s⁻¹: K_SV = 1200 M⁻¹; at 1 mM, I₀/I = 2.2.
    const forward = ok({ lifetime: 600e-9, kq: 2e9, concentration: 1e-3 });
    expect(forward.outputs['KSV']).toBeCloseTo(1200, 9);
    expect(forward.outputs['intensityRatio']).toBeCloseTo(2.2, 12);
    const back = ok({ lifetime: 600e-9, intensityRatio: 2.2, quencherConcentration: 1e-3 });
    expect(back.outputs['KSV']).toBeCloseTo(1200, 9);
    expect(back.outputs['kq'] as number).toBeCloseTo(2e9, -1);
    // No quencher: no quenching.
    expect(ok({ lifetime: 1e-8, kq: 1e9, concentration: 0 }).outputs['intensityRatio']).toBe(1);
  });

  it('gives the Rehm–Weller k_q(ΔG°) curve as mathjs evaluates the Gold Book form', () => {
    const series = [-1.0, -0.3, 0, 0.2];
    const answer = ok({ lifetime: 1e-6, kq: 1e9, deltaG0Series: series, temperature: 298.15 });
    const curve = answer.outputs['rehmWeller'] as { deltaG0: number; kq: number }[];
    const barrier = 2.4 / 23.06054783;
    for (const [i, dg] of series.entries()) {
      const expected = evaluate(
        `kd / (1 + 0.25 * (exp((dg/2 + sqrt((dg/2)^2 + b^2)) / kt) + exp(dg / kt)))`,
        { kd: 2e10, dg, b: barrier, kt: 8.617333262e-5 * 298.15 },
      ) as number;
      expect(curve[i]!.kq / expected).toBeCloseTo(1, 12);
    }
    // Limit ΔG° → −∞: ΔG‡ → 0, so k_q → k_d/(1 + 0.25) (plateau, no inverted region).
    // At −100 eV, ΔG‡ ≈ ΔG‡(0)²/200 ≈ 5e-5 eV: within 1e-3 of the plateau.
    const far = ok({ lifetime: 1e-6, kq: 1e9, deltaG0Series: [-100], temperature: 298.15 });
    const plateau = (far.outputs['rehmWeller'] as { kq: number }[])[0]!.kq / (2e10 / 1.25);
    expect(Math.abs(plateau - 1)).toBeLessThan(1e-3);
    // At ΔG° = 0, ΔG‡ = ΔG‡(0) = 2.4 kcal/mol exactly.
    expect(curve[2]).toMatchObject({ activationFreeEnergy: expect.closeTo(barrier, 12) });
  });

  it('warns kq-above-diffusion-limit (B33) when k_q exceeds k_d', () => {
    const fast = ok({ lifetime: 1e-6, intensityRatio: 101, quencherConcentration: 1e-3 });
    expect(fast.outputs['kq']).toBeCloseTo(1e11, -3);
    expect(fast.warnings.map((w) => w.code)).toContain('kq-above-diffusion-limit');
    const slow = ok({ lifetime: 1e-6, kq: 1e9 });
    expect(slow.warnings).toEqual([]);
  });

  it('refuses bad inputs naming the field', () => {
    const run = (inputs: Record<string, unknown>) => inputs;
    expectRefusal(run({ lifetime: 0, kq: 1e9 }), 'lifetime');
    expectRefusal(run({ lifetime: 1e-6 }), 'kq');
    expectRefusal(run({ lifetime: 1e-6, intensityRatio: 2 }), 'quencherConcentration');
    expectRefusal(
      run({ lifetime: 1e-6, intensityRatio: 0.5, quencherConcentration: 1 }),
      'intensityRatio',
    );
    expectRefusal(
      run({ lifetime: 1e-6, kq: 1e9, intensityRatio: 2, quencherConcentration: 1 }),
      'kq',
    );
    expectRefusal(run({ lifetime: 1e-6, kq: 1e9, deltaG0Series: [-0.2] }), 'temperature');
    expectRefusal(run({ lifetime: 1e-6, kq: 1e9, temperature: 298 }), 'temperature');
    expectRefusal(
      run({ lifetime: 1e-6, kq: 1e9, deltaG0Series: [], temperature: 298 }),
      'deltaG0Series',
    );
  });
});
