import {
  Check,
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
  type Relation,
} from 'typeorm';
import { CascadeEntity } from './cascade';
import { UserEntity } from './user';
import { WorkspaceEntity } from './workspace';

/**
 * A report of one pair, a comparison of pairs, or a cascade (a network of states). `snapshot` is frozen at creation (and replaced
 * only by a revision while in draft or changes-requested); `snapshotId` is its SHA-256 content
 * hash. `revision` counts every change of what the PDF shows (revisions, comments, decisions);
 * `pdfKey` names the stored PDF of the current revision, if generated.
 */
@Entity({ name: 'reports' })
@Index('idx_reports_workspace_status', ['workspaceId', 'status'])
@Index('idx_reports_cascade', ['cascadeId'])
@Check('CHK_reports_kind', `"kind" IN ('pair', 'comparison', 'cascade')`)
@Check('CHK_reports_status', `"status" IN ('draft', 'submitted', 'changes-requested', 'approved')`)
export class ReportEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId: string;

  /** pair | comparison | cascade */
  @Column({ type: 'text' })
  kind: string;

  @Column({ type: 'text' })
  title: string;

  /** draft | submitted | changes-requested | approved */
  @Column({ type: 'text', default: 'draft' })
  status: string;

  @Column({ type: 'uuid', name: 'author_id', nullable: true })
  authorId: string | null;

  @Column({ type: 'uuid', array: true, name: 'pair_ids', default: () => "'{}'" })
  pairIds: string[];

  /** A cascade report's cascade (null for pair reports, or once the cascade is deleted). */
  @Column({ type: 'uuid', name: 'cascade_id', nullable: true })
  cascadeId: string | null;

  /** The cascade version the snapshot was frozen from. */
  @Column({ type: 'integer', name: 'cascade_version', nullable: true })
  cascadeVersion: number | null;

  @Column({ type: 'jsonb' })
  snapshot: unknown;

  @Column({ type: 'text', name: 'snapshot_id' })
  snapshotId: string;

  @Column({ type: 'integer', default: 1 })
  revision: number;

  @Column({ type: 'text', name: 'pdf_key', nullable: true })
  pdfKey: string | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' })
  updatedAt: Date;

  @ManyToOne(() => WorkspaceEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'workspace_id', foreignKeyConstraintName: 'FK_reports_workspace' })
  workspace: Relation<WorkspaceEntity>;

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'author_id', foreignKeyConstraintName: 'FK_reports_author' })
  author: Relation<UserEntity> | null;

  @ManyToOne(() => CascadeEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'cascade_id', foreignKeyConstraintName: 'FK_reports_cascade' })
  cascade: Relation<CascadeEntity> | null;
}
