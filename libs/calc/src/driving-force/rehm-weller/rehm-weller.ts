/**
 * `drivingForce.rehmWeller`: driving forces of photoinduced charge separation and of charge
 * recombination from redox potentials and the excitation energy (SCIENCE.md §4).
 */
import { COULOMB_EV_ANGSTROM } from '../../core/constants';
import type { InputReader, MethodDefinition } from '../../core/method';
import { PLAUSIBLE_RANGES, WARNING_CODES } from '../../core/warnings';

const DIELECTRIC_MESSAGE = 'Dielectric constant and refractive index must be ≥ 1.';
const RADIUS_MESSAGE = 'Radii and distances must be > 0.';
/** Charges of D and A beyond ±10 are refused (no molecular ion in solution carries more). */
export const MAX_CHARGE = 10;

/**
 * Coulomb work term w = z₁z₂e²/(4πε₀ε_sR) in eV for charges z₁, z₂ at R Å in a solvent of static
 * dielectric constant ε_s (e²/(4πε₀) = 14.3996454784 eV Å, CODATA 2018).
 * Reference: IUPAC Compendium of Chemical Terminology (Gold Book), "Rehm–Weller equation" and
 * "work term" (checked).
 */
export function coulombWorkEv(
  charge1: number,
  charge2: number,
  epsilon: number,
  distanceAngstrom: number,
): number {
  return (charge1 * charge2 * COULOMB_EV_ANGSTROM) / (epsilon * distanceAngstrom);
}

/**
 * Change of the Coulomb work on forming the ion pair D⁺A⁻ from D (charge z_D) and A (charge z_A):
 * w(D⁺A⁻) − w(DA); −e²/(4πε₀ε_sR) for neutral D and A.
 */
export function ionPairCoulombTermEv(
  epsilon: number,
  distanceAngstrom: number,
  chargeDonor = 0,
  chargeAcceptor = 0,
): number {
  return (
    coulombWorkEv(chargeDonor + 1, chargeAcceptor - 1, epsilon, distanceAngstrom) -
    coulombWorkEv(chargeDonor, chargeAcceptor, epsilon, distanceAngstrom)
  );
}

/**
 * Born solvent correction for redox potentials measured in a solvent of dielectric constant
 * ε_ref, used for ET in a solvent ε_s, with the real charges of D and A (z_D → z_D + 1,
 * z_A → z_A − 1 on transfer), in eV:
 * ΔG_Born = (e²/(8πε₀)) [(2z_D + 1)/r_D + (1 − 2z_A)/r_A] (1/ε_s − 1/ε_ref).
 * For z_D = z_A = 0 this is Weller's −(e²/(8πε₀))(1/r_D + 1/r_A)(1/ε_ref − 1/ε_s), positive when
 * ε_s < ε_ref. Every driving-force path of Gapwise (the method, the pair editor's helper,
 * screens) goes through this one function, so the neutral form is never applied to charged
 * reactants (SCIENCE.md §4).
 * References: M. Born, Z. Phys. 1920, 1, 45 (doi 10.1007/BF01881023; from memory);
 * A. Weller, Z. Phys. Chem. (Neue Folge) 1982, 133, 93 (doi 10.1524/zpch.1982.133.1.093;
 * from memory).
 */
export function bornSolventCorrectionEv(
  radiusDonorAngstrom: number,
  radiusAcceptorAngstrom: number,
  epsilonReference: number,
  epsilon: number,
  chargeDonor = 0,
  chargeAcceptor = 0,
): number {
  const chargeSum =
    (2 * chargeDonor + 1) / radiusDonorAngstrom + (1 - 2 * chargeAcceptor) / radiusAcceptorAngstrom;
  return (COULOMB_EV_ANGSTROM / 2) * chargeSum * (1 / epsilon - 1 / epsilonReference);
}

/**
 * Rehm–Weller driving force of photoinduced charge separation, eV:
 * ΔG°_CS = e[E_ox(D⁺/D) − E_red(A/A⁻)] − E₀₀ + [w(D⁺A⁻) − w(DA)] + Born correction.
 * References: D. Rehm, A. Weller, Isr. J. Chem. 1970, 8, 259 (doi 10.1002/ijch.197000029);
 * IUPAC Gold Book "Rehm–Weller equation" (checked); A. Weller 1982 for the Born term.
 */
export function rehmWellerChargeSeparationEv(
  donorOxidationV: number,
  acceptorReductionV: number,
  excitationEnergyEv: number,
  coulombTermEv: number,
  solventCorrectionEv: number,
): number {
  return (
    donorOxidationV - acceptorReductionV - excitationEnergyEv + coulombTermEv + solventCorrectionEv
  );
}

/**
 * Charge recombination to the ground state, ΔG°_CR = −e[E_ox − E_red] − w(D⁺A⁻) + w(DA) (minus
 * the Born correction when it applies), so that ΔG°_CS + ΔG°_CR = −E₀₀ exactly.
 */
export function rehmWellerChargeRecombinationEv(
  chargeSeparationEv: number,
  excitationEnergyEv: number,
): number {
  return -excitationEnergyEv - chargeSeparationEv;
}

export interface RehmWellerInputs {
  readonly donorOxidationV: number;
  readonly acceptorReductionV: number;
  readonly excitationEnergyEv: number;
  readonly distanceAngstrom: number;
  readonly epsilon: number;
  readonly chargeDonor: number;
  readonly chargeAcceptor: number;
  readonly born?: {
    readonly radiusDonor: number;
    readonly radiusAcceptor: number;
    readonly epsilonReference: number;
  };
  readonly references: { readonly donor?: string; readonly acceptor?: string };
}

function readOptionalText(reader: InputReader, name: string): string | undefined {
  const raw = reader.raw(name);
  if (raw === undefined) return undefined;
  if (typeof raw !== 'string' || raw.trim() === '') {
    reader.fail(name, `Field ${name} must be a non-empty string naming the reference electrode.`);
    return undefined;
  }
  return raw.trim();
}

export const rehmWellerMethod = {
  id: 'drivingForce.rehmWeller',
  summary:
    'Rehm–Weller ΔG° of photoinduced charge separation and of recombination, with the Born solvent correction for the real charges.',
  references: [
    'D. Rehm, A. Weller, Isr. J. Chem. 1970, 8, 259; doi 10.1002/ijch.197000029',
    'A. Weller, Z. Phys. Chem. (N.F.) 1982, 133, 93; doi 10.1524/zpch.1982.133.1.093',
    'IUPAC Compendium of Chemical Terminology (Gold Book): Rehm–Weller equation; work term',
    'M. Born, Z. Phys. 1920, 1, 45; doi 10.1007/BF01881023 (charged Born term)',
  ],
  inputs: [
    {
      name: 'donorOxidation',
      quantity: 'potential',
      required: true,
      label: 'Donor oxidation potential E_ox(D⁺/D)',
      description: 'E_ox(D⁺/D), V, same reference electrode and solvent as E_red.',
      referenced: true,
    },
    {
      name: 'acceptorReduction',
      quantity: 'potential',
      required: true,
      label: 'Acceptor reduction potential E_red(A/A⁻)',
      description: 'E_red(A/A⁻), V.',
      referenced: true,
    },
    {
      name: 'excitationEnergy',
      quantity: 'photonEnergy',
      required: true,
      description: '0–0 excitation energy E₀₀ (> 0).',
    },
    {
      name: 'distance',
      quantity: 'distance',
      required: true,
      label: 'Ion-pair distance R',
      description: 'Ion-pair (centre-to-centre) distance R (> 0).',
    },
    {
      name: 'epsilon',
      quantity: 'dimensionless',
      required: true,
      description: 'Static dielectric constant ε_s of the ET solvent (≥ 1).',
    },
    {
      name: 'radiusDonor',
      quantity: 'distance',
      required: false,
      description: 'Donor ion radius r_D for the Born correction.',
    },
    {
      name: 'radiusAcceptor',
      quantity: 'distance',
      required: false,
      description: 'Acceptor ion radius r_A for the Born correction.',
    },
    {
      name: 'epsilonReference',
      quantity: 'dimensionless',
      required: false,
      description: 'ε of the solvent the potentials were measured in (with both radii).',
    },
    {
      name: 'chargeDonor',
      quantity: 'dimensionless',
      required: false,
      label: 'Donor charge z_D',
      description: 'Charge z_D of D before transfer (Coulomb work and Born terms).',
      defaultValue: 0,
    },
    {
      name: 'chargeAcceptor',
      quantity: 'dimensionless',
      required: false,
      label: 'Acceptor charge z_A',
      description: 'Charge z_A of A before transfer (Coulomb work and Born terms).',
      defaultValue: 0,
    },
    {
      name: 'donorReference',
      quantity: 'string',
      required: false,
      description: 'Reference electrode of E_ox (e.g. SCE, Fc+/Fc).',
    },
    {
      name: 'acceptorReference',
      quantity: 'string',
      required: false,
      description: 'Reference electrode of E_red.',
    },
  ],
  outputs: [
    { name: 'deltaG0CS', unit: 'eV', description: 'ΔG° of charge separation.' },
    {
      name: 'deltaG0CR',
      unit: 'eV',
      description: 'ΔG° of charge recombination to the ground state.',
    },
    { name: 'coulombTerm', unit: 'eV', description: 'w(D⁺A⁻) − w(DA) in the ET solvent.' },
    {
      name: 'solventCorrection',
      unit: 'eV',
      description:
        'Born correction with the real charges z_D, z_A (Weller’s form when neutral; 0 without radii).',
    },
  ],
  read(reader) {
    const donorOxidationV = reader.quantity('donorOxidation', 'potential', { referenced: true });
    const acceptorReductionV = reader.quantity('acceptorReduction', 'potential', {
      referenced: true,
    });
    const excitationEnergyEv = reader.quantity('excitationEnergy', 'photonEnergy', {
      greaterThan: 0,
      message: 'Excitation energy E₀₀ must be > 0.',
    });
    const distanceAngstrom = reader.quantity('distance', 'distance', {
      greaterThan: 0,
      message: 'Ion-pair distance must be > 0.',
    });
    const epsilon = reader.number('epsilon', { atLeast: 1, message: DIELECTRIC_MESSAGE });
    const radiusDonor = reader.optionalQuantity('radiusDonor', 'distance', {
      greaterThan: 0,
      message: RADIUS_MESSAGE,
    });
    const radiusAcceptor = reader.optionalQuantity('radiusAcceptor', 'distance', {
      greaterThan: 0,
      message: RADIUS_MESSAGE,
    });
    const epsilonReference = reader.optionalNumber('epsilonReference', {
      atLeast: 1,
      message: DIELECTRIC_MESSAGE,
    });
    const chargeOptions = {
      defaultValue: 0,
      atLeast: -MAX_CHARGE,
      atMost: MAX_CHARGE,
      message: `Charges must be whole numbers from −${MAX_CHARGE} to ${MAX_CHARGE}.`,
    };
    const chargeDonor = reader.integer('chargeDonor', chargeOptions);
    const chargeAcceptor = reader.integer('chargeAcceptor', chargeOptions);
    // Potentials given with { reference, solvent } were put on the SHE scale by the reader, which
    // also warns (B15) when the two scales differ; they count as stated references here.
    const donorScale = reader.potentialScale('donorOxidation');
    const acceptorScale = reader.potentialScale('acceptorReduction');
    const bothOnScales = donorScale !== undefined && acceptorScale !== undefined;
    const references = {
      donor: readOptionalText(reader, 'donorReference') ?? (bothOnScales ? 'SHE' : undefined),
      acceptor: readOptionalText(reader, 'acceptorReference') ?? (bothOnScales ? 'SHE' : undefined),
    };
    for (const [name, value] of Object.entries({
      donorOxidation: donorOxidationV,
      acceptorReduction: acceptorReductionV,
    })) {
      if (Math.abs(value) > 100)
        reader.fail(name, `Field ${name} is outside the supported range (|value| ≤ 100 V).`);
    }
    if (excitationEnergyEv > 1e3)
      reader.fail(
        'excitationEnergy',
        'Field excitationEnergy is outside the supported range (≤ 1e3 eV).',
      );
    const bornParts = [radiusDonor, radiusAcceptor, epsilonReference];
    const given = bornParts.filter((part) => part !== undefined).length;
    if (given > 0 && given < 3) {
      reader.fail(
        given === 1 && epsilonReference !== undefined ? 'radiusDonor' : 'epsilonReference',
        'The Weller solvent correction needs the donor radius, the acceptor radius and ε of the ' +
          'solvent the potentials were measured in, all three (or none).',
      );
    }
    const born =
      given === 3
        ? {
            radiusDonor: radiusDonor!,
            radiusAcceptor: radiusAcceptor!,
            epsilonReference: epsilonReference!,
          }
        : undefined;
    return {
      donorOxidationV,
      acceptorReductionV,
      excitationEnergyEv,
      distanceAngstrom,
      epsilon,
      chargeDonor,
      chargeAcceptor,
      born,
      references,
    };
  },
  compute(inputs, sink) {
    const { donorOxidationV, acceptorReductionV, excitationEnergyEv, epsilon, born } = inputs;
    const coulombTerm = ionPairCoulombTermEv(
      epsilon,
      inputs.distanceAngstrom,
      inputs.chargeDonor,
      inputs.chargeAcceptor,
    );
    const solventCorrection = born
      ? bornSolventCorrectionEv(
          born.radiusDonor,
          born.radiusAcceptor,
          born.epsilonReference,
          epsilon,
          inputs.chargeDonor,
          inputs.chargeAcceptor,
        )
      : 0;
    const deltaG0CS = rehmWellerChargeSeparationEv(
      donorOxidationV,
      acceptorReductionV,
      excitationEnergyEv,
      coulombTerm,
      solventCorrection,
    );
    if (Math.abs(solventCorrection) > 0.5) {
      sink.warn(
        WARNING_CODES.bornCorrectionLarge,
        `Born correction > 0.5 eV (${solventCorrection.toFixed(3)} eV); ΔG° in the ET solvent highly uncertain.`,
      );
    }
    const { donor, acceptor } = inputs.references;
    if (donor === undefined || acceptor === undefined || donor !== acceptor) {
      sink.warn(
        WARNING_CODES.referenceElectrode,
        donor !== undefined && acceptor !== undefined
          ? `E_ox is vs ${donor} but E_red is vs ${acceptor}: E_ox and E_red must be vs the same ` +
              'reference electrode in the same solvent (no conversion is made).'
          : 'E_ox and E_red must be vs the same reference electrode in the same solvent; state ' +
              'donorReference and acceptorReference to confirm.',
      );
    }
    const redoxGapEv = Math.abs(donorOxidationV - acceptorReductionV);
    if (
      excitationEnergyEv < redoxGapEv - 1 ||
      excitationEnergyEv > PLAUSIBLE_RANGES.excitationEnergyEvMax
    ) {
      sink.warn(
        WARNING_CODES.excitationEnergySuspect,
        'Check E₀₀ (0–0 energy, not absorption maximum).',
      );
    }
    return {
      deltaG0CS,
      deltaG0CR: rehmWellerChargeRecombinationEv(deltaG0CS, excitationEnergyEv),
      coulombTerm,
      solventCorrection,
    };
  },
} satisfies MethodDefinition<RehmWellerInputs>;

/** What `drivingForce.rehmWeller` answers (the compiler reads it through `MethodOutputs`). */
export type RehmWellerOutputs = ReturnType<(typeof rehmWellerMethod)['compute']>;
