import {
  FERROCENE_SOLVENTS,
  REFERENCE_ELECTRODES,
  convertPotential,
  isFerroceneSolvent,
  isReferenceElectrode,
  potentialScaleLabel,
  samePotentialScale,
  type PotentialScale,
} from '@gapwise/calc';

/**
 * The reference electrode a pair's potential was typed against, kept in the parameter's `unit`
 * ("V vs SCE", "mV vs Fc in MeCN") so it lives with the value, its versions and diffs and needs no
 * column of its own. The stored `value` of such a parameter is canonical: V vs SHE, converted by
 * the calculation core's published offsets (`drivingForce.reference`). A bare `V` / `mV` means the
 * reference was not stated (pairs saved before references existed): its value is as typed.
 */

/** A scale as a short code: `SCE`, `AgAgCl-3M`, `Fc/MeCN`. */
export type PotentialScaleCode = string;

/** Every scale a potential may be typed against, in the order a picker offers them. */
export const POTENTIAL_SCALE_CODES: readonly PotentialScaleCode[] = [
  ...REFERENCE_ELECTRODES.filter((r) => r !== 'Fc'),
  ...FERROCENE_SOLVENTS.map((s) => `Fc/${s}`),
];

/** The scale of a code, or null when the code is not one of `POTENTIAL_SCALE_CODES`. */
export function potentialScaleOf(code: string): PotentialScale | null {
  if (code.startsWith('Fc/')) {
    const solvent = code.slice(3);
    return isFerroceneSolvent(solvent) ? { reference: 'Fc', solvent } : null;
  }
  return isReferenceElectrode(code) && code !== 'Fc' ? { reference: code } : null;
}

export function potentialScaleCode(scale: PotentialScale): PotentialScaleCode {
  return scale.reference === 'Fc' ? `Fc/${scale.solvent ?? ''}` : scale.reference;
}

/** "SCE", "Fc⁺/Fc in MeCN": the words a person reads for a code. */
export function potentialScaleName(code: PotentialScaleCode): string {
  const scale = potentialScaleOf(code);
  return scale ? potentialScaleLabel(scale) : code;
}

/** "V vs SCE", "mV vs Fc in MeCN" (≤ 20 characters, the unit's limit). */
export function referencedPotentialUnit(unit: string, code: PotentialScaleCode | null): string {
  if (!code) return unit;
  const scale = potentialScaleOf(code);
  if (!scale) return unit;
  return scale.reference === 'Fc'
    ? `${unit} vs Fc in ${scale.solvent}`
    : `${unit} vs ${scale.reference}`;
}

/** Splits a stored potential unit into the unit typed and its scale code (null: none stated). */
export function splitPotentialUnit(stored: string): {
  readonly unit: string;
  readonly code: PotentialScaleCode | null;
  readonly valid: boolean;
} {
  const m = /^(\S+) vs (\S+)(?: in (\S+))?$/.exec(stored);
  if (!m) return { unit: stored, code: null, valid: true };
  const code = m[2] === 'Fc' ? `Fc/${m[3] ?? ''}` : m[3] === undefined ? m[2]! : '';
  return { unit: m[1]!, code, valid: potentialScaleOf(code) !== null };
}

const SHE: PotentialScale = { reference: 'SHE' };

/** A potential typed on `code` (V) as the stored value, V vs SHE (the core's offsets). */
export function potentialToShe(valueV: number, code: PotentialScaleCode | null): number {
  const scale = code ? potentialScaleOf(code) : null;
  if (!scale) return valueV;
  const c = convertPotential(valueV, scale, SHE);
  return c.ok ? c.potentialV : valueV;
}

/** A stored value (V vs SHE) on the scale `code`, in V. */
export function potentialFromShe(valueV: number, code: PotentialScaleCode | null): number {
  const scale = code ? potentialScaleOf(code) : null;
  if (!scale) return valueV;
  const c = convertPotential(valueV, SHE, scale);
  return c.ok ? c.potentialV : valueV;
}

/**
 * SCIENCE.md §4 pitfall and VALIDATION.md B15: the two potentials of a driving force should be
 * measured against one reference in one solvent. Returns the warning, naming both scales with the
 * labels the user sees, or null when they agree (or one potential is missing).
 */
export function mixedReferenceWarning(
  a: { readonly label: string; readonly code: PotentialScaleCode | null } | null,
  b: { readonly label: string; readonly code: PotentialScaleCode | null } | null,
): string | null {
  if (!a || !b) return null;
  const sa = a.code ? potentialScaleOf(a.code) : null;
  const sb = b.code ? potentialScaleOf(b.code) : null;
  if (!sa && !sb) return null;
  const name = (s: PotentialScale | null) => (s ? potentialScaleLabel(s) : 'no stated reference');
  if (!sa || !sb) {
    return (
      `${a.label} is vs ${name(sa)} and ${b.label} is vs ${name(sb)}: a potential without a ` +
      'reference cannot be put on the other one’s scale. State the reference of both.'
    );
  }
  if (samePotentialScale(sa, sb)) return null;
  return (
    `${a.label} is vs ${name(sa)} and ${b.label} is vs ${name(sb)}: both are put on the SHE scale ` +
    'with published offsets, which leave a liquid-junction uncertainty of tens of mV ' +
    (sa.solvent !== sb.solvent ? 'between solvents' : 'between electrodes') +
    '. Potentials measured against one reference in one solvent are better.'
  );
}
