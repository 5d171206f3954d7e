import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { runDefinition } from '../core/run-definition';
import { calculate, serializeAnswer } from './calculate';
import { CalcRefusal, type MethodDefinition } from '../core/method';
import { allMethods, methodCatalog } from './registry';

/** A valid request for every method this half of the core owns (CALC-API.md examples). */
const VALID: Record<string, Record<string, unknown>> = {
  'rate.marcus': { deltaG0: -0.3, lambda: 0.8, coupling: 0.01, temperature: 298.15 },
  'rate.mlj': {
    deltaG0: -1,
    lambdaSolvent: 0.5,
    lambdaVib: 0.18,
    hbarOmega: 0.18,
    coupling: 0.01,
    temperature: 298.15,
  },
  'rate.crossover': {
    deltaG0: -0.3,
    lambda: 0.8,
    coupling: 0.01,
    temperature: 298.15,
    tauL: 2e-13,
  },
  'rate.ruler': { distance: 10, deltaG0: -0.5, lambda: 0.7 },
  'rate.crossRelation': { k11: 1e3, k22: 1e5, K12: 100 },
  'drivingForce.rehmWeller': {
    donorOxidation: 1,
    acceptorReduction: -1.2,
    excitationEnergy: 2.8,
    distance: 7,
    epsilon: 35.94,
  },
  'reorg.twoSphere': {
    radiusDonor: 3.5,
    radiusAcceptor: 3.5,
    distance: 7,
    epsilon: 35.94,
    refractiveIndex: 1.344,
  },
  'reorg.fourPoint': {
    initialAtInitial: 0,
    initialAtFinal: 0.1,
    finalAtFinal: 1,
    finalAtInitial: 1.1,
  },
  'coupling.gmh': { transitionDipole: 2, dipoleDifference: 10, transitionEnergy: 2 },
  'coupling.hush': { bandMaximum: 10000, molarAbsorptivity: 1000, bandwidth: 5000, distance: 5 },
  'coupling.distanceDecay': { coupling0: 0.01, distance0: 3.6, beta: 1.38, distance: 10 },
  'evb.twoState': { energy1: 0, energy2: 0.1, coupling: 0.05 },
  'evb.multiState': {
    hamiltonian: [
      [0, 0.1],
      [0.1, 0.2],
    ],
  },
  'units.convert': { value: 1, from: 'eV', to: 'kJ/mol' },
};

const BAD_VALUES: unknown[] = [
  Number.NaN,
  Number.POSITIVE_INFINITY,
  'abc',
  '1,5',
  '',
  null,
  { value: 1, unit: 'furlong' },
  [1],
  true,
];

function allFinite(value: unknown): boolean {
  if (typeof value === 'number') return Number.isFinite(value);
  if (Array.isArray(value)) return value.every(allFinite);
  if (value !== null && typeof value === 'object') return Object.values(value).every(allFinite);
  return true;
}

describe('calculate', () => {
  it('answers every valid example of this half of CALC-API.md with finite outputs', () => {
    for (const [method, inputs] of Object.entries(VALID)) {
      const answer = calculate({ method, inputs });
      expect(answer.ok, `${method}: ${JSON.stringify(answer)}`).toBe(true);
      if (answer.ok) expect(allFinite(answer.outputs)).toBe(true);
    }
  });

  it('never throws for any JSON value, and any ok answer is finite (property)', () => {
    const ids = [...allMethods().map((m) => m.id), 'nope'];
    fc.assert(
      fc.property(fc.jsonValue(), (request) => {
        const answer = calculate(request);
        expect(typeof answer.ok).toBe('boolean');
        if (answer.ok) expect(allFinite(answer.outputs)).toBe(true);
      }),
      { numRuns: 300 },
    );
    fc.assert(
      fc.property(
        fc.constantFrom(...ids),
        fc.dictionary(fc.string(), fc.jsonValue()),
        (method, inputs) => {
          const answer = calculate({ method, inputs });
          if (answer.ok) expect(allFinite(answer.outputs)).toBe(true);
          else expect(answer.errors.length).toBeGreaterThan(0);
        },
      ),
      { numRuns: 500 },
    );
    fc.assert(
      fc.property(fc.anything(), (anything) => {
        expect(() => calculate(anything)).not.toThrow();
        expect(() => calculate({ method: 'rate.marcus', inputs: anything })).not.toThrow();
      }),
      { numRuns: 300 },
    );
  });

  it('refuses any invalid field of a valid request, naming that field (property)', () => {
    const cases = Object.entries(VALID).flatMap(([method, inputs]) =>
      Object.keys(inputs)
        .filter((name) => !(method === 'units.convert' && name !== 'value'))
        .map((name) => [method, name] as const),
    );
    fc.assert(
      fc.property(
        fc.constantFrom(...cases),
        fc.constantFrom(...BAD_VALUES),
        ([method, field], bad) => {
          const answer = calculate({ method, inputs: { ...VALID[method], [field]: bad } });
          expect(answer.ok).toBe(false);
          if (!answer.ok)
            expect(answer.errors.map((e) => e.field.replace(/\[.*$/, ''))).toContain(field);
        },
      ),
      { numRuns: 400 },
    );
  });

  it('refuses unknown methods on field method, non-objects on field request, unknown keys', () => {
    expect(calculate({ method: 'rate.nope', inputs: {} })).toMatchObject({
      ok: false,
      errors: [{ field: 'method' }],
    });
    expect(calculate({ inputs: {} })).toMatchObject({ ok: false, errors: [{ field: 'method' }] });
    expect(calculate('rate.marcus')).toMatchObject({ ok: false, errors: [{ field: 'request' }] });
    expect(
      calculate({ ...{ method: 'rate.marcus', inputs: VALID['rate.marcus'] }, extra: 1 }),
    ).toMatchObject({
      ok: false,
      errors: [{ field: 'extra' }],
    });
    expect(
      calculate({ method: 'rate.marcus', inputs: { ...VALID['rate.marcus'], lamda: 1 } }),
    ).toMatchObject({
      ok: false,
      errors: [{ field: 'lamda' }],
    });
  });

  it('refuses, as a bug, a non-finite output; passes CalcRefusal through; reports thrown errors', () => {
    const fake = (compute: () => Record<string, unknown>): MethodDefinition<null> => ({
      id: 'test.fake',
      summary: '',
      references: [],
      inputs: [],
      outputs: [],
      read: () => null,
      compute,
    });
    expect(
      runDefinition(
        fake(() => ({ x: 1, y: { z: [1, Number.NaN] } })),
        {},
      ),
    ).toMatchObject({
      ok: false,
      errors: [{ field: 'outputs.y.z[1]' }],
    });
    expect(
      runDefinition(
        fake(() => ({ k: Number.POSITIVE_INFINITY })),
        {},
      ),
    ).toMatchObject({ ok: false });
    const refusal = new CalcRefusal([{ field: 'a', message: 'no' }]);
    expect(
      runDefinition(
        fake(() => {
          throw refusal;
        }),
        {},
      ),
    ).toEqual({ ok: false, errors: [{ field: 'a', message: 'no' }] });
    expect(
      runDefinition(
        fake(() => {
          throw new Error('boom');
        }),
        {},
      ),
    ).toMatchObject({ ok: false, errors: [{ field: 'method' }] });
    expect(
      runDefinition(
        fake(() => ({ v: new Float64Array([1, 2]) })),
        {},
      ),
    ).toEqual({
      ok: true,
      method: 'test.fake',
      outputs: { v: [1, 2] },
      warnings: [],
    });
  });

  it('serializes as plain JSON that parses back to the same answer', () => {
    const answer = calculate({ method: 'rate.marcus', inputs: VALID['rate.marcus'] });
    const text = serializeAnswer(answer);
    expect(text).toBe(JSON.stringify(answer));
    expect(JSON.parse(text)).toEqual(answer);
  });
});

describe('registry', () => {
  it('has unique ids and every method of this half of CALC-API.md', () => {
    const ids = allMethods().map((m) => m.id);
    expect(new Set(ids).size).toBe(ids.length);
    for (const id of Object.keys(VALID)) expect(ids).toContain(id);
  });

  it('describes every input with its canonical unit and accepted units', () => {
    const marcus = methodCatalog().find((m) => m.id === 'rate.marcus')!;
    expect(marcus.inputs.map((i) => [i.name, i.unit])).toEqual([
      ['deltaG0', 'eV'],
      ['lambda', 'eV'],
      ['coupling', 'eV'],
      ['temperature', 'K'],
    ]);
    expect(marcus.inputs[3].units).toEqual(['K', 'degC']);
    expect(marcus.outputs.map((o) => o.name)).toEqual([
      'k',
      'log10k',
      'activationFreeEnergy',
      'regime',
      'couplingRegime',
    ]);
  });
});
