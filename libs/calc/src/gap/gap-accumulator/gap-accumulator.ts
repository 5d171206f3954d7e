/**
 * One-pass, bounded-memory statistics of an energy-gap time series (SCIENCE.md §7), for a server
 * job reading 10⁷ lines as well as for the `reorg.gapSamples` method.
 */
import { percentileSorted } from '../histogram/histogram';
import { SystematicSample } from './systematic-sample';

/** Levels of the blocking transformation kept (block sizes 1, 2, 4, …, 2⁶³). */
const MAX_LEVELS = 64;
/** Fewest blocks for a level's standard error to be used (SCIENCE.md §7). */
export const MIN_BLOCKS = 10;

export interface BlockLevel {
  /** Samples per block, 2^level. */
  readonly blockSize: number;
  /** Complete blocks at this size. */
  readonly blocks: number;
  /** sd(block means)/√blocks. */
  readonly standardError: number;
  /** Relative error of that estimate, 1/√(2(blocks − 1)). */
  readonly relativeUncertainty: number;
}

export interface BlockPlateau {
  readonly blockSize: number;
  readonly blocks: number;
  readonly standardError: number;
  /** False when no larger block size confirms the plateau (or fewer than 10 blocks). */
  readonly reached: boolean;
}

export interface GapStatistics {
  readonly count: number;
  readonly mean: number;
  /** Sample variance with n − 1. */
  readonly variance: number;
  readonly min: number;
  readonly max: number;
  /** g₁ = m₃/m₂^(3/2) (population moments). */
  readonly skewness: number;
  /** g₂ = m₄/m₂² − 3. */
  readonly excessKurtosis: number;
  /** s/√N, ignoring correlation. */
  readonly naiveStandardError: number;
  readonly blockLevels: readonly BlockLevel[];
  readonly plateau: BlockPlateau;
  /** N·SE²/s², the number of correlated frames per independent one (1 if uncorrelated). */
  readonly statisticalInefficiency: number;
  /** Lower and upper quartiles of the kept subsample (exact while N ≤ 65 536). */
  readonly quartileEstimates: readonly [number, number];
}

/**
 * Streaming accumulator of an energy-gap series: push samples one at a time or in typed-array
 * chunks; memory is O(1) in the number of samples (≈ 3 kB).
 *
 * Method:
 * - mean, variance, skewness and kurtosis by the one-pass central-moment updates of Welford
 *   (1962) extended to third and fourth moments (Pébay 2008);
 * - the blocking transformation of Flyvbjerg & Petersen (1989): level k holds block means of 2^k
 *   consecutive samples; each level keeps only its count, shifted sum and sum of squares of
 *   block means and one pending half-block, so all 64 levels cost O(1) per sample amortised;
 * - quartiles from an evenly spaced subsample of at most 65 536 samples (`SystematicSample`).
 *
 * Notes: the Freedman–Diaconis width needs the IQR. An exact IQR needs all samples (or a
 * selection pass per quartile over the file), which a 10⁷-line job should not hold in memory,
 * so the streaming path takes the quartiles of a bounded, evenly spaced subsample (512 kB):
 * exact up to 65 536 samples, ~1 % of the IQR beyond, which moves the FD bin count by at most
 * about one. (A P² marker estimate was tried first: no memory, but ~60 ns per sample, three
 * times the rest of the accumulator, and poor on heavy tails; a random reservoir spent as much
 * on random numbers.) The counts then come from
 * a second pass over the data with `HistogramCounter`. The `reorg.gapSamples` method, which has
 * the arrays, uses exact quartiles of all samples.
 * Block means are accumulated relative to the first sample, which keeps the sum-of-squares form
 * accurate when the mean is large compared with the spread.
 * References: B. P. Welford, Technometrics 1962, 4, 419 (doi 10.1080/00401706.1962.10490022);
 * P. Pébay, Sandia report SAND2008-6212, 2008 (doi 10.2172/1028931); H. Flyvbjerg,
 * H. G. Petersen, J. Chem. Phys. 1989, 91, 461 (doi 10.1063/1.457480); R. Jain, I. Chlamtac,
 * Commun. ACM 1985, 28, 1076 (doi 10.1145/4372.4378).
 */
export class GapSampleAccumulator {
  private n = 0;
  private mean = 0;
  private m2 = 0;
  private m3 = 0;
  private m4 = 0;
  private min = Number.POSITIVE_INFINITY;
  private max = Number.NEGATIVE_INFINITY;
  private shift = 0;
  private readonly blockCount = new Float64Array(MAX_LEVELS);
  private readonly blockSum = new Float64Array(MAX_LEVELS);
  private readonly blockSumSquares = new Float64Array(MAX_LEVELS);
  private readonly pending = new Float64Array(MAX_LEVELS);
  private readonly hasPending = new Uint8Array(MAX_LEVELS);
  private readonly subsample: SystematicSample | undefined;

  /** @param trackQuartiles keep a quartile subsample (for a streaming FD width); default true. */
  constructor(trackQuartiles = true) {
    this.subsample = trackQuartiles ? new SystematicSample() : undefined;
  }

  get count(): number {
    return this.n;
  }

  push(x: number): void {
    if (this.n === 0) this.shift = x;
    // Welford/Pébay central-moment update.
    const n1 = this.n;
    const n = n1 + 1;
    this.n = n;
    const delta = x - this.mean;
    const deltaN = delta / n;
    const deltaN2 = deltaN * deltaN;
    const term1 = delta * deltaN * n1;
    this.mean += deltaN;
    this.m4 += term1 * deltaN2 * (n * n - 3 * n + 3) + 6 * deltaN2 * this.m2 - 4 * deltaN * this.m3;
    this.m3 += term1 * deltaN * (n - 2) - 3 * deltaN * this.m2;
    this.m2 += term1;
    if (x < this.min) this.min = x;
    if (x > this.max) this.max = x;
    // Blocking transformation: a completed pair at level k becomes one block at level k + 1.
    let value = x - this.shift;
    for (let level = 0; level < MAX_LEVELS; level++) {
      this.blockCount[level]++;
      this.blockSum[level] += value;
      this.blockSumSquares[level] += value * value;
      if (this.hasPending[level] === 0) {
        this.pending[level] = value;
        this.hasPending[level] = 1;
        break;
      }
      value = 0.5 * (this.pending[level] + value);
      this.hasPending[level] = 0;
    }
    this.subsample?.push(x);
  }

  /** Pushes every element of a chunk, in order. */
  pushMany(values: ArrayLike<number>): void {
    for (let i = 0; i < values.length; i++) this.push(values[i]);
  }

  /** Standard errors for every block size with at least two blocks. */
  blockLevels(): BlockLevel[] {
    const levels: BlockLevel[] = [];
    for (let level = 0; level < MAX_LEVELS; level++) {
      const blocks = this.blockCount[level];
      if (blocks < 2) break;
      const sum = this.blockSum[level];
      const variance = Math.max(
        0,
        (this.blockSumSquares[level] - (sum * sum) / blocks) / (blocks - 1),
      );
      levels.push({
        blockSize: 2 ** level,
        blocks,
        standardError: Math.sqrt(variance / blocks),
        relativeUncertainty: 1 / Math.sqrt(2 * (blocks - 1)),
      });
    }
    return levels;
  }

  statistics(): GapStatistics {
    const n = this.n;
    const variance = n > 1 ? this.m2 / (n - 1) : Number.NaN;
    const levels = this.blockLevels();
    const plateau = findPlateau(levels);
    const sample = this.subsample?.sorted();
    return {
      count: n,
      mean: this.mean,
      variance,
      min: this.min,
      max: this.max,
      skewness: (Math.sqrt(n) * this.m3) / this.m2 ** 1.5,
      excessKurtosis: (n * this.m4) / (this.m2 * this.m2) - 3,
      naiveStandardError: Math.sqrt(variance / n),
      blockLevels: levels,
      plateau,
      statisticalInefficiency: (n * plateau.standardError ** 2) / variance,
      quartileEstimates:
        sample !== undefined && sample.length > 0
          ? [percentileSorted(sample, 0.25), percentileSorted(sample, 0.75)]
          : [Number.NaN, Number.NaN],
    };
  }
}

/** Larger block sizes that must agree before a level counts as the plateau. */
const PLATEAU_LOOKAHEAD = 2;

/**
 * The block-averaging plateau: the smallest block size with ≥ 10 blocks whose standard error is
 * not exceeded, by more than one combined standard deviation of the two estimates, at the next
 * two larger block sizes with ≥ 10 blocks. (The SE of correlated data rises with block size
 * until blocks outgrow the correlation time, then stays flat within its growing noise;
 * Flyvbjerg & Petersen 1989. Looking only two levels ahead keeps one noisy large-block estimate
 * from pushing the plateau to the noisiest level.)
 * `reached` is false when no larger usable level confirms the chosen one.
 */
export function findPlateau(levels: readonly BlockLevel[]): BlockPlateau {
  const usable = levels.filter((l) => l.blocks >= MIN_BLOCKS);
  if (usable.length === 0) {
    const last = levels[levels.length - 1] ?? {
      blockSize: 1,
      blocks: 0,
      standardError: Number.NaN,
    };
    return { ...pick(last), reached: false };
  }
  for (let k = 0; k < usable.length; k++) {
    const here = usable[k];
    const confirmed = usable.slice(k + 1, k + 1 + PLATEAU_LOOKAHEAD).every((later) => {
      const tolerance = Math.hypot(
        later.standardError * later.relativeUncertainty,
        here.standardError * here.relativeUncertainty,
      );
      return later.standardError - here.standardError <= tolerance;
    });
    if (confirmed) return { ...pick(here), reached: k < usable.length - 1 };
  }
  return { ...pick(usable[usable.length - 1]), reached: false };
}

function pick(level: { blockSize: number; blocks: number; standardError: number }) {
  return { blockSize: level.blockSize, blocks: level.blocks, standardError: level.standardError };
}

/** Second pass of the streaming path: counts samples into fixed equal-width edges. */
export class HistogramCounter {
  readonly counts: Float64Array;
  private readonly low: number;
  private readonly high: number;
  private readonly scale: number;

  constructor(readonly edges: readonly number[]) {
    const bins = edges.length - 1;
    this.counts = new Float64Array(bins);
    this.low = edges[0];
    this.high = edges[bins];
    this.scale = bins / (this.high - this.low);
  }

  pushMany(values: ArrayLike<number>): void {
    const bins = this.counts.length;
    for (let i = 0; i < values.length; i++) {
      const x = values[i];
      if (x < this.low || x > this.high) continue;
      let index = Math.floor((x - this.low) * this.scale);
      if (index === bins) index--;
      if (x < this.edges[index]) index--;
      else if (index < bins - 1 && x >= this.edges[index + 1]) index++;
      this.counts[index]++;
    }
  }
}
