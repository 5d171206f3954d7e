/**
 * Ranking scores a user can pick for a screen. Each is a plain function of one result row, so
 * the worker computes it with the rates and the table sorts on an indexed column.
 *
 * Which rate a score uses for each step (charge separation, recombination) is the model valid
 * for that step: MLJ where the row gives ħω; MLJ with an assumed ħω (DEFAULT_ASSUMED_HBAR_OMEGA_EV
 * unless the user sets another, the row marked `assumed-hbar-omega`) where the step lies in the
 * inverted region (−ΔG° > λ) and the row gives none, because there the classical rate falls
 * off as a Gaussian in ΔG° and understates the rate by orders of magnitude (Jortner, J. Chem.
 * Phys. 1976, 64, 4860; Ulstrup & Jortner, J. Chem. Phys. 1975, 63, 4358); classical Marcus
 * elsewhere.
 */
import { SCREEN_SCORE_KINDS, type ScreenScoreKind } from '@gapwise/contracts';

export const SCORE_KINDS = SCREEN_SCORE_KINDS;
export type ScoreKind = ScreenScoreKind;

/**
 * ħω assumed for an inverted step without one: 0.186 eV (1500 cm⁻¹), a C=C / C=O stretch, the
 * usual single accepting mode of aromatic donors and acceptors (a stated assumption, not a fit).
 */
export const DEFAULT_ASSUMED_HBAR_OMEGA_EV = 0.186;

export interface ScoreChoice {
  readonly kind: ScoreKind;
  /** For `fastest-forward-above-floor`: minimum −ΔG°_CS in eV (default 0.1 eV). */
  readonly floorEv?: number;
  /** ħω (eV) assumed for an inverted step whose row gives none (default 0.186 eV). */
  readonly assumedHbarOmegaEv?: number;
}

export const DEFAULT_SCORE: ScoreChoice = { kind: 'cs-fast-cr-inverted' };

/** Decades added when recombination lies in the inverted region (−ΔG°_CR > λ). */
export const INVERTED_CR_BONUS = 1;

const MODEL_WORDS =
  'Each step is ranked with the model valid for it: MLJ where the row gives ħω; MLJ with an ' +
  'assumed ħω (0.186 eV = 1500 cm⁻¹ unless set, rows marked "ħω assumed") where the step lies ' +
  'in the inverted region and the row gives none; classical Marcus otherwise.';

export const SCORE_DESCRIPTIONS: Record<ScoreKind, string> = {
  'cs-fast-cr-inverted':
    'log10 k_CS − log10 k_CR, plus one decade when recombination lies in the inverted region ' +
    `(−ΔG°_CR > λ). ${MODEL_WORDS}`,
  'fastest-forward-above-floor':
    'log10 k_CS for pairs whose charge-separation driving force −ΔG°_CS reaches the floor; ' +
    `pairs below the floor get no score and sort last. ${MODEL_WORDS}`,
};

/** Which rate the score takes for one step. */
export type StepModel = 'mlj' | 'mlj-assumed-hbar-omega' | 'marcus';

/**
 * The model valid for one step of a row.
 * @param hbarOmegaGiven whether the row gives ħω
 * @param deltaGEv ΔG° of the step (eV)
 * @param lambdaEv total λ (eV)
 */
export function stepModel(hbarOmegaGiven: boolean, deltaGEv: number, lambdaEv: number): StepModel {
  if (hbarOmegaGiven) return 'mlj';
  return -deltaGEv > lambdaEv ? 'mlj-assumed-hbar-omega' : 'marcus';
}

/**
 * Score of one row; NaN when the row has no score (stored as NULL).
 * @param log10kCs log10 k of charge separation from the model valid for that step
 * @param log10kCr log10 k of charge recombination from the model valid for that step
 */
export function scoreRow(
  choice: ScoreChoice,
  deltaGCsEv: number,
  deltaGCrEv: number,
  lambdaEv: number,
  log10kCs: number,
  log10kCr: number,
): number {
  if (choice.kind === 'fastest-forward-above-floor') {
    const floor = choice.floorEv ?? 0.1;
    return -deltaGCsEv >= floor ? log10kCs : Number.NaN;
  }
  const bonus = -deltaGCrEv > lambdaEv ? INVERTED_CR_BONUS : 0;
  return log10kCs - log10kCr + bonus;
}

/** Bounds of an assumed ħω: a real vibrational quantum, 100–4000 cm⁻¹. */
export const ASSUMED_HBAR_OMEGA_RANGE_EV = [0.0124, 0.496] as const;

export function parseScoreChoice(
  kind: unknown,
  floor: unknown,
  hbarOmega?: unknown,
): ScoreChoice | { field: string; message: string } {
  const k = kind === undefined || kind === '' ? DEFAULT_SCORE.kind : kind;
  if (typeof k !== 'string' || !(SCORE_KINDS as readonly string[]).includes(k)) {
    return { field: 'score', message: `must be one of ${SCORE_KINDS.join(', ')}` };
  }
  let choice: ScoreChoice = { kind: k as ScoreKind };
  if (floor !== undefined && floor !== '' && floor !== null) {
    const f = Number(floor);
    if (!Number.isFinite(f)) return { field: 'floorEv', message: 'is not a finite number' };
    choice = { ...choice, floorEv: f };
  }
  if (hbarOmega !== undefined && hbarOmega !== '' && hbarOmega !== null) {
    const w = typeof hbarOmega === 'string' ? Number(hbarOmega) : Number.NaN;
    const [low, high] = ASSUMED_HBAR_OMEGA_RANGE_EV;
    if (!Number.isFinite(w) || w < low || w > high) {
      return {
        field: 'assumedHbarOmegaEv',
        message: `must be a number from ${low} to ${high} eV (100–4000 cm⁻¹)`,
      };
    }
    choice = { ...choice, assumedHbarOmegaEv: w };
  }
  return choice;
}
