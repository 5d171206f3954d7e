import { calculate } from '@gapwise/calc';
import { computeNetwork, monteCarloRequest, runMonteCarlo } from './cascade-compute';
import { buildNetwork, designFromNetwork, emptyDesign, newLink, newState } from './cascade-design';

/** S1 (E₀₀ 590 nm) → CS (S1 − 0.3 eV) → S0, with fluorescence; invented numbers. */
function dyadDesign() {
  const d = emptyDesign();
  const s1 = newState('S1', 'singlet');
  s1.label = 'Singlet';
  s1.e00 = 590;
  s1.e00Unit = 'nm';
  const cs = newState('CS', 'csFinal');
  cs.label = 'CS';
  cs.mode = 'step';
  cs.fromState = 'S1';
  cs.stepDeltaG = -0.3;
  d.states.push(s1, cs);
  const fl = newLink('S1', 'S0', 'lifetime');
  fl.lifetime = 3000;
  fl.lifetimeUnit = 'ps';
  const et = newLink('S1', 'CS', 'et');
  et.lambda = 0.6;
  et.coupling = 20;
  const cr = newLink('CS', 'S0', 'et');
  cr.lambda = 0.8;
  cr.coupling = 0.4;
  d.links.push(fl, et, cr);
  return d;
}

describe('cascade design → kinetics.network', () => {
  it('keeps E₀₀ in nm for the core and builds a step state on its starting state', () => {
    const built = buildNetwork(dyadDesign());
    expect(built.errors).toEqual([]);
    const states = built.network!['states'] as { id: string; energy: unknown; kind: string }[];
    expect(states[1]).toEqual({
      id: 'S1',
      label: 'Singlet',
      energy: { value: 590, unit: 'nm' },
      kind: 'excited',
    });
    // E = hc/λ = 1239.84198 eV nm / 590 nm (SCIENCE.md §4).
    expect(built.states[1]!.energyEv).toBeCloseTo(1239.84198 / 590, 6);
    expect(built.states[2]!.energyEv).toBeCloseTo(1239.84198 / 590 - 0.3, 6);
    expect(states[2].kind).toBe('chargeSeparated');
  });

  it('computes the same answer as the bare network typed by hand', () => {
    const answer = computeNetwork(buildNetwork(dyadDesign()).network!);
    const e00 = 1239.84198 / 590;
    const byHand = calculate({
      method: 'kinetics.network',
      inputs: {
        states: [
          { id: 'S0', energy: 0, kind: 'ground' },
          { id: 'S1', energy: e00, kind: 'excited' },
          { id: 'CS', energy: e00 - 0.3, kind: 'chargeSeparated' },
        ],
        links: [
          { from: 'S1', to: 'S0', lifetime: { value: 3000, unit: 'ps' } },
          { from: 'S1', to: 'CS', lambda: 0.6, coupling: { value: 20, unit: 'cm-1' } },
          { from: 'CS', to: 'S0', lambda: 0.8, coupling: { value: 0.4, unit: 'cm-1' } },
        ],
      },
    });
    expect(answer.ok && byHand.ok).toBe(true);
    if (!answer.ok || !byHand.ok) return;
    expect(answer.outputs.formationYields['CS']).toBeCloseTo(
      byHand.outputs.formationYields['CS'],
      9,
    );
  });

  it('derives a charge-separated state from potentials with the charged-reactant correction', () => {
    const d = dyadDesign();
    const cs = d.states[2];
    Object.assign(cs, {
      mode: 'potentials',
      donorOxidationV: 1.1,
      acceptorReductionV: -0.6,
      distanceA: 10,
      epsilon: 37.5,
      radiusDonorA: 4,
      radiusAcceptorA: 4,
      epsilonReference: 37.5,
    });
    const neutral = buildNetwork(d).states[2]!.energyEv;
    const rw = calculate({
      method: 'drivingForce.rehmWeller',
      inputs: {
        donorOxidation: { value: 1.1, unit: 'V' },
        acceptorReduction: { value: -0.6, unit: 'V' },
        excitationEnergy: 2,
        distance: { value: 10, unit: 'A' },
        epsilon: 37.5,
        radiusDonor: { value: 4, unit: 'A' },
        radiusAcceptor: { value: 4, unit: 'A' },
        epsilonReference: 37.5,
      },
    });
    expect(rw.ok).toBe(true);
    if (rw.ok) expect(neutral).toBeCloseTo(-rw.outputs.deltaG0CR, 12);
    // A cationic donor (z_D = +1) changes the Coulomb work: the state energy moves.
    cs.chargeDonor = 1;
    expect(Math.abs(buildNetwork(d).states[2]!.energyEv - neutral)).toBeGreaterThan(1e-3);
  });

  it('names the field by its label when an input is missing, and builds nothing', () => {
    const d = dyadDesign();
    d.links[1].lambda = null;
    d.states[1].e00 = null;
    const built = buildNetwork(d);
    expect(built.network).toBeNull();
    expect(built.errors.map((e) => e.message)).toEqual(
      expect.arrayContaining([
        'State Singlet: E₀₀ must be > 0.',
        expect.stringContaining('Step Singlet → CS: λ must be > 0.'),
      ]),
    );
  });

  it('reads a bare network back as a design (kinds from the links) that rebuilds the same request', () => {
    const network = {
      states: [
        { id: 'S0', energy: 0, kind: 'ground' },
        { id: 'S1', energy: { value: 590, unit: 'nm' }, kind: 'excited' },
        { id: 'T1', label: 'Triplet ³S*', energy: 1.3, kind: 'excited' },
        { id: 'CS1', energy: 1.8, kind: 'chargeSeparated' },
        { id: 'CS2', energy: 1.45, kind: 'chargeSeparated' },
      ],
      links: [
        { from: 'S1', to: 'T1', k: 1e8 },
        { from: 'S1', to: 'CS1', lambda: 0.55, coupling: { value: 30, unit: 'cm-1' } },
        { from: 'CS1', to: 'CS2', lambda: 0.6, coupling: { value: 25, unit: 'cm-1' } },
        { from: 'CS2', to: 'S0', lambda: 0.8, coupling: { value: 0.4, unit: 'cm-1' } },
      ],
      temperature: 298.15,
    };
    const d = designFromNetwork(network);
    expect(d.states.map((s) => s.kind)).toEqual([
      'ground',
      'singlet',
      'triplet',
      'csIntermediate',
      'csFinal',
    ]);
    const again = buildNetwork(d).network!;
    const a = computeNetwork(again);
    const b = computeNetwork(network);
    expect(a.ok && b.ok).toBe(true);
    if (a.ok && b.ok) expect(a.outputs.yields).toEqual(b.outputs.yields);
  });

  it('writes σ for Monte Carlo; the 95 % interval of the yield brackets the nominal value', () => {
    const d = dyadDesign();
    d.links[1].lambdaSigma = 0.05;
    d.links[1].couplingSigma = 4;
    const built = buildNetwork(d, true);
    expect(built.uncertainInputs).toBe(2);
    const link = (built.network!['links'] as Record<string, unknown>[])[1];
    expect(link['lambda']).toEqual({ value: 0.6, sigma: 0.05, unit: 'eV' });
    const request = monteCarloRequest(built.network!);
    (request.inputs as { samples: number }).samples = 200;
    const mc = runMonteCarlo(request);
    expect(mc.ok).toBe(true);
    const nominal = computeNetwork(buildNetwork(d).network!);
    if (!mc.ok || !nominal.ok) return;
    const i = mc.intervals['formationYields.CS'];
    expect(i.p025).toBeLessThanOrEqual(nominal.outputs.formationYields['CS']);
    expect(i.p975).toBeGreaterThanOrEqual(nominal.outputs.formationYields['CS']);
    expect(i.p975 - i.p025).toBeGreaterThan(0);
  });

  it('takes ΔG°, λ and |H_AB| from a pair with their σ, keeping the pair and its provenance', () => {
    const pair = {
      id: 'p1',
      name: 'DA-1',
      version: 3,
      values: {
        deltaG0: { value: -0.35, sigma: 0.02 },
        lambdaTotal: { value: 0.7, sigma: 0.05 },
        coupling: { value: 0.002, sigma: null },
      },
      provenance: { lambdaTotal: { kind: 'measured' as const } },
    };
    const d = dyadDesign();
    Object.assign(d.states[2], { mode: 'pair', fromState: 'S1', pair });
    d.links[1].pair = pair;
    const plain = buildNetwork(d);
    expect(plain.errors).toEqual([]);
    expect(plain.states[2]!.energyEv).toBeCloseTo(1239.84198 / 590 - 0.35, 6);
    expect(plain.states[2]!.how).toContain('pair DA-1 (v3)');
    const link = (plain.network!['links'] as Record<string, unknown>[])[1];
    expect(link['lambda']).toEqual({ value: 0.7, unit: 'eV' });
    expect(link['coupling']).toEqual({ value: 0.002, unit: 'eV' });
    const withSigma = buildNetwork(d, true);
    expect((withSigma.network!['links'] as Record<string, unknown>[])[1]['lambda']).toEqual({
      value: 0.7,
      sigma: 0.05,
      unit: 'eV',
    });
    const cs = (withSigma.network!['states'] as { energy: unknown }[])[2];
    expect(cs.energy).toEqual({ value: expect.any(Number), sigma: 0.02, unit: 'eV' });
  });
});
