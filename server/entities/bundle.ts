import { Column, Entity, PrimaryColumn, PrimaryGeneratedColumn } from 'typeorm';
import type { BundleKind, JobStatus } from '../../shared/schemas/bundles';

// bigint columns come back from pg as strings.
const bigintAsNumber = { to: (v: number | null) => v, from: (v: string | null) => (v === null ? null : Number(v)) };

/** One zip of a stack version (kind 'stack') or of a session's stacks past draft (kind 'session'). */
@Entity({ name: 'bundles' })
export class Bundle {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'studio_id', type: 'uuid' }) studioId: string;
  @Column({ name: 'stack_id', type: 'uuid', nullable: true }) stackId: string | null;
  @Column({ name: 'session_id', type: 'uuid' }) sessionId: string;
  @Column({ name: 'stack_version', type: 'int', nullable: true }) stackVersion: number | null;
  /** { stackId: version } of every stack in the bundle. */
  @Column({ name: 'stack_versions', type: 'jsonb' }) stackVersions: Record<string, number>;
  @Column({ type: 'text' }) kind: BundleKind;
  @Column({ type: 'text' }) status: JobStatus;
  @Column({ type: 'int' }) progress: number;
  @Column({ type: 'text', nullable: true }) error: string | null;
  /** The download's file name, without ".zip". */
  @Column({ name: 'file_name', type: 'text' }) fileName: string;
  @Column({ name: 'storage_key', type: 'text', nullable: true }) storageKey: string | null;
  @Column({ type: 'bigint', nullable: true, transformer: bigintAsNumber }) bytes: number | null;
  @Column({ name: 'created_by', type: 'uuid', nullable: true }) createdBy: string | null;
  @Column({ name: 'created_at', type: 'timestamptz', default: () => 'now()' }) createdAt: Date;
  @Column({ name: 'finished_at', type: 'timestamptz', nullable: true }) finishedAt: Date | null;
}

/** The contact sheet (JPEG + PDF) of one stack version. */
@Entity({ name: 'contact_sheets' })
export class ContactSheet {
  @PrimaryColumn({ name: 'stack_id', type: 'uuid' }) stackId: string;
  @PrimaryColumn({ name: 'stack_version', type: 'int' }) stackVersion: number;
  @Column({ type: 'text' }) status: JobStatus;
  @Column({ type: 'text', nullable: true }) error: string | null;
  @Column({ name: 'jpeg_key', type: 'text', nullable: true }) jpegKey: string | null;
  @Column({ name: 'pdf_key', type: 'text', nullable: true }) pdfKey: string | null;
  @Column({ type: 'int', nullable: true }) pages: number | null;
  @Column({ name: 'width_px', type: 'int', nullable: true }) widthPx: number | null;
  @Column({ name: 'height_px', type: 'int', nullable: true }) heightPx: number | null;
  @Column({ name: 'missing_previews', type: 'int' }) missingPreviews: number;
  @Column({ name: 'created_at', type: 'timestamptz', default: () => 'now()' }) createdAt: Date;
  @Column({ name: 'finished_at', type: 'timestamptz', nullable: true }) finishedAt: Date | null;
}
