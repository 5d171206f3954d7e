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
import { MaterialEntity } from './material';
import { UserEntity } from './user';

/** Immutable snapshot of a material as saved (name, notes, λ, temperature, dimensions, neighbours), one row per version. */
@Entity({ name: 'material_versions' })
@Unique('uq_material_versions_material_version', ['materialId', 'version'])
export class MaterialVersionEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'material_id' })
  materialId: string;

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

  @ManyToOne(() => MaterialEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'material_id', foreignKeyConstraintName: 'FK_material_versions_material' })
  material: Relation<MaterialEntity>;

  @ManyToOne(() => UserEntity, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'created_by', foreignKeyConstraintName: 'FK_material_versions_created_by' })
  creator: Relation<UserEntity> | null;
}
