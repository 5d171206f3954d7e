import {
  Check,
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

/** A personal API token for scripts (`gw_…`); only its SHA-256 is stored. */
@Entity({ name: 'api_tokens' })
@Check('CHK_api_tokens_scope', `"scope" IN ('read', 'read-write')`)
@Index('idx_api_tokens_user', ['userId'])
export class ApiTokenEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'user_id' })
  userId: string;

  @Column({ type: 'text' })
  name: string;

  /** First characters of the token, safe to show in lists. */
  @Column({ type: 'text' })
  prefix: string;

  @Column({ type: 'text', name: 'token_hash', unique: true })
  tokenHash: string;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;

  @Column({ type: 'timestamptz', name: 'last_used_at', nullable: true })
  lastUsedAt: Date | null;

  @Column({ type: 'timestamptz', name: 'revoked_at', nullable: true })
  revokedAt: Date | null;

  /** `read`: safe methods only; `read-write`: everything its owner may do. */
  @Column({ type: 'text', default: 'read-write' })
  scope: 'read' | 'read-write';

  /** After this instant the token is refused; null = until revoked. */
  @Column({ type: 'timestamptz', name: 'expires_at', nullable: true })
  expiresAt: Date | null;

  @ManyToOne(() => UserEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id' })
  user: Relation<UserEntity>;
}
