import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

const bigintAsNumber = { to: (v: number | null) => v, from: (v: string | null) => (v === null ? null : Number(v)) };

/** A link for an outside retoucher: only the SHA-256 of its token is kept. */
@Entity({ name: 'share_links' })
export class ShareLink {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'studio_id', type: 'uuid' }) studioId: string;
  @Column({ name: 'stack_id', type: 'uuid' }) stackId: string;
  @Column({ type: 'text' }) email: string;
  @Column({ name: 'token_hash', type: 'text', unique: true }) tokenHash: string;
  @Column({ name: 'expires_at', type: 'timestamptz' }) expiresAt: Date;
  @Column({ name: 'revoked_at', type: 'timestamptz', nullable: true }) revokedAt: Date | null;
  @Column({ name: 'download_count', type: 'int' }) downloadCount: number;
  @Column({ name: 'last_download_at', type: 'timestamptz', nullable: true }) lastDownloadAt: Date | null;
  @Column({ name: 'created_by', type: 'uuid', nullable: true }) createdBy: string | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
}

/** The merged picture a retoucher sent back for a stack, with its previews made by the worker. */
@Entity({ name: 'merged_results' })
export class MergedResult {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'stack_id', type: 'uuid' }) stackId: string;
  @Column({ name: 'session_id', type: 'uuid' }) sessionId: string;
  @Column({ name: 'storage_key', type: 'text' }) storageKey: string;
  @Column({ type: 'text' }) sha256: string;
  @Column({ name: 'size_bytes', type: 'bigint', transformer: bigintAsNumber }) sizeBytes: number;
  @Column({ type: 'text' }) mime: string;
  @Column({ name: 'original_name', type: 'text' }) originalName: string;
  @Column({ name: 'uploaded_by_user_id', type: 'uuid', nullable: true }) uploadedByUserId: string | null;
  @Column({ name: 'uploaded_by_label', type: 'text' }) uploadedByLabel: string;
  @Column({ name: 'share_link_id', type: 'uuid', nullable: true }) shareLinkId: string | null;
  @Column({ name: 'preview_status', type: 'text' }) previewStatus: 'pending' | 'done' | 'failed';
  @Column({ name: 'preview_error', type: 'text', nullable: true }) previewError: string | null;
  @Column({ name: 'preview_small_key', type: 'text', nullable: true }) previewSmallKey: string | null;
  @Column({ name: 'preview_large_key', type: 'text', nullable: true }) previewLargeKey: string | null;
  @Column({ name: 'width_px', type: 'int', nullable: true }) widthPx: number | null;
  @Column({ name: 'height_px', type: 'int', nullable: true }) heightPx: number | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
}
