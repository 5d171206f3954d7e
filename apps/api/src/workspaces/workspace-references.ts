import type { EntityManager } from 'typeorm';
import { validationFailed } from '../http/app-error';
import { isUuid } from '../http/validate';

/** Tables of the records a provenance source or a series may point to, by source type. */
const TABLE_OF_TYPE: Readonly<Record<string, string>> = {
  pair: 'pairs',
  series: 'series',
  trace: 'traces',
  'trace-analysis': 'trace_analyses',
  report: 'reports',
  screen: 'screens',
};

export interface Reference {
  /** The field as the request named it (`pairIds.2`, `parameters.0.provenance.sources.1.id`). */
  readonly field: string;
  readonly type: string;
  readonly id: string;
}

/**
 * Refuses (400 naming each field) references to records that are not in `workspaceId`: an id of
 * another workspace must never be linked from this one (it would leak that it exists, and a
 * read through the link would cross the workspace boundary). Types without a table (free-text
 * sources such as `parameter`) are not checked.
 */
export async function requireWorkspaceReferences(
  db: EntityManager,
  workspaceId: string,
  references: readonly Reference[],
): Promise<void> {
  const problems: Array<{ field: string; message: string }> = [];
  const byTable = new Map<string, Reference[]>();
  for (const ref of references) {
    if (!Object.hasOwn(TABLE_OF_TYPE, ref.type)) continue;
    if (!isUuid(ref.id)) {
      problems.push({ field: ref.field, message: `is not a ${ref.type} of this workspace` });
      continue;
    }
    const table = TABLE_OF_TYPE[ref.type]!;
    byTable.set(table, [...(byTable.get(table) ?? []), ref]);
  }
  for (const [table, refs] of byTable) {
    // One query per table for the whole list (the table name comes from the constant map).
    const rows: Array<{ id: string }> = await db.query(
      `SELECT id FROM ${table} WHERE workspace_id = $1 AND id = ANY($2::uuid[])`,
      [workspaceId, refs.map((r) => r.id)],
    );
    const found = new Set(rows.map((r) => r.id));
    for (const ref of refs)
      if (!found.has(ref.id.toLowerCase()))
        problems.push({ field: ref.field, message: `is not a ${ref.type} of this workspace` });
  }
  if (problems.length) throw validationFailed(problems);
}

/** The provenance sources of a pair input, as references with their request field names. */
export function provenanceReferences(input: {
  readonly parameters: ReadonlyArray<{
    readonly provenance: { readonly sources?: ReadonlyArray<{ type: string; id: string }> | null };
  }>;
}): Reference[] {
  return input.parameters.flatMap((p, i) =>
    (p.provenance.sources ?? []).map((s, j) => ({
      field: `parameters.${i}.provenance.sources.${j}.id`,
      type: s.type,
      id: s.id,
    })),
  );
}
