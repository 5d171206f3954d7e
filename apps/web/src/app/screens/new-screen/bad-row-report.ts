import type { ApiError } from '../../session/api-errors';

/** A refused upload's bad rows, as the API reports them (400 screen-bad-rows). */
export interface BadRowReport {
  readonly message: string;
  readonly badRowCount: number;
  readonly goodRows: number;
  /** The file cannot be read as a screen at all (no choice to run good rows). */
  readonly fatal: boolean;
  readonly rows: ReadonlyArray<{ readonly line: number | null; readonly message: string }>;
}

/** Reads the report out of an API error, or null when the error is something else. */
export function badRowReportOf(error: ApiError): BadRowReport | null {
  if (error.code !== 'screen-bad-rows') return null;
  const current = (error.current ?? {}) as Partial<{
    badRowCount: number;
    goodRows: number;
    fatal: boolean;
  }>;
  const rows = (error.fields ?? []).map((f) => {
    const m = /^line (\d+)$/.exec(f.field);
    // The message repeats "Line n: " for readers of the raw API answer; the page shows it once.
    return { line: m ? Number(m[1]) : null, message: f.message.replace(/^Line \d+:\s*/, '') };
  });
  return {
    message: error.message,
    badRowCount: current.badRowCount ?? rows.length,
    goodRows: current.goodRows ?? 0,
    fatal: !!current.fatal,
    rows,
  };
}
