import {
  Check,
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

/** One measured rate constant of an electrode case (`fit.electrodeKinetics` point). */
export interface ElectrodePointRecord {
  /** η = E − E°′ in V. */
  overpotentialV: number;
  /** Rate constant in the case's `rateUnit`. */
  k: number;
  direction: 'reduction' | 'oxidation';
}

/**
 * An electrode case (issue 18): a redox couple at an electrode, with λ, temperature and either
 * k⁰ or |H| with the electrode's density of states, the measured k(η) and where the numbers came
 * from. Versions are immutable snapshots in `electrode_case_versions`.
 */
@Entity({ name: 'electrode_cases' })
@Index('idx_electrode_cases_workspace', ['workspaceId'])
@Check('CHK_electrode_cases_rate_source', `"rate_source" IN ('k0', 'coupling')`)
export class ElectrodeCaseEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId: string;

  @Column({ type: 'text' })
  name: string;

  @Column({ type: 'text', name: 'redox_couple' })
  redoxCouple: string;

  @Column({ type: 'text' })
  electrode: string;

  @Column({ type: 'double precision', name: 'lambda_ev' })
  lambdaEv: number;

  @Column({ type: 'double precision', name: 'temperature_k' })
  temperatureK: number;

  /** 'k0' (k⁰ given) or 'coupling' (|H| and ρ_M given; k⁰ by `electrode.mhcAbsolute`). */
  @Column({ type: 'text', name: 'rate_source' })
  rateSource: 'k0' | 'coupling';

  /** k⁰ in `rateUnit` (rate source 'k0'). */
  @Column({ type: 'double precision', nullable: true })
  k0: number | null;

  /** 's-1' or 'cm s-1': the unit of k⁰ and of the measured k. */
  @Column({ type: 'text', name: 'rate_unit', default: 's-1' })
  rateUnit: string;

  @Column({ type: 'double precision', name: 'coupling_ev', nullable: true })
  couplingEv: number | null;

  @Column({ type: 'double precision', name: 'density_of_states_per_ev', nullable: true })
  densityOfStatesPerEv: number | null;

  /** Where λ and k⁰ came from (paper, measurement, an applied fit). */
  @Column({ type: 'text', default: '' })
  provenance: string;

  @Column({ type: 'jsonb', default: () => "'[]'" })
  points: ElectrodePointRecord[];

  /** How the points were obtained, e.g. the conversion from current to k. */
  @Column({ type: 'text', name: 'data_note', default: '' })
  dataNote: string;

  @Column({ type: 'text', default: '' })
  notes: string;

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
  @JoinColumn({ name: 'workspace_id', foreignKeyConstraintName: 'FK_electrode_cases_workspace' })
  workspace: Relation<WorkspaceEntity>;

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'created_by', foreignKeyConstraintName: 'FK_electrode_cases_created_by' })
  creator: Relation<UserEntity> | null;

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'updated_by', foreignKeyConstraintName: 'FK_electrode_cases_updated_by' })
  updater: Relation<UserEntity> | null;
}
