import {
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
import type { PairResults, PairStatus, RateModel } from '@gapwise/contracts';
import { UserEntity } from './user';
import { WorkspaceEntity } from './workspace';

/**
 * A donor–acceptor pair. Temperature is canonical (K) with the typed unit kept. The columns
 * `delta_g0` … `regime` repeat values of the parameters and results so the list can sort and
 * filter in SQL; they are rewritten on every save.
 */
@Entity({ name: 'pairs' })
@Index('idx_pairs_workspace', ['workspaceId'])
export class PairEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId: string;

  @Column({ type: 'text' })
  name: string;

  @Column({ type: 'text' })
  donor: string;

  @Column({ type: 'text' })
  acceptor: string;

  @Column({ type: 'text' })
  medium: string;

  @Column({ type: 'double precision', name: 'temperature_k' })
  temperatureK: number;

  @Column({ type: 'text', name: 'temperature_unit', default: 'K' })
  temperatureUnit: string;

  @Column({ type: 'text', default: '' })
  notes: string;

  @Column({ type: 'text', default: 'draft' })
  status: PairStatus;

  @Column({ type: 'text', array: true, default: () => "'{}'" })
  tags: string[];

  @Column({ type: 'text', default: 'marcus' })
  model: RateModel;

  @Column({ type: 'integer', default: 1 })
  version: number;

  @Column({ type: 'jsonb', nullable: true })
  results: PairResults | null;

  @Column({ type: 'double precision', name: 'delta_g0', nullable: true })
  deltaG0: number | null;

  @Column({ type: 'double precision', name: 'lambda_total', nullable: true })
  lambdaTotal: number | null;

  @Column({ type: 'double precision', name: 'coupling_abs', nullable: true })
  couplingAbs: number | null;

  @Column({ type: 'double precision', name: 'log10k', nullable: true })
  log10k: number | null;

  @Column({ type: 'text', nullable: true })
  regime: string | null;

  @Column({ type: 'uuid', name: 'created_by', nullable: true })
  createdBy: string | null;

  @Column({ type: 'uuid', name: 'updated_by', nullable: true })
  updatedBy: string | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' })
  updatedAt: Date;

  @ManyToOne(() => WorkspaceEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'workspace_id' })
  workspace: Relation<WorkspaceEntity>;

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'updated_by' })
  updater: Relation<UserEntity> | null;

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'created_by' })
  creator: Relation<UserEntity> | null;
}
