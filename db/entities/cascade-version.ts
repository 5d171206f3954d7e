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
import { CascadeEntity } from './cascade';
import { UserEntity } from './user';

/** Immutable snapshot of a cascade as saved (name, notes, network), one row per version. */
@Entity({ name: 'cascade_versions' })
@Unique('uq_cascade_versions_cascade_version', ['cascadeId', 'version'])
export class CascadeVersionEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'cascade_id' })
  cascadeId: string;

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

  @ManyToOne(() => CascadeEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'cascade_id', foreignKeyConstraintName: 'FK_cascade_versions_cascade' })
  cascade: Relation<CascadeEntity>;

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'created_by', foreignKeyConstraintName: 'FK_cascade_versions_created_by' })
  creator: Relation<UserEntity> | null;
}
