/**
 * The columns of a screen CSV: names, physical quantities, canonical units and the header
 * syntax `name [unit]`. Units in brackets are any unit the calculation core accepts for that
 * quantity (CALC-API.md); conversion goes through the core's one units module.
 */
import { allowedUnits, canonicalUnit, isUnitFor, toCanonical, type Quantity } from '@gapwise/calc';

export type ColumnQuantity = Extract<
  Quantity,
  | 'energy'
  | 'potential'
  | 'distance'
  | 'temperature'
  | 'inverseDistance'
  | 'dimensionless'
  | 'string'
>;

export interface ColumnSpec {
  readonly key: ScreenColumnKey;
  readonly quantity: ColumnQuantity;
  readonly required: boolean;
  /** Unit written in the template header ('' for unitless). */
  readonly templateUnit: string;
  readonly description: string;
  /** Value in the template's example row (as typed in templateUnit). */
  readonly example: string;
}

export const NUMERIC_KEYS = [
  'donorOxidation',
  'acceptorReduction',
  'excitationEnergy',
  'distance',
  'radiusDonor',
  'radiusAcceptor',
  'epsilon',
  'refractiveIndex',
  'epsilonReference',
  'chargeDonor',
  'chargeAcceptor',
  'lambdaInner',
  'lambdaOuter',
  'coupling',
  'coupling0',
  'distance0',
  'beta',
  'hbarOmega',
  'temperature',
] as const;
export type NumericKey = (typeof NUMERIC_KEYS)[number];
export type ScreenColumnKey = 'donor' | 'acceptor' | 'solvent' | NumericKey;

/** Every column, in template order. Optional columns may be left out of the header. */
export const SCREEN_COLUMNS: readonly ColumnSpec[] = [
  {
    key: 'donor',
    quantity: 'string',
    required: true,
    templateUnit: '',
    example: 'Med-1',
    description: 'Donor code',
  },
  {
    key: 'acceptor',
    quantity: 'string',
    required: true,
    templateUnit: '',
    example: 'Med-2',
    description: 'Acceptor code',
  },
  {
    key: 'donorOxidation',
    quantity: 'potential',
    required: true,
    templateUnit: 'V',
    example: '0.95',
    description: 'E_ox(D⁺/D), same reference electrode and solvent as the acceptor',
  },
  {
    key: 'acceptorReduction',
    quantity: 'potential',
    required: true,
    templateUnit: 'V',
    example: '-1.10',
    description: 'E_red(A/A⁻)',
  },
  {
    key: 'excitationEnergy',
    quantity: 'energy',
    required: true,
    templateUnit: 'eV',
    example: '2.45',
    description: '0–0 excitation energy E₀₀ of the excited partner',
  },
  {
    key: 'distance',
    quantity: 'distance',
    required: true,
    templateUnit: 'A',
    example: '7.0',
    description: 'Centre-to-centre distance R',
  },
  {
    key: 'radiusDonor',
    quantity: 'distance',
    required: false,
    templateUnit: 'A',
    example: '3.5',
    description: 'Donor radius (two-sphere λ_outer, Weller correction)',
  },
  {
    key: 'radiusAcceptor',
    quantity: 'distance',
    required: false,
    templateUnit: 'A',
    example: '3.5',
    description: 'Acceptor radius',
  },
  {
    key: 'solvent',
    quantity: 'string',
    required: false,
    templateUnit: '',
    example: 'acetonitrile',
    description: 'A solvent of the built-in table, or empty and give epsilon and refractiveIndex',
  },
  {
    key: 'epsilon',
    quantity: 'dimensionless',
    required: false,
    templateUnit: '',
    example: '',
    description: 'Static dielectric constant ε_s (overrides the table)',
  },
  {
    key: 'refractiveIndex',
    quantity: 'dimensionless',
    required: false,
    templateUnit: '',
    example: '',
    description: 'Refractive index n (overrides the table)',
  },
  {
    key: 'epsilonReference',
    quantity: 'dimensionless',
    required: false,
    templateUnit: '',
    example: '',
    description:
      'ε of the solvent the potentials were measured in (Weller correction; needs radii)',
  },
  {
    key: 'chargeDonor',
    quantity: 'dimensionless',
    required: false,
    templateUnit: '',
    example: '',
    description: 'Charge z_D of the donor before transfer (Coulomb work, Born term); empty = 0',
  },
  {
    key: 'chargeAcceptor',
    quantity: 'dimensionless',
    required: false,
    templateUnit: '',
    example: '',
    description: 'Charge z_A of the acceptor before transfer; empty = 0',
  },
  {
    key: 'lambdaInner',
    quantity: 'energy',
    required: true,
    templateUnit: 'eV',
    example: '0.15',
    description: 'Inner-sphere reorganization energy (the quantum mode part for MLJ)',
  },
  {
    key: 'lambdaOuter',
    quantity: 'energy',
    required: false,
    templateUnit: 'eV',
    example: '',
    description: 'Outer-sphere λ; empty = two-sphere estimate from radii, R, ε_s, n',
  },
  {
    key: 'coupling',
    quantity: 'energy',
    required: false,
    templateUnit: 'cm-1',
    example: '80',
    description: '|H_AB|; empty = distance decay from coupling0, distance0, beta',
  },
  {
    key: 'coupling0',
    quantity: 'energy',
    required: false,
    templateUnit: 'cm-1',
    example: '',
    description: 'Coupling at contact distance0 (distance decay)',
  },
  {
    key: 'distance0',
    quantity: 'distance',
    required: false,
    templateUnit: 'A',
    example: '',
    description: 'Contact distance of coupling0',
  },
  {
    key: 'beta',
    quantity: 'inverseDistance',
    required: false,
    templateUnit: 'A-1',
    example: '',
    description: 'Decay constant β of the rate (coupling decays with β/2)',
  },
  {
    key: 'hbarOmega',
    quantity: 'energy',
    required: false,
    templateUnit: 'eV',
    example: '0.18',
    description: 'Effective quantum mode ħω; given = MLJ rates as well',
  },
  {
    key: 'temperature',
    quantity: 'temperature',
    required: true,
    templateUnit: 'K',
    example: '298.15',
    description: 'Temperature',
  },
];

const BY_LOWER_KEY = new Map(SCREEN_COLUMNS.map((c) => [c.key.toLowerCase(), c]));

/** The downloadable template: header with units and one example row. */
export function templateCsv(): string {
  const header = SCREEN_COLUMNS.map((c) =>
    c.templateUnit ? `${c.key} [${c.templateUnit}]` : c.key,
  );
  const example = SCREEN_COLUMNS.map((c) => c.example);
  return `${header.join(',')}\n${example.join(',')}\n`;
}

/** A header cell resolved to a column with a linear conversion to the canonical unit. */
export interface ResolvedColumn {
  readonly spec: ColumnSpec;
  /** Position in the CSV row. */
  readonly index: number;
  readonly unit: string;
  /** canonical = raw × scale + offset. */
  readonly scale: number;
  readonly offset: number;
}

export interface HeaderProblem {
  readonly line: number;
  readonly message: string;
}

/**
 * Resolves the header row: `name` or `name [unit]`, names case-insensitive. Unknown or
 * duplicate names, refused units and missing required columns are all reported.
 */
export function resolveHeader(
  cells: readonly string[],
):
  | { ok: true; columns: ResolvedColumn[]; width: number }
  | { ok: false; problems: HeaderProblem[] } {
  const problems: string[] = [];
  const columns: ResolvedColumn[] = [];
  const seen = new Set<string>();
  cells.forEach((raw, index) => {
    const match = /^\s*([A-Za-z0-9_]+)\s*(?:\[\s*([^\]]*?)\s*\])?\s*$/.exec(raw);
    if (!match) {
      problems.push(`column ${index + 1}: cannot read header '${raw}'; write name or name [unit]`);
      return;
    }
    const spec = BY_LOWER_KEY.get(match[1].toLowerCase());
    if (!spec) {
      problems.push(`column ${index + 1}: unknown column '${match[1]}'`);
      return;
    }
    if (seen.has(spec.key)) {
      problems.push(`column ${index + 1}: '${spec.key}' appears twice`);
      return;
    }
    seen.add(spec.key);
    const unit = match[2] ?? '';
    if (spec.quantity === 'string' || spec.quantity === 'dimensionless') {
      if (unit !== '') problems.push(`column ${index + 1}: '${spec.key}' takes no unit`);
      columns.push({ spec, index, unit: '', scale: 1, offset: 0 });
      return;
    }
    // A bare name means the canonical unit, like a bare number in a calculation request.
    const typed = unit === '' ? canonicalUnit(spec.quantity) : unit;
    if (!isUnitFor(typed, spec.quantity)) {
      problems.push(
        `column ${index + 1}: Unrecognised unit '${typed}' for '${spec.key}' (${spec.quantity}); ` +
          `use one of ${allowedUnits(spec.quantity).join(', ')}`,
      );
      return;
    }
    const offset = toCanonical(0, typed, spec.quantity);
    const scale = toCanonical(1, typed, spec.quantity) - offset;
    columns.push({ spec, index, unit: typed, scale, offset });
  });
  for (const spec of SCREEN_COLUMNS) {
    if (spec.required && !seen.has(spec.key))
      problems.push(`missing required column '${spec.key}'`);
  }
  if (problems.length > 0)
    return { ok: false, problems: problems.map((message) => ({ line: 1, message })) };
  return { ok: true, columns, width: cells.length };
}
