import { calculate } from '@gapwise/calc';
import { describe, expect, it } from 'vitest';
import {
  computePairResults,
  NON_POLAR_NO_RATE,
  pairSaveFieldLabel,
  pairSolventScan,
  scanFieldLabel,
} from './pair-model';
import { findSolvent, pekarFactor, SOLVENTS } from './solvents';

/** A pair whose ΔG° and λₒ were derived from potentials and geometry (as on the pair page). */
function pair(charges: { chargeDonor?: number; chargeAcceptor?: number } = {}) {
  const rw = {
    donorOxidation: 1.0,
    acceptorReduction: -0.9,
    excitationEnergy: 2.5,
    distance: 7,
    epsilon: 35.94,
    radiusDonor: 3.5,
    radiusAcceptor: 3.5,
    epsilonReference: 35.94,
    ...charges,
  };
  const ts = {
    radiusDonor: 3.5,
    radiusAcceptor: 3.5,
    distance: 7,
    epsilon: 35.94,
    refractiveIndex: 1.3442,
  };
  const dg = calculate({ method: 'drivingForce.rehmWeller', inputs: rw });
  const lo = calculate({ method: 'reorg.twoSphere', inputs: ts });
  if (!dg.ok || !lo.ok) throw new Error('fixture');
  const derived = (methodId: string, methodInputs: Record<string, unknown>) => ({
    kind: 'derived' as const,
    methodId,
    methodInputs,
  });
  return {
    temperature: 298.15,
    model: 'marcus' as const,
    parameters: [
      {
        kind: 'deltaG0',
        value: dg.outputs['deltaG0CS'] as number,
        provenance: derived('drivingForce.rehmWeller', rw),
      },
      {
        kind: 'deltaG0Recombination',
        value: dg.outputs['deltaG0CR'] as number,
        provenance: derived('drivingForce.rehmWeller', rw),
      },
      {
        kind: 'lambdaOuter',
        value: lo.outputs['lambdaOuter'] as number,
        provenance: derived('reorg.twoSphere', ts),
      },
      { kind: 'lambdaInner', value: 0.2 },
      { kind: 'coupling', value: 0.005 },
      { kind: 'epsilonStatic', value: 35.94 },
      { kind: 'refractiveIndex', value: 1.3442 },
    ],
  };
}

describe('pairSolventScan (solvent choice, issue 18)', () => {
  it('reproduces the stored pair in its own solvent (acetonitrile) through computePairResults', () => {
    const source = pair();
    const scan = pairSolventScan(source);
    expect(scan.unavailable).toBeNull();
    const mecn = scan.rows.find((r) => r.solvent.key === 'acetonitrile')!;
    const direct = computePairResults(source);
    expect(mecn.log10kCS).toBeCloseTo(direct.log10k!, 10);
    expect(mecn.log10kCR).toBeCloseTo(direct.recombination!.log10k!, 10);
    expect(mecn.solventCorrection).toBeCloseTo(0, 12);
  });

  it('recomputes λₒ by the two-sphere formula per solvent (SCIENCE.md §5)', () => {
    const scan = pairSolventScan(pair());
    for (const row of scan.rows) {
      // 14.39965 (1/2a + 1/2a − 1/R)(1/n² − 1/ε) with a = 3.5 Å, R = 7 Å.
      // A negative Pekar factor (non-polar solvent, n² > ε_s in the table) gives λₒ = 0, said.
      const expected = 14.39965 * (1 / 7 + 1 / 7 - 1 / 7) * Math.max(0, pekarFactor(row.solvent));
      expect(row.lambdaOuter!).toBeCloseTo(expected, 5);
      expect(row.note !== null).toBe(pekarFactor(row.solvent) < 0);
    }
  });

  it('applies Weller’s neutral Born and Coulomb terms: MeCN → toluene raises ΔG°_CS (SCIENCE.md §4)', () => {
    const scan = pairSolventScan(pair());
    const mecn = scan.rows.find((r) => r.solvent.key === 'acetonitrile')!;
    const tol = scan.rows.find((r) => r.solvent.key === 'toluene')!;
    // Born: 7.199823 (1/3.5 + 1/3.5)(1/2.38 − 1/35.94); Coulomb: −14.39965/7 (1/2.38 − 1/35.94).
    const born = 7.199823 * (2 / 3.5) * (1 / 2.38 - 1 / 35.94);
    const coulomb = (-14.39965 / 7) * (1 / 2.38 - 1 / 35.94);
    expect(tol.deltaG0CS! - mecn.deltaG0CS!).toBeCloseTo(born + coulomb, 4);
    expect(tol.deltaG0CS! + tol.deltaG0CR!).toBeCloseTo(-2.5, 12); // ΔG_CS + ΔG_CR = −E₀₀
  });

  it('uses the charged Born term, not the neutral one, for charged reactants (SCIENCE.md §4 check)', () => {
    // z_D = 2, z_A = 2, r_D = 7.0 Å, r_A = 3.5 Å, ε_s = 8.93, ε_ref = 35.94: ΔG_Born = −0.0866 eV
    // (SCIENCE.md §4, from memory).
    const source = pair({ chargeDonor: 2, chargeAcceptor: 2 });
    const dgProv = source.parameters[0].provenance!.methodInputs as Record<string, number>;
    dgProv['radiusDonor'] = 7.0;
    const dcm = pairSolventScan(source, [{ ...findSolvent('dichloromethane')!, epsilon: 8.93 }]);
    expect(dcm.rows[0].solventCorrection).toBeCloseTo(-0.0866, 4);
  });

  it('puts the solvent into the new parameters with provenance naming it and its source', () => {
    const scan = pairSolventScan(pair());
    const row = scan.rows.find((r) => r.solvent.key === 'dichloromethane')!;
    const eps = row.parameters!.find((p) => p.kind === 'epsilonStatic')!;
    expect(eps.value).toBe(row.solvent.epsilon);
    const dg = row.parameters!.find((p) => p.kind === 'deltaG0')!;
    expect(dg.value).toBe(row.deltaG0CS);
    expect(dg.provenance!.note).toContain('Dichloromethane');
    expect((dg.provenance!.methodInputs as Record<string, unknown>)['epsilon']).toBe(
      row.solvent.epsilon,
    );
  });

  it('says what is missing when ΔG° or λₒ is not derived', () => {
    const source = pair();
    const plain = {
      ...source,
      parameters: source.parameters.map((p) => ({ ...p, provenance: null })),
    };
    expect(pairSolventScan(plain).unavailable).toMatch(/Rehm–Weller.*two-sphere/);
  });

  it('says in plain words why Marcus–Levich–Jortner gives no rate where λₒ is set to 0', () => {
    const source = pair();
    const mlj = {
      ...source,
      model: 'mlj' as const,
      parameters: [...source.parameters, { kind: 'hbarOmega', value: 0.18 }],
    };
    const scan = pairSolventScan(mlj);
    for (const key of ['n-hexane', 'cyclohexane']) {
      const row = scan.rows.find((r) => r.solvent.key === key)!;
      expect(row.pekar).toBeLessThan(0);
      expect(row.lambdaOuter).toBe(0);
      expect(row.log10kCS).toBeNull();
      expect(row.errors).toEqual([NON_POLAR_NO_RATE]);
    }
    // A polar solvent keeps its rate; no message shown anywhere carries a core field code.
    expect(scan.rows.find((r) => r.solvent.key === 'acetonitrile')!.log10kCS).not.toBeNull();
    for (const row of scan.rows) {
      for (const e of row.errors) expect(e).not.toMatch(/lambdaSolvent|lambdaVib|deltaG0|inputs\./);
    }
  });

  it('names core fields by the labels the user sees', () => {
    expect(scanFieldLabel('inputs.lambdaSolvent')).toBe('Outer reorganization energy λₒ');
    expect(scanFieldLabel('hbarOmega')).toBe('Effective mode energy ħω');
    expect(scanFieldLabel('deltaG0Recombination')).toBe('Recombination ΔG°');
    expect(scanFieldLabel('epsilon')).toBe('Static dielectric constant ε_s');
    const sent = [{ kind: 'deltaG0' }, { kind: 'lambdaOuter' }];
    expect(pairSaveFieldLabel('parameters.1.value', sent)).toBe('Outer reorganization energy λₒ');
    expect(pairSaveFieldLabel('parameters.0.unit', sent)).toBe('Driving force ΔG° (unit)');
    expect(pairSaveFieldLabel('version', sent)).toBe('Version');
  });

  it('has a published source on every value, marked verified or not', () => {
    for (const s of SOLVENTS) {
      for (const note of Object.values(s.sources)) {
        expect(note.citation).toMatch(/CRC Handbook/);
        expect(typeof note.verified).toBe('boolean');
      }
      // Non-polar solvents have ε_s ≈ n²: the Pekar factor may dip just below 0, never far.
      expect(pekarFactor(s)).toBeGreaterThan(-0.01);
    }
  });
});
