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
 * A cascade: a multi-step electron-transfer network of states and links, stored as the
 * `kinetics.network` inputs it is computed from (CALC-API.md). `results` keeps the last computed
 * answer's outputs (rewritten on every save); `finalYield` and `longLivedLifetimeS` repeat two of
 * its numbers so the list can show and sort them.
 */
@Entity({ name: 'cascades' })
@Index('idx_cascades_workspace', ['workspaceId'])
export class CascadeEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId: string;

  @Column({ type: 'text' })
  name: string;

  @Column({ type: 'text', default: '' })
  notes: string;

  /** The `kinetics.network` inputs as the user gave them (units kept). */
  @Column({ type: 'jsonb' })
  network: Record<string, unknown>;

  /**
   * The web editor's design (derivations of the energies, σ, pairs a step came from); the
   * network above is what it resolves to. Null for cascades written as a bare network.
   */
  @Column({ type: 'jsonb', nullable: true })
  design: Record<string, unknown> | null;

  @Column({ type: 'jsonb', nullable: true })
  results: Record<string, unknown> | null;

  @Column({ type: 'double precision', name: 'long_lived_yield', nullable: true })
  longLivedYield: number | null;

  @Column({ type: 'double precision', name: 'long_lived_lifetime_s', nullable: true })
  longLivedLifetimeS: number | null;

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
  @JoinColumn({ name: 'workspace_id', foreignKeyConstraintName: 'FK_cascades_workspace' })
  workspace: Relation<WorkspaceEntity>;

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'created_by', foreignKeyConstraintName: 'FK_cascades_created_by' })
  creator: Relation<UserEntity> | null;

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'updated_by', foreignKeyConstraintName: 'FK_cascades_updated_by' })
  updater: Relation<UserEntity> | null;
}
