import {
  Check,
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
  type ValueTransformer,
} from 'typeorm';
import { UserEntity } from './user';
import { WorkspaceEntity } from './workspace';

/** bigint columns come back from pg as strings; file sizes stay far below 2^53. */
export const bigintAsNumber: ValueTransformer = {
  to: (value: number | null | undefined) => value,
  from: (value: string | null) => (value === null ? null : Number(value)),
};

/**
 * An uploaded energy-gap trace (ΔE = E_P − E_R sampled in one state). The raw file lives in
 * object storage under `object_key` (content-addressed by `sha256`); the row keeps the parse
 * settings so an analysis reads it again the same way, and what the upload's parse found.
 */
@Entity({ name: 'traces' })
@Index('idx_traces_workspace', ['workspaceId', 'uploadedAt'])
@Index('idx_traces_object_key', ['objectKey'])
@Check('CHK_traces_state', `"state" IN ('reactant', 'product')`)
export class TraceEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId: string;

  /** reactant | product: the state the simulation sampled. */
  @Column({ type: 'text' })
  state: string;

  @Column({ type: 'text', name: 'file_name' })
  fileName: string;

  @Column({ type: 'bigint', name: 'size_bytes', transformer: bigintAsNumber })
  sizeBytes: number;

  @Column({ type: 'text' })
  sha256: string;

  @Column({ type: 'text', name: 'object_key' })
  objectKey: string;

  @Column({ type: 'boolean' })
  gzip: boolean;

  /** The energy unit of the file's values (converted to eV when read). */
  @Column({ type: 'text' })
  unit: string;

  /** The column as the user chose it (name or 1-based index as text); null: the last column. */
  @Column({ type: 'text', name: 'column_setting', nullable: true })
  columnSetting: string | null;

  @Column({ type: 'integer', name: 'column_index' })
  columnIndex: number;

  @Column({ type: 'text', name: 'column_name', nullable: true })
  columnName: string | null;

  /** comma | tab | whitespace (as detected or chosen). */
  @Column({ type: 'text' })
  delimiter: string;

  @Column({ type: 'boolean', name: 'skip_bad_lines' })
  skipBadLines: boolean;

  @Column({ type: 'bigint', name: 'sample_count', transformer: bigintAsNumber })
  sampleCount: number;

  @Column({ type: 'bigint', name: 'line_count', transformer: bigintAsNumber })
  lineCount: number;

  @Column({ type: 'bigint', name: 'skipped_line_count', transformer: bigintAsNumber })
  skippedLineCount: number;

  /** The first 20 skipped lines: [{ line, message }]. */
  @Column({ type: 'jsonb', name: 'skipped_lines', default: () => "'[]'" })
  skippedLines: Array<{ line: number; message: string }>;

  @Column({ type: 'double precision', name: 'min_ev' })
  minEv: number;

  @Column({ type: 'double precision', name: 'max_ev' })
  maxEv: number;

  @Column({ type: 'double precision', name: 'mean_ev' })
  meanEv: number;

  @Column({ type: 'uuid', name: 'uploaded_by', nullable: true })
  uploadedBy: string | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'uploaded_at' })
  uploadedAt: Date;

  @ManyToOne(() => WorkspaceEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'workspace_id', foreignKeyConstraintName: 'FK_traces_workspace' })
  workspace: Relation<WorkspaceEntity>;

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'uploaded_by', foreignKeyConstraintName: 'FK_traces_uploaded_by' })
  uploader: Relation<UserEntity> | null;
}
