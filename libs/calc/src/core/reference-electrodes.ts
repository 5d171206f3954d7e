/**
 * Reference electrodes and the offsets that put a potential measured against one of them on a
 * common scale (the standard hydrogen electrode, SHE). Used by the input reader for potentials
 * given as `{ value, unit, reference, solvent }` (CALC-API.md, second wave) and by
 * `drivingForce.reference`.
 *
 * Offsets are E(reference electrode) vs SHE at 25 °C; a potential E measured vs `ref` is
 * E + offset(ref) vs SHE. Fc⁺/Fc offsets go through the aqueous SCE, so they carry the liquid
 * junction potential between the solvent and water (tens of mV): good for putting two numbers
 * side by side, not for thermodynamics to the millivolt.
 */

/** Reference electrodes the core knows (ids used in requests). */
export const REFERENCE_ELECTRODES = ['SHE', 'NHE', 'SCE', 'AgAgCl-sat', 'AgAgCl-3M', 'Fc'] as const;
export type ReferenceElectrode = (typeof REFERENCE_ELECTRODES)[number];

/** Solvents for which a Fc⁺/Fc offset is tabulated. */
export const FERROCENE_SOLVENTS = ['MeCN', 'DMF', 'CH2Cl2'] as const;
export type FerroceneSolvent = (typeof FERROCENE_SOLVENTS)[number];

/** A potential scale: the reference electrode, and the solvent where the offset depends on it. */
export interface PotentialScale {
  readonly reference: ReferenceElectrode;
  /** Required for `Fc`; ignored (may be given for the record) for aqueous electrodes. */
  readonly solvent?: string;
}

/** Labels people read (pickers, messages). */
export const REFERENCE_ELECTRODE_LABELS: Readonly<Record<ReferenceElectrode, string>> = {
  SHE: 'SHE',
  NHE: 'NHE',
  SCE: 'SCE',
  'AgAgCl-sat': 'Ag/AgCl (saturated KCl)',
  'AgAgCl-3M': 'Ag/AgCl (3 M KCl)',
  Fc: 'Fc⁺/Fc',
};

interface Offset {
  /** E(reference) vs SHE, V. */
  readonly offsetV: number;
  readonly source: string;
}

const BARD_FAULKNER =
  'A. J. Bard, L. R. Faulkner, Electrochemical Methods, 2nd ed., Wiley 2001, table of reference ' +
  'electrode potentials (from memory)';

/** Aqueous reference electrodes vs SHE at 25 °C. */
const AQUEOUS_OFFSETS: Readonly<Record<Exclude<ReferenceElectrode, 'Fc'>, Offset>> = {
  SHE: { offsetV: 0, source: 'definition (SHE is the zero of the scale)' },
  // NHE (1 N acid) and SHE (unit activity) differ by a few mV; by common usage they are one scale.
  NHE: { offsetV: 0, source: `taken equal to SHE, as is common usage; ${BARD_FAULKNER}` },
  SCE: { offsetV: 0.241, source: `SCE (saturated KCl) +0.241 V vs SHE; ${BARD_FAULKNER}` },
  'AgAgCl-sat': {
    offsetV: 0.197,
    source: `Ag/AgCl (saturated KCl) +0.197 V vs SHE; ${BARD_FAULKNER}`,
  },
  'AgAgCl-3M': {
    offsetV: 0.21,
    source:
      'Ag/AgCl (3 M KCl) +0.210 V vs SHE; D. T. Sawyer, A. Sobkowiak, J. L. Roberts, ' +
      'Electrochemistry for Chemists, 2nd ed., Wiley 1995 (from memory)',
  },
};

/** Fc⁺/Fc vs SCE in each solvent (0.1 M Bu₄N⁺ salt), V. */
const FERROCENE_VS_SCE: Readonly<Record<FerroceneSolvent, Offset>> = {
  MeCN: {
    offsetV: 0.38,
    source:
      'Fc⁺/Fc +0.380 V vs SCE in MeCN: V. V. Pavlishchuk, A. W. Addison, Inorg. Chim. Acta ' +
      '2000, 298, 97 (doi 10.1016/S0020-1693(99)00407-7; from memory)',
  },
  DMF: {
    offsetV: 0.45,
    source:
      'Fc⁺/Fc +0.45 V vs SCE in DMF: N. G. Connelly, W. E. Geiger, Chem. Rev. 1996, 96, 877 ' +
      '(doi 10.1021/cr940053x; from memory)',
  },
  CH2Cl2: {
    offsetV: 0.46,
    source:
      'Fc⁺/Fc +0.46 V vs SCE in CH2Cl2: N. G. Connelly, W. E. Geiger, Chem. Rev. 1996, 96, 877 ' +
      '(doi 10.1021/cr940053x; from memory)',
  },
};

export function isReferenceElectrode(value: unknown): value is ReferenceElectrode {
  return typeof value === 'string' && (REFERENCE_ELECTRODES as readonly string[]).includes(value);
}

export function isFerroceneSolvent(value: unknown): value is FerroceneSolvent {
  return typeof value === 'string' && (FERROCENE_SOLVENTS as readonly string[]).includes(value);
}

/** Result of looking up an offset: the offset vs SHE with its sources, or why not. */
export type ReferenceOffsetResult =
  | { readonly ok: true; readonly offsetV: number; readonly sources: readonly string[] }
  | { readonly ok: false; readonly field: 'reference' | 'solvent'; readonly message: string };

/**
 * E(reference) vs SHE in V, with the published sources it rests on. Fc⁺/Fc needs a solvent of
 * `FERROCENE_SOLVENTS` (the offset is solvent-dependent, SCIENCE.md §4 pitfalls).
 */
export function referenceOffsetVsShe(scale: PotentialScale): ReferenceOffsetResult {
  if (!isReferenceElectrode(scale.reference)) {
    return {
      ok: false,
      field: 'reference',
      message: `Unknown reference electrode '${String(scale.reference)}'; use one of ${REFERENCE_ELECTRODES.join(', ')}.`,
    };
  }
  if (scale.reference !== 'Fc') {
    const aqueous = AQUEOUS_OFFSETS[scale.reference];
    return { ok: true, offsetV: aqueous.offsetV, sources: [aqueous.source] };
  }
  if (!isFerroceneSolvent(scale.solvent)) {
    return {
      ok: false,
      field: 'solvent',
      message:
        scale.solvent === undefined
          ? `The Fc⁺/Fc offset depends on the solvent; give solvent as one of ${FERROCENE_SOLVENTS.join(', ')}.`
          : `No Fc⁺/Fc offset for solvent '${scale.solvent}'; use one of ${FERROCENE_SOLVENTS.join(', ')}.`,
    };
  }
  const fc = FERROCENE_VS_SCE[scale.solvent];
  const sce = AQUEOUS_OFFSETS.SCE;
  return { ok: true, offsetV: fc.offsetV + sce.offsetV, sources: [fc.source, sce.source] };
}

/** Result of converting a potential between scales. */
export type PotentialConversion =
  | {
      readonly ok: true;
      /** The potential on the target scale, V. */
      readonly potentialV: number;
      /** Added to the value: E_to = E_from + offset, V. */
      readonly offsetV: number;
      readonly sources: readonly string[];
    }
  | {
      readonly ok: false;
      readonly field: 'from' | 'to' | 'fromSolvent' | 'toSolvent';
      readonly message: string;
    };

/** Converts a potential (V) measured vs `from` to the scale `to`: E_to = E_from + off(from) − off(to). */
export function convertPotential(
  potentialV: number,
  from: PotentialScale,
  to: PotentialScale,
): PotentialConversion {
  const a = referenceOffsetVsShe(from);
  if (!a.ok)
    return {
      ok: false,
      field: a.field === 'reference' ? 'from' : 'fromSolvent',
      message: a.message,
    };
  const b = referenceOffsetVsShe(to);
  if (!b.ok)
    return { ok: false, field: b.field === 'reference' ? 'to' : 'toSolvent', message: b.message };
  const offsetV = a.offsetV - b.offsetV;
  const sources = [...new Set([...a.sources, ...b.sources])];
  return { ok: true, potentialV: potentialV + offsetV, offsetV, sources };
}

/** "SCE", "Fc⁺/Fc in MeCN": how a scale is named in messages. */
export function potentialScaleLabel(scale: PotentialScale): string {
  const name = isReferenceElectrode(scale.reference)
    ? REFERENCE_ELECTRODE_LABELS[scale.reference]
    : String(scale.reference);
  return scale.solvent ? `${name} in ${scale.solvent}` : name;
}

/** Whether two scales are the same reference in the same solvent (solvent compared when given). */
export function samePotentialScale(a: PotentialScale, b: PotentialScale): boolean {
  return a.reference === b.reference && (a.solvent ?? '') === (b.solvent ?? '');
}
