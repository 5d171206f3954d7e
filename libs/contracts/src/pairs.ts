/**
 * Donor–acceptor pairs and their parameters, as the API sends and receives them.
 * Values are canonical (eV, Å, K, V, s, debye, cm⁻¹ for band data, Pa s); `unit` is the unit the
 * user typed, kept for display. Unit names are those of CALC-API.md.
 */

/** Parameter kinds a pair may carry; each maps to one physical quantity. */
export const PARAMETER_KINDS = {
  deltaG0: { label: 'Driving force ΔG°', quantity: 'energy' },
  deltaG0Recombination: { label: 'Recombination ΔG°', quantity: 'energy' },
  lambdaTotal: { label: 'Total reorganization energy λ', quantity: 'energy' },
  lambdaInner: { label: 'Inner reorganization energy λᵢ', quantity: 'energy' },
  lambdaOuter: { label: 'Outer reorganization energy λₒ', quantity: 'energy' },
  coupling: { label: 'Electronic coupling |H_AB|', quantity: 'energy' },
  hbarOmega: { label: 'Effective mode energy ħω', quantity: 'energy' },
  tauL: { label: 'Longitudinal relaxation time τ_L', quantity: 'time' },
  distance: { label: 'Centre-to-centre distance R', quantity: 'distance' },
  edgeDistance: { label: 'Edge-to-edge distance', quantity: 'distance' },
  radiusDonor: { label: 'Donor radius', quantity: 'distance' },
  radiusAcceptor: { label: 'Acceptor radius', quantity: 'distance' },
  donorOxidation: { label: 'Donor oxidation potential', quantity: 'potential' },
  acceptorReduction: { label: 'Acceptor reduction potential', quantity: 'potential' },
  epsilonMeasurement: {
    label: 'Measurement-solvent ε (of the potentials)',
    quantity: 'dimensionless',
  },
  // An energy of light: also typed as a wavelength in nm (E = 1239.84198/λ eV, SCIENCE.md §4).
  excitationEnergy: { label: 'Excitation energy E₀₀', quantity: 'photonEnergy' },
  epsilonStatic: { label: 'Static dielectric constant ε_s', quantity: 'dimensionless' },
  refractiveIndex: { label: 'Refractive index n', quantity: 'dimensionless' },
} as const;

export type ParameterKind = keyof typeof PARAMETER_KINDS;

export const PROVENANCE_KINDS = [
  'measured',
  'computed',
  'literature',
  'derived',
  'assumed',
] as const;
export type ProvenanceKind = (typeof PROVENANCE_KINDS)[number];

export interface Provenance {
  readonly kind: ProvenanceKind;
  /** Required when kind is `literature`. */
  readonly citation?: string | null;
  /** For `derived`: the Gapwise method id, its inputs, and the source records it came from. */
  readonly methodId?: string | null;
  readonly methodInputs?: Record<string, unknown> | null;
  readonly sources?: ReadonlyArray<{ readonly type: string; readonly id: string }> | null;
  readonly note?: string | null;
}

export interface PairParameter {
  readonly kind: ParameterKind;
  /** Canonical value (eV, Å, K, V, s, …). */
  readonly value: number;
  /** Unit the user typed (CALC-API.md unit string); canonical unit when typed bare. */
  readonly unit: string;
  /** One standard deviation, canonical unit; null when not given. */
  readonly uncertainty: number | null;
  readonly provenance: Provenance;
}

export const PAIR_STATUSES = ['draft', 'active', 'archived'] as const;
export type PairStatus = (typeof PAIR_STATUSES)[number];

export const RATE_MODELS = ['marcus', 'mlj', 'mljThermal', 'crossover'] as const;
export type RateModel = (typeof RATE_MODELS)[number];

/** Body of create and update (update also carries `version`). */
export interface PairInput {
  readonly name: string;
  readonly donor: string;
  readonly acceptor: string;
  readonly medium: string;
  /** Kelvin. */
  readonly temperature: number;
  readonly temperatureUnit?: string;
  readonly notes?: string;
  readonly status?: PairStatus;
  readonly tags?: string[];
  readonly model?: RateModel;
  readonly parameters: PairParameter[];
}

export interface PairUpdate extends PairInput {
  /** The version the edit started from (optimistic locking); a stale one answers 409. */
  readonly version: number;
}

/** Results the server computed on the last save (same dispatcher as the CLI). */
export interface PairResults {
  readonly model: RateModel;
  readonly k: number | null;
  readonly log10k: number | null;
  readonly activationFreeEnergy: number | null;
  readonly regime: string | null;
  /**
   * nonadiabatic, intermediate or adiabatic (CALC-API.md `couplingRegime`); absent in results
   * stored before the core reported it.
   */
  readonly couplingRegime?: string | null;
  readonly warnings: ReadonlyArray<{ readonly code: string; readonly message: string }>;
  readonly errors: ReadonlyArray<{ readonly field: string; readonly message: string }>;
  /**
   * Charge recombination (ΔG°_CR with the same λ and |H_AB|), null when the pair states no
   * recombination ΔG°; absent in results stored before it was computed. `note` says which model
   * recombination used and why (pair-model.ts `recombinationModel`).
   */
  readonly recombination?: PairStepResults | null;
  /** log10(k_CS / k_CR): positive when separation outpaces recombination. */
  readonly log10Ratio?: number | null;
}

/** One step's results (used for charge recombination). */
export interface PairStepResults {
  readonly model: RateModel;
  readonly note: string;
  readonly k: number | null;
  readonly log10k: number | null;
  readonly activationFreeEnergy: number | null;
  readonly regime: string | null;
  readonly couplingRegime: string | null;
  readonly warnings: ReadonlyArray<{ readonly code: string; readonly message: string }>;
  readonly errors: ReadonlyArray<{ readonly field: string; readonly message: string }>;
}

export interface Pair extends PairInput {
  readonly id: string;
  readonly workspaceId: string;
  readonly version: number;
  readonly status: PairStatus;
  readonly tags: string[];
  readonly model: RateModel;
  readonly results: PairResults | null;
  readonly createdAt: string;
  readonly updatedAt: string;
  readonly updatedBy: { readonly id: string; readonly displayName: string } | null;
}

/** A row of the pairs table. */
export interface PairListItem {
  readonly id: string;
  readonly name: string;
  readonly donor: string;
  readonly acceptor: string;
  readonly status: PairStatus;
  readonly tags: string[];
  readonly deltaG0: number | null;
  readonly lambda: number | null;
  readonly coupling: number | null;
  readonly log10k: number | null;
  readonly regime: string | null;
  /** Charge recombination log10 k_CR and regime, when the pair states ΔG°_CR. */
  readonly log10kCr?: number | null;
  readonly regimeCr?: string | null;
  /** log10(k_CS / k_CR). */
  readonly log10Ratio?: number | null;
  readonly version: number;
  readonly updatedAt: string;
  readonly updatedBy: string | null;
}

export interface Page<T> {
  readonly items: T[];
  readonly total: number;
  readonly offset: number;
  readonly limit: number;
}

export interface PairVersionSummary {
  readonly version: number;
  readonly createdAt: string;
  readonly createdBy: string | null;
  readonly summary: string;
}

/** One difference between two versions of a pair (`GET /api/pairs/:id/compare`). */
export interface PairFieldDifference {
  /** `name`, `temperature`, `tags`, `parameters.<kind>[.value|.unit|.uncertainty|.provenance]`, `results.<field>`. */
  readonly field: string;
  readonly from: unknown;
  readonly to: unknown;
}

export interface PairComparison {
  readonly from: number;
  readonly to: number;
  readonly differences: PairFieldDifference[];
}

/** Query of `GET /api/workspaces/:wid/pairs`: sort keys (prefix `-` for descending). */
export const PAIR_SORT_KEYS = [
  'name',
  'donor',
  'acceptor',
  'updatedAt',
  'log10k',
  'deltaG0',
  'lambda',
  'coupling',
] as const;
export type PairSortKey = (typeof PAIR_SORT_KEYS)[number];

/**
 * Largest magnitude (canonical unit) accepted for an input of each quantity. These are refusal
 * bounds, far beyond anything physical, so that no real input reaches them while absurd values
 * (1e155 eV, which overflow k = exp(−(ΔG°+λ)²/4λk_BT) intermediates and the report's plots) are
 * refused at input. VALIDATION.md part B §9/§10 already *warn* from λ > 3 eV, |ΔG°| > 4 eV and
 * 20–1000 "eV" (kJ/mol or cm⁻¹ typed as eV); above 1000 eV no typing slip explains the value
 * (covalent bonds hold ~4 eV, core-electron binding in light atoms is a few hundred eV).
 * Distances: 10⁴ Å = 1 µm, a thousand times the longest measured tunnelling distances (~25 Å,
 * VALIDATION.md B23). Potentials: electrochemical windows span a few volts. τ_L: solvent
 * relaxation is ps–ns; 10³ s is no solvent. Dielectric constants of liquids stay below ~200.
 */
export const INPUT_MAGNITUDE_LIMITS: Readonly<Record<string, { max: number; unit: string }>> = {
  energy: { max: 1e3, unit: 'eV' },
  photonEnergy: { max: 1e3, unit: 'eV' },
  distance: { max: 1e4, unit: 'Å' },
  potential: { max: 1e2, unit: 'V' },
  time: { max: 1e3, unit: 's' },
  dimensionless: { max: 1e5, unit: '' },
};

/**
 * The refusal message for a value (canonical unit) beyond its quantity's magnitude limit, else
 * null. Also used for uncertainties and series points.
 */
export function magnitudeProblem(quantity: string, value: number): string | null {
  const limit = Object.hasOwn(INPUT_MAGNITUDE_LIMITS, quantity)
    ? INPUT_MAGNITUDE_LIMITS[quantity]
    : undefined;
  if (!limit || !(Math.abs(value) > limit.max)) return null;
  const unit = limit.unit ? ` ${limit.unit}` : '';
  return `must be between −${limit.max}${unit} and ${limit.max}${unit} (a value this large is not physical; check the unit)`;
}
