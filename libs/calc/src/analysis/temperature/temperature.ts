/**
 * `analysis.temperature`: Arrhenius and Eyring fits of measured k(T) by linear least squares, with
 * standard errors and residuals, and the Marcus prediction of the apparent activation energy
 * beside them (SCIENCE.md §15).
 */
import { BOLTZMANN_EV_PER_K, KJ_PER_MOL_PER_EV, PLANCK_EV_S } from '../../core/constants';
import type { MethodDefinition, WarningSink } from '../../core/method';
import { warnTemperatureRange } from '../../core/warnings';
import { readEnergy, readLambda, readTemperature } from '../../rates/rate-inputs';

const A15_MESSAGE = 'Need ≥ 3 distinct points with k > 0 to fit with uncertainties.';
/** J mol⁻¹ K⁻¹ per eV K⁻¹ (1 eV = 96485.33212 J/mol). */
const J_PER_MOL_K_PER_EV_PER_K = KJ_PER_MOL_PER_EV * 1000;

/** Straight line y = intercept + slope·x with standard errors (s² = RSS/(n − 2)). */
export interface LineFit {
  readonly slope: number;
  readonly intercept: number;
  readonly slopeError: number;
  readonly interceptError: number;
  /** y − fitted y, in the order of the points. */
  readonly residuals: number[];
}

/**
 * Ordinary least squares for a straight line, centred (x − x̄) for numerical stability.
 * Standard errors: SE(b) = s/√Sxx, SE(a) = s √(1/n + x̄²/Sxx), s² = Σr²/(n − 2).
 * Reference: N. R. Draper, H. Smith, Applied Regression Analysis, 3rd ed., Wiley 1998, ch. 1.
 * Needs n ≥ 3 and at least two distinct x.
 */
export function fitLine(x: readonly number[], y: readonly number[]): LineFit {
  const n = x.length;
  const meanX = x.reduce((s, v) => s + v, 0) / n;
  const meanY = y.reduce((s, v) => s + v, 0) / n;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    sxx += (x[i]! - meanX) ** 2;
    sxy += (x[i]! - meanX) * (y[i]! - meanY);
  }
  const slope = sxy / sxx;
  const intercept = meanY - slope * meanX;
  const residuals = x.map((xi, i) => y[i]! - (intercept + slope * xi));
  const rss = residuals.reduce((s, r) => s + r * r, 0);
  const s = Math.sqrt(rss / (n - 2));
  return {
    slope,
    intercept,
    slopeError: s / Math.sqrt(sxx),
    interceptError: s * Math.sqrt(1 / n + (meanX * meanX) / sxx),
    residuals,
  };
}

/**
 * Marcus apparent activation energy E_a = −k_B d ln k/d(1/T) for T-independent λ, with a reaction
 * entropy ΔS° (eV K⁻¹; ΔG° = ΔH° − TΔS°, ΔG° taken at T):
 * E_a = (λ + ΔG°)(λ + ΔG° + 2TΔS°)/(4λ) − k_BT/2; with ΔS° = 0 this is ΔG‡ − k_BT/2.
 * References: R. A. Marcus, N. Sutin, Biochim. Biophys. Acta 1985, 811, 265
 * (doi 10.1016/0304-4173(85)90014-X; from memory); SCIENCE.md §15.
 */
export function marcusApparentActivationEv(
  lambdaEv: number,
  deltaG0Ev: number,
  temperatureK: number,
  deltaS0EvPerK = 0,
): number {
  const sum = lambdaEv + deltaG0Ev;
  return (
    (sum * (sum + 2 * temperatureK * deltaS0EvPerK)) / (4 * lambdaEv) -
    (BOLTZMANN_EV_PER_K * temperatureK) / 2
  );
}

export interface TemperatureFit {
  readonly arrheniusEaEv: number;
  readonly arrheniusEaErrorEv: number;
  readonly lnPrefactor: number;
  readonly lnPrefactorError: number;
  readonly arrheniusResiduals: number[];
  readonly eyringEnthalpyEv: number;
  readonly eyringEnthalpyErrorEv: number;
  /** ΔS‡ in eV K⁻¹. */
  readonly eyringEntropyEvPerK: number;
  readonly eyringEntropyErrorEvPerK: number;
  readonly eyringResiduals: number[];
}

/**
 * Arrhenius: ln k = ln A − E_a/(k_BT) against 1/T. Eyring: ln(hk/(k_BT)) = ΔS‡/k_B − ΔH‡/(k_BT).
 * References: S. Arrhenius, Z. Phys. Chem. 1889, 4, 226; H. Eyring, J. Chem. Phys. 1935, 3, 107
 * (doi 10.1063/1.1749604).
 */
export function fitTemperatureSeries(
  temperaturesK: readonly number[],
  rates: readonly number[],
): TemperatureFit {
  const x = temperaturesK.map((t) => 1 / t);
  const arrhenius = fitLine(
    x,
    rates.map((k) => Math.log(k)),
  );
  const eyring = fitLine(
    x,
    rates.map((k, i) => Math.log((PLANCK_EV_S * k) / (BOLTZMANN_EV_PER_K * temperaturesK[i]!))),
  );
  return {
    arrheniusEaEv: -arrhenius.slope * BOLTZMANN_EV_PER_K,
    arrheniusEaErrorEv: arrhenius.slopeError * BOLTZMANN_EV_PER_K,
    lnPrefactor: arrhenius.intercept,
    lnPrefactorError: arrhenius.interceptError,
    arrheniusResiduals: arrhenius.residuals,
    eyringEnthalpyEv: -eyring.slope * BOLTZMANN_EV_PER_K,
    eyringEnthalpyErrorEv: eyring.slopeError * BOLTZMANN_EV_PER_K,
    eyringEntropyEvPerK: eyring.intercept * BOLTZMANN_EV_PER_K,
    eyringEntropyErrorEvPerK: eyring.interceptError * BOLTZMANN_EV_PER_K,
    eyringResiduals: eyring.residuals,
  };
}

export interface TemperatureInputs {
  readonly temperaturesK: number[];
  readonly rates: number[];
  readonly marcus?: {
    readonly lambdaEv: number;
    readonly deltaG0Ev: number;
    readonly deltaS0EvPerK: number;
  };
}

function warnApparentEntropy(entropyJPerMolK: number, sink: WarningSink): void {
  if (entropyJPerMolK < 0) {
    sink.warn(
      'eyring-entropy-apparent',
      `ΔS‡ = ${entropyJPerMolK.toFixed(1)} J mol⁻¹ K⁻¹ < 0: for a nonadiabatic rate a negative ` +
        'Eyring ΔS‡ reflects the small electronic factor, not a real entropy.',
    );
  }
}

export const temperatureMethod = {
  id: 'analysis.temperature',
  summary:
    'Arrhenius and Eyring fits of measured k(T) (≥ 3 points) with standard errors and residuals, and the Marcus apparent E_a beside them.',
  references: [
    'S. Arrhenius, Z. Phys. Chem. 1889, 4, 226',
    'H. Eyring, J. Chem. Phys. 1935, 3, 107; doi 10.1063/1.1749604',
    'R. A. Marcus, N. Sutin, Biochim. Biophys. Acta 1985, 811, 265; doi 10.1016/0304-4173(85)90014-X (from memory)',
  ],
  inputs: [
    {
      name: 'points',
      quantity: 'array',
      required: true,
      label: 'Measured rates k(T)',
      description:
        'Array of { temperature (K), k (s⁻¹, > 0) }; ≥ 3 points at ≥ 3 distinct temperatures.',
    },
    {
      name: 'lambda',
      quantity: 'energy',
      required: false,
      description: 'Reorganization energy λ for the Marcus E_a (with deltaG0).',
    },
    {
      name: 'deltaG0',
      quantity: 'energy',
      required: false,
      label: 'Driving force ΔG°',
      description: 'ΔG° at the mean temperature, for the Marcus E_a (with lambda).',
    },
    {
      name: 'deltaS0',
      quantity: 'dimensionless',
      required: false,
      label: 'Reaction entropy ΔS°',
      description: 'Reaction entropy ΔS° in J mol⁻¹ K⁻¹ for the Marcus E_a.',
      defaultValue: 0,
    },
  ],
  outputs: [
    { name: 'arrheniusEa', unit: 'eV', description: 'Arrhenius activation energy E_a.' },
    { name: 'arrheniusPrefactor', unit: 's-1', description: 'Arrhenius prefactor A.' },
    { name: 'eyringEnthalpy', unit: 'eV', description: 'Eyring ΔH‡.' },
    { name: 'eyringEntropy', unit: 'J mol-1 K-1', description: 'Eyring ΔS‡.' },
    {
      name: 'standardErrors',
      unit: '',
      description:
        '{ arrheniusEa (eV), lnArrheniusPrefactor, eyringEnthalpy (eV), eyringEntropy (J mol⁻¹ K⁻¹) }.',
    },
    {
      name: 'residuals',
      unit: '',
      description: '{ arrhenius: ln k − fit, eyring: ln(hk/k_BT) − fit }, per point.',
    },
    {
      name: 'meanTemperature',
      unit: 'K',
      description: 'T_m = 1/mean(1/T), where the Marcus E_a is evaluated.',
    },
    {
      name: 'marcusEa',
      unit: 'eV',
      description:
        'Marcus apparent E_a = ΔG‡ − k_BT/2 (with ΔS°) at T_m, when λ and ΔG° are given.',
    },
  ],
  read(reader) {
    const children = reader.objectArray('points', { minLength: 3, message: A15_MESSAGE });
    const temperaturesK: number[] = [];
    const rates: number[] = [];
    for (const child of children) {
      temperaturesK.push(readTemperature(child));
      rates.push(
        child.quantity('k', 'rateFirstOrder', {
          greaterThan: 0,
          message: A15_MESSAGE,
        }),
      );
    }
    if (children.length >= 3 && temperaturesK.every(Number.isFinite)) {
      if (new Set(temperaturesK).size < 3) reader.fail('points', A15_MESSAGE);
    }
    const lambdaGiven = reader.raw('lambda') !== undefined;
    const deltaG0Given = reader.raw('deltaG0') !== undefined;
    const lambdaEv = lambdaGiven ? readLambda(reader, 'lambda') : Number.NaN;
    const deltaG0Ev = deltaG0Given ? readEnergy(reader, 'deltaG0') : Number.NaN;
    const deltaS0 = reader.number('deltaS0', { defaultValue: 0 });
    if (lambdaGiven !== deltaG0Given) {
      reader.fail(
        lambdaGiven ? 'deltaG0' : 'lambda',
        'The Marcus E_a needs lambda and deltaG0 together.',
      );
    }
    if (!lambdaGiven && reader.raw('deltaS0') !== undefined) {
      reader.fail('deltaS0', 'Field deltaS0 is used only with lambda and deltaG0.');
    }
    return {
      temperaturesK,
      rates,
      marcus: lambdaGiven
        ? { lambdaEv, deltaG0Ev, deltaS0EvPerK: deltaS0 / J_PER_MOL_K_PER_EV_PER_K }
        : undefined,
    };
  },
  compute(inputs, sink) {
    const fit = fitTemperatureSeries(inputs.temperaturesK, inputs.rates);
    for (const t of inputs.temperaturesK) warnTemperatureRange(t, sink);
    const entropy = fit.eyringEntropyEvPerK * J_PER_MOL_K_PER_EV_PER_K;
    warnApparentEntropy(entropy, sink);
    const meanTemperature =
      inputs.temperaturesK.length / inputs.temperaturesK.reduce((s, t) => s + 1 / t, 0);
    return {
      arrheniusEa: fit.arrheniusEaEv,
      arrheniusPrefactor: Math.exp(fit.lnPrefactor),
      eyringEnthalpy: fit.eyringEnthalpyEv,
      eyringEntropy: entropy,
      standardErrors: {
        arrheniusEa: fit.arrheniusEaErrorEv,
        lnArrheniusPrefactor: fit.lnPrefactorError,
        eyringEnthalpy: fit.eyringEnthalpyErrorEv,
        eyringEntropy: fit.eyringEntropyErrorEvPerK * J_PER_MOL_K_PER_EV_PER_K,
      },
      residuals: { arrhenius: fit.arrheniusResiduals, eyring: fit.eyringResiduals },
      meanTemperature,
      ...(inputs.marcus
        ? {
            marcusEa: marcusApparentActivationEv(
              inputs.marcus.lambdaEv,
              inputs.marcus.deltaG0Ev,
              meanTemperature,
              inputs.marcus.deltaS0EvPerK,
            ),
          }
        : {}),
    };
  },
} satisfies MethodDefinition<TemperatureInputs>;

/** What `analysis.temperature` answers (the compiler reads it through `MethodOutputs`). */
export type TemperatureOutputs = ReturnType<(typeof temperatureMethod)['compute']>;
