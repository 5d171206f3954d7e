/**
 * Diabatic free-energy parabolas along the energy-gap coordinate ΔE = E_P − E_R, and the
 * adiabatic surfaces of two-state mixing (SCIENCE.md §3 and §7). Pure functions: no DOM, no
 * framework; the web page and the PDF report draw the same numbers.
 *
 * With E1(x) = λx² and E2(x) = λ(x − 1)² + ΔG° along the reaction coordinate x, the gap is
 * ΔE = λ(1 − 2x) + ΔG°, so x = (λ + ΔG° − ΔE)/(2λ) and
 *   G_R(ΔE) = (ΔE − ΔG° − λ)²/(4λ),   G_P(ΔE) = G_R(ΔE) + ΔE   (linear free-energy relation).
 * The curves cross where ΔE = 0, at height ΔG‡ = (ΔG° + λ)²/(4λ). Two-state mixing with H_AB:
 *   E_∓ = (G_R + G_P)/2 ∓ ½ √(ΔE² + 4H_AB²), split by exactly 2|H_AB| at ΔE = 0.
 */

export interface ParabolaInputs {
  /** ΔG°, eV (negative is downhill). */
  readonly deltaG0: number;
  /** Total reorganization energy λ, eV (> 0). */
  readonly lambda: number;
  /** |H_AB|, eV (sign ignored). */
  readonly coupling: number;
  /** Number of samples along ΔE (the crossing ΔE = 0 is always one of them). */
  readonly samples?: number;
}

export interface ParabolaPoint {
  /** Energy gap ΔE, eV. */
  readonly gap: number;
  /** Reactant diabat G_R, eV. */
  readonly reactant: number;
  /** Product diabat G_P, eV. */
  readonly product: number;
  /** Lower adiabatic surface, eV. */
  readonly lower: number;
  /** Upper adiabatic surface, eV. */
  readonly upper: number;
}

/** A labelled vertical arrow: from `from` to `to` (eV) at gap `gap` (eV). */
export interface EnergyArrow {
  readonly id: 'deltaG0' | 'lambda' | 'activation' | 'splitting';
  readonly label: string;
  readonly gap: number;
  readonly from: number;
  readonly to: number;
}

export interface ParabolaGeometry {
  readonly gapDomain: readonly [number, number];
  readonly energyDomain: readonly [number, number];
  readonly points: readonly ParabolaPoint[];
  readonly reactantMinimum: { readonly gap: number; readonly energy: number };
  readonly productMinimum: { readonly gap: number; readonly energy: number };
  readonly crossing: { readonly gap: number; readonly energy: number };
  /** Lower and upper adiabatic energies at the crossing (differ by 2|H_AB|). */
  readonly adiabaticAtCrossing: { readonly lower: number; readonly upper: number };
  readonly arrows: readonly EnergyArrow[];
}

export function reactantFreeEnergy(gap: number, deltaG0: number, lambda: number): number {
  return (gap - deltaG0 - lambda) ** 2 / (4 * lambda);
}

/** Lower and upper adiabatic surfaces at one gap value. */
export function adiabaticSurfaces(gap: number, deltaG0: number, lambda: number, coupling: number) {
  const r = reactantFreeEnergy(gap, deltaG0, lambda);
  const p = r + gap;
  const half = 0.5 * Math.sqrt(gap * gap + 4 * coupling * coupling);
  const mean = 0.5 * (r + p);
  return { lower: mean - half, upper: mean + half };
}

/** Everything needed to draw the parabola picture; throws on λ ≤ 0 or non-finite input. */
export function parabolaGeometry(inputs: ParabolaInputs): ParabolaGeometry {
  const { deltaG0, lambda } = inputs;
  const coupling = Math.abs(inputs.coupling);
  if (
    !(lambda > 0) ||
    !Number.isFinite(deltaG0) ||
    !Number.isFinite(coupling) ||
    !Number.isFinite(lambda)
  ) {
    throw new RangeError('parabolaGeometry needs finite ΔG°, |H_AB| and λ > 0.');
  }
  const samples = Math.max(21, inputs.samples ?? 161);
  const reactantGap = deltaG0 + lambda;
  const productGap = deltaG0 - lambda;
  const pad = 0.45 * lambda;
  const lo = Math.min(productGap, 0) - pad;
  const hi = Math.max(reactantGap, 0) + pad;
  const gaps: number[] = [];
  for (let i = 0; i < samples; i++) gaps.push(lo + ((hi - lo) * i) / (samples - 1));
  gaps.push(0);
  gaps.sort((a, b) => a - b);
  const points = gaps
    .filter((g, i) => i === 0 || g !== gaps[i - 1])
    .map((gap) => {
      const reactant = reactantFreeEnergy(gap, deltaG0, lambda);
      const { lower, upper } = adiabaticSurfaces(gap, deltaG0, lambda, coupling);
      return { gap, reactant, product: reactant + gap, lower, upper };
    });
  const activation = reactantFreeEnergy(0, deltaG0, lambda);
  const atCrossing = adiabaticSurfaces(0, deltaG0, lambda, coupling);
  const bottom = Math.min(0, deltaG0);
  const top = Math.max(activation + coupling, deltaG0 + lambda, lambda, 0);
  const span = top - bottom;
  const energyDomain: [number, number] = [bottom - 0.08 * span, top + 0.22 * span];

  const arrows: EnergyArrow[] = [
    { id: 'deltaG0', label: 'ΔG°', gap: productGap, from: 0, to: deltaG0 },
    { id: 'lambda', label: 'λ', gap: reactantGap, from: deltaG0, to: deltaG0 + lambda },
    { id: 'activation', label: 'ΔG‡', gap: 0, from: 0, to: activation },
  ];
  if (coupling > 0) {
    arrows.push({
      id: 'splitting',
      label: '2|H_AB|',
      gap: 0,
      from: atCrossing.lower,
      to: atCrossing.upper,
    });
  }
  return {
    gapDomain: [lo, hi],
    energyDomain,
    points,
    reactantMinimum: { gap: reactantGap, energy: 0 },
    productMinimum: { gap: productGap, energy: deltaG0 },
    crossing: { gap: 0, energy: activation },
    adiabaticAtCrossing: atCrossing,
    arrows,
  };
}
