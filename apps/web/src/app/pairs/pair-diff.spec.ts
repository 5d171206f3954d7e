import type { PairInput, PairParameter } from '@gapwise/contracts';
import { describe, expect, it } from 'vitest';
import { describeParameter, pairDifferences } from './pair-diff';

const param = (over: Partial<PairParameter>): PairParameter => ({
  kind: 'lambdaOuter',
  value: 0.683425360906,
  unit: 'eV',
  uncertainty: null,
  provenance: { kind: 'measured' },
  ...over,
});

describe('the version comparison of inputs', () => {
  it('shows a typed value as typed and a derived one with the digits its σ supports', () => {
    expect(describeParameter(param({ value: 0.5, uncertainty: 0.05 }))).toBe(
      '0.5 eV ± 0.05 (Measured)',
    );
    const derived = param({
      uncertainty: 0.05,
      provenance: { kind: 'derived', methodId: 'reorg.twoSphere', note: null },
    });
    const text = describeParameter(derived);
    expect(text.startsWith('0.683 ± 0.050 eV (')).toBe(true);
    expect(text).not.toContain('0.683425');
    expect(text).not.toContain('reorg.twoSphere');
    expect(describeParameter(param({ provenance: { kind: 'derived', methodId: 'x.y' } }))).toMatch(
      /^0\.6834 eV/,
    );
  });

  it('lists only the changed fields when asked', () => {
    const a: PairInput = {
      name: 'DA-1',
      donor: 'D',
      acceptor: 'A',
      medium: 'MeCN',
      temperature: 298.15,
      parameters: [param({ value: 0.5 })],
    };
    const b: PairInput = { ...a, parameters: [param({ value: 0.7 })] };
    const rows = pairDifferences(a, b, true);
    expect(rows.map((r) => r.field)).toEqual(['Outer reorganization energy λₒ']);
    expect(rows[0]!.left).toBe('0.5 eV (Measured)');
  });
});
