import { CM1_PER_EV, PLAUSIBLE_RANGES } from '@gapwise/calc';
import { PARAMETER_KINDS, type ParameterKind } from './pairs';
import { plainText } from './rich-text';

/**
 * Plausibility of one pair value (VALIDATION.md B8–B11, B16), worded with the label the user
 * sees. The pair fields and every derivation helper ask this one function, so a helper cannot
 * offer a value that the pair field would then flag. Nothing here refuses a value: an unusual
 * value may be right, so callers warn (and a helper asks for an explicit override).
 * @param canonicalValue the value in its canonical unit (eV for energies)
 * @param typedUnit the unit the user typed or sees it in ('' or 'eV' for eV)
 * @returns what looks wrong, or null when the value is within the usual range
 */
export function parameterPlausibility(
  kind: ParameterKind,
  canonicalValue: number,
  typedUnit: string,
): string | null {
  if (!Number.isFinite(canonicalValue)) return null;
  const label = plainText(PARAMETER_KINDS[kind].label);
  const magnitude = Math.abs(canonicalValue);
  const inEv = typedUnit === '' || typedUnit === 'eV';
  const ev = `${Number(canonicalValue.toPrecision(4))} eV`.replace(/^-/, '−');
  const energyLimit =
    kind === 'lambdaInner' || kind === 'lambdaOuter'
      ? PLAUSIBLE_RANGES.lambdaEvMax
      : kind === 'deltaG0' || kind === 'deltaG0Recombination'
        ? PLAUSIBLE_RANGES.deltaG0EvMax
        : null;
  if (energyLimit !== null) {
    const suspect = PLAUSIBLE_RANGES.energyTypedAsEvSuspect;
    if (inEv && magnitude >= suspect.min && magnitude <= suspect.max) {
      return `${label} = ${ev} looks like kJ/mol or cm⁻¹ entered as eV; check the unit.`;
    }
    if (magnitude > energyLimit) {
      return `${label} = ${ev} is unusually large (above ${energyLimit} eV); check the unit (kJ/mol entered as eV?).`;
    }
    return null;
  }
  if (kind === 'coupling') {
    if (inEv && magnitude > PLAUSIBLE_RANGES.couplingTypedEvMax) {
      return `${label} = ${ev} is far too large for a coupling typed in eV; check the unit (cm⁻¹ entered as eV?).`;
    }
    if (magnitude > PLAUSIBLE_RANGES.couplingEvMax) {
      return `${label} = ${ev} is unusually large (above ${PLAUSIBLE_RANGES.couplingEvMax} eV); check the unit.`;
    }
    if (
      typedUnit === 'cm-1' &&
      magnitude > 0 &&
      magnitude * CM1_PER_EV < PLAUSIBLE_RANGES.couplingCm1Min
    ) {
      return `${label} is below ${PLAUSIBLE_RANGES.couplingCm1Min} cm⁻¹; check the unit (eV entered as cm⁻¹?).`;
    }
    return null;
  }
  if (kind === 'excitationEnergy' && magnitude > PLAUSIBLE_RANGES.excitationEnergyEvMax) {
    return `${label} = ${ev} is above ${PLAUSIBLE_RANGES.excitationEnergyEvMax} eV; check it is the 0–0 energy, not an absorption maximum, and its unit.`;
  }
  return null;
}

/** Plausibility of a temperature in kelvin (VALIDATION.md B8); warns, never refuses. */
export function temperaturePlausibility(temperatureK: number): string | null {
  const { min, max } = PLAUSIBLE_RANGES.temperatureK;
  if (!Number.isFinite(temperatureK) || temperatureK <= 0) return null;
  if (temperatureK < min || temperatureK > max) {
    const t = Number(temperatureK.toPrecision(5));
    return `${t} K is outside ${min}–${max} K: check that λ, ΔG°, ε_s and τ_L refer to this temperature${temperatureK < min ? '; classical Marcus is questionable at low T' : ''}.`;
  }
  return null;
}
