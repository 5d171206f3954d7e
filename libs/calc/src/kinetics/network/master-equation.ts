/**
 * The first-order master equation dp/dt = K p of a network of states (SCIENCE.md §17), solved
 * without subtracting large numbers from one another, so that rates spanning 16 decades
 * (1e-3 to 1e13 s⁻¹) keep their slow channels.
 *
 * Why not p(t) = V e^(Λt) V⁻¹ p₀ straight from the eigenvectors of K: the diagonal of K is
 * −Σ (outgoing rates); with a 1e13 s⁻¹ step beside a 1e-3 s⁻¹ decay the slow rate is below the
 * round-off of the diagonal, and the eigenvalue and LU routes (ml-matrix, measured) then lose it
 * (a slow eigenvalue 19 % off and yields summing to 1.024 on a four-state case). The routines
 * below only add and multiply non-negative numbers (the GTH idea: every pivot is a sum of
 * outgoing rates, never a difference), which keeps each quantity to relative round-off.
 * The eigen-decomposition (ml-matrix) is used where it is accurate: on the fundamental matrix
 * N = (−K_TT)⁻¹, whose largest eigenvalues are the slow relaxation times, with relative accuracy.
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';

/** One directed first-order channel i → j with rate k (s⁻¹), states by index. */
export interface RateLink {
  readonly from: number;
  readonly to: number;
  readonly kPerS: number;
}

/** rates[i][j] = Σ k of the links i → j (i ≠ j), the diagonal zero. */
export function rateTable(stateCount: number, links: readonly RateLink[]): number[][] {
  const rates = Array.from({ length: stateCount }, () => new Array<number>(stateCount).fill(0));
  for (const link of links) {
    if (link.from !== link.to) rates[link.from][link.to] += link.kPerS;
  }
  return rates;
}

/**
 * The rate matrix K of dp/dt = K p: K_ji = k_ij (i ≠ j), K_ii = −Σ_j k_ij, so that each column
 * sums to zero (population is conserved). For display and for independent checks; the solvers
 * below work on the rate table. Reference: N. G. van Kampen, Stochastic Processes in Physics and
 * Chemistry, 3rd ed., Elsevier 2007, ch. V (from memory).
 */
export function rateMatrix(rates: readonly (readonly number[])[]): number[][] {
  const n = rates.length;
  const k = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      if (i === j) continue;
      k[j][i] = rates[i][j];
      k[i][i] -= rates[i][j];
    }
  }
  return k;
}

/** Total outgoing rate of each state, s⁻¹. */
export function outgoingRates(rates: readonly (readonly number[])[]): number[] {
  return rates.map((row) => row.reduce((s, k) => s + k, 0));
}

/**
 * The closed classes of the network (sets of states that, once entered, are never left: an
 * absorbing state, or states joined only to one another), by strongly connected components
 * (Tarjan's algorithm; R. Tarjan, SIAM J. Comput. 1972, 1, 146, from memory) that have no link
 * leaving them. Every other state is transient.
 */
export function closedClasses(rates: readonly (readonly number[])[]): number[][] {
  const n = rates.length;
  const index = new Array<number>(n).fill(-1);
  const low = new Array<number>(n).fill(0);
  const onStack = new Array<boolean>(n).fill(false);
  const stack: number[] = [];
  const components: number[][] = [];
  let counter = 0;
  const visit = (v: number): void => {
    index[v] = low[v] = counter++;
    stack.push(v);
    onStack[v] = true;
    for (let w = 0; w < n; w++) {
      if (w === v || rates[v][w] <= 0) continue;
      if (index[w] < 0) {
        visit(w);
        low[v] = Math.min(low[v], low[w]);
      } else if (onStack[w]) low[v] = Math.min(low[v], index[w]);
    }
    if (low[v] === index[v]) {
      const component: number[] = [];
      let w: number;
      do {
        w = stack.pop()!;
        onStack[w] = false;
        component.push(w);
      } while (w !== v);
      components.push(component.sort((a, b) => a - b));
    }
  };
  for (let v = 0; v < n; v++) if (index[v] < 0) visit(v);
  return components
    .filter((c) => c.every((i) => rates[i].every((k, j) => k <= 0 || c.includes(j))))
    .sort((a, b) => a[0] - b[0]);
}

/**
 * Stationary distribution of one closed class (π K = 0 restricted to the class, Σπ = 1) by the
 * GTH state reduction, which only adds positive numbers. Reference: W. K. Grassmann,
 * M. I. Taksar, D. P. Heyman, Oper. Res. 1985, 33, 1107 (from memory).
 */
export function stationaryDistribution(
  rates: readonly (readonly number[])[],
  members: readonly number[],
): number[] {
  const m = members.length;
  if (m === 1) return [1];
  const r = members.map((i) => members.map((j) => (i === j ? 0 : rates[i][j])));
  for (let s = m - 1; s > 0; s--) {
    let out = 0;
    for (let j = 0; j < s; j++) out += r[s][j];
    for (let i = 0; i < s; i++) {
      if (r[i][s] === 0) continue;
      const share = r[i][s] / out;
      for (let j = 0; j < s; j++) if (j !== i) r[i][j] += share * r[s][j];
    }
  }
  const pi = new Array<number>(m).fill(0);
  pi[0] = 1;
  for (let s = 1; s < m; s++) {
    let inflow = 0;
    for (let i = 0; i < s; i++) inflow += pi[i] * r[i][s];
    let out = 0;
    for (let j = 0; j < s; j++) out += r[s][j];
    pi[s] = inflow / out;
  }
  const total = pi.reduce((a, b) => a + b, 0);
  return pi.map((x) => x / total);
}

/** What the absorbing-state analysis returns. */
export interface Absorption {
  /** Expected time spent in each state (s); 0 for states of closed classes. */
  readonly occupationS: number[];
  /** lim p(t → ∞) for every state. */
  readonly finalPopulations: number[];
  /** Probability that each state is ever reached (its formation yield). */
  readonly reached: number[];
  /** The closed classes (state indices). */
  readonly classes: number[][];
  /** true for states in no closed class. */
  readonly transient: boolean[];
}

/**
 * −K_TT of the transient states factorised by Gaussian elimination in GTH form: eliminating
 * state s turns the paths through it into direct rates (r_ij += r_is r_sj / R_s) and every pivot
 * R_s is the sum of the remaining outgoing rates (including those into closed classes), so no
 * difference of large numbers is ever taken. `solve(b)` then gives τ = (−K_TT)⁻¹ b in O(n²).
 * References: Grassmann, Taksar & Heyman 1985 (above); for absorption by the fundamental matrix,
 * J. G. Kemeny, J. L. Snell, Finite Markov Chains, Van Nostrand 1960, ch. III (from memory).
 */
export class TransientFactor {
  readonly classes: number[][];
  readonly transient: boolean[];
  /** Indices of the transient states, in elimination order. */
  readonly order: number[];
  private readonly reduced: number[][];
  private readonly pivots: number[];

  constructor(private readonly rates: readonly (readonly number[])[]) {
    const n = rates.length;
    this.classes = closedClasses(rates);
    this.transient = new Array<boolean>(n).fill(true);
    for (const c of this.classes) for (const i of c) this.transient[i] = false;
    const t = [...Array(n).keys()].filter((i) => this.transient[i]);
    this.order = t;
    const m = t.length;
    const r = t.map((i) => t.map((j) => (i === j ? 0 : rates[i][j])));
    const exit = t.map((i) => {
      let sum = 0;
      for (let j = 0; j < n; j++) if (!this.transient[j]) sum += rates[i][j];
      return sum;
    });
    const pivots = new Array<number>(m).fill(0);
    for (let s = 0; s < m; s++) {
      let out = exit[s];
      const rs = r[s];
      for (let j = s + 1; j < m; j++) out += rs[j];
      pivots[s] = out;
      for (let i = s + 1; i < m; i++) {
        const ri = r[i];
        if (ri[s] === 0) continue;
        const share = ri[s] / out; // i → s, then s onwards
        for (let j = s + 1; j < m; j++) if (j !== i) ri[j] += share * rs[j];
        exit[i] += share * exit[s];
      }
    }
    this.reduced = r;
    this.pivots = pivots;
  }

  /** τ = (−K_TT)⁻¹ b for b over all states (entries of closed-class states ignored). */
  solve(b: readonly number[]): number[] {
    const { order: t, reduced: r, pivots } = this;
    const m = t.length;
    const rhs = t.map((i) => b[i]);
    for (let s = 0; s < m; s++) {
      if (rhs[s] === 0) continue;
      const share = rhs[s] / pivots[s];
      const rs = r[s];
      for (let i = s + 1; i < m; i++) rhs[i] += rs[i] * share;
    }
    const tau = new Array<number>(m).fill(0);
    for (let s = m - 1; s >= 0; s--) {
      let inflow = rhs[s];
      for (let j = s + 1; j < m; j++) inflow += r[j][s] * tau[j];
      tau[s] = inflow / pivots[s];
    }
    const full = new Array<number>(this.rates.length).fill(0);
    t.forEach((i, a) => (full[i] = tau[a]));
    return full;
  }

  private readonly columns = new Map<number, number[]>();

  /** Column j of N = (−K_TT)⁻¹ over all states (occupation times starting in j), memoised. */
  fundamentalColumn(j: number): number[] {
    let column = this.columns.get(j);
    if (column === undefined) {
      const unit = new Array<number>(this.rates.length).fill(0);
      unit[j] = 1;
      column = this.solve(unit);
      this.columns.set(j, column);
    }
    return column;
  }

  /** N_jj: expected time in transient state j when starting there. */
  selfOccupation(j: number): number {
    return this.fundamentalColumn(j)[j];
  }
}

/**
 * Occupation times τ = (−K_TT)⁻¹ p₀,T, the limit populations and the formation yields.
 * The final population of a closed class is the flux into it, Σ_i τ_i r_i→class (plus its initial
 * population), shared by the class's stationary distribution; once entered, every state of the
 * class is visited. A transient state j is reached with probability τ_j / N_jj (strong Markov
 * property: every visit to j lasts N_jj on average, counting returns).
 */
export function absorb(
  rates: readonly (readonly number[])[],
  initial: readonly number[],
  factor = new TransientFactor(rates),
): Absorption {
  const n = rates.length;
  const { classes, transient } = factor;
  const occupationS = factor.solve(initial);
  const finalPopulations = new Array<number>(n).fill(0);
  const reached = new Array<number>(n).fill(0);
  for (const c of classes) {
    let reach = 0;
    for (const i of c) reach += initial[i];
    for (const a of factor.order) {
      for (const j of c) reach += occupationS[a] * rates[a][j];
    }
    const pi = stationaryDistribution(rates, c);
    c.forEach((i, k) => {
      finalPopulations[i] = reach * pi[k];
      reached[i] = reach;
    });
  }
  for (const j of factor.order) {
    reached[j] = occupationS[j] === 0 ? 0 : Math.min(1, occupationS[j] / factor.selfOccupation(j));
  }
  return { occupationS, finalPopulations, reached, classes, transient };
}

/**
 * The probability that state `target` is ever reached from p₀ (its formation yield).
 */
export function reachProbability(
  rates: readonly (readonly number[])[],
  initial: readonly number[],
  target: number,
): number {
  const factor = new TransientFactor(rates);
  if (!factor.transient[target]) return absorb(rates, initial, factor).reached[target];
  const tau = factor.solve(initial)[target];
  return tau === 0 ? 0 : Math.min(1, tau / factor.selfOccupation(target));
}

/** Largest relative size of a Taylor step: ‖K t‖ at most this before squaring starts. */
const TAYLOR_NORM = 1 / 64;

/**
 * Matrices below are flat row-major `Float64Array`s (entry (i, j) at i·n + j): the population
 * grid squares a 20 × 20 propagator ~160 times per recompute, and arrays of arrays cost most of
 * that time in allocation and garbage collection (measured: 9 ms → under 2 ms per grid).
 */
type Flat = Float64Array<ArrayBuffer>;

/**
 * The propagator P(t) = exp(K t) (P_ji = probability of being in j at t after starting in i) for
 * a small t with ‖K t‖ ≤ 1/64: Taylor series to round-off for the off-diagonal entries (each
 * leading term is a product of positive rates), the diagonal as 1 − Σ (column's off-diagonal),
 * which conserves population to round-off without subtracting the slow rates from 1.
 * Reference: C. Moler, C. Van Loan, SIAM Rev. 2003, 45, 3 (scaling and squaring; from memory).
 */
function smallTimePropagator(k: Flat, n: number, timeS: number): Flat {
  const size = n * n;
  const a = new Float64Array(size);
  for (let x = 0; x < size; x++) a[x] = k[x] * timeS;
  let term = a.slice();
  const sum = a.slice();
  let next = new Float64Array(size);
  for (let order = 2; order < 30; order++) {
    next.fill(0);
    let largest = 0;
    for (let i = 0; i < n; i++) {
      const rowI = i * n;
      for (let l = 0; l < n; l++) {
        const ail = a[rowI + l];
        if (ail === 0) continue;
        const factor = ail / order;
        const rowL = l * n;
        for (let j = 0; j < n; j++) next[rowI + j] += factor * term[rowL + j];
      }
    }
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) {
        const x = i * n + j;
        sum[x] += next[x];
        if (i !== j && next[x] !== 0) {
          const relative = Math.abs(next[x] / (sum[x] || 1));
          if (relative > largest) largest = relative;
        }
      }
    const previous = term;
    term = next;
    next = previous;
    if (largest < 1e-17) break;
  }
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      const x = i * n + j;
      sum[x] = i === j ? 0 : Math.max(sum[x], 0);
    }
  return complementDiagonal(sum, n);
}

/** Sets each diagonal entry to 1 − Σ (off-diagonal of its column). */
function complementDiagonal(p: Flat, n: number): Flat {
  for (let i = 0; i < n; i++) {
    let left = 0;
    for (let j = 0; j < n; j++) if (j !== i) left += p[j * n + i];
    p[i * n + i] = Math.max(0, 1 - left);
  }
  return p;
}

/**
 * P·P for a column-stochastic propagator, non-negative arithmetic only: each off-diagonal entry is
 * a sum of products of non-negative numbers; a diagonal entry is the positive sum Σ_l P_il P_li
 * when it is small (the state has mostly emptied) and 1 − Σ (column off-diagonal) when it is near
 * 1 (so the slow leaks are not lost against 1). Writes into `out` (not `p`).
 */
function squarePropagator(p: Flat, n: number, out: Flat = new Float64Array(n * n)): Flat {
  out.fill(0);
  for (let i = 0; i < n; i++) {
    const rowI = i * n;
    for (let l = 0; l < n; l++) {
      const pil = p[rowI + l];
      if (pil === 0) continue;
      const rowL = l * n;
      for (let j = 0; j < n; j++) out[rowI + j] += pil * p[rowL + j];
    }
  }
  for (let i = 0; i < n; i++) {
    let left = 0;
    for (let j = 0; j < n; j++) if (j !== i) left += out[j * n + i];
    if (left < 0.5) out[i * n + i] = 1 - left;
  }
  return out;
}

/** Applies P to p₀. */
function propagate(p: Flat, n: number, initial: readonly number[]): number[] {
  const out = new Array<number>(n);
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let j = 0; j < n; j++) s += p[i * n + j] * initial[j];
    out[i] = s;
  }
  return out;
}

function flatRateMatrix(rates: readonly (readonly number[])[]): Flat {
  const n = rates.length;
  const k = new Float64Array(n * n);
  const nested = rateMatrix(rates);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) k[i * n + j] = nested[i][j];
  return k;
}

/** Propagator at `timeS` by scaling and squaring from a Taylor step. */
function propagatorAt(k: Flat, n: number, norm: number, timeS: number): Flat {
  let squarings = 0;
  let step = timeS;
  while (norm * step > TAYLOR_NORM) {
    step /= 2;
    squarings++;
  }
  let p = smallTimePropagator(k, n, step);
  let spare = new Float64Array(n * n);
  for (let s = 0; s < squarings; s++) {
    const squared = squarePropagator(p, n, spare);
    spare = p;
    p = squared;
  }
  return p;
}

/** Populations on a log time grid. */
export interface PopulationGrid {
  /** Times, s (ascending, geometric). */
  readonly timesS: number[];
  /** populations[t][i]: population of state i at timesS[t]. */
  readonly populations: number[][];
}

/**
 * p(t) = exp(K t) p₀ on the grid t = t_start · 2^(m/chains), m = 0, 1, …, up to t_end: one
 * propagator per chain at its first time (scaling and squaring), then one squaring per step of
 * the chain (t doubles). With 3 chains that is 10 points per decade.
 */
export function populationGrid(
  rates: readonly (readonly number[])[],
  initial: readonly number[],
  startS: number,
  endS: number,
  chains = 3,
): PopulationGrid {
  const n = rates.length;
  const k = flatRateMatrix(rates);
  const norm = Math.max(0, ...outgoingRates(rates)) * 2;
  const points: { t: number; p: number[] }[] = [];
  for (let c = 0; c < chains; c++) {
    let t = startS * 2 ** (c / chains);
    let prop = propagatorAt(k, n, norm, t);
    let spare = new Float64Array(n * n);
    while (t <= endS * (1 + 1e-12)) {
      points.push({ t, p: propagate(prop, n, initial) });
      const squared = squarePropagator(prop, n, spare);
      spare = prop;
      prop = squared;
      t *= 2;
    }
  }
  points.sort((a, b) => a.t - b.t);
  return { timesS: points.map((x) => x.t), populations: points.map((x) => x.p) };
}

/** p(t) at one time (s), by scaling and squaring. */
export function populationsAt(
  rates: readonly (readonly number[])[],
  initial: readonly number[],
  timeS: number,
): number[] {
  if (timeS === 0) return [...initial];
  const n = rates.length;
  const norm = Math.max(0, ...outgoingRates(rates)) * 2;
  return propagate(propagatorAt(flatRateMatrix(rates), n, norm, timeS), n, initial);
}

/** One relaxation mode of the transient states. */
export interface RelaxationMode {
  /** Relaxation time −1/Re λ, s. */
  readonly timeS: number;
  /** Eigenvector of K_TT, scaled so its largest |component| is 1 (index = transient state order). */
  readonly shape: number[];
}

/**
 * ln π of the detailed-balance weights of the transient states, when the transient block is
 * reversible: every link between two transient states has its reverse, and π_i k_ij = π_j k_ji
 * holds around every cycle (Kolmogorov's criterion; F. P. Kelly, Reversibility and Stochastic
 * Networks, Wiley 1979, ch. 1, from memory) to 1e-9 in ln. ET steps with their detailed-balance
 * reverses always are; a fixed rate between transient states (intersystem crossing) is not.
 * Returns undefined when the block is not reversible. π is built along a spanning forest in ln
 * (ratios of e^±80 and more stay representable) and checked on every link.
 */
export function reversibleWeights(
  rates: readonly (readonly number[])[],
  order: readonly number[],
): number[] | undefined {
  const m = order.length;
  const lnPi = new Array<number>(m).fill(Number.NaN);
  for (let root = 0; root < m; root++) {
    if (!Number.isNaN(lnPi[root])) continue;
    lnPi[root] = 0;
    const queue = [root];
    while (queue.length > 0) {
      const a = queue.pop()!;
      for (let b = 0; b < m; b++) {
        if (b === a) continue;
        const ab = rates[order[a]][order[b]];
        const ba = rates[order[b]][order[a]];
        if (ab === 0 && ba === 0) continue;
        if (ab === 0 || ba === 0) return undefined;
        const expected = lnPi[a] + Math.log(ab) - Math.log(ba);
        if (Number.isNaN(lnPi[b])) {
          lnPi[b] = expected;
          queue.push(b);
        } else if (Math.abs(lnPi[b] - expected) > 1e-9 * Math.max(1, Math.abs(expected))) {
          return undefined;
        }
      }
    }
  }
  return lnPi;
}

/**
 * Relaxation times of the transient states from the eigenvalues μ of the fundamental matrix
 * N = (−K_TT)⁻¹ (μ = −1/λ for each eigenvalue λ of K_TT). N comes from GTH elimination column by
 * column, so its entries (and the large μ, the slow modes) carry relative accuracy.
 * When the transient block is reversible (`reversibleWeights`), N is similar to the symmetric
 * D⁻¹ N D with D = diag(√π) (detailed balance makes K_TT symmetrisable; van Kampen, above), whose
 * eigenvalues are real and are found by ml-matrix's symmetric path (Householder tridiagonal
 * reduction and implicit QL, EISPACK tred2/tql2; Golub & Van Loan, Matrix Computations, 4th ed.,
 * 2013, §8.3) — about ten times faster than the general path, which Monte Carlo repeats per
 * sample; eigenvectors of N are D times those of the symmetric matrix. Otherwise ml-matrix's
 * general `EigenvalueDecomposition` (Hessenberg reduction and shifted QR, the JAMA port of
 * EISPACK hqr2; Golub & Van Loan §7.5). Modes with μ < 1e-12 μ_max sit below round-off and are
 * left out.
 */
export function relaxationModes(
  rates: readonly (readonly number[])[],
  transient: readonly boolean[],
  factor?: TransientFactor,
): { modes: RelaxationMode[]; order: number[] } {
  const n = rates.length;
  const order = [...Array(n).keys()].filter((i) => transient[i]);
  if (order.length === 0) return { modes: [], order };
  const columns = fundamentalColumns(factor ?? new TransientFactor(rates), order);
  const m = order.length;
  const lnPi = reversibleWeights(rates, order);
  const modes: RelaxationMode[] = [];
  if (lnPi !== undefined) {
    const top = Math.max(...lnPi);
    const half = lnPi.map((x) => (x - top) / 2);
    // S[r][c] = N[r][c] √(π_c/π_r), symmetric to round-off: averaged.
    const sym = Array.from({ length: m }, () => new Array<number>(m).fill(0));
    for (let r = 0; r < m; r++)
      for (let c = 0; c <= r; c++) {
        const a = columns[c][r] * Math.exp(half[c] - half[r]);
        const b = columns[r][c] * Math.exp(half[r] - half[c]);
        sym[r][c] = sym[c][r] = (a + b) / 2;
      }
    const decomposition = new EigenvalueDecomposition(new Matrix(sym), { assumeSymmetric: true });
    const real = decomposition.realEigenvalues;
    const vectors = decomposition.eigenvectorMatrix.to2DArray();
    const largest = Math.max(...real.map(Math.abs));
    real.forEach((re, k) => {
      if (!(re > 0) || re < 1e-12 * largest) return;
      const column = vectors.map((row, r) => row[k] * Math.exp(half[r]));
      const peak = Math.max(...column.map(Math.abs)) || 1;
      modes.push({ timeS: re, shape: column.map((x) => x / peak) });
    });
  } else {
    // columns[c][r] = N[r][c]
    const fundamental = new Matrix(order.map((_, r) => order.map((__, c) => columns[c][r])));
    const decomposition = new EigenvalueDecomposition(fundamental);
    const real = decomposition.realEigenvalues;
    const imaginary = decomposition.imaginaryEigenvalues;
    const vectors = decomposition.eigenvectorMatrix.to2DArray();
    const largest = Math.max(...real.map((re, k) => Math.hypot(re, imaginary[k])));
    real.forEach((re, k) => {
      const size = Math.hypot(re, imaginary[k]);
      if (!(re > 0) || size < 1e-12 * largest) return;
      const column = vectors.map((row) => row[k]);
      const peak = Math.max(...column.map(Math.abs)) || 1;
      modes.push({ timeS: (size * size) / re, shape: column.map((x) => x / peak) });
    });
  }
  modes.sort((a, b) => b.timeS - a.timeS);
  return { modes, order };
}

/** columns[c][r] = N[r][c] over the transient states `order`, one GTH solve per column. */
function fundamentalColumns(factor: TransientFactor, order: readonly number[]): number[][] {
  return order.map((i) => {
    const occupationS = factor.fundamentalColumn(i);
    return order.map((j) => occupationS[j]);
  });
}
