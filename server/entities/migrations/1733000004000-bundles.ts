import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Bundles (zip per stack version or per session) and contact sheets (JPEG + PDF per stack version).
 * A stack bundle is stale once its stack's version moved on; a session bundle keeps the version of
 * each stack it holds in `stack_versions`. At most one live (not failed) bundle per stack version.
 */
export class Bundles1733000004000 implements MigrationInterface {
  name = 'Bundles1733000004000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE bundles (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      studio_id uuid NOT NULL REFERENCES studios(id) ON DELETE CASCADE,
      stack_id uuid REFERENCES stacks(id) ON DELETE SET NULL,
      session_id uuid NOT NULL REFERENCES shoot_sessions(id) ON DELETE CASCADE,
      stack_version int,
      stack_versions jsonb NOT NULL DEFAULT '{}',
      kind text NOT NULL CHECK (kind IN ('stack','session')),
      status text NOT NULL DEFAULT 'queued' CHECK (status IN ('queued','running','done','failed')),
      progress int NOT NULL DEFAULT 0 CHECK (progress BETWEEN 0 AND 100),
      error text,
      file_name text NOT NULL,
      storage_key text,
      bytes bigint,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      finished_at timestamptz,
      CHECK ((kind = 'stack') = (stack_version IS NOT NULL)))`);
    await q.query(`CREATE INDEX bundles_stack_idx ON bundles (stack_id, created_at DESC)`);
    await q.query(`CREATE INDEX bundles_session_idx ON bundles (session_id, created_at DESC)`);
    await q.query(`CREATE UNIQUE INDEX bundles_one_live_per_stack_version ON bundles (stack_id, stack_version) WHERE kind = 'stack' AND status <> 'failed'`);
    await q.query(`CREATE TABLE contact_sheets (
      stack_id uuid NOT NULL REFERENCES stacks(id) ON DELETE CASCADE,
      stack_version int NOT NULL,
      status text NOT NULL DEFAULT 'queued' CHECK (status IN ('queued','running','done','failed')),
      error text,
      jpeg_key text,
      pdf_key text,
      pages int,
      width_px int,
      height_px int,
      missing_previews int NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      finished_at timestamptz,
      PRIMARY KEY (stack_id, stack_version))`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE contact_sheets`);
    await q.query(`DROP TABLE bundles`);
  }
}
