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
} from 'typeorm';
import { TraceEntity } from './trace';
import { WorkspaceEntity } from './workspace';

/**
 * One analysis of a reactant-state and a product-state trace at a temperature, run as a
 * background job. `result` is written once, in the same transaction that sets status `done`.
 */
@Entity({ name: 'trace_analyses' })
@Index('idx_trace_analyses_workspace', ['workspaceId', 'createdAt'])
@Check('CHK_trace_analyses_status', `"status" IN ('queued', 'running', 'done', 'failed')`)
export class TraceAnalysisEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId: string;

  @Column({ type: 'uuid', name: 'reactant_trace_id' })
  reactantTraceId: string;

  @Column({ type: 'uuid', name: 'product_trace_id' })
  productTraceId: string;

  @Column({ type: 'double precision', name: 'temperature_k' })
  temperatureK: number;

  /** queued | running | done | failed */
  @Column({ type: 'text', default: 'queued' })
  status: string;

  /** Fraction of the work done, 0…1. */
  @Column({ type: 'double precision', default: 0 })
  progress: number;

  @Column({ type: 'jsonb', nullable: true })
  result: Record<string, unknown> | null;

  /** Why it failed: [{ field, message }] (refusals of the estimator, unreadable files). */
  @Column({ type: 'jsonb', nullable: true })
  error: Array<{ field: string; message: string }> | null;

  @Column({ type: 'integer', default: 0 })
  attempts: number;

  @Column({ type: 'uuid', name: 'created_by', nullable: true })
  createdBy: string | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  @Column({ type: 'timestamptz', name: 'started_at', nullable: true })
  startedAt: Date | null;

  @Column({ type: 'timestamptz', name: 'finished_at', nullable: true })
  finishedAt: Date | null;

  @ManyToOne(() => WorkspaceEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'workspace_id', foreignKeyConstraintName: 'FK_trace_analyses_workspace' })
  workspace: Relation<WorkspaceEntity>;

  @ManyToOne(() => TraceEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'reactant_trace_id', foreignKeyConstraintName: 'FK_trace_analyses_reactant' })
  reactantTrace: Relation<TraceEntity>;

  @ManyToOne(() => TraceEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'product_trace_id', foreignKeyConstraintName: 'FK_trace_analyses_product' })
  productTrace: Relation<TraceEntity>;
}
