import {
  PARAMETER_KINDS,
  type Pair,
  type PairFieldDifference,
  type ParameterKind,
} from '@gapwise/contracts';

const SCALAR_FIELDS = [
  'name',
  'donor',
  'acceptor',
  'medium',
  'temperature',
  'temperatureUnit',
  'notes',
  'status',
  'model',
] as const;
/** The labels of the pair form, for the version summary. */
const FIELD_LABELS: Readonly<Record<string, string>> = {
  name: 'name',
  donor: 'donor',
  acceptor: 'acceptor',
  medium: 'medium',
  temperature: 'temperature',
  temperatureUnit: 'temperature unit',
  notes: 'notes',
  status: 'status',
  model: 'rate model',
  tags: 'tags',
};
const PARAMETER_FIELDS = ['value', 'unit', 'uncertainty', 'provenance'] as const;
const RESULT_FIELDS = ['k', 'log10k', 'activationFreeEnergy', 'regime'] as const;

const same = (a: unknown, b: unknown) => JSON.stringify(a ?? null) === JSON.stringify(b ?? null);

/**
 * Field-by-field differences between two states of a pair. Parameters are matched by kind
 * (`parameters.coupling.value`); a parameter only on one side is reported as a whole.
 */
export function diffPairs(from: Pair, to: Pair): PairFieldDifference[] {
  const out: PairFieldDifference[] = [];
  for (const f of SCALAR_FIELDS) {
    if (!same(from[f], to[f])) out.push({ field: f, from: from[f] ?? null, to: to[f] ?? null });
  }
  const tagsFrom = [...(from.tags ?? [])].sort();
  const tagsTo = [...(to.tags ?? [])].sort();
  if (!same(tagsFrom, tagsTo)) out.push({ field: 'tags', from: from.tags, to: to.tags });
  const kinds = [
    ...new Set([...from.parameters.map((p) => p.kind), ...to.parameters.map((p) => p.kind)]),
  ];
  for (const kind of kinds) {
    const a = from.parameters.find((p) => p.kind === kind);
    const b = to.parameters.find((p) => p.kind === kind);
    if (!a || !b) {
      out.push({ field: `parameters.${kind}`, from: a ?? null, to: b ?? null });
      continue;
    }
    for (const f of PARAMETER_FIELDS) {
      if (!same(a[f], b[f]))
        out.push({ field: `parameters.${kind}.${f}`, from: a[f] ?? null, to: b[f] ?? null });
    }
  }
  for (const f of RESULT_FIELDS) {
    const a = from.results?.[f] ?? null;
    const b = to.results?.[f] ?? null;
    if (!same(a, b)) out.push({ field: `results.${f}`, from: a, to: b });
  }
  return out;
}

/** One line for the version list, e.g. "changed name, temperature; parameters: coupling". */
export function summariseChange(before: Pair | null, after: Pair, action?: string): string {
  if (!before) return action ?? 'created';
  const diffs = diffPairs(before, after).filter((d) => !d.field.startsWith('results.'));
  if (action) return action;
  if (diffs.length === 0) return 'saved without changes';
  const plain = diffs.filter((d) => !d.field.startsWith('parameters.')).map((d) => d.field);
  const params = [
    ...new Set(
      diffs.filter((d) => d.field.startsWith('parameters.')).map((d) => d.field.split('.')[1]),
    ),
  ];
  // Written with the labels the user sees (the version list shows this sentence).
  const parts: string[] = [];
  if (plain.length) parts.push(`changed ${plain.map((f) => FIELD_LABELS[f] ?? f).join(', ')}`);
  if (params.length) {
    const labels = params.map((k) => PARAMETER_KINDS[k as ParameterKind]?.label ?? k);
    parts.push(`parameters: ${labels.join(', ')}`);
  }
  return parts.join('; ');
}
