import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * A registration waiting for its e-mail confirmation. One row per (lower-cased) address: a new
 * request replaces the previous one and its token. Only the SHA-256 of the token is stored; the
 * row is deleted when the link is used. The user is created only on confirmation.
 */
@Entity({ name: 'pending_registrations' })
@Index('idx_pending_registrations_expires', ['expiresAt'])
export class PendingRegistrationEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'text', unique: true })
  email: string;

  @Column({ type: 'text', name: 'display_name' })
  displayName: string;

  @Column({ type: 'text', name: 'password_hash' })
  passwordHash: string;

  @Column({ type: 'text', name: 'token_hash', unique: true })
  tokenHash: string;

  @Column({ type: 'timestamptz', name: 'expires_at' })
  expiresAt: Date;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;
}
