import { evaluate } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { calculate } from '../methods/calculate';
import {
  convertPotential,
  REFERENCE_ELECTRODES,
  referenceOffsetVsShe,
} from './reference-electrodes';

describe('reference electrode offsets', () => {
  it('puts the aqueous electrodes at their tabulated potentials vs SHE', () => {
    // Bard & Faulkner, Electrochemical Methods, 2nd ed. (from memory): SCE +0.241 V,
    // Ag/AgCl (sat. KCl) +0.197 V; Ag/AgCl (3 M KCl) +0.210 V (Sawyer et al., from memory).
    const expected = { SHE: 0, NHE: 0, SCE: 0.241, 'AgAgCl-sat': 0.197, 'AgAgCl-3M': 0.21 };
    for (const [reference, offset] of Object.entries(expected)) {
      const result = referenceOffsetVsShe({ reference: reference as 'SCE' });
      expect(result.ok && result.offsetV).toBeCloseTo(offset, 12);
    }
  });

  it('puts Fc⁺/Fc in MeCN at +0.380 V vs SCE (Pavlishchuk & Addison 2000, from memory)', () => {
    const result = convertPotential(0, { reference: 'Fc', solvent: 'MeCN' }, { reference: 'SCE' });
    expect(result.ok && result.potentialV).toBeCloseTo(0.38, 12);
    expect(result.ok && result.sources.join(' ')).toContain('Pavlishchuk');
    // Connelly & Geiger 1996 (from memory): DMF +0.45 V, CH2Cl2 +0.46 V vs SCE.
    const dmf = convertPotential(0, { reference: 'Fc', solvent: 'DMF' }, { reference: 'SCE' });
    expect(dmf.ok && dmf.potentialV).toBeCloseTo(0.45, 12);
    const dcm = convertPotential(0, { reference: 'Fc', solvent: 'CH2Cl2' }, { reference: 'SCE' });
    expect(dcm.ok && dcm.potentialV).toBeCloseTo(0.46, 12);
  });

  it('round-trips every pair of scales and composes offsets (mathjs sum of the legs)', () => {
    const scales = REFERENCE_ELECTRODES.map((reference) =>
      reference === 'Fc' ? { reference, solvent: 'MeCN' } : { reference },
    );
    for (const a of scales) {
      for (const b of scales) {
        const there = convertPotential(0.35, a, b);
        expect(there.ok).toBe(true);
        if (!there.ok) continue;
        const back = convertPotential(there.potentialV, b, a);
        expect(back.ok && back.potentialV).toBeCloseTo(0.35, 12);
        const viaShe = convertPotential(0.35, a, { reference: 'SHE' });
        const sheToB = convertPotential(0, { reference: 'SHE' }, b);
        if (viaShe.ok && sheToB.ok) {
          const sum = evaluate(`${viaShe.potentialV} + ${sheToB.offsetV}`) as number;
          expect(there.potentialV).toBeCloseTo(sum, 12);
        }
      }
    }
  });

  it('refuses Fc without a known solvent and unknown electrodes, naming the field', () => {
    expect(referenceOffsetVsShe({ reference: 'Fc' })).toMatchObject({
      ok: false,
      field: 'solvent',
    });
    expect(referenceOffsetVsShe({ reference: 'Fc', solvent: 'water' })).toMatchObject({
      ok: false,
      field: 'solvent',
    });
    expect(referenceOffsetVsShe({ reference: 'RHE' as 'SHE' })).toMatchObject({
      ok: false,
      field: 'reference',
    });
  });
});

describe('drivingForce.reference', () => {
  it('converts 0.35 V vs Fc⁺/Fc (MeCN) to SCE and SHE with the offset and its sources', () => {
    const answer = calculate({
      method: 'drivingForce.reference',
      inputs: { potential: 0.35, from: 'Fc', fromSolvent: 'MeCN', to: 'SCE' },
    });
    expect(answer.ok).toBe(true);
    if (!answer.ok) return;
    expect(answer.outputs['potential']).toBeCloseTo(0.73, 12);
    expect(answer.outputs['offset']).toBeCloseTo(0.38, 12);
    expect(answer.outputs['source']).toContain('Inorg. Chim. Acta 2000, 298, 97');
    const she = calculate({
      method: 'drivingForce.reference',
      inputs: { potential: { value: 350, unit: 'mV' }, from: 'Fc', fromSolvent: 'MeCN', to: 'SHE' },
    });
    expect(she.ok && she.outputs['potential']).toBeCloseTo(0.35 + 0.38 + 0.241, 12);
  });

  it('refuses an unknown electrode and a Fc scale without solvent, naming the field', () => {
    const unknown = calculate({
      method: 'drivingForce.reference',
      inputs: { potential: 0.35, from: 'RHE', to: 'SCE' },
    });
    expect(unknown).toMatchObject({ ok: false, errors: [{ field: 'from' }] });
    const noSolvent = calculate({
      method: 'drivingForce.reference',
      inputs: { potential: 0.35, from: 'SCE', to: 'Fc' },
    });
    expect(noSolvent).toMatchObject({ ok: false, errors: [{ field: 'toSolvent' }] });
    expect(noSolvent.ok ? '' : noSolvent.errors[0]!.message).toContain('MeCN');
  });
});

describe('potentials with a reference electrode on inputs', () => {
  const rehmWeller = (donor: unknown, acceptor: unknown, excitation: unknown = 2.5) =>
    calculate({
      method: 'drivingForce.rehmWeller',
      inputs: {
        donorOxidation: donor,
        acceptorReduction: acceptor,
        excitationEnergy: excitation,
        distance: 7,
        epsilon: 35.94,
      },
    });

  it('gives the same ΔG° whether both potentials are vs SCE or both vs Fc (MeCN), no B15', () => {
    const plain = rehmWeller(1.2, -0.8);
    const sce = rehmWeller(
      { value: 1.2, unit: 'V', reference: 'SCE' },
      { value: -0.8, unit: 'V', reference: 'SCE' },
    );
    const fc = rehmWeller(
      { value: 1.2 - 0.38, unit: 'V', reference: 'Fc', solvent: 'MeCN' },
      { value: -0.8 - 0.38, unit: 'V', reference: 'Fc', solvent: 'MeCN' },
    );
    if (!plain.ok || !sce.ok || !fc.ok) throw new Error('refused');
    expect(sce.outputs['deltaG0CS']).toBeCloseTo(plain.outputs['deltaG0CS'] as number, 12);
    expect(fc.outputs['deltaG0CS']).toBeCloseTo(plain.outputs['deltaG0CS'] as number, 12);
    expect(sce.warnings.map((w) => w.code)).not.toContain('reference-electrode');
    expect(fc.warnings.map((w) => w.code)).not.toContain('reference-electrode');
    // Without stated references the method still asks for them (B15).
    expect(plain.warnings.map((w) => w.code)).toContain('reference-electrode');
  });

  it('converts E_ox vs SCE and E_red vs Fc (MeCN) and warns B15 naming both scales', () => {
    const mixed = rehmWeller(
      { value: 1.2, unit: 'V', reference: 'SCE' },
      { value: -0.8 - 0.38, unit: 'V', reference: 'Fc', solvent: 'MeCN' },
    );
    const plain = rehmWeller(1.2, -0.8);
    if (!mixed.ok || !plain.ok) throw new Error('refused');
    expect(mixed.outputs['deltaG0CS']).toBeCloseTo(plain.outputs['deltaG0CS'] as number, 12);
    const b15 = mixed.warnings.filter((w) => w.code === 'reference-electrode');
    expect(b15).toHaveLength(1);
    expect(b15[0]!.message).toContain('vs SCE');
    expect(b15[0]!.message).toContain('Fc⁺/Fc in MeCN');
    // Same electrode, different solvents: still B15.
    const solvents = rehmWeller(
      { value: 1.2, unit: 'V', reference: 'Fc', solvent: 'DMF' },
      { value: -0.8, unit: 'V', reference: 'Fc', solvent: 'MeCN' },
    );
    expect(solvents.ok && solvents.warnings.map((w) => w.code)).toContain('reference-electrode');
  });

  it('refuses an unknown reference, a Fc potential without solvent, and a reference on η', () => {
    const unknown = rehmWeller({ value: 1.2, unit: 'V', reference: 'XYZ' }, -0.8);
    expect(unknown).toMatchObject({ ok: false, errors: [{ field: 'donorOxidation' }] });
    const noSolvent = rehmWeller(1.2, { value: -0.8, unit: 'V', reference: 'Fc' });
    expect(noSolvent).toMatchObject({ ok: false, errors: [{ field: 'acceptorReduction' }] });
    const overpotential = calculate({
      method: 'electrode.butlerVolmer',
      inputs: {
        k0: 1,
        alpha: 0.5,
        overpotential: { value: 0.1, unit: 'V', reference: 'SCE' },
        temperature: 298.15,
      },
    });
    expect(overpotential).toMatchObject({ ok: false, errors: [{ field: 'overpotential' }] });
    expect(overpotential.ok ? '' : overpotential.errors[0]!.message).toContain(
      'difference of potentials',
    );
  });

  it('reads the excitation energy as a wavelength in nm (E = hc/λ, CODATA 2018)', () => {
    const nm = rehmWeller(1.2, -0.8, { value: 496, unit: 'nm' });
    const ev = rehmWeller(1.2, -0.8, evaluate('4.135667696e-15 * 299792458e9 / 496') as number);
    if (!nm.ok || !ev.ok) throw new Error('refused');
    expect(nm.outputs['deltaG0CS']).toBeCloseTo(ev.outputs['deltaG0CS'] as number, 12);
    const zero = rehmWeller(1.2, -0.8, { value: 0, unit: 'nm' });
    expect(zero).toMatchObject({ ok: false, errors: [{ field: 'excitationEnergy' }] });
  });
});
