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
import type { SeriesFit, SeriesModelOptions } from '@gapwise/contracts';
import { WorkspaceEntity } from './workspace';

/**
 * A measured driving-force series: points in `series_points`, the temperature, the model
 * options of the last fit, the pairs it is linked to, and the last fit result.
 */
@Entity({ name: 'series' })
@Index('idx_series_workspace', ['workspaceId'])
export class SeriesEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'workspace_id' })
  workspaceId: string;

  @Column({ type: 'text' })
  name: string;

  @Column({ type: 'double precision', name: 'temperature_k' })
  temperatureK: number;

  @Column({ type: 'text', name: 'temperature_unit', default: 'K' })
  temperatureUnit: string;

  /** Unit the ΔG° values were typed in (display only; stored in eV). */
  @Column({ type: 'text', name: 'energy_unit', default: 'eV' })
  energyUnit: string;

  @Column({ type: 'jsonb', name: 'model_options', default: () => "'{}'" })
  modelOptions: SeriesModelOptions;

  @Column({ type: 'uuid', name: 'pair_ids', array: true, default: () => "'{}'" })
  pairIds: string[];

  @Column({ type: 'jsonb', nullable: true })
  fit: SeriesFit | null;

  @Column({ type: 'text', default: '' })
  notes: string;

  @Column({ type: 'integer', default: 1 })
  version: number;

  @Column({ type: 'uuid', name: 'created_by', nullable: true })
  createdBy: string | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  @UpdateDateColumn({ type: 'timestamptz', name: 'updated_at' })
  updatedAt: Date;

  @ManyToOne(() => WorkspaceEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'workspace_id', foreignKeyConstraintName: 'FK_series_workspace' })
  workspace: Relation<WorkspaceEntity>;
}
