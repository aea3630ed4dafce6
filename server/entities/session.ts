import { Column, CreateDateColumn, Entity, PrimaryColumn, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { FrameStatsJson, StackState } from '../../shared/schemas/sessions';

// bigint columns come back from pg as strings; this keeps capture times as numbers in ms.
const bigintAsNumber = { to: (v: number | null) => v, from: (v: string | null) => (v === null ? null : Number(v)) };

@Entity({ name: 'shoot_sessions' })
export class ShootSession {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'studio_id', type: 'uuid' }) studioId: string;
  @Column({ type: 'text' }) title: string;
  @Column({ name: 'shoot_date', type: 'date' }) shootDate: string;
  @Column({ type: 'text' }) subject: string;
  @Column({ type: 'text' }) location: string;
  @Column({ type: 'text' }) notes: string;
  @Column({ name: 'grouping_options', type: 'jsonb' }) groupingOptions: Record<string, number>;
  @Column({ name: 'created_by', type: 'uuid', nullable: true }) createdBy: string | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}

@Entity({ name: 'card_imports' })
export class CardImport {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'session_id', type: 'uuid' }) sessionId: string;
  @Column({ name: 'created_by', type: 'uuid', nullable: true }) createdBy: string | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @Column({ name: 'completed_at', type: 'timestamptz', nullable: true }) completedAt: Date | null;
  @Column({ name: 'expected_files', type: 'int', nullable: true }) expectedFiles: number | null;
  @Column({ name: 'stored_count', type: 'int' }) storedCount: number;
  @Column({ name: 'duplicate_count', type: 'int' }) duplicateCount: number;
  @Column({ name: 'refused_count', type: 'int' }) refusedCount: number;
}

@Entity({ name: 'stored_files' })
export class StoredFile {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'session_id', type: 'uuid' }) sessionId: string;
  @Column({ name: 'import_id', type: 'uuid', nullable: true }) importId: string | null;
  @Column({ type: 'text' }) sha256: string;
  @Column({ name: 'original_name', type: 'text' }) originalName: string;
  @Column({ name: 'display_name', type: 'text' }) displayName: string;
  @Column({ name: 'storage_key', type: 'text' }) storageKey: string;
  @Column({ name: 'size_bytes', type: 'bigint', transformer: bigintAsNumber }) sizeBytes: number;
  @Column({ type: 'text' }) kind: string;
  @Column({ type: 'text' }) mime: string;
  @Column({ name: 'is_raw', type: 'boolean' }) isRaw: boolean;
  @Column({ name: 'file_mtime_ms', type: 'bigint', nullable: true, transformer: bigintAsNumber }) fileMtimeMs: number | null;
  @Column({ type: 'jsonb' }) metadata: Record<string, unknown>;
  @Column({ name: 'capture_time_ms', type: 'bigint', nullable: true, transformer: bigintAsNumber }) captureTimeMs: number | null;
  @Column({ type: 'text', array: true }) flags: string[];
  @Column({ name: 'frame_id', type: 'uuid', nullable: true }) frameId: string | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
}

@Entity({ name: 'stacks' })
export class Stack {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'session_id', type: 'uuid' }) sessionId: string;
  @Column({ type: 'text' }) name: string;
  @Column({ type: 'text' }) state: StackState;
  @Column({ type: 'int' }) position: number;
  @Column({ name: 'start_reason', type: 'text' }) startReason: string;
  @Column({ name: 'plan_id', type: 'uuid', nullable: true }) planId: string | null;
  @Column({ type: 'int' }) version: number;
  @Column({ name: 'handed_to_user_id', type: 'uuid', nullable: true }) handedToUserId: string | null;
  @Column({ name: 'handed_to_email', type: 'text', nullable: true }) handedToEmail: string | null;
  @Column({ name: 'handed_off_at', type: 'timestamptz', nullable: true }) handedOffAt: Date | null;
  @Column({ name: 'merged_at', type: 'timestamptz', nullable: true }) mergedAt: Date | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}

@Entity({ name: 'frames' })
export class Frame {
  @PrimaryColumn({ type: 'uuid' }) id: string;
  @Column({ name: 'session_id', type: 'uuid' }) sessionId: string;
  @Column({ name: 'primary_file_id', type: 'uuid' }) primaryFileId: string;
  @Column({ name: 'picture_file_id', type: 'uuid', nullable: true }) pictureFileId: string | null;
  @Column({ name: 'file_name', type: 'text' }) fileName: string;
  @Column({ name: 'capture_time_ms', type: 'bigint', nullable: true, transformer: bigintAsNumber }) captureTimeMs: number | null;
  @Column({ name: 'body_serial', type: 'text', nullable: true }) bodySerial: string | null;
  @Column({ name: 'f_number', type: 'double precision', nullable: true }) fNumber: number | null;
  @Column({ name: 'focal_length_mm', type: 'double precision', nullable: true }) focalLengthMm: number | null;
  @Column({ name: 'exposure_time_s', type: 'double precision', nullable: true }) exposureTimeS: number | null;
  @Column({ type: 'int', nullable: true }) iso: number | null;
  @Column({ type: 'int', nullable: true }) orientation: number | null;
  @Column({ name: 'file_number', type: 'bigint', nullable: true, transformer: bigintAsNumber }) fileNumber: number | null;
  @Column({ name: 'stack_id', type: 'uuid', nullable: true }) stackId: string | null;
  @Column({ type: 'int' }) position: number;
  @Column({ type: 'boolean' }) excluded: boolean;
  @Column({ type: 'text', array: true }) flags: string[];
  @Column({ name: 'preview_status', type: 'text' }) previewStatus: string;
  @Column({ name: 'preview_error', type: 'text', nullable: true }) previewError: string | null;
  @Column({ name: 'preview_small_key', type: 'text', nullable: true }) previewSmallKey: string | null;
  @Column({ name: 'preview_large_key', type: 'text', nullable: true }) previewLargeKey: string | null;
  @Column({ type: 'jsonb', nullable: true }) stats: FrameStatsJson | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
}

@Entity({ name: 'sorting_snapshots' })
export class SortingSnapshot {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'session_id', type: 'uuid' }) sessionId: string;
  @Column({ type: 'text' }) label: string;
  @Column({ type: 'jsonb' }) snapshot: unknown;
  @Column({ name: 'created_by', type: 'uuid', nullable: true }) createdBy: string | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
}

@Entity({ name: 'stack_events' })
export class StackEvent {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'stack_id', type: 'uuid' }) stackId: string;
  @Column({ name: 'actor_id', type: 'uuid', nullable: true }) actorId: string | null;
  @Column({ name: 'actor_label', type: 'text' }) actorLabel: string;
  @Column({ type: 'text' }) action: string;
  @Column({ type: 'jsonb' }) detail: Record<string, unknown>;
  @Column({ type: 'timestamptz' }) at: Date;
}
