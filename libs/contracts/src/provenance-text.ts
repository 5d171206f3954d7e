import { methodCatalog } from '@gapwise/calc';
import type { Provenance } from './pairs';

/**
 * Provenance as a sentence a reader follows: "Derived with the generalized Mulliken–Hush helper
 * from adiabatic transition dipole μ₁₂ = 1.1 D, …", "Derived from a trace analysis of
 * reactant.dat and product.dat at 300 K", never the stored JSON, record ids or file hashes.
 * One renderer for the report page, the pair page's tooltip, the PDF and the CSV export: the
 * parts carry links (to a trace analysis, a series, a screen) that the web page draws as links
 * and the PDF and CSV print as their text.
 */

/** A record a provenance sentence links to. */
export interface ProvenanceLink {
  readonly type: 'trace-analysis' | 'series' | 'screen';
  readonly id: string;
}

/** One run of a provenance sentence: text (with the subscript markup of rich-text.ts), maybe linked. */
export interface ProvenancePart {
  readonly text: string;
  readonly link?: ProvenanceLink;
  /** A name someone typed (file or series name): drawn as is, no subscript markup. */
  readonly verbatim?: boolean;
}

const MINUS = '\u2212';

/** The helpers' names as the pair page's derivation menu calls them. */
const HELPER_NAMES: Readonly<Record<string, string>> = {
  'drivingForce.rehmWeller': 'Rehm–Weller',
  'drivingForce.reference': 'reference-electrode conversion',
  'reorg.twoSphere': 'two-sphere continuum',
  'reorg.fourPoint': 'four-point',
  'reorg.normalModes': 'normal-mode',
  'coupling.gmh': 'generalized Mulliken–Hush',
  'coupling.hush': 'Hush charge-transfer band',
  'coupling.distanceDecay': 'distance-decay',
};

const KIND_WORDS: Readonly<Record<string, string>> = {
  measured: 'Measured',
  computed: 'Computed',
  literature: 'From the literature',
  derived: 'Derived',
  assumed: 'Assumed',
};

/** Stored ids and fingerprints: never printed. */
const HIDDEN_INPUT = /(Id|Sha256|Version)$/;

type CatalogInput = { label: string; unit: string };
let catalog: Map<string, { summary: string; inputs: Map<string, CatalogInput> }> | null = null;

function method(methodId: string) {
  catalog ??= new Map(
    methodCatalog().map((m) => [
      m.id,
      { summary: m.summary, inputs: new Map(m.inputs.map((i) => [i.name, i])) },
    ]),
  );
  return catalog.get(methodId);
}

/** The helper's name ("generalized Mulliken–Hush"), else the method's one-line summary. */
export function helperName(methodId: string): string {
  return HELPER_NAMES[methodId] ?? method(methodId)?.summary.replace(/\.$/, '') ?? methodId;
}

/** First letter in lower case unless the label starts with a symbol or acronym ("E_ox", "ΔE°"). */
function inSentence(label: string): string {
  return /^[A-Z][a-z]/.test(label) ? label.charAt(0).toLowerCase() + label.slice(1) : label;
}

/** Display form of a unit string (A → Å, cm-1 → cm⁻¹); kept local so this file needs no formatter. */
const UNITS: Readonly<Record<string, string>> = {
  A: 'Å',
  'A-1': 'Å⁻¹',
  'cm-1': 'cm⁻¹',
  degC: '°C',
  's-1': 's⁻¹',
  'M-1 s-1': 'M⁻¹ s⁻¹',
  'M-1 cm-1': 'M⁻¹ cm⁻¹',
  'Pa*s': 'Pa s',
  'e*A': 'e Å',
};

/** Up to 6 significant figures, trailing zeros dropped, U+2212 minus, scientific outside 10⁻³…10⁶. */
function numberText(x: number): string {
  const abs = Math.abs(x);
  let text: string;
  if (x !== 0 && (abs < 1e-3 || abs >= 1e6)) {
    const [m, e] = x.toExponential(5).split('e');
    const exp = String(Number(e))
      .split('')
      .map((c) => '⁰¹²³⁴⁵⁶⁷⁸⁹'['0123456789'.indexOf(c)] ?? (c === '-' ? '⁻' : c))
      .join('');
    text = `${m.replace(/\.?0+$/, '')} × 10${exp}`;
  } else {
    text = String(Number(x.toPrecision(6)));
  }
  return text.startsWith('-') ? MINUS + text.slice(1) : text;
}

function quantityText(value: number, unit: string): string {
  const u = UNITS[unit] ?? unit;
  return u ? `${numberText(value)} ${u}` : numberText(value);
}

/**
 * One method input as "label = value unit": a bare number is in the method's canonical unit, a
 * `{ value, unit }` as typed keeps its unit, text (a reference electrode) is printed as is.
 * Anything else (arrays of modes, missing values) is left out rather than dumped as JSON.
 */
function inputText(methodId: string, name: string, value: unknown): string | null {
  if (HIDDEN_INPUT.test(name)) return null;
  const input = method(methodId)?.inputs.get(name);
  // "Absolute temperature, to flag modes …": the label up to its first comma names the input.
  const label = input ? inSentence(input.label.split(',')[0]) : name;
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) return null;
    return `${label} = ${quantityText(value, input?.unit ?? '')}`;
  }
  if (typeof value === 'string') return value.trim() ? `${label} = ${value.trim()}` : null;
  if (value && typeof value === 'object' && 'value' in value) {
    const q = value as { value: unknown; unit?: unknown };
    const unit = typeof q.unit === 'string' ? q.unit : (input?.unit ?? '');
    if (typeof q.value === 'number' && Number.isFinite(q.value))
      return `${label} = ${quantityText(q.value, unit)}`;
    if (typeof q.value === 'string' && q.value.trim())
      return `${label} = ${q.value.trim()}${unit ? ` ${UNITS[unit] ?? unit}` : ''}`;
  }
  return null;
}

function linkOf(p: Provenance, type: ProvenanceLink['type']): ProvenanceLink | undefined {
  const s = p.sources?.find((x) => x.type === type);
  return s ? { type, id: s.id } : undefined;
}

const str = (v: unknown): string | null => (typeof v === 'string' && v.trim() ? v.trim() : null);
const num = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);

const ESTIMATORS: Readonly<Record<string, string>> = {
  lambdaFromMeans: 'λ from the mean gaps of both states',
  deltaG0FromMeans: 'ΔG° from the mean gaps of both states',
};

/** "λ and ΔG° from a trace analysis of reactant.dat and product.dat at 300 K". */
function traceParts(p: Provenance): ProvenancePart[] {
  const inputs = p.methodInputs ?? {};
  const link =
    linkOf(p, 'trace-analysis') ??
    (str(inputs['analysisId'])
      ? { type: 'trace-analysis' as const, id: str(inputs['analysisId'])! }
      : undefined);
  // File names: stored beside the ids since the analysis records them; older values carry them
  // only in the note "From energy-gap samples (a.dat, b.dat) at 300 K".
  let files = [str(inputs['reactantFileName']), str(inputs['productFileName'])].filter(
    (f): f is string => f !== null,
  );
  if (files.length === 0 && p.note) {
    const m = /energy-gap samples \((.+), (.+)\) at/.exec(p.note);
    if (m) files = [m[1], m[2]];
  }
  const parts: ProvenancePart[] = [{ text: 'Derived from a ' }];
  parts.push({ text: 'trace analysis', link });
  if (files.length === 2) {
    parts.push({ text: ' of the energy-gap samples ' });
    parts.push({ text: files[0], verbatim: true });
    parts.push({ text: ' (reactant state) and ' });
    parts.push({ text: files[1], verbatim: true });
    parts.push({ text: ' (product state)' });
  } else parts.push({ text: ' of energy-gap samples of both states' });
  const details: string[] = [];
  const t = num(inputs['temperature']);
  if (t !== null) details.push(`at ${quantityText(t, 'K')}`);
  const estimator = str(inputs['estimator']);
  if (estimator) details.push(ESTIMATORS[estimator] ?? estimator);
  const nr = num(inputs['reactantSamples']);
  const np = num(inputs['productSamples']);
  if (nr !== null && np !== null) details.push(`${nr} and ${np} samples`);
  const skipped = num(inputs['skippedLines']);
  if (skipped) details.push(`${skipped} bad line${skipped === 1 ? '' : 's'} skipped`);
  if (details.length) parts.push({ text: `, ${details.join(', ')}` });
  const warnings = p.note ? /warnings: (.+)$/.exec(p.note)?.[1] : undefined;
  if (warnings) parts.push({ text: `; analysis warnings: ${warnings.replace(/-/g, ' ')}` });
  return parts;
}

const FIT_MODELS: Readonly<Record<string, string>> = {
  marcus: 'classical Marcus',
  mlj: 'Marcus–Levich–Jortner',
};

/** "Fitted to the driving-force series "Quinones in MeCN" (classical Marcus, 6 points) at 298 K". */
function seriesParts(p: Provenance): ProvenancePart[] {
  const inputs = p.methodInputs ?? {};
  const name = str(inputs['seriesName']) ?? (p.note ? /series "(.+)"/.exec(p.note)?.[1] : null);
  const details: string[] = [];
  const model = str(inputs['model']);
  if (model) details.push(FIT_MODELS[model] ?? model);
  const points = num(inputs['points']);
  if (points !== null) details.push(`${points} points`);
  const t = num(inputs['temperature']);
  return [
    { text: 'Fitted to the driving-force ' },
    { text: name ? `series “${name}”` : 'series', link: linkOf(p, 'series'), verbatim: true },
    { text: `${details.length ? ` (${details.join(', ')})` : ''}` },
    ...(t !== null ? [{ text: ` at ${quantityText(t, 'K')}` }] : []),
  ];
}

/** "Derived with the generalized Mulliken–Hush helper from … = … D, …". */
function helperParts(p: Provenance): ProvenancePart[] {
  const id = p.methodId!;
  const inputs = Object.entries(p.methodInputs ?? {})
    .map(([k, v]) => inputText(id, k, v))
    .filter((t): t is string => t !== null);
  const how = HELPER_NAMES[id]
    ? `Derived with the ${HELPER_NAMES[id]} helper`
    : method(id)
      ? `Derived by ${inSentence(helperName(id))}`
      : `Derived by ${id}`;
  return [{ text: inputs.length ? `${how} from ${inputs.join(', ')}` : how }];
}

/** A note, linked to the screen it names when the value came from a screen row. */
function noteParts(p: Provenance): ProvenancePart[] {
  const note = p.note?.trim();
  if (!note) return [];
  const screen = linkOf(p, 'screen');
  return [{ text: note.replace(/\.$/, ''), link: screen }];
}

/** The provenance as runs of text with links, in reading order. */
export function provenanceParts(p: Provenance): ProvenancePart[] {
  const parts: ProvenancePart[] = [];
  const sep = () => parts.length > 0 && parts.push({ text: '. ' });
  if (p.kind === 'derived' && p.methodId === 'reorg.gapSamples') {
    parts.push(...traceParts(p));
  } else if (p.kind === 'derived' && p.methodId === 'fit.drivingForceSeries') {
    parts.push(...seriesParts(p));
  } else if (p.kind === 'derived' && p.methodId) {
    parts.push(...helperParts(p));
    const note = noteParts(p);
    if (note.length) {
      sep();
      parts.push(...note);
    }
  } else {
    const word = KIND_WORDS[p.kind] ?? p.kind;
    const citation = p.citation?.trim();
    const note = noteParts(p);
    if (citation) parts.push({ text: `${word}: ${citation}` });
    else parts.push({ text: note.length ? `${word}: ` : word });
    if (citation && note.length) parts.push({ text: '. ' });
    parts.push(...note);
  }
  const last = parts[parts.length - 1];
  if (last && !/[.!?]$/.test(last.text)) parts.push({ text: '.' });
  return parts;
}

/** The provenance sentence as plain text (PDF, CSV, tooltips). */
export function provenanceText(p: Provenance): string {
  return provenanceParts(p)
    .map((x) => x.text)
    .join('');
}

/** The web app's path of a linked record. */
export function provenanceHref(link: ProvenanceLink, workspaceId: string): string {
  const base = `/w/${encodeURIComponent(workspaceId)}`;
  const id = encodeURIComponent(link.id);
  switch (link.type) {
    case 'trace-analysis':
      return `${base}/trace-analyses/${id}`;
    case 'series':
      return `${base}/series/${id}`;
    case 'screen':
      return `${base}/screens/${id}`;
  }
}
