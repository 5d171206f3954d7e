import {
  Column,
  CreateDateColumn,
  Entity,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  Unique,
  type Relation,
} from 'typeorm';
import { ElectrodeCaseEntity } from './electrode-case';
import { UserEntity } from './user';

/** Immutable snapshot of an electrode case as saved, one row per version. */
@Entity({ name: 'electrode_case_versions' })
@Unique('uq_electrode_case_versions_case_version', ['caseId', 'version'])
export class ElectrodeCaseVersionEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'case_id' })
  caseId: string;

  @Column({ type: 'integer' })
  version: number;

  @Column({ type: 'jsonb' })
  snapshot: Record<string, unknown>;

  @Column({ type: 'text' })
  summary: string;

  @Column({ type: 'uuid', name: 'created_by', nullable: true })
  createdBy: string | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  @ManyToOne(() => ElectrodeCaseEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'case_id', foreignKeyConstraintName: 'FK_electrode_case_versions_case' })
  electrodeCase: Relation<ElectrodeCaseEntity>;

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({
    name: 'created_by',
    foreignKeyConstraintName: 'FK_electrode_case_versions_created_by',
  })
  creator: Relation<UserEntity> | null;
}
