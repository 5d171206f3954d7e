import {
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import { WorkspaceEntity } from './workspace';

/**
 * A screen: many pairs computed in chunks by workers. `input_hash` + `software_version` identify
 * inputs whose results can be reused; `bad_row_choice` records what the user chose when the
 * upload had bad rows ('none' when it had none, 'run-good' or 'fixed').
 */
@Entity({ name: 'screens' })
@Index('idx_screens_workspace', ['workspaceId', 'createdAt'])
@Index('idx_screens_reuse', ['workspaceId', 'inputHash', 'softwareVersion'])
export class ScreenEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId: string;

  @Column({ type: 'text' })
  name: string;

  /** uploaded | running | cancelled | done | failed */
  @Column({ type: 'text', default: 'uploaded' })
  status: string;

  @Column({ type: 'text', name: 'input_hash' })
  inputHash: string;

  @Column({ type: 'text', name: 'software_version' })
  softwareVersion: string;

  @Column({ type: 'integer', name: 'row_count', default: 0 })
  rowCount: number;

  @Column({ type: 'integer', name: 'bad_row_count', default: 0 })
  badRowCount: number;

  @Column({ type: 'jsonb', name: 'bad_rows', default: () => "'[]'" })
  badRows: Array<{ line: number; message: string }>;

  @Column({ type: 'text', name: 'bad_row_choice', default: 'none' })
  badRowChoice: string;

  @Column({ type: 'text', name: 'score_kind' })
  scoreKind: string;

  @Column({ type: 'double precision', name: 'score_floor_ev', nullable: true })
  scoreFloorEv: number | null;

  /** ħω (eV) the score assumes for an inverted step without one; NULL on older screens. */
  @Column({ type: 'double precision', name: 'score_hbar_omega_ev', nullable: true })
  scoreHbarOmegaEv: number | null;

  /** Unit the upload's header named per column key (values are stored canonical). */
  @Column({ type: 'jsonb', name: 'column_units', default: () => "'{}'" })
  columnUnits: Record<string, string>;

  @Column({ type: 'integer', name: 'chunk_size' })
  chunkSize: number;

  @Column({ type: 'integer', name: 'chunk_count', default: 0 })
  chunkCount: number;

  @Column({ type: 'integer', name: 'chunks_done', default: 0 })
  chunksDone: number;

  @Column({ type: 'integer', name: 'rows_done', default: 0 })
  rowsDone: number;

  @Column({ type: 'uuid', name: 'reused_from', nullable: true })
  reusedFrom: string | null;

  @Column({ type: 'text', nullable: true })
  error: string | null;

  @Column({ type: 'integer', name: 'upload_ms', nullable: true })
  uploadMs: number | null;

  @Column({ type: 'uuid', name: 'created_by', nullable: true })
  createdBy: string | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  @Column({ type: 'timestamptz', name: 'started_at', nullable: true })
  startedAt: Date | null;

  @Column({ type: 'timestamptz', name: 'finished_at', nullable: true })
  finishedAt: Date | null;

  @ManyToOne(() => WorkspaceEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'workspace_id', foreignKeyConstraintName: 'FK_screens_workspace' })
  workspace: Relation<WorkspaceEntity>;
}
