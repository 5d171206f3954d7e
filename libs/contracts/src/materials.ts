import { calculate, type CalcRequest } from '@gapwise/calc';

/**
 * Material cases (charge transport, issue 18) and the material model: the one place that turns a
 * stored material (canonical values, uncertainties) into `transport.hopping` requests — nominal,
 * μ against temperature, Monte Carlo — and the answers into what the page and the API show.
 * Values are canonical: eV, Å, K; `sigma` is one standard deviation in the same unit.
 */

/** One neighbour of a site, as stored. */
export interface MaterialNeighbour {
  /** Short label the chart shows (e.g. "a", "b", "a+b"). */
  readonly label: string;
  /** Centre-to-centre distance in Å (omitted when a vector is given). */
  readonly distanceAngstrom?: number | null;
  /** Displacement vector (x, y, z) in Å; with one on every neighbour the tensor is reported. */
  readonly vectorAngstrom?: readonly number[] | null;
  /** Transfer integral J in eV (only |J| enters). */
  readonly couplingEv: number;
  /** 1σ of J in eV, or null. */
  readonly couplingSigmaEv?: number | null;
  /** Site-energy difference ΔG° of the hop in eV (0 between equivalent sites). */
  readonly deltaG0Ev?: number | null;
}

/** Body of create and update (update also carries `version`). */
export interface MaterialInput {
  readonly name: string;
  readonly notes?: string;
  readonly lambdaEv: number;
  readonly lambdaSigmaEv?: number | null;
  readonly temperatureK: number;
  /** Lattice dimensionality n of D = (1/2n) Σ r²k. */
  readonly dimensions: 1 | 2 | 3;
  readonly neighbours: MaterialNeighbour[];
}

export interface MaterialUpdate extends MaterialInput {
  readonly version: number;
}

/** One point of μ against temperature. */
export interface MobilityPoint {
  readonly temperatureK: number;
  readonly mobility: number;
}

/** Median and 95 % interval of one Monte Carlo output. */
export interface MonteCarloSummary {
  readonly median: number;
  readonly p025: number;
  readonly p975: number;
}

/** What a material's computation answers (stored with the case, shown on its page). */
export interface MaterialResults {
  readonly rates: number[];
  readonly log10Rates: (number | null)[];
  /** cm² s⁻¹, random-walk form. */
  readonly diffusion: number;
  /** cm² V⁻¹ s⁻¹, Einstein relation. */
  readonly mobility: number;
  readonly contributions: number[];
  readonly diffusionTensor: number[][] | null;
  readonly mobilityTensor: number[][] | null;
  readonly principalMobility: { largest: number; middle: number; smallest: number } | null;
  readonly principalAxes: number[][] | null;
  readonly validity: {
    couplingOverLambda: number;
    couplingOverThermal: number;
    regime: 'hopping' | 'band-or-transient-localization';
  }[];
  readonly warnings: { code: string; message: string }[];
  readonly mobilityVsTemperature: MobilityPoint[];
  /** Monte Carlo over λ and couplings; null when no σ is stated. */
  readonly monteCarlo: {
    readonly samples: number;
    readonly seed: number;
    readonly diffusion: MonteCarloSummary;
    readonly mobility: MonteCarloSummary;
  } | null;
}

/** The user-facing name of each material field (errors name the field by it). */
export const MATERIAL_FIELD_LABELS: Record<string, string> = {
  name: 'Name',
  lambdaEv: 'Reorganization energy λ',
  lambdaSigmaEv: 'σ of λ',
  temperatureK: 'Temperature',
  dimensions: 'Dimensions n',
  neighbours: 'Neighbours',
};

export const MATERIAL_MONTE_CARLO_SAMPLES = 1000;
export const MATERIAL_MONTE_CARLO_SEED = 20261205;
/** Temperatures of the μ(T) curve (K). */
export const MATERIAL_TEMPERATURES_K: readonly number[] = [
  150, 175, 200, 225, 250, 275, 300, 325, 350, 375, 400,
];

function sigmaOrNull(s: number | null | undefined): number | null {
  return typeof s === 'number' && Number.isFinite(s) && s > 0 ? s : null;
}

/**
 * The `transport.hopping` request of a material (random-walk D), at its own temperature or at
 * `temperatureK`. With `uncertain`, each stated σ becomes `{ value, sigma }` for Monte Carlo.
 */
export function materialHoppingRequest(
  material: MaterialInput,
  options: { temperatureK?: number; uncertain?: boolean } = {},
): CalcRequest {
  const u = options.uncertain === true;
  const lambdaSigma = sigmaOrNull(material.lambdaSigmaEv);
  return {
    method: 'transport.hopping',
    inputs: {
      neighbors: material.neighbours.map((n) => {
        const sigma = sigmaOrNull(n.couplingSigmaEv);
        const out: Record<string, unknown> = {
          coupling: u && sigma !== null ? { value: n.couplingEv, sigma } : n.couplingEv,
        };
        if (n.vectorAngstrom && n.vectorAngstrom.length > 0) out['vector'] = [...n.vectorAngstrom];
        else out['distance'] = n.distanceAngstrom;
        if (n.deltaG0Ev !== undefined && n.deltaG0Ev !== null) out['deltaG0'] = n.deltaG0Ev;
        return out;
      }),
      lambda:
        u && lambdaSigma !== null
          ? { value: material.lambdaEv, sigma: lambdaSigma }
          : material.lambdaEv,
      temperature: options.temperatureK ?? material.temperatureK,
      dimensions: material.dimensions,
      form: 'random-walk',
    },
  };
}

/** True when λ or any coupling carries a σ (then Monte Carlo runs). */
export function materialHasUncertainty(material: MaterialInput): boolean {
  return (
    sigmaOrNull(material.lambdaSigmaEv) !== null ||
    material.neighbours.some((n) => sigmaOrNull(n.couplingSigmaEv) !== null)
  );
}

/** A core field (`neighbors[2].coupling`) as the label the user sees ("Neighbour 3 coupling J"). */
export function materialFieldLabel(field: string): string {
  const m = /^(?:inputs\.)?neighbors(?:\[(\d+)\])?(?:\.(\w+))?/.exec(field);
  if (m) {
    const which = m[1] !== undefined ? ` ${Number(m[1]) + 1}` : '';
    const part: Record<string, string> = {
      coupling: ' coupling J',
      distance: ' distance',
      vector: ' vector',
      deltaG0: ' site-energy difference ΔG°',
    };
    return `Neighbour${m[1] !== undefined ? which : 's'}${m[2] ? (part[m[2]] ?? ` ${m[2]}`) : ''}`;
  }
  const plain = field.replace(/^inputs\./, '');
  const core: Record<string, string> = {
    lambda: 'Reorganization energy λ',
    temperature: 'Temperature',
    dimensions: 'Dimensions n',
  };
  return core[plain] ?? MATERIAL_FIELD_LABELS[plain] ?? plain;
}

function summary(v: unknown): MonteCarloSummary {
  const o = v as Record<string, number>;
  return { median: o['median'], p025: o['p025'], p975: o['p975'] };
}

/**
 * Computes a material: the nominal hopping answer, μ at each of `MATERIAL_TEMPERATURES_K` (plus
 * the case's own T) and, when σ are stated, Monte Carlo over λ and the couplings. A refusal
 * answers `{ ok: false, errors }` with fields named by their labels. Never throws.
 */
export function computeMaterialResults(
  material: MaterialInput,
):
  | { ok: true; results: MaterialResults }
  | { ok: false; errors: { field: string; message: string }[] } {
  const answer = calculate(materialHoppingRequest(material));
  if (!answer.ok) {
    return {
      ok: false,
      errors: answer.errors.map((e) => ({
        field: e.field,
        message: `${materialFieldLabel(e.field)}: ${e.message}`,
      })),
    };
  }
  const out = answer.outputs as unknown as Omit<
    MaterialResults,
    'warnings' | 'mobilityVsTemperature' | 'monteCarlo'
  >;
  const temperatures = [...new Set([...MATERIAL_TEMPERATURES_K, material.temperatureK])].sort(
    (a, b) => a - b,
  );
  const mobilityVsTemperature: MobilityPoint[] = [];
  for (const t of temperatures) {
    const at = calculate(materialHoppingRequest(material, { temperatureK: t }));
    if (at.ok)
      mobilityVsTemperature.push({ temperatureK: t, mobility: at.outputs['mobility'] as number });
  }
  let monteCarlo: MaterialResults['monteCarlo'] = null;
  if (materialHasUncertainty(material)) {
    const inner = materialHoppingRequest(material, { uncertain: true });
    const mc = calculate({
      method: 'uncertainty.monteCarlo',
      inputs: {
        method: inner.method,
        inputs: inner.inputs,
        samples: MATERIAL_MONTE_CARLO_SAMPLES,
        seed: MATERIAL_MONTE_CARLO_SEED,
      },
    });
    if (mc.ok) {
      monteCarlo = {
        samples: MATERIAL_MONTE_CARLO_SAMPLES,
        seed: MATERIAL_MONTE_CARLO_SEED,
        diffusion: summary(mc.outputs['diffusion']),
        mobility: summary(mc.outputs['mobility']),
      };
    }
  }
  return {
    ok: true,
    results: {
      rates: out.rates,
      log10Rates: out.log10Rates,
      diffusion: out.diffusion,
      mobility: out.mobility,
      contributions: out.contributions,
      diffusionTensor: out.diffusionTensor,
      mobilityTensor: out.mobilityTensor,
      principalMobility: out.principalMobility,
      principalAxes: out.principalAxes,
      validity: out.validity,
      warnings: answer.warnings.map((w) => ({ code: w.code, message: w.message })),
      mobilityVsTemperature,
      monteCarlo,
    },
  };
}

/**
 * Neighbours from CSV text with a header row: `label, distance` or `label, x, y, z`, then
 * `coupling` (eV), optional `coupling_sigma` and `deltaG0` (eV). Comma, semicolon or tab.
 * Errors name the line and column as the user sees them.
 */
export function parseNeighbourCsv(text: string): {
  neighbours: MaterialNeighbour[];
  errors: string[];
} {
  const lines = text
    .split(/\r?\n/)
    .map((l) => l.trim())
    .filter((l) => l.length > 0 && !l.startsWith('#'));
  const errors: string[] = [];
  if (lines.length < 2) return { neighbours: [], errors: ['Need a header row and ≥ 1 neighbour.'] };
  const split = (l: string) => l.split(/[,;\t]/).map((c) => c.trim());
  const header = split(lines[0]).map((h) => h.toLowerCase().replace(/[^a-z0-9_]/g, ''));
  const col = (...names: string[]) => header.findIndex((h) => names.includes(h));
  const iLabel = col('label', 'name');
  const iDist = col('distance', 'r', 'distanceangstrom');
  const [ix, iy, iz] = [col('x'), col('y'), col('z')];
  const iJ = col('coupling', 'j', 'couplingev');
  const iSigma = col('coupling_sigma', 'sigma', 'jsigma', 'couplingsigma');
  const iDg = col('deltag0', 'dg', 'deltag0ev');
  if (iJ < 0) errors.push('Header needs a coupling column (J in eV).');
  if (iDist < 0 && ix < 0) errors.push('Header needs a distance column or x, y, z columns (Å).');
  if (errors.length) return { neighbours: [], errors };
  const neighbours: MaterialNeighbour[] = [];
  lines.slice(1).forEach((line, index) => {
    const cells = split(line);
    const row = index + 2;
    const number = (i: number, name: string, required: boolean): number | null => {
      if (i < 0 || cells[i] === undefined || cells[i] === '') {
        if (required) errors.push(`Line ${row}: ${name} is missing.`);
        return null;
      }
      const v = Number(cells[i]);
      if (!Number.isFinite(v)) {
        errors.push(`Line ${row}: ${name} '${cells[i]}' is not a number.`);
        return null;
      }
      return v;
    };
    const coupling = number(iJ, 'coupling', true);
    const sigma = number(iSigma, 'coupling σ', false);
    const dg = number(iDg, 'ΔG°', false);
    const label = iLabel >= 0 && cells[iLabel] ? cells[iLabel] : `n${index + 1}`;
    if (ix >= 0) {
      const v = [number(ix, 'x', true), number(iy, 'y', false) ?? 0, number(iz, 'z', false) ?? 0];
      if (coupling === null || v[0] === null) return;
      neighbours.push({
        label,
        vectorAngstrom: v as number[],
        couplingEv: coupling,
        couplingSigmaEv: sigma,
        deltaG0Ev: dg,
      });
    } else {
      const d = number(iDist, 'distance', true);
      if (coupling === null || d === null) return;
      neighbours.push({
        label,
        distanceAngstrom: d,
        couplingEv: coupling,
        couplingSigmaEv: sigma,
        deltaG0Ev: dg,
      });
    }
  });
  return { neighbours, errors };
}
