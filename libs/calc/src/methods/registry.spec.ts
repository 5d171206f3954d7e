import { describe, expect, it } from 'vitest';
import type { TypedMethodId } from './method-outputs';
import { allMethods, inputLabel, methodCatalog } from './registry';

describe('input labels', () => {
  it('give every input of every method a short name a report can print', () => {
    for (const method of methodCatalog()) {
      for (const input of method.inputs) {
        const where = `${method.id}.${input.name}: '${input.label}'`;
        expect(input.label, where).toBe(inputLabel(input));
        expect(input.label.length, where).toBeGreaterThan(2);
        expect(input.label.length, where).toBeLessThanOrEqual(60);
        // A phrase, not a sentence or a format description.
        expect(input.label, where).not.toMatch(/[.,;:]$|^\W*$|\[\{|', '/);
        expect(input.label, where).not.toBe(input.name);
      }
    }
  });

  it('take the description up to its first parenthesis or full stop unless set', () => {
    expect(
      inputLabel({
        name: 'radiusDonor',
        quantity: 'distance',
        required: true,
        description: 'Donor radius a_D (> 0).',
      }),
    ).toBe('Donor radius a_D');
    expect(
      inputLabel({
        name: 'k0',
        quantity: 'energy',
        required: true,
        description: 'Standard rate constant k⁰. Per second.',
      }),
    ).toBe('Standard rate constant k⁰');
    expect(
      inputLabel({
        name: 'x',
        quantity: 'energy',
        required: true,
        label: 'Own label',
        description: 'Anything (ignored).',
      }),
    ).toBe('Own label');
  });
});

describe('typed outputs', () => {
  it('cover every registered method', () => {
    // The type makes this list equal MethodOutputs' keys (a missing or extra id does not compile);
    // the assertion makes it equal the registry's ids.
    const typed: Record<TypedMethodId, true> = {
      'rate.marcus': true,
      'kinetics.network': true,
      'rate.mlj': true,
      'rate.crossover': true,
      'rate.ruler': true,
      'rate.crossRelation': true,
      'rate.crossRelationWork': true,
      'rate.landauZener': true,
      'rate.mljThermal': true,
      'drivingForce.rehmWeller': true,
      'drivingForce.reference': true,
      'reorg.twoSphere': true,
      'reorg.fourPoint': true,
      'reorg.gapSamples': true,
      'reorg.normalModes': true,
      'coupling.gmh': true,
      'coupling.hush': true,
      'coupling.distanceDecay': true,
      'evb.twoState': true,
      'evb.multiState': true,
      'evb.adiabaticBarrier': true,
      'electrode.mhc': true,
      'electrode.butlerVolmer': true,
      'electrode.mhcAbsolute': true,
      'transport.hopping': true,
      'quench.diffusion': true,
      'quench.sternVolmer': true,
      'analysis.temperature': true,
      'fit.drivingForceSeries': true,
      'fit.electrodeKinetics': true,
      'uncertainty.monteCarlo': true,
      'units.convert': true,
    };
    expect(Object.keys(typed).sort()).toEqual(
      allMethods()
        .map((method) => method.id)
        .sort(),
    );
  });
});
