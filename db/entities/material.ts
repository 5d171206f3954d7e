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
import { UserEntity } from './user';
import { WorkspaceEntity } from './workspace';

/**
 * A material case (charge transport, issue 18): λ, temperature, lattice dimensionality and the
 * neighbours of one site (canonical eV, Å, K; see `MaterialInput` in contracts). `results` keeps
 * the last computed answer (rewritten on every save); `mobility` repeats its μ for the list.
 */
@Entity({ name: 'materials' })
@Index('idx_materials_workspace', ['workspaceId'])
export class MaterialEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId: string;

  @Column({ type: 'text' })
  name: string;

  @Column({ type: 'text', default: '' })
  notes: string;

  @Column({ type: 'double precision', name: 'lambda_ev' })
  lambdaEv: number;

  @Column({ type: 'double precision', name: 'lambda_sigma_ev', nullable: true })
  lambdaSigmaEv: number | null;

  @Column({ type: 'double precision', name: 'temperature_k' })
  temperatureK: number;

  @Column({ type: 'integer' })
  dimensions: number;

  /** The neighbours of one site (`MaterialNeighbour[]`). */
  @Column({ type: 'jsonb' })
  neighbours: Record<string, unknown>[];

  @Column({ type: 'jsonb', nullable: true })
  results: Record<string, unknown> | null;

  @Column({ type: 'double precision', name: 'mobility_cm2_per_vs', nullable: true })
  mobilityCm2PerVs: number | null;

  @Column({ type: 'integer', default: 1 })
  version: number;

  @Column({ type: 'uuid', name: 'created_by', nullable: true })
  createdBy: string | null;

  @Column({ type: 'uuid', name: 'updated_by', nullable: true })
  updatedBy: string | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' })
  updatedAt: Date;

  @ManyToOne(() => WorkspaceEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'workspace_id', foreignKeyConstraintName: 'FK_materials_workspace' })
  workspace: Relation<WorkspaceEntity>;

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'created_by', foreignKeyConstraintName: 'FK_materials_created_by' })
  creator: Relation<UserEntity> | null;

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'updated_by', foreignKeyConstraintName: 'FK_materials_updated_by' })
  updater: Relation<UserEntity> | null;
}
