/**
 * Ranking scores a user can pick for a screen. Each is a plain function of one result row, so
 * the worker computes it with the rates and the table sorts on an indexed column.
 */
import { SCREEN_SCORE_KINDS, type ScreenScoreKind } from '@gapwise/contracts';

export const SCORE_KINDS = SCREEN_SCORE_KINDS;
export type ScoreKind = ScreenScoreKind;

export interface ScoreChoice {
  readonly kind: ScoreKind;
  /** For `fastest-forward-above-floor`: minimum −ΔG°_CS in eV (default 0.1 eV). */
  readonly floorEv?: number;
}

export const DEFAULT_SCORE: ScoreChoice = { kind: 'cs-fast-cr-inverted' };

/** Decades added when recombination lies in the inverted region (−ΔG°_CR > λ). */
export const INVERTED_CR_BONUS = 1;

export const SCORE_DESCRIPTIONS: Record<ScoreKind, string> = {
  'cs-fast-cr-inverted':
    'log10 k_CS − log10 k_CR, plus one decade when recombination lies in the inverted region ' +
    '(−ΔG°_CR > λ). MLJ rates are used where ħω is given, classical Marcus otherwise.',
  'fastest-forward-above-floor':
    'log10 k_CS for pairs whose charge-separation driving force −ΔG°_CS reaches the floor; ' +
    'pairs below the floor get no score and sort last.',
};

/**
 * Score of one row; NaN when the row has no score (stored as NULL).
 * @param log10kCs best available log10 k of charge separation
 * @param log10kCr best available log10 k of charge recombination
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

export function parseScoreChoice(kind: unknown, floor: unknown): ScoreChoice | string {
  const k = kind === undefined || kind === '' ? DEFAULT_SCORE.kind : kind;
  if (typeof k !== 'string' || !(SCORE_KINDS as readonly string[]).includes(k)) {
    return `score must be one of ${SCORE_KINDS.join(', ')}`;
  }
  if (floor === undefined || floor === '' || floor === null) return { kind: k as ScoreKind };
  const f = Number(floor);
  if (!Number.isFinite(f)) return 'floorEv is not a finite number';
  return { kind: k as ScoreKind, floorEv: f };
}
