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
const VECTOR_MESSAGE = 'A displacement vector has 1 to 3 components (Å), not all zero.';

export interface HoppingNeighbour {
  readonly distanceAngstrom: number;
  /** Transfer integral J (H_AB) in eV; only |J| enters. */
  readonly couplingEv: number;
  /** Site-energy difference ΔG° of the hop in eV (0 between equivalent sites). */
  readonly deltaG0Ev: number;
  /** Displacement vector (x, y, z) in Å when known; then the distance is its length. */
  readonly vectorAngstrom?: readonly [number, number, number];
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

/** A symmetric 3 × 3 tensor, rows of the Cartesian components. */
export type Tensor3 = [
  [number, number, number],
  [number, number, number],
  [number, number, number],
];

/**
 * Random-walk diffusion tensor D_ab = ½ Σ_i k_i r_ia r_ib in cm² s⁻¹ (r in Å, k in s⁻¹).
 *
 * Method: the covariance of the displacement of a continuous-time random walk grows as 2 D t;
 * each hop i adds k_i r_i r_iᵀ per unit time. Its trace over n dimensions is 2n times the scalar
 * D = (1/2n) Σ r_i² k_i, so trace(D)/n equals `randomWalkDiffusionCm2PerS`.
 * References: Coropceanu et al., Chem. Rev. 2007, 107, 926 (doi 10.1021/cr050140x), eq. for the
 * mobility tensor; H. Risken, The Fokker–Planck Equation, Springer 1989, ch. 4 (from memory).
 */
export function diffusionTensorCm2PerS(
  vectorsAngstrom: ReadonlyArray<readonly [number, number, number]>,
  ratesPerS: ArrayLike<number>,
): Tensor3 {
  const t: Tensor3 = [
    [0, 0, 0],
    [0, 0, 0],
    [0, 0, 0],
  ];
  vectorsAngstrom.forEach((v, i) => {
    for (let a = 0; a < 3; a++) {
      for (let b = 0; b < 3; b++) {
        t[a][b] += 0.5 * ratesPerS[i] * v[a] * CM_PER_ANGSTROM * v[b] * CM_PER_ANGSTROM;
      }
    }
  });
  return t;
}

/** Eigenvalues (largest first) and unit eigenvectors of a symmetric 3 × 3 tensor. */
export interface PrincipalAxes {
  readonly values: [number, number, number];
  readonly axes: [[number, number, number], [number, number, number], [number, number, number]];
}

/**
 * Principal values and axes of a symmetric 3 × 3 tensor by cyclic Jacobi rotations.
 *
 * Method: each rotation zeroes one off-diagonal element; sweeps repeat until the off-diagonal
 * norm is below 1e-15 of the Frobenius norm (quadratic convergence).
 * References: C. G. J. Jacobi, J. Reine Angew. Math. 1846, 30, 51; G. H. Golub, C. F. Van Loan,
 * Matrix Computations, 4th ed., Johns Hopkins 2013, §8.5 (from memory).
 */
export function principalAxes(tensor: Tensor3): PrincipalAxes {
  const a = tensor.map((row) => [...row]);
  const v = [
    [1, 0, 0],
    [0, 1, 0],
    [0, 0, 1],
  ];
  const scale = Math.sqrt(a.flat().reduce((s, x) => s + x * x, 0));
  for (let sweep = 0; sweep < 50 && scale > 0; sweep++) {
    const off = Math.sqrt(2 * (a[0][1] ** 2 + a[0][2] ** 2 + a[1][2] ** 2));
    if (off <= 1e-15 * scale) break;
    for (let p = 0; p < 2; p++) {
      for (let q = p + 1; q < 3; q++) {
        if (a[p][q] === 0) continue;
        const theta = (a[q][q] - a[p][p]) / (2 * a[p][q]);
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        for (let k = 0; k < 3; k++) {
          const akp = a[k][p];
          const akq = a[k][q];
          a[k][p] = c * akp - s * akq;
          a[k][q] = s * akp + c * akq;
        }
        for (let k = 0; k < 3; k++) {
          const apk = a[p][k];
          const aqk = a[q][k];
          a[p][k] = c * apk - s * aqk;
          a[q][k] = s * apk + c * aqk;
        }
        for (let k = 0; k < 3; k++) {
          const vkp = v[k][p];
          const vkq = v[k][q];
          v[k][p] = c * vkp - s * vkq;
          v[k][q] = s * vkp + c * vkq;
        }
      }
    }
  }
  const order = [0, 1, 2].sort((i, j) => a[j][j] - a[i][i]);
  const values = order.map((i) => a[i][i]) as [number, number, number];
  const axes = order.map((i) => [v[0][i], v[1][i], v[2][i]]) as PrincipalAxes['axes'];
  return { values, axes };
}

/** Where one hop sits against the conditions of Marcus hopping (SCIENCE.md §12). */
export interface HopValidity {
  /** |J|/λ; hopping needs it ≪ 1 (warned above ¼). */
  readonly couplingOverLambda: number;
  /** |J|/k_BT; hopping needs it < 1. */
  readonly couplingOverThermal: number;
  readonly regime: 'hopping' | 'band-or-transient-localization';
}

/** |J|/λ and |J|/k_BT of each hop, and whether Marcus hopping applies to it. */
export function hopValidity(
  couplingEv: number,
  lambdaEv: number,
  temperatureK: number,
): HopValidity {
  const thermalEv = BOLTZMANN_EV_PER_K * temperatureK;
  const couplingOverLambda = Math.abs(couplingEv) / lambdaEv;
  const couplingOverThermal = Math.abs(couplingEv) / thermalEv;
  return {
    couplingOverLambda,
    couplingOverThermal,
    regime:
      couplingOverLambda > 0.25 || couplingOverThermal > 1
        ? 'band-or-transient-localization'
        : 'hopping',
  };
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
  /** Share of each hop in Σ r_i² k_i (the random-walk D); sums to 1 (all 0 when every k = 0). */
  readonly contributions: number[];
  /** Diffusion tensor (cm² s⁻¹) when every neighbour has a displacement vector, else null. */
  readonly diffusionTensor: Tensor3 | null;
  /** Mobility tensor μ = D/(k_BT/e) (cm² V⁻¹ s⁻¹), or null. */
  readonly mobilityTensor: Tensor3 | null;
  /** Principal mobilities, largest first (cm² V⁻¹ s⁻¹), or null without vectors. */
  readonly principalMobility: { largest: number; middle: number; smallest: number } | null;
  /** Unit principal axes of the mobility tensor (same order), or null. */
  readonly principalAxes: PrincipalAxes['axes'] | null;
  readonly validity: HopValidity[];
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
  const weights = rates.map((k, i) => (distances[i] * CM_PER_ANGSTROM) ** 2 * k);
  const totalWeight = weights.reduce((a, b) => a + b, 0);
  const contributions = weights.map((w) => (totalWeight > 0 ? w / totalWeight : 0));
  const thermalV = BOLTZMANN_EV_PER_K * temperatureK;
  const vectors = neighbours.map((n) => n.vectorAngstrom);
  const allVectors = vectors.every((v) => v !== undefined);
  const diffusionTensor = allVectors
    ? diffusionTensorCm2PerS(vectors as [number, number, number][], rates)
    : null;
  const mobilityTensor = diffusionTensor
    ? (diffusionTensor.map((row) => row.map((x) => x / thermalV)) as Tensor3)
    : null;
  const principal = mobilityTensor ? principalAxes(mobilityTensor) : null;
  return {
    contributions,
    diffusionTensor,
    mobilityTensor,
    principalMobility: principal
      ? {
          largest: principal.values[0],
          middle: principal.values[1],
          smallest: principal.values[2],
        }
      : null,
    principalAxes: principal ? principal.axes : null,
    validity: neighbours.map((n) => hopValidity(n.couplingEv, lambdaEv, temperatureK)),
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
  const strong = inputs.neighbours.some(
    (n) => hopValidity(n.couplingEv, inputs.lambdaEv, inputs.temperatureK).regime !== 'hopping',
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
        'Neighbours [{ distance (Å) or vector [x, y, z] (Å), coupling J (eV), deltaG0 (eV, ' +
        'default 0) }] of one site. With a vector on every neighbour the tensor is reported.',
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
      name: 'contributions',
      unit: '',
      description: 'Share of each hop in Σ r²k (random-walk D), summing to 1.',
    },
    {
      name: 'diffusionTensor',
      unit: 'cm2 s-1',
      description: 'D_ab = ½ Σ k r_a r_b when every neighbour has a vector, else null.',
    },
    {
      name: 'mobilityTensor',
      unit: 'cm2 V-1 s-1',
      description: 'Mobility tensor D/(k_BT/e), or null.',
    },
    {
      name: 'principalMobility',
      unit: 'cm2 V-1 s-1',
      description: 'Principal mobilities { largest, middle, smallest }, or null.',
    },
    { name: 'principalAxes', unit: '', description: 'Unit principal axes (same order), or null.' },
    {
      name: 'validity',
      unit: '',
      description:
        'Per hop: |J|/λ, |J|/k_BT and regime (hopping, or band-or-transient-localization ' +
        'when |J| > λ/4 or |J| > k_BT).',
    },
    {
      name: 'couplingRegimes',
      unit: '',
      description:
        'couplingRegime of each hop (nonadiabatic, intermediate, adiabatic) from the Landau–Zener γ with ν_n = 1e13 s⁻¹.',
    },
  ],
  read(reader) {
    const children = reader.objectArray('neighbors', { minLength: 1, message: NEIGHBOUR_MESSAGE });
    const neighbours = children.map((child): HoppingNeighbour => {
      const couplingEv = readEnergy(child, 'coupling');
      const deltaG0Ev = child.raw('deltaG0') === undefined ? 0 : readEnergy(child, 'deltaG0');
      if (child.raw('vector') !== undefined) {
        const v = child.quantityArray('vector', 'distance', {
          minLength: 1,
          message: VECTOR_MESSAGE,
        });
        if (v.length > 3) child.fail('vector', VECTOR_MESSAGE);
        const vector: [number, number, number] = [v[0] ?? 0, v[1] ?? 0, v[2] ?? 0];
        const length = Math.hypot(...vector);
        if (!(length > 0)) child.fail('vector', VECTOR_MESSAGE);
        if (child.raw('distance') !== undefined) {
          const distance = child.quantity('distance', 'distance', { greaterThan: 0 });
          if (Math.abs(distance - length) > 1e-3 * Math.max(length, 1e-9)) {
            child.fail(
              'distance',
              `Distance ${distance} Å differs from the length of the vector (${length.toPrecision(6)} Å); give one of them.`,
            );
          }
        }
        return { distanceAngstrom: length, couplingEv, deltaG0Ev, vectorAngstrom: vector };
      }
      return {
        distanceAngstrom: child.quantity('distance', 'distance', {
          greaterThan: 0,
          message: NEIGHBOUR_MESSAGE,
        }),
        couplingEv,
        deltaG0Ev,
      };
    });
    const withVector = neighbours.filter((n) => n.vectorAngstrom !== undefined).length;
    if (withVector > 0 && withVector < neighbours.length) {
      reader.fail(
        'neighbors',
        'Give a displacement vector for every neighbour or for none (the tensor needs all).',
      );
    }
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
