import type { ParameterKind } from '@gapwise/contracts';

/**
 * Derivation helpers of the pair editor: which calculation method fills which parameter, from
 * which output, and which of the pair's parameters pre-fill the method's inputs. The inputs
 * themselves (names, quantities, descriptions) come from the calculation core's registry.
 */
export interface Derivation {
  readonly id: string;
  readonly methodId: string;
  readonly label: string;
  readonly target: ParameterKind;
  /** Output (canonical) that becomes the target's value. */
  readonly output: string;
  /** Further parameters filled from other outputs of the same run. */
  readonly alsoFills?: ReadonlyArray<{ readonly kind: ParameterKind; readonly output: string }>;
  /** Method input → pair parameter that pre-fills it. */
  readonly prefill: Readonly<Record<string, ParameterKind>>;
  /** All energy inputs must share one unit (VALIDATION.md A28). */
  readonly sharedUnit?: boolean;
  /** Inputs shown first with this unit when the pair has no value for them. */
  readonly defaultUnits?: Readonly<Record<string, string>>;
  /** A helper with its own dialog (a list input the generic dialog cannot type). */
  readonly dialog?: 'normal-modes';
  /** Further parameters whose menu offers this helper (besides the target). */
  readonly offeredFor?: readonly ParameterKind[];
}

export const DERIVATIONS: readonly Derivation[] = [
  {
    id: 'rehm-weller',
    methodId: 'drivingForce.rehmWeller',
    label: 'From redox potentials and excitation energy (Rehm–Weller)',
    target: 'deltaG0',
    output: 'deltaG0CS',
    alsoFills: [{ kind: 'deltaG0Recombination', output: 'deltaG0CR' }],
    prefill: {
      donorOxidation: 'donorOxidation',
      acceptorReduction: 'acceptorReduction',
      excitationEnergy: 'excitationEnergy',
      distance: 'distance',
      epsilon: 'epsilonStatic',
      radiusDonor: 'radiusDonor',
      radiusAcceptor: 'radiusAcceptor',
      epsilonReference: 'epsilonMeasurement',
    },
  },
  {
    id: 'two-sphere',
    methodId: 'reorg.twoSphere',
    label: 'Outer-sphere λ from the two-sphere continuum model',
    target: 'lambdaOuter',
    output: 'lambdaOuter',
    prefill: {
      radiusDonor: 'radiusDonor',
      radiusAcceptor: 'radiusAcceptor',
      distance: 'distance',
      epsilon: 'epsilonStatic',
      refractiveIndex: 'refractiveIndex',
    },
  },
  {
    id: 'four-point',
    methodId: 'reorg.fourPoint',
    label: 'Inner λ from four-point energies',
    target: 'lambdaInner',
    output: 'lambdaInner',
    prefill: {},
    sharedUnit: true,
    defaultUnits: {
      initialAtInitial: 'hartree',
      initialAtFinal: 'hartree',
      finalAtFinal: 'hartree',
      finalAtInitial: 'hartree',
    },
  },
  {
    id: 'normal-modes',
    methodId: 'reorg.normalModes',
    label: 'λᵢ and ħω from normal modes (a frequency calculation)',
    target: 'lambdaInner',
    output: 'lambdaVib',
    alsoFills: [{ kind: 'hbarOmega', output: 'effectiveHbarOmega' }],
    prefill: {},
    dialog: 'normal-modes',
    offeredFor: ['hbarOmega'],
  },
  {
    id: 'gmh',
    methodId: 'coupling.gmh',
    label: 'Coupling from generalized Mulliken–Hush',
    target: 'coupling',
    output: 'coupling',
    prefill: {},
  },
  {
    id: 'hush',
    methodId: 'coupling.hush',
    label: 'Coupling from a charge-transfer band (Hush)',
    target: 'coupling',
    output: 'coupling',
    prefill: { distance: 'distance' },
  },
  {
    id: 'distance-decay',
    methodId: 'coupling.distanceDecay',
    label: 'Coupling from distance decay',
    target: 'coupling',
    output: 'coupling',
    prefill: { distance: 'distance' },
  },
];

export function derivationsFor(kind: ParameterKind): Derivation[] {
  return DERIVATIONS.filter((d) => d.target === kind || d.offeredFor?.includes(kind));
}

export function derivationById(id: string): Derivation | undefined {
  return DERIVATIONS.find((d) => d.id === id);
}
