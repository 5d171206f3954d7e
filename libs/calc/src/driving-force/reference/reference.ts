/**
 * `drivingForce.reference`: a potential measured against one reference electrode expressed
 * against another (SHE, NHE, SCE, Ag/AgCl, Fc⁺/Fc in MeCN, DMF or CH2Cl2), with the offset used and
 * its published sources (SCIENCE.md §4 pitfalls: offsets are solvent-dependent).
 */
import type { InputReader, MethodDefinition } from '../../core/method';
import {
  convertPotential,
  FERROCENE_SOLVENTS,
  REFERENCE_ELECTRODES,
  type PotentialScale,
  type ReferenceElectrode,
} from '../../core/reference-electrodes';

export interface ReferenceInputs {
  readonly potentialV: number;
  readonly from: PotentialScale;
  readonly to: PotentialScale;
}

function readSolvent(reader: InputReader, name: string): string | undefined {
  const raw = reader.raw(name);
  if (raw === undefined) return undefined;
  if (typeof raw !== 'string' || raw.trim() === '') {
    reader.fail(name, `Field ${name} must be one of ${FERROCENE_SOLVENTS.join(', ')}.`);
    return undefined;
  }
  return raw.trim();
}

export const referenceMethod = {
  id: 'drivingForce.reference',
  summary:
    'A potential vs one reference electrode expressed vs another (SHE, NHE, SCE, Ag/AgCl, Fc⁺/Fc), with the offset and its source.',
  references: [
    'A. J. Bard, L. R. Faulkner, Electrochemical Methods, 2nd ed., Wiley 2001 (SCE, Ag/AgCl vs SHE; from memory)',
    'V. V. Pavlishchuk, A. W. Addison, Inorg. Chim. Acta 2000, 298, 97; doi 10.1016/S0020-1693(99)00407-7 (Fc⁺/Fc vs SCE in MeCN; from memory)',
    'N. G. Connelly, W. E. Geiger, Chem. Rev. 1996, 96, 877; doi 10.1021/cr940053x (Fc⁺/Fc vs SCE in DMF, CH2Cl2; from memory)',
  ],
  inputs: [
    {
      name: 'potential',
      quantity: 'potential',
      required: true,
      label: 'Potential E',
      description: 'Potential measured vs the reference electrode `from`.',
    },
    {
      name: 'from',
      quantity: 'string',
      required: true,
      description: `Reference electrode of the potential: ${REFERENCE_ELECTRODES.join(', ')}.`,
    },
    {
      name: 'fromSolvent',
      quantity: 'string',
      required: false,
      description: `Solvent of a Fc⁺/Fc reference: ${FERROCENE_SOLVENTS.join(', ')}.`,
    },
    {
      name: 'to',
      quantity: 'string',
      required: true,
      description: `Reference electrode to express it against: ${REFERENCE_ELECTRODES.join(', ')}.`,
    },
    {
      name: 'toSolvent',
      quantity: 'string',
      required: false,
      description: `Solvent of a Fc⁺/Fc target: ${FERROCENE_SOLVENTS.join(', ')}.`,
    },
  ],
  outputs: [
    { name: 'potential', unit: 'V', description: 'The potential vs `to`.' },
    { name: 'offset', unit: 'V', description: 'Added to the input: E(to) = E(from) + offset.' },
    { name: 'source', unit: '', description: 'Published sources of the offsets used.' },
  ],
  read(reader) {
    const potentialV = reader.quantity('potential', 'potential');
    const from = reader.choice<ReferenceElectrode>('from', REFERENCE_ELECTRODES);
    const fromSolvent = readSolvent(reader, 'fromSolvent');
    const to = reader.choice<ReferenceElectrode>('to', REFERENCE_ELECTRODES);
    const toSolvent = readSolvent(reader, 'toSolvent');
    const scales = {
      from:
        fromSolvent === undefined ? { reference: from } : { reference: from, solvent: fromSolvent },
      to: toSolvent === undefined ? { reference: to } : { reference: to, solvent: toSolvent },
    };
    if (!reader.failed) {
      const check = convertPotential(0, scales.from, scales.to);
      if (!check.ok) reader.fail(check.field, `Field ${check.field}: ${check.message}`);
    }
    return { potentialV, ...scales };
  },
  compute(inputs) {
    const result = convertPotential(inputs.potentialV, inputs.from, inputs.to);
    // read() refused every scale convertPotential refuses.
    if (!result.ok) throw new Error(result.message);
    return {
      potential: result.potentialV,
      offset: result.offsetV,
      source: result.sources.join('; '),
    };
  },
} satisfies MethodDefinition<ReferenceInputs>;

/** What `drivingForce.reference` answers (the compiler reads it through `MethodOutputs`). */
export type ReferenceOutputs = ReturnType<(typeof referenceMethod)['compute']>;
