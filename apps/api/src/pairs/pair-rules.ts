import { allowedUnits, canonicalUnit, isUnitFor, type Quantity } from '@gapwise/calc';
import {
  lambdaParts,
  magnitudeProblem,
  PARAMETER_KINDS,
  PARAMETER_LOWER_BOUNDS,
  POTENTIAL_SCALE_CODES,
  referencedPotentialUnit,
  splitPotentialUnit,
  withinLowerBound,
  type PairInput,
  type PairParameter,
  type Provenance,
} from '@gapwise/contracts';
import type { ParameterDto, PairInputDto } from './pair-dto';

type FieldError = { field: string; message: string };

/** Units a parameter kind accepts; dimensionless kinds take the empty unit. */
export function unitsForKind(kind: keyof typeof PARAMETER_KINDS): readonly string[] {
  const quantity = PARAMETER_KINDS[kind].quantity as Quantity;
  const units = allowedUnits(quantity);
  return units.length ? units : [''];
}

function checkParameter(p: ParameterDto, i: number, errors: FieldError[]): void {
  const at = (f: string) => `parameters.${i}.${f}`;
  const quantity = PARAMETER_KINDS[p.kind].quantity as Quantity;
  // A potential may name its reference electrode in the unit ("V vs SCE"); its value is then V vs SHE.
  const split = quantity === 'potential' ? splitPotentialUnit(p.unit) : null;
  const unit = split ? split.unit : p.unit;
  const unitOk = allowedUnits(quantity).length === 0 ? unit === '' : isUnitFor(unit, quantity);
  if (!unitOk) {
    errors.push({
      field: at('unit'),
      message: `must be one of ${unitsForKind(p.kind)
        .map((u) => `'${u}'`)
        .join(', ')} for ${p.kind}`,
    });
  } else if (split && !split.valid) {
    errors.push({
      field: at('unit'),
      message: `names an unknown reference electrode; use '${unit} vs <reference>' with one of ${POTENTIAL_SCALE_CODES.map(
        (c) => referencedPotentialUnit(unit, c).slice(unit.length + 4),
      ).join(', ')}`,
    });
  }
  const bound = PARAMETER_LOWER_BOUNDS[p.kind];
  if (bound && !withinLowerBound(p.kind, p.value)) {
    const unit = canonicalUnit(quantity);
    errors.push({
      field: at('value'),
      message: `must be ${bound.strict ? 'greater than' : 'at least'} ${bound.min}${unit ? ' ' + unit : ''}`,
    });
  }
  const tooLarge = magnitudeProblem(quantity, p.value);
  if (tooLarge) errors.push({ field: at('value'), message: tooLarge });
  const sigmaTooLarge = p.uncertainty == null ? null : magnitudeProblem(quantity, p.uncertainty);
  if (sigmaTooLarge) errors.push({ field: at('uncertainty'), message: sigmaTooLarge });
  const prov = p.provenance;
  if (prov.kind === 'literature' && !prov.citation?.trim()) {
    errors.push({ field: at('provenance.citation'), message: 'is required for literature values' });
  }
  if (prov.kind === 'derived' && !prov.methodId?.trim()) {
    errors.push({ field: at('provenance.methodId'), message: 'is required for derived values' });
  }
  if (prov.methodInputs && JSON.stringify(prov.methodInputs).length > 20000) {
    errors.push({ field: at('provenance.methodInputs'), message: 'is too large (20 kB at most)' });
  }
}

/** Rules across fields that class-validator cannot express; every problem is returned. */
export function pairInputProblems(input: PairInputDto): FieldError[] {
  const errors: FieldError[] = [];
  const seen = new Map<string, number>();
  input.parameters.forEach((p, i) => {
    if (seen.has(p.kind)) {
      errors.push({
        field: `parameters.${i}.kind`,
        message: `${p.kind} is given twice (also parameters.${seen.get(p.kind)})`,
      });
    } else seen.set(p.kind, i);
    checkParameter(p, i, errors);
  });
  // λ entered as a total and as both parts must agree (the pair model would use the total).
  const total = input.parameters.findIndex((p) => p.kind === 'lambdaTotal');
  const parts = lambdaParts(input.parameters.filter((p) => p.kind !== 'lambdaTotal'));
  if (total >= 0 && parts.inner !== null && parts.outer !== null) {
    const given = input.parameters[total].value;
    if (Math.abs(given - (parts.total ?? 0)) > 1e-9 * Math.max(1, Math.abs(given))) {
      errors.push({
        field: `parameters.${total}.value`,
        message: `must equal inner λᵢ + outer λₒ (${parts.total} eV) when all three are given; clear the total or one part`,
      });
    }
  }
  return errors;
}

const provenanceOf = (p: ParameterDto['provenance']): Provenance => ({
  kind: p.kind,
  citation: p.citation?.trim() || null,
  methodId: p.methodId?.trim() || null,
  methodInputs: p.methodInputs ?? null,
  sources: p.sources?.map((s) => ({ type: s.type, id: s.id })) ?? null,
  note: p.note?.trim() || null,
});

/** A validated DTO as a plain, normalised `PairInput` (trimmed, defaults filled, tags unique). */
export function normalisePairInput(input: PairInputDto): Required<PairInput> {
  const parameters: PairParameter[] = input.parameters.map((p) => ({
    kind: p.kind,
    value: p.value,
    unit: p.unit,
    uncertainty: p.uncertainty ?? null,
    provenance: provenanceOf(p.provenance),
  }));
  const tags = [...new Set((input.tags ?? []).map((t) => t.trim()).filter(Boolean))];
  return {
    name: input.name.trim(),
    donor: input.donor.trim(),
    acceptor: input.acceptor.trim(),
    medium: input.medium.trim(),
    temperature: input.temperature,
    temperatureUnit: input.temperatureUnit ?? 'K',
    notes: input.notes ?? '',
    status: input.status ?? 'draft',
    tags,
    model: input.model ?? 'marcus',
    parameters,
  };
}
