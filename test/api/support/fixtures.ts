import type { PairInput } from '@gapwise/contracts';

/** A valid pair body (canonical values, typed units kept). */
export function pairBody(overrides: Partial<PairInput> = {}): PairInput {
  return {
    name: 'T-1',
    donor: 'Dye X',
    acceptor: 'Acc Y',
    medium: 'acetonitrile',
    temperature: 298.15,
    temperatureUnit: 'K',
    notes: 'test pair',
    status: 'draft',
    tags: ['test'],
    model: 'marcus',
    parameters: [
      {
        kind: 'deltaG0',
        value: -0.5,
        unit: 'eV',
        uncertainty: 0.05,
        provenance: { kind: 'measured', note: 'CV' },
      },
      {
        kind: 'lambdaOuter',
        value: 0.8,
        unit: 'kcal/mol',
        uncertainty: null,
        provenance: { kind: 'literature', citation: 'Group notebook 2026-03, p. 7' },
      },
      {
        kind: 'lambdaInner',
        value: 0.2,
        unit: 'eV',
        uncertainty: null,
        provenance: { kind: 'assumed' },
      },
      {
        kind: 'coupling',
        value: 0.0062,
        unit: 'cm-1',
        uncertainty: null,
        provenance: {
          kind: 'derived',
          methodId: 'coupling.gmh',
          methodInputs: { transitionDipole: 1 },
          sources: [{ type: 'parameter', id: 'x' }],
        },
      },
    ],
    ...overrides,
  };
}
