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
import { ReportEntity } from './report';
import { UserEntity } from './user';

/** One status change of a report (creation has `from` null). Never updated. */
@Entity({ name: 'report_transitions' })
@Index('idx_report_transitions_report', ['reportId', 'at'])
export class ReportTransitionEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'report_id' })
  reportId: string;

  @Column({ type: 'text', name: 'from_status', nullable: true })
  fromStatus: string | null;

  @Column({ type: 'text', name: 'to_status' })
  toStatus: string;

  @Column({ type: 'uuid', name: 'by_id', nullable: true })
  byId: string | null;

  @CreateDateColumn({ type: 'timestamptz' })
  at: Date;

  @Column({ type: 'text', nullable: true })
  note: string | null;

  /** The snapshot the transition acted on (null for rows written before it was recorded). */
  @Column({ type: 'text', name: 'snapshot_id', nullable: true })
  snapshotId: string | null;

  @ManyToOne(() => ReportEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'report_id', foreignKeyConstraintName: 'FK_report_transitions_report' })
  report: Relation<ReportEntity>;

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'by_id', foreignKeyConstraintName: 'FK_report_transitions_by' })
  by: Relation<UserEntity> | null;
}
