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

/** A comment on a report, optionally anchored to a parameter kind and threaded under a parent. */
@Entity({ name: 'report_comments' })
@Index('idx_report_comments_report', ['reportId', 'createdAt'])
export class ReportCommentEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'report_id' })
  reportId: string;

  @Column({ type: 'uuid', name: 'author_id', nullable: true })
  authorId: string | null;

  @Column({ type: 'text' })
  body: string;

  /** Parameter kind (e.g. `coupling`) or null for the report as a whole. */
  @Column({ type: 'text', nullable: true })
  anchor: string | null;

  @Column({ type: 'uuid', name: 'parent_id', nullable: true })
  parentId: string | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  @ManyToOne(() => ReportEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'report_id', foreignKeyConstraintName: 'FK_report_comments_report' })
  report: Relation<ReportEntity>;

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'author_id', foreignKeyConstraintName: 'FK_report_comments_author' })
  author: Relation<UserEntity> | null;

  @ManyToOne(() => ReportCommentEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'parent_id', foreignKeyConstraintName: 'FK_report_comments_parent' })
  parent: Relation<ReportCommentEntity> | null;
}
