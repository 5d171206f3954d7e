/** Hopping transport between equivalent sites: Marcus pair rates, diffusion and mobility. */
import { BOLTZMANN_EV_PER_K, HBAR_EV_S } from '../../core/constants';
import type { MethodDefinition, WarningSink } from '../../core/method';
// Transfer integrals J carry a sign by convention, so no coupling-negative note here.
import { warnLambdaBelowKt, warnTemperatureRange } from '../../core/warnings';
import { adiabaticityMeasures, warnAdiabaticity } from '../../rates/coupling-regime';
import { readEnergy, readLambda, readTemperature, refuseClassIII } from '../../rates/rate-inputs';
import { reportRate } from '../../rates/rate-log';

const CM_PER_ANGSTROM = 1e-8;
const NEIGHBOUR_MESSAGE = 'Need ≥ 1 neighbour with r > 0 and n = 1, 2 or 3.';

export interface HoppingNeighbour {
  readonly distanceAngstrom: number;
  /** Transfer integral J (H_AB) in eV; only |J| enters. */
  readonly couplingEv: number;
  /** Site-energy difference ΔG° of the hop in eV (0 between equivalent sites). */
  readonly deltaG0Ev: number;
}

export type DiffusionForm = 'random-walk' | 'pi-weighted';

export interface HoppingInputs {
  readonly neighbours: readonly HoppingNeighbour[];
  readonly lambdaEv: number;
  readonly temperatureK: number;
  readonly dimensions: 1 | 2 | 3;
  readonly form: DiffusionForm;
}

/**
 * ln k of the classical nonadiabatic Marcus rate,
 * k = (2π/ħ)|J|² (4πλk_BT)^(−½) exp[−(ΔG° + λ)²/(4λk_BT)]; −∞ for J = 0.
 *
 * Method: evaluated in log space so that no intermediate underflows.
 * Notes: golden-rule rate; needs |J| ≪ λ and |J| < k_BT (warning B27 otherwise).
 * References: R. A. Marcus, J. Chem. Phys. 1956, 24, 966 (doi 10.1063/1.1742723);
 * R. A. Marcus, N. Sutin, Biochim. Biophys. Acta 1985, 811, 265
 * (doi 10.1016/0304-4173(85)90014-X).
 */
export function logMarcusRate(
  couplingEv: number,
  deltaG0Ev: number,
  lambdaEv: number,
  temperatureK: number,
): number {
  const thermalEv = BOLTZMANN_EV_PER_K * temperatureK;
  return (
    Math.log((2 * Math.PI) / HBAR_EV_S) +
    2 * Math.log(Math.abs(couplingEv)) -
    0.5 * Math.log(4 * Math.PI * lambdaEv * thermalEv) -
    (deltaG0Ev + lambdaEv) ** 2 / (4 * lambdaEv * thermalEv)
  );
}

/**
 * Random-walk diffusion coefficient D = (1/2n) Σ r_i² k_i in cm² s⁻¹ (r in Å, k in s⁻¹).
 *
 * Method: the mean-square displacement of a continuous-time random walk on a lattice of
 * equivalent sites grows as 2nDt with this D (exact; checked by kinetic Monte Carlo in the spec).
 * References: V. Coropceanu, J. Cornil, D. A. da Silva Filho, Y. Olivier, R. Silbey,
 * J.-L. Brédas, Chem. Rev. 2007, 107, 926 (doi 10.1021/cr050140x).
 */
export function randomWalkDiffusionCm2PerS(
  distancesAngstrom: ArrayLike<number>,
  ratesPerS: ArrayLike<number>,
  dimensions: number,
): number {
  let sum = 0;
  for (let i = 0; i < ratesPerS.length; i++) {
    sum += (distancesAngstrom[i] * CM_PER_ANGSTROM) ** 2 * ratesPerS[i];
  }
  return sum / (2 * dimensions);
}

/**
 * The literature "P_i-weighted" form D = (1/2n) Σ r_i² k_i P_i with P_i = k_i/Σ_j k_j.
 *
 * Notes: not the mean-square-displacement result: for N equivalent neighbours it is N times
 * smaller than `randomWalkDiffusionCm2PerS` (SCIENCE.md §12). Offered only for comparison.
 * References: W.-Q. Deng, W. A. Goddard III, J. Phys. Chem. B 2004, 108, 8614
 * (doi 10.1021/jp0495848; from memory).
 */
export function piWeightedDiffusionCm2PerS(
  distancesAngstrom: ArrayLike<number>,
  ratesPerS: ArrayLike<number>,
  dimensions: number,
): number {
  let total = 0;
  for (let i = 0; i < ratesPerS.length; i++) total += ratesPerS[i];
  if (total === 0) return 0;
  let sum = 0;
  for (let i = 0; i < ratesPerS.length; i++) {
    sum += (distancesAngstrom[i] * CM_PER_ANGSTROM) ** 2 * ratesPerS[i] * (ratesPerS[i] / total);
  }
  return sum / (2 * dimensions);
}

/**
 * Einstein mobility μ = D/(k_BT/e) in cm² V⁻¹ s⁻¹ for D in cm² s⁻¹ (k_BT/e in V equals k_BT in
 * eV for a unit charge).
 * References: A. Einstein, Ann. Phys. 1905, 322, 549 (doi 10.1002/andp.19053220806).
 */
export function einsteinMobilityCm2PerVS(diffusionCm2PerS: number, temperatureK: number): number {
  return diffusionCm2PerS / (BOLTZMANN_EV_PER_K * temperatureK);
}

export interface HoppingResult {
  readonly rates: number[];
  /** log10 of each rate; null where J = 0 (k = 0 exactly, no finite logarithm). */
  readonly log10Rates: (number | null)[];
  readonly diffusion: number;
  readonly mobility: number;
  readonly diffusionRandomWalk: number;
  readonly diffusionPiWeighted: number;
  readonly form: DiffusionForm;
}

/** Pair rates, D (the chosen form) and μ for a set of hopping neighbours. */
export function hoppingTransport(inputs: HoppingInputs): HoppingResult {
  const { neighbours, lambdaEv, temperatureK, dimensions } = inputs;
  const logRates = neighbours.map((n) =>
    logMarcusRate(n.couplingEv, n.deltaG0Ev, lambdaEv, temperatureK),
  );
  const rates = logRates.map((ln) => Math.exp(ln));
  const distances = neighbours.map((n) => n.distanceAngstrom);
  const diffusionRandomWalk = randomWalkDiffusionCm2PerS(distances, rates, dimensions);
  const diffusionPiWeighted = piWeightedDiffusionCm2PerS(distances, rates, dimensions);
  const diffusion = inputs.form === 'pi-weighted' ? diffusionPiWeighted : diffusionRandomWalk;
  return {
    rates,
    log10Rates: logRates.map((ln) => (Number.isFinite(ln) ? ln / Math.LN10 : null)),
    diffusion,
    mobility: einsteinMobilityCm2PerVS(diffusion, temperatureK),
    diffusionRandomWalk,
    diffusionPiWeighted,
    form: inputs.form,
  };
}

/** Warnings B27 and B28 of VALIDATION.md. */
export function warnHopping(inputs: HoppingInputs, warnings: WarningSink): void {
  const thermalEv = BOLTZMANN_EV_PER_K * inputs.temperatureK;
  const strong = inputs.neighbours.some(
    (n) => Math.abs(n.couplingEv) > inputs.lambdaEv / 4 || Math.abs(n.couplingEv) > thermalEv,
  );
  if (strong) {
    warnings.warn(
      'hopping-band-regime',
      'J > λ/4 or J > k_BT: Marcus hopping questionable (band/transient-localization regime).',
    );
  }
  if (inputs.form === 'pi-weighted') {
    warnings.warn(
      'hopping-pi-weighted-form',
      'Literature P_i-weighted form: it underestimates D by about the number of neighbours ' +
        'compared with the random-walk result (diffusionRandomWalk).',
    );
  }
}

export const hoppingMethod = {
  id: 'transport.hopping',
  summary:
    'Marcus hopping rates to each neighbour, random-walk diffusion coefficient and Einstein ' +
    'mobility.',
  references: [
    'V. Coropceanu et al., Chem. Rev. 2007, 107, 926. doi:10.1021/cr050140x',
    'R. A. Marcus, N. Sutin, Biochim. Biophys. Acta 1985, 811, 265.',
    'A. Einstein, Ann. Phys. 1905, 322, 549. doi:10.1002/andp.19053220806',
  ],
  inputs: [
    {
      name: 'neighbors',
      quantity: 'array',
      required: true,
      label: 'Neighbours',
      description:
        'Neighbours [{ distance (Å), coupling J (eV), deltaG0 (eV, default 0) }] of one site.',
    },
    { name: 'lambda', quantity: 'energy', required: true, description: 'Reorganization energy λ.' },
    { name: 'temperature', quantity: 'temperature', required: true, description: 'Temperature.' },
    {
      name: 'dimensions',
      quantity: 'integer',
      required: true,
      description: 'Lattice dimensionality n (1, 2 or 3).',
    },
    {
      name: 'form',
      quantity: 'string',
      required: false,
      label: 'Form of the diffusion coefficient',
      defaultValue: 'random-walk',
      description: "'random-walk' (exact) or 'pi-weighted' (literature P_i-weighted form).",
    },
  ],
  outputs: [
    { name: 'rates', unit: 's-1', description: 'Marcus rate to each neighbour.' },
    { name: 'log10Rates', unit: '', description: 'log10 of each rate (null where J = 0).' },
    { name: 'diffusion', unit: 'cm2 s-1', description: 'Diffusion coefficient (chosen form).' },
    { name: 'mobility', unit: 'cm2 V-1 s-1', description: 'Einstein mobility D/(k_BT/e).' },
    { name: 'diffusionRandomWalk', unit: 'cm2 s-1', description: 'D = (1/2n) Σ r² k.' },
    { name: 'diffusionPiWeighted', unit: 'cm2 s-1', description: 'Literature P_i-weighted D.' },
    { name: 'form', unit: '', description: 'Form used for diffusion and mobility.' },
    {
      name: 'couplingRegimes',
      unit: '',
      description:
        'couplingRegime of each hop (nonadiabatic, intermediate, adiabatic) from the Landau–Zener γ with ν_n = 1e13 s⁻¹.',
    },
  ],
  read(reader) {
    const children = reader.objectArray('neighbors', { minLength: 1, message: NEIGHBOUR_MESSAGE });
    const neighbours = children.map((child) => ({
      distanceAngstrom: child.quantity('distance', 'distance', {
        greaterThan: 0,
        message: NEIGHBOUR_MESSAGE,
      }),
      couplingEv: readEnergy(child, 'coupling'),
      deltaG0Ev: child.raw('deltaG0') === undefined ? 0 : readEnergy(child, 'deltaG0'),
    }));
    // The same readers, ranges and class III refusal as rate.marcus (VALIDATION.md A1, A2, A5).
    const lambdaEv = readLambda(reader, 'lambda');
    const temperatureK = readTemperature(reader);
    children.forEach((child, i) => refuseClassIII(child, neighbours[i].couplingEv, lambdaEv));
    const dimensions = reader.integer('dimensions', {
      atLeast: 1,
      atMost: 3,
      message: NEIGHBOUR_MESSAGE,
    }) as 1 | 2 | 3;
    const form = reader.choice<DiffusionForm>(
      'form',
      ['random-walk', 'pi-weighted'],
      'random-walk',
    );
    return { neighbours, lambdaEv, temperatureK, dimensions, form };
  },
  compute(inputs, warnings) {
    warnHopping(inputs, warnings);
    const { lambdaEv, temperatureK } = inputs;
    warnLambdaBelowKt(lambdaEv, temperatureK, warnings);
    warnTemperatureRange(temperatureK, warnings);
    const result = hoppingTransport(inputs);
    // Each pair rate goes through the rate methods' range check: refused beyond the double
    // range, reported as 0 with the underflow note below it.
    inputs.neighbours.forEach((n, i) => {
      const lnK = logMarcusRate(n.couplingEv, n.deltaG0Ev, lambdaEv, temperatureK);
      reportRate(lnK, n.couplingEv === 0, warnings, `neighbors[${i}].coupling`);
    });
    const couplingRegimes = inputs.neighbours.map((n) => {
      const measures = adiabaticityMeasures(n.couplingEv, lambdaEv, temperatureK);
      warnAdiabaticity(n.couplingEv, temperatureK, measures, warnings);
      return measures.regime;
    });
    return { ...result, couplingRegimes };
  },
} satisfies MethodDefinition<HoppingInputs>;

/** What `transport.hopping` answers (the compiler reads it through `MethodOutputs`). */
export type HoppingOutputs = ReturnType<(typeof hoppingMethod)['compute']>;
