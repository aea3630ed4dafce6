import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, Unique } from 'typeorm';
import type { Role } from '../../shared/roles';
import { User } from './user';

@Entity({ name: 'studios' })
export class Studio {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ type: 'text' }) name: string;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
}

@Entity({ name: 'memberships' })
@Unique(['studioId', 'userId'])
export class Membership {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'studio_id', type: 'uuid' }) studioId: string;
  @Column({ name: 'user_id', type: 'uuid' }) userId: string;
  @Column({ type: 'text' }) role: Role;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @ManyToOne(() => User, { onDelete: 'CASCADE' }) @JoinColumn({ name: 'user_id' }) user?: User;
  @ManyToOne(() => Studio, { onDelete: 'CASCADE' }) @JoinColumn({ name: 'studio_id' }) studio?: Studio;
}

@Entity({ name: 'invitations' })
export class Invitation {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'studio_id', type: 'uuid' }) studioId: string;
  @Column({ type: 'text' }) email: string;
  @Column({ type: 'text' }) role: Role;
  @Column({ name: 'token_hash', type: 'text', unique: true }) tokenHash: string;
  @Column({ name: 'expires_at', type: 'timestamptz' }) expiresAt: Date;
  @Column({ name: 'accepted_at', type: 'timestamptz', nullable: true }) acceptedAt: Date | null;
  @Column({ name: 'revoked_at', type: 'timestamptz', nullable: true }) revokedAt: Date | null;
  @Column({ name: 'invited_by', type: 'uuid', nullable: true }) invitedBy: string | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
}

@Entity({ name: 'password_resets' })
export class PasswordReset {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'user_id', type: 'uuid' }) userId: string;
  @Column({ name: 'token_hash', type: 'text', unique: true }) tokenHash: string;
  @Column({ name: 'expires_at', type: 'timestamptz' }) expiresAt: Date;
  @Column({ name: 'used_at', type: 'timestamptz', nullable: true }) usedAt: Date | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
}

@Entity({ name: 'caught_mail' })
export class CaughtMail {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'from_address', type: 'text' }) fromAddress: string;
  @Column({ name: 'to_addresses', type: 'text', array: true }) toAddresses: string[];
  @Column({ type: 'text' }) subject: string;
  @Column({ name: 'text_body', type: 'text' }) textBody: string;
  @Column({ name: 'received_at', type: 'timestamptz' }) receivedAt: Date;
}
