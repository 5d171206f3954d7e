import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * The record kept when a workspace is deleted: who, when, and what it held. Deliberately without
 * foreign keys (to the workspace, which is gone, or to the user, who may leave later): it must
 * survive the workspace's cascade and the deleting user's own deletion. Never updated.
 */
@Entity({ name: 'workspace_deletions' })
@Index('idx_workspace_deletions_deleted_at', ['deletedAt'])
export class WorkspaceDeletionEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId: string;

  @Column({ type: 'text', name: 'workspace_name' })
  workspaceName: string;

  @Column({ type: 'uuid', name: 'deleted_by', nullable: true })
  deletedBy: string | null;

  /** E-mail of the deleting user at the time (kept if the account goes). */
  @Column({ type: 'text', name: 'deleted_by_email' })
  deletedByEmail: string;

  @CreateDateColumn({ type: 'timestamptz', name: 'deleted_at' })
  deletedAt: Date;

  @Column({ type: 'integer', name: 'pair_count' })
  pairCount: number;

  @Column({ type: 'integer', name: 'report_count' })
  reportCount: number;

  @Column({ type: 'integer', name: 'screen_count' })
  screenCount: number;

  @Column({ type: 'integer', name: 'trace_count' })
  traceCount: number;

  @Column({ type: 'integer', name: 'series_count' })
  seriesCount: number;

  @Column({ type: 'integer', name: 'member_count' })
  memberCount: number;
}
