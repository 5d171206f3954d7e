import {
  Column,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import type { ParameterKind, ProvenanceKind } from '@gapwise/contracts';
import { PairEntity } from './pair';

/** One parameter of a pair: canonical value, typed unit, uncertainty and provenance. */
@Entity({ name: 'pair_parameters' })
@Index('idx_pair_parameters_pair', ['pairId'])
export class PairParameterEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'pair_id' })
  pairId: string;

  @Column({ type: 'integer' })
  position: number;

  @Column({ type: 'text' })
  kind: ParameterKind;

  @Column({ type: 'double precision' })
  value: number;

  @Column({ type: 'text' })
  unit: string;

  @Column({ type: 'double precision', nullable: true })
  uncertainty: number | null;

  @Column({ type: 'text', name: 'provenance_kind' })
  provenanceKind: ProvenanceKind;

  @Column({ type: 'text', nullable: true })
  citation: string | null;

  @Column({ type: 'text', name: 'method_id', nullable: true })
  methodId: string | null;

  @Column({ type: 'jsonb', name: 'method_inputs', nullable: true })
  methodInputs: Record<string, unknown> | null;

  @Column({ type: 'jsonb', nullable: true })
  sources: Array<{ type: string; id: string }> | null;

  @Column({ type: 'text', nullable: true })
  note: string | null;

  @ManyToOne(() => PairEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'pair_id' })
  pair: Relation<PairEntity>;
}
