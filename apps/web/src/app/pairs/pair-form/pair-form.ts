import { FormControl, FormGroup, Validators } from '@angular/forms';
import {
  PARAMETER_KINDS,
  type Pair,
  type PairInput,
  type PairParameter,
  type PairRateSource,
  type PairStatus,
  type ParameterKind,
  type Provenance,
  type ProvenanceKind,
  type RateModel,
  potentialFromShe,
  potentialToShe,
  referencedPotentialUnit,
  splitPotentialUnit,
  temperaturePlausibility,
  withinLowerBound,
} from '@gapwise/contracts';
import type { Quantity } from '@gapwise/calc';
import { QuantityGroup, QuantitySpec, ValueRule, createQuantityGroup } from './quantity-control';

export type ProvenanceGroup = FormGroup<{
  kind: FormControl<ProvenanceKind>;
  citation: FormControl<string>;
  note: FormControl<string>;
  methodId: FormControl<string | null>;
  methodInputs: FormControl<Record<string, unknown> | null>;
  /** The records a derived value came from (trace analysis, series, screen), kept on save. */
  sources: FormControl<Provenance['sources']>;
}>;

export type ParameterGroup = QuantityGroup & {
  readonly controls: QuantityGroup['controls'] & {
    provenance: ProvenanceGroup;
    /**
     * Potentials only: the scale code (`SCE`, `Fc/MeCN`) the value is typed against, '' when not
     * stated. The form keeps the value on that scale; the contract stores it vs SHE.
     */
    reference: FormControl<string>;
  };
};

/** Each kind's lower bound (the pair model's, as the API checks on save), in words. */
function bounded(kind: ParameterKind, message: string): ValueRule {
  return (v) => (withinLowerBound(kind, v) ? null : message);
}
const REORGANIZATION = 'Reorganization energy must not be negative.';
const DISTANCE = 'Radii and distances must be > 0.';

/** Domain rules of VALIDATION.md part A that a single field can check. */
const RULES: Partial<Record<ParameterKind, ValueRule>> = {
  lambdaTotal: bounded('lambdaTotal', REORGANIZATION),
  lambdaInner: bounded('lambdaInner', REORGANIZATION),
  lambdaOuter: bounded('lambdaOuter', REORGANIZATION),
  hbarOmega: bounded('hbarOmega', 'Mode energy must be > 0.'),
  tauL: bounded('tauL', 'must be greater than 0.'),
  distance: bounded('distance', DISTANCE),
  edgeDistance: bounded('edgeDistance', 'must not be negative.'),
  radiusDonor: bounded('radiusDonor', DISTANCE),
  radiusAcceptor: bounded('radiusAcceptor', DISTANCE),
  excitationEnergy: bounded('excitationEnergy', 'must be greater than 0.'),
  epsilonStatic: bounded('epsilonStatic', 'must be at least 1.'),
  epsilonMeasurement: bounded('epsilonMeasurement', 'must be at least 1.'),
  refractiveIndex: bounded('refractiveIndex', 'must be at least 1.'),
};

/** Default unit offered for a new parameter of each kind. */
const DEFAULT_UNITS: Partial<Record<ParameterKind, string>> = { tauL: 'ps', coupling: 'cm-1' };

export function parameterSpec(kind: ParameterKind): QuantitySpec {
  const def = PARAMETER_KINDS[kind];
  return { label: def.label, quantity: def.quantity as Quantity, rule: RULES[kind] };
}

export const TEMPERATURE_SPEC: QuantitySpec = {
  label: 'Temperature',
  quantity: 'temperature',
  required: true,
  rule: (v) => (v > 0 ? null : 'Temperature must be > 0 K (absolute). Did you enter °C?'),
  warn: temperaturePlausibility,
};

export function defaultUnit(kind: ParameterKind): string {
  const q = PARAMETER_KINDS[kind].quantity;
  return (
    DEFAULT_UNITS[kind] ??
    ({ energy: 'eV', time: 's', distance: 'A', potential: 'V' } as Record<string, string>)[q] ??
    ''
  );
}

export function createParameterGroup(kind: ParameterKind, p?: PairParameter): ParameterGroup {
  const isPotential = PARAMETER_KINDS[kind].quantity === 'potential';
  const split = isPotential && p ? splitPotentialUnit(p.unit) : null;
  const code = split?.valid ? split.code : null;
  const group = createQuantityGroup(parameterSpec(kind), {
    value: p ? potentialFromShe(p.value, code) : null,
    unit: (split ? split.unit : p?.unit) || defaultUnit(kind),
    uncertainty: p?.uncertainty ?? null,
    // A derived value reads with the digits it supports; the stored full value is kept.
    rounded: p?.provenance.kind === 'derived',
  }) as unknown as FormGroup;
  group.addControl('reference', new FormControl(code ?? '', { nonNullable: true }));
  const prov = p?.provenance;
  group.addControl(
    'provenance',
    new FormGroup({
      kind: new FormControl<ProvenanceKind>(prov?.kind ?? 'assumed', { nonNullable: true }),
      citation: new FormControl(prov?.citation ?? '', { nonNullable: true }),
      note: new FormControl(prov?.note ?? '', { nonNullable: true }),
      methodId: new FormControl<string | null>(prov?.methodId ?? null),
      methodInputs: new FormControl<Record<string, unknown> | null>(prov?.methodInputs ?? null),
      sources: new FormControl<Provenance['sources']>(prov?.sources ?? null),
    }),
  );
  return group as unknown as ParameterGroup;
}

export const PARAMETER_ORDER = Object.keys(PARAMETER_KINDS) as ParameterKind[];

export type ParametersGroup = FormGroup<Record<ParameterKind, ParameterGroup>>;

export type PairForm = FormGroup<{
  name: FormControl<string>;
  donor: FormControl<string>;
  acceptor: FormControl<string>;
  medium: FormControl<string>;
  notes: FormControl<string>;
  status: FormControl<PairStatus>;
  tags: FormControl<string>;
  model: FormControl<RateModel>;
  temperature: QuantityGroup;
  parameters: ParametersGroup;
}>;

/** A typed form for a pair (or a new one, at 298.15 K with the classical Marcus model). */
export function createPairForm(pair?: Pair | null): PairForm {
  const params = {} as Record<ParameterKind, ParameterGroup>;
  for (const kind of PARAMETER_ORDER) {
    params[kind] = createParameterGroup(
      kind,
      pair?.parameters.find((p) => p.kind === kind),
    );
  }
  return new FormGroup({
    name: new FormControl(pair?.name ?? '', {
      nonNullable: true,
      validators: [Validators.required],
    }),
    donor: new FormControl(pair?.donor ?? '', {
      nonNullable: true,
      validators: [Validators.required],
    }),
    acceptor: new FormControl(pair?.acceptor ?? '', {
      nonNullable: true,
      validators: [Validators.required],
    }),
    medium: new FormControl(pair?.medium ?? '', { nonNullable: true }),
    notes: new FormControl(pair?.notes ?? '', { nonNullable: true }),
    status: new FormControl<PairStatus>(pair?.status ?? 'draft', { nonNullable: true }),
    tags: new FormControl((pair?.tags ?? []).join(', '), { nonNullable: true }),
    model: new FormControl<RateModel>(pair?.model ?? 'marcus', { nonNullable: true }),
    temperature: createQuantityGroup(TEMPERATURE_SPEC, {
      value: pair?.temperature ?? 298.15,
      unit: pair?.temperatureUnit || 'K',
    }),
    parameters: new FormGroup(params),
  });
}

/** The parameters that carry a value, in the contract's shape. */
export function parametersOf(form: PairForm): PairParameter[] {
  const out: PairParameter[] = [];
  for (const kind of PARAMETER_ORDER) {
    const g = form.controls.parameters.controls[kind];
    const value = g.controls.value.value;
    if (value === null || g.controls.text.value.trim() === '') continue;
    const p = g.controls.provenance.getRawValue();
    const reference = g.controls.reference.value || null;
    const potential = PARAMETER_KINDS[kind].quantity === 'potential';
    out.push({
      kind,
      // Converted by the core's reference-electrode offsets (drivingForce.reference): vs SHE.
      value: potential ? potentialToShe(value, reference) : value,
      unit: potential
        ? referencedPotentialUnit(g.controls.unit.value, reference)
        : g.controls.unit.value,
      uncertainty:
        g.controls.uncertaintyText.value.trim() === '' ? null : g.controls.uncertainty.value,
      provenance: {
        kind: p.kind,
        citation: p.citation.trim() || null,
        note: p.note.trim() || null,
        methodId: p.kind === 'derived' ? p.methodId : null,
        methodInputs: p.kind === 'derived' ? p.methodInputs : null,
        sources: p.kind === 'derived' ? p.sources : null,
      },
    });
  }
  return out;
}

/** The body of create / update. */
export function pairInputOf(form: PairForm): PairInput {
  const v = form.getRawValue();
  return {
    name: v.name.trim(),
    donor: v.donor.trim(),
    acceptor: v.acceptor.trim(),
    medium: v.medium.trim(),
    notes: v.notes,
    status: v.status,
    tags: v.tags
      .split(',')
      .map((t) => t.trim())
      .filter((t) => t.length > 0),
    model: v.model,
    temperature: v.temperature.value ?? Number.NaN,
    temperatureUnit: v.temperature.unit,
    parameters: parametersOf(form),
  };
}

/** What the rate depends on, for `computePairResults` (the same call the server makes). */
export function rateSourceOf(form: PairForm): PairRateSource {
  return {
    temperature: form.controls.temperature.controls.value.value ?? Number.NaN,
    model: form.controls.model.value,
    parameters: parametersOf(form).map((p) => ({
      kind: p.kind,
      value: p.value,
      uncertainty: p.uncertainty,
    })),
  };
}

/** Stable text of what would be saved, to tell whether anything changed since the last save. */
export function snapshotOf(form: PairForm): string {
  return JSON.stringify(pairInputOf(form));
}
