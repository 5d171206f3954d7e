import {
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import { UserEntity } from './user';

/**
 * A signed-in browser or script session. Its id is the `sid` of the access and refresh JWTs; a
 * token is honoured only while its session is neither revoked nor expired. `generation` counts
 * refreshes: a refresh token of an older generation is a reused one and revokes the session.
 */
@Entity({ name: 'sessions' })
@Index('idx_sessions_user', ['userId'])
export class SessionEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'user_id' })
  userId: string;

  @Column({ type: 'integer', default: 0 })
  generation: number;

  @Column({ type: 'timestamptz', name: 'refreshed_at', default: () => 'now()' })
  refreshedAt: Date;

  @Column({ type: 'timestamptz', name: 'expires_at' })
  expiresAt: Date;

  @Column({ type: 'timestamptz', name: 'revoked_at', nullable: true })
  revokedAt: Date | null;

  /** Why it ended: sign-out, sign-out-everywhere, password-changed, password-reset, refresh-reuse. */
  @Column({ type: 'text', name: 'revoked_reason', nullable: true })
  revokedReason: string | null;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  @ManyToOne(() => UserEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id', foreignKeyConstraintName: 'FK_sessions_user' })
  user: Relation<UserEntity>;
}
