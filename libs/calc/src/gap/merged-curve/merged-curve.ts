/**
 * Merged diabatic free-energy curve from the reactant- and product-state histograms of the energy
 * gap, through the exact linear free-energy relation G_P(x) = G_R(x) + x (SCIENCE.md §7).
 */

/** G_R and G_P merged from both states' histograms on one grid (eV). */
export interface MergedFreeEnergyCurve {
  /** Bin centres populated in at least one state (the union), eV. */
  readonly x: number[];
  /** Merged G_R(x), zero of energy as −k_BT ln P_R (the reactant state's own normalisation). */
  readonly reactant: number[];
  /** Merged G_P(x) = G_R(x) + x on the same zero. */
  readonly product: number[];
  /** Bins populated in both states: the ones the shift is fitted on. */
  readonly overlapBins: number;
  /**
   * The constant aligning the two states' curves, −k_BT ln P_P(x) − x + shift ≈ −k_BT ln P_R(x):
   * the free-energy difference ΔG° = A_P − A_R estimated from the overlap, eV.
   */
  readonly shiftEv: number;
  /** Standard error of the shift from Poisson counts, k_BT/√(Σ n_R n_P/(n_R + n_P)), eV. */
  readonly shiftStandardError: number;
}

/**
 * Merges the two states' energy-gap histograms into one diabatic free-energy curve.
 *
 * With P_R, P_P the gap densities sampled in the reactant and product states, the exact relation
 * G_P(x) = G_R(x) + x (Tachiya; King & Warshel) reads P_P(x) = P_R(x)·exp(−(x − ΔG°)/k_BT), so
 * both histograms estimate the same curve once the constant ΔG° is known:
 * 1. on the bins populated in both states, each gives an estimate of ΔG°,
 *    d_i = [−k_BT ln P_R(x_i)] − [−k_BT ln P_P(x_i) − x_i]; the shift is their weighted
 *    least-squares constant, s = Σ w_i d_i / Σ w_i, with inverse-variance weights from Poisson
 *    counts (var d_i ≈ (k_BT)²(1/n_R + 1/n_P), so w_i = n_R n_P/(n_R + n_P));
 * 2. in every bin populated in either state, the Poisson maximum-likelihood density given s (the
 *    two-histogram step of WHAM, Ferrenberg & Swendsen):
 *    P_R(x) = (n_R + n_P) / (h·(N_R + N_P e^{−(x − s)/k_BT})), G_R = −k_BT ln P_R, G_P = G_R + x.
 *    Where only one state samples x this is that state's own estimate (tilted for the product).
 *
 * Returns null when no bin is populated in both states (the constant cannot be aligned).
 * Empty bins never enter a logarithm.
 *
 * References (from memory): M. Tachiya, J. Phys. Chem. 1989, 93, 7050 (doi 10.1021/j100357a004);
 * G. King, A. Warshel, J. Chem. Phys. 1990, 93, 8682 (doi 10.1063/1.459255); A. M. Ferrenberg,
 * R. H. Swendsen, Phys. Rev. Lett. 1989, 63, 1195 (doi 10.1103/PhysRevLett.63.1195).
 *
 * @param edges equal-width bin edges shared by both states (n + 1 values, eV)
 * @param countsReactant reactant-state counts in those bins (N_R = their sum)
 * @param countsProduct product-state counts in those bins (N_P = their sum)
 * @param thermalEv k_BT, eV
 */
export function mergeDiabaticCurves(
  edges: readonly number[],
  countsReactant: ArrayLike<number>,
  countsProduct: ArrayLike<number>,
  thermalEv: number,
): MergedFreeEnergyCurve | null {
  const bins = edges.length - 1;
  const width = edges[1] - edges[0];
  let totalR = 0;
  let totalP = 0;
  for (let i = 0; i < bins; i++) {
    totalR += countsReactant[i];
    totalP += countsProduct[i];
  }
  const centre = (i: number) => 0.5 * (edges[i] + edges[i + 1]);
  const gR = (i: number) => -thermalEv * Math.log(countsReactant[i] / (totalR * width));
  const gP = (i: number) => -thermalEv * Math.log(countsProduct[i] / (totalP * width));

  let sw = 0;
  let swd = 0;
  let overlapBins = 0;
  for (let i = 0; i < bins; i++) {
    const nR = countsReactant[i];
    const nP = countsProduct[i];
    if (!(nR > 0 && nP > 0)) continue;
    const w = (nR * nP) / (nR + nP);
    sw += w;
    swd += w * (gR(i) - gP(i) + centre(i));
    overlapBins++;
  }
  if (overlapBins === 0) return null;
  const shiftEv = swd / sw;

  const logTotalR = Math.log(totalR);
  const logTotalP = Math.log(totalP);
  const x: number[] = [];
  const reactant: number[] = [];
  const product: number[] = [];
  for (let i = 0; i < bins; i++) {
    const n = countsReactant[i] + countsProduct[i];
    if (!(n > 0)) continue;
    const xi = centre(i);
    // ln(N_R + N_P e^{−(x − s)/k_BT}) without overflow.
    const a = logTotalR;
    const b = logTotalP - (xi - shiftEv) / thermalEv;
    const high = Math.max(a, b);
    const logDenominator =
      high + Math.log(Math.exp(a - high) + Math.exp(b - high)) + Math.log(width);
    const g = -thermalEv * (Math.log(n) - logDenominator);
    x.push(xi);
    reactant.push(g);
    product.push(g + xi);
  }
  return {
    x,
    reactant,
    product,
    overlapBins,
    shiftEv,
    shiftStandardError: thermalEv / Math.sqrt(sw),
  };
}
