/**
 * Reports and their review, as the API sends them and as the PDF renderer reads them.
 *
 * A `ReportSnapshot` is frozen when a report is created (or revised): the pair at one version,
 * the results computed from it, the methods used with their published sources, and the software
 * version. It never changes afterwards; its id is a content hash (`snapshotId`). The review state
 * (status, comments, decisions) lives beside it and is passed to the renderer separately.
 */
import type { PairStepResults, ParameterKind, Provenance, RateModel } from './pairs';

export const REPORT_STATUSES = ['draft', 'submitted', 'changes-requested', 'approved'] as const;
export type ReportStatus = (typeof REPORT_STATUSES)[number];

export const REPORT_KINDS = ['pair', 'comparison', 'cascade'] as const;
export type ReportKind = (typeof REPORT_KINDS)[number];

/** Review actions and the statuses they move between (draft → submitted → …). */
export const REPORT_TRANSITIONS = {
  submit: { from: ['draft', 'changes-requested'], to: 'submitted' },
  'request-changes': { from: ['submitted'], to: 'changes-requested' },
  approve: { from: ['submitted'], to: 'approved' },
} as const satisfies Record<string, { from: readonly ReportStatus[]; to: ReportStatus }>;
export type ReportAction = keyof typeof REPORT_TRANSITIONS;

/** One input of a pair as it stood when the snapshot was taken. */
export interface ReportInput {
  /** Parameter kind, or `temperature` for the pair's temperature. */
  readonly kind: ParameterKind | 'temperature';
  readonly label: string;
  /** Canonical value (eV, Å, K, V, s, …). */
  readonly value: number;
  readonly canonicalUnit: string;
  /** The value in the unit the user typed, and that unit. */
  readonly typedValue: number;
  readonly typedUnit: string;
  /** One standard deviation in the canonical unit, or null. */
  readonly uncertainty: number | null;
  readonly provenance: Provenance;
}

/** Monte Carlo interval of log10 k from the stated uncertainties. */
export interface ReportInterval {
  readonly log10kMedian: number;
  readonly log10kLow: number;
  readonly log10kHigh: number;
  /** Lower and upper percentiles, e.g. 2.5 and 97.5. */
  readonly percentiles: readonly [number, number];
  readonly samples: number;
  readonly seed: number;
  /**
   * The distribution of log10 k the interval summarises (bin edges, counts per bin), as the pair
   * page draws it; absent in snapshots taken before it was kept.
   */
  readonly histogram?: { readonly edges: readonly number[]; readonly counts: readonly number[] };
}

/** The result of one rate model for the pair, or why it does not apply. */
export interface ReportModelResult {
  /** A pair rate model, or `ruler` (the empirical protein ruler, when an edge distance is given). */
  readonly model: RateModel | 'ruler';
  /** Calculation method id (CALC-API.md), e.g. `rate.marcus`. */
  readonly methodId: string;
  /** Whether this is the pair's chosen model. */
  readonly primary: boolean;
  readonly applies: boolean;
  /** When the model does not apply: what is missing or refused. */
  readonly reason: string | null;
  readonly k: number | null;
  readonly log10k: number | null;
  /** ΔG‡ in eV (classical (ΔG° + λ)²/4λ where the model does not report its own). */
  readonly activationFreeEnergy: number | null;
  readonly regime: string | null;
  /**
   * nonadiabatic, intermediate or adiabatic (CALC-API.md `couplingRegime`); absent in snapshots
   * taken before reports carried it.
   */
  readonly couplingRegime?: string | null;
  readonly interval: ReportInterval | null;
  readonly warnings: ReadonlyArray<{ readonly code: string; readonly message: string }>;
}

/** A method cited in the report: the equation as printed and its published sources. */
export interface ReportMethod {
  readonly id: string;
  readonly name: string;
  /** Plain-text equation(s), Unicode (λ, Δ, ‡, subscripts, U+2212 minus). */
  readonly equation: string;
  readonly references: readonly string[];
}

/** Everything a report shows about one pair. */
export interface ReportPairSnapshot {
  readonly pairId: string;
  readonly pairVersion: number;
  readonly name: string;
  readonly donor: string;
  readonly acceptor: string;
  readonly medium: string;
  readonly temperatureK: number;
  readonly model: RateModel;
  readonly inputs: readonly ReportInput[];
  readonly results: readonly ReportModelResult[];
  /** Warnings of the pair as a whole, de-duplicated across models. */
  readonly warnings: ReadonlyArray<{ readonly code: string; readonly message: string }>;
  /**
   * Charge recombination as the pair model computes it (null without ΔG°_CR; absent in
   * snapshots frozen before it was reported).
   */
  readonly recombination?: PairStepResults | null;
  /** log10(k_CS / k_CR) of the chosen model. */
  readonly log10Ratio?: number | null;
}

/** One state of a cascade as a report shows it. */
export interface ReportCascadeState {
  readonly id: string;
  readonly label: string;
  readonly kind: string;
  /** Free energy, eV (the ground state at 0). */
  readonly energyEv: number;
  /** How the energy was given, as a sentence ("E₀₀ typed as 590 nm", "typed as 1.8 eV"). */
  readonly source: string;
}

/** One directed step of a cascade: its rate and where it comes from. */
export interface ReportCascadeStep {
  readonly from: string;
  readonly to: string;
  /** `fixed` (a given rate or lifetime), `electronTransfer`, `detailedBalance` (reverse). */
  readonly type: 'fixed' | 'electronTransfer' | 'detailedBalance';
  readonly k: number;
  readonly deltaG0Ev: number | null;
  readonly regime: string | null;
  readonly couplingRegime: string | null;
  /** Integrated flux ∫k p dt: expected number of times the step is taken (can exceed 1). */
  readonly flux: number;
  /** The step's provenance as a sentence: inputs with the units the user typed, or the rule. */
  readonly source: string;
}

/** A yield, lifetime or other number of a cascade, with its Monte Carlo interval when known. */
export interface ReportCascadeValue {
  readonly label: string;
  readonly value: number;
  readonly unit: string;
  /** 2.5 % and 97.5 % points over the stated uncertainties, or null (none stated). */
  readonly low: number | null;
  readonly high: number | null;
}

/** Everything a cascade report shows (issue 17). */
export interface ReportCascadeSnapshot {
  readonly cascadeId: string;
  readonly cascadeVersion: number;
  readonly name: string;
  readonly notes: string;
  readonly temperatureK: number;
  readonly states: readonly ReportCascadeState[];
  readonly steps: readonly ReportCascadeStep[];
  /** Final-state yields, formation yields and lifetimes, with intervals. */
  readonly yields: readonly ReportCascadeValue[];
  readonly lifetimes: readonly ReportCascadeValue[];
  readonly dominantPathway: readonly string[];
  /** Populations on the log time grid, for the population plot. */
  readonly times: readonly number[];
  readonly populations: Readonly<Record<string, readonly number[]>>;
  /** The landscape: transition states of the ET steps and the disconnectivity tree. */
  readonly transitionStates: ReadonlyArray<{
    readonly from: string;
    readonly to: string;
    readonly energyEv: number;
  }>;
  readonly tree: {
    readonly nodes: ReadonlyArray<{
      readonly id: string;
      readonly kind: 'minimum' | 'join';
      readonly energy: number;
      readonly children: readonly string[];
    }>;
    readonly roots: readonly string[];
  };
  /** How the intervals were obtained, or why there are none. */
  readonly monteCarlo: { readonly samples: number; readonly seed: number } | null;
  readonly monteCarloNote: string;
  readonly warnings: ReadonlyArray<{ readonly code: string; readonly message: string }>;
}

export interface ReportSnapshot {
  readonly schema: 1;
  readonly kind: ReportKind;
  readonly title: string;
  readonly workspace: { readonly id: string; readonly name: string };
  readonly author: { readonly id: string; readonly displayName: string };
  /** ISO time the snapshot was frozen. */
  readonly createdAt: string;
  readonly softwareVersion: string;
  /** Physical constants' standard, e.g. `CODATA 2018`. */
  readonly constants: string;
  readonly pairs: readonly ReportPairSnapshot[];
  /** A cascade report's network (kind `cascade`; `pairs` is then empty). */
  readonly cascade?: ReportCascadeSnapshot;
  readonly methods: readonly ReportMethod[];
  /** The "limits of this estimate" note, as printed. */
  readonly limitsNote: string;
}

/** One status change of a report. */
export interface ReportTransitionView {
  readonly from: ReportStatus | null;
  readonly to: ReportStatus;
  readonly by: { readonly id: string; readonly displayName: string };
  readonly at: string;
  readonly note: string | null;
  /** The snapshot the transition acted on; null for transitions recorded before it was kept. */
  readonly snapshotId?: string | null;
}

/** What a transition of the review history means to the reader (see `reviewRounds`). */
export interface ReviewRound {
  /** For a submission: its number, 1 for the first (the revision a reviewer saw). */
  readonly submission: number | null;
  /**
   * For a submission after the first: whether the snapshot differs from the one submitted
   * before (the author revised it from newer pair versions); null when either is unknown.
   */
  readonly snapshotChanged: boolean | null;
}

/** One entry per transition, in order: submissions numbered, snapshot changes marked. */
export function reviewRounds(history: readonly ReportTransitionView[]): ReviewRound[] {
  let submission = 0;
  let previous: string | null | undefined;
  return history.map((t) => {
    if (t.to !== 'submitted') return { submission: null, snapshotChanged: null };
    submission += 1;
    const now = t.snapshotId ?? null;
    const changed = submission === 1 || !previous || !now ? null : previous !== now;
    previous = now;
    return { submission, snapshotChanged: changed };
  });
}

/**
 * The revision a reviewer knows: how many times the report was submitted (comments and status
 * changes in between are not revisions). 0 while it was never submitted.
 */
export function reviewRevision(history: readonly ReportTransitionView[]): number {
  return history.filter((t) => t.to === 'submitted').length;
}

/** "Approved, revision 2" / "Draft, not yet submitted". */
export function reviewStatusText(
  status: ReportStatus,
  history: readonly ReportTransitionView[],
): string {
  const s = status.replace(/-/g, ' ');
  const label = s.charAt(0).toUpperCase() + s.slice(1);
  const n = reviewRevision(history);
  return n === 0 ? `${label}, not yet submitted` : `${label}, revision ${n}`;
}

/** The decision column of the review history: "Draft → Submitted (revision 2, snapshot changed)". */
export function transitionText(t: ReportTransitionView, round: ReviewRound): string {
  const label = (x: string) => {
    const s = x.replace(/-/g, ' ');
    return s.charAt(0).toUpperCase() + s.slice(1);
  };
  const move = t.from ? `${label(t.from)} → ${label(t.to)}` : `Created as ${label(t.to)}`;
  if (round.submission === null) return move;
  const change =
    round.snapshotChanged === true
      ? `; snapshot changed since revision ${round.submission - 1}`
      : round.snapshotChanged === false
        ? `; same snapshot as revision ${round.submission - 1}`
        : '';
  return `${move} (revision ${round.submission}${change})`;
}

export interface ReportCommentView {
  readonly id: string;
  readonly author: { readonly id: string; readonly displayName: string };
  readonly body: string;
  /** The parameter kind the comment is anchored to, or null for the report as a whole. */
  readonly anchor: string | null;
  readonly parentId: string | null;
  readonly createdAt: string;
}

/** What the renderer needs besides the snapshot: the review state at rendering time. */
export interface ReportReviewState {
  readonly reportId: string;
  readonly snapshotId: string;
  readonly revision: number;
  readonly status: ReportStatus;
  readonly history: readonly ReportTransitionView[];
  readonly comments: readonly ReportCommentView[];
}

/** `GET /api/reports/:id`. */
export interface ReportView extends ReportReviewState {
  readonly workspaceId: string;
  readonly kind: ReportKind;
  readonly title: string;
  readonly author: { readonly id: string; readonly displayName: string };
  readonly pairIds: readonly string[];
  readonly snapshot: ReportSnapshot;
  readonly createdAt: string;
  readonly updatedAt: string;
}

/** A row of `GET /api/workspaces/:wid/reports` and `GET /api/reviews/waiting`. */
export interface ReportListItem {
  readonly id: string;
  readonly workspaceId: string;
  readonly workspaceName?: string;
  readonly kind: ReportKind;
  readonly title: string;
  readonly status: ReportStatus;
  readonly author: { readonly id: string; readonly displayName: string };
  readonly pairIds: readonly string[];
  readonly snapshotId: string;
  readonly createdAt: string;
  readonly updatedAt: string;
}

/** Body of `POST /api/workspaces/:wid/reports`: one pair, or several for a comparison. */
export type ReportCreate =
  | { readonly pairId: string; readonly title?: string }
  | { readonly cascadeId: string; readonly title?: string }
  | { readonly pairIds: readonly string[]; readonly title?: string };

export interface ReportCommentCreate {
  readonly body: string;
  readonly anchor?: string | null;
  readonly parentId?: string | null;
}

/** The cautions note of PRODUCT.md, printed on every report and on the pair page. */
export const LIMITS_OF_ESTIMATE_NOTE =
  'These are model estimates with stated assumptions, not measurements. Agreement with ' +
  'experiment to within an order of magnitude is typical. Check the regime and the warnings ' +
  'before relying on a number.';

/** Whether a report in this status may still change (comments, revisions, deletion). */
export function isReportFrozen(status: ReportStatus): boolean {
  return status === 'approved';
}
