/**
 * `reorg.twoSphere`: Marcus two-sphere continuum outer-sphere reorganization energy (SCIENCE.md §5).
 */
import { COULOMB_EV_ANGSTROM } from '../../core/constants';
import type { MethodDefinition } from '../../core/method';
import { WARNING_CODES } from '../../core/warnings';

const RADIUS_MESSAGE = 'Radii and distances must be > 0.';
const DIELECTRIC_MESSAGE = 'Dielectric constant and refractive index must be ≥ 1.';

/** Pekar factor 1/n² − 1/ε_s (optical minus static inverse dielectric constants). */
export function pekarFactor(refractiveIndex: number, epsilon: number): number {
  return 1 / (refractiveIndex * refractiveIndex) - 1 / epsilon;
}

/**
 * Outer-sphere reorganization energy of the two-sphere continuum model, eV:
 * λ_s = (Δz)² e²/(4πε₀) [1/(2a_D) + 1/(2a_A) − 1/R] (1/n² − 1/ε_s), radii and R in Å.
 *
 * Notes: needs R ≥ a_D + a_A and 1/n² ≥ 1/ε_s; overestimates λ_s for large organics (up to ×2).
 * References: R. A. Marcus, J. Chem. Phys. 1956, 24, 966 (doi 10.1063/1.1742723); R. A. Marcus,
 * J. Chem. Phys. 1965, 43, 679 (doi 10.1063/1.1696792).
 */
export function twoSphereLambdaEv(
  radiusDonorAngstrom: number,
  radiusAcceptorAngstrom: number,
  distanceAngstrom: number,
  epsilon: number,
  refractiveIndex: number,
  charge = 1,
): number {
  const geometry =
    1 / (2 * radiusDonorAngstrom) + 1 / (2 * radiusAcceptorAngstrom) - 1 / distanceAngstrom;
  return charge * charge * COULOMB_EV_ANGSTROM * geometry * pekarFactor(refractiveIndex, epsilon);
}

export interface TwoSphereInputs {
  readonly radiusDonorAngstrom: number;
  readonly radiusAcceptorAngstrom: number;
  readonly distanceAngstrom: number;
  readonly epsilon: number;
  readonly refractiveIndex: number;
  readonly charge: number;
}

export const twoSphereMethod = {
  id: 'reorg.twoSphere',
  summary: 'Outer-sphere λ from the Marcus two-sphere dielectric continuum model.',
  references: [
    'R. A. Marcus, J. Chem. Phys. 1956, 24, 966; doi 10.1063/1.1742723',
    'R. A. Marcus, J. Chem. Phys. 1965, 43, 679; doi 10.1063/1.1696792',
  ],
  inputs: [
    {
      name: 'radiusDonor',
      quantity: 'distance',
      required: true,
      description: 'Donor radius a_D (> 0).',
    },
    {
      name: 'radiusAcceptor',
      quantity: 'distance',
      required: true,
      description: 'Acceptor radius a_A (> 0).',
    },
    {
      name: 'distance',
      quantity: 'distance',
      required: true,
      description: 'Centre-to-centre distance R (≥ a_D + a_A).',
    },
    {
      name: 'epsilon',
      quantity: 'dimensionless',
      required: true,
      description: 'Static dielectric constant ε_s (≥ 1).',
    },
    {
      name: 'refractiveIndex',
      quantity: 'dimensionless',
      required: true,
      description: 'Refractive index n (≥ 1; n² ≤ ε_s).',
    },
    {
      name: 'charge',
      quantity: 'dimensionless',
      required: false,
      description: 'Charge transferred Δz.',
      defaultValue: 1,
    },
  ],
  outputs: [
    { name: 'lambdaOuter', unit: 'eV', description: 'Outer-sphere reorganization energy λ_s.' },
  ],
  read(reader) {
    const positive = { greaterThan: 0, message: RADIUS_MESSAGE };
    const radiusDonorAngstrom = reader.quantity('radiusDonor', 'distance', positive);
    const radiusAcceptorAngstrom = reader.quantity('radiusAcceptor', 'distance', positive);
    const distanceAngstrom = reader.quantity('distance', 'distance', positive);
    const epsilon = reader.number('epsilon', { atLeast: 1, message: DIELECTRIC_MESSAGE });
    const refractiveIndex = reader.number('refractiveIndex', {
      atLeast: 1,
      message: DIELECTRIC_MESSAGE,
    });
    const charge = reader.number('charge', { defaultValue: 1 });
    if (Math.abs(charge) > 100)
      reader.fail('charge', 'Field charge is outside the supported range (|Δz| ≤ 100).');
    if (distanceAngstrom < radiusDonorAngstrom + radiusAcceptorAngstrom) {
      reader.fail('distance', 'Centre-to-centre distance must be ≥ a_D + a_A.');
    }
    if (pekarFactor(refractiveIndex, epsilon) < 0) {
      reader.fail(
        'refractiveIndex',
        'Optical dielectric constant exceeds static one; for a non-polar solvent set λ_s = 0 explicitly.',
      );
    }
    return {
      radiusDonorAngstrom,
      radiusAcceptorAngstrom,
      distanceAngstrom,
      epsilon,
      refractiveIndex,
      charge,
    };
  },
  compute(inputs, sink) {
    const pekar = pekarFactor(inputs.refractiveIndex, inputs.epsilon);
    if (pekar < 0.05) {
      sink.warn(
        WARNING_CODES.nearlyNonpolar,
        'Nearly non-polar solvent: λ_s ≈ 0; continuum estimate unreliable.',
      );
    }
    if (
      inputs.distanceAngstrom > 30 ||
      inputs.radiusDonorAngstrom < 1.5 ||
      inputs.radiusAcceptorAngstrom < 1.5
    ) {
      sink.warn(WARNING_CODES.continuumRange, 'Outside typical range of the continuum model.');
    }
    return {
      lambdaOuter: twoSphereLambdaEv(
        inputs.radiusDonorAngstrom,
        inputs.radiusAcceptorAngstrom,
        inputs.distanceAngstrom,
        inputs.epsilon,
        inputs.refractiveIndex,
        inputs.charge,
      ),
    };
  },
} satisfies MethodDefinition<TwoSphereInputs>;

/** What `reorg.twoSphere` answers (the compiler reads it through `MethodOutputs`). */
export type TwoSphereOutputs = ReturnType<(typeof twoSphereMethod)['compute']>;
