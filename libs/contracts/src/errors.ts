/** The JSON body of every API error (one error middleware answers all of them). */
export interface ApiErrorBody {
  readonly error: {
    /** Stable kebab-case code, e.g. `validation-failed`, `version-conflict`, `forbidden`. */
    readonly code: string;
    readonly message: string;
    /** Every refused field when `code` is `validation-failed`. */
    readonly fields?: ReadonlyArray<{ readonly field: string; readonly message: string }>;
    /** The current record when `code` is `version-conflict` (e.g. the current `Pair`). */
    readonly current?: unknown;
  };
}
