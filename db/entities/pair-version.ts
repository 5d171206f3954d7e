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
import type { Pair } from '@gapwise/contracts';
import { PairEntity } from './pair';
import { UserEntity } from './user';

/** Immutable snapshot of a pair as saved (the full `Pair` JSON), one row per version. */
@Entity({ name: 'pair_versions' })
@Unique('uq_pair_versions_pair_version', ['pairId', 'version'])
export class PairVersionEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'pair_id' })
  pairId: string;

  @Column({ type: 'integer' })
  version: number;

  @Column({ type: 'jsonb' })
  snapshot: Pair;

  @Column({ type: 'text' })
  summary: string;

  @Column({ type: 'uuid', name: 'created_by', nullable: true })
  createdBy: string | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  @ManyToOne(() => PairEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'pair_id' })
  pair: Relation<PairEntity>;

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'created_by' })
  creator: Relation<UserEntity> | null;
}
