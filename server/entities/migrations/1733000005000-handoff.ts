import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Share links for outside retouchers, and merged results sent back for stacks. */
export class Handoff1733000005000 implements MigrationInterface {
  name = 'Handoff1733000005000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE share_links (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      studio_id uuid NOT NULL REFERENCES studios(id) ON DELETE CASCADE,
      stack_id uuid NOT NULL REFERENCES stacks(id) ON DELETE CASCADE,
      email text NOT NULL,
      token_hash text NOT NULL UNIQUE,
      expires_at timestamptz NOT NULL,
      revoked_at timestamptz,
      download_count int NOT NULL DEFAULT 0,
      last_download_at timestamptz,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now())`);
    await q.query(`CREATE INDEX share_links_stack_idx ON share_links (stack_id, created_at)`);
    await q.query(`CREATE TABLE merged_results (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      stack_id uuid NOT NULL REFERENCES stacks(id) ON DELETE CASCADE,
      session_id uuid NOT NULL REFERENCES shoot_sessions(id) ON DELETE CASCADE,
      storage_key text NOT NULL,
      sha256 text NOT NULL,
      size_bytes bigint NOT NULL,
      mime text NOT NULL,
      original_name text NOT NULL,
      uploaded_by_user_id uuid REFERENCES users(id) ON DELETE SET NULL,
      uploaded_by_label text NOT NULL,
      share_link_id uuid REFERENCES share_links(id) ON DELETE SET NULL,
      preview_status text NOT NULL DEFAULT 'pending',
      preview_error text,
      preview_small_key text,
      preview_large_key text,
      width_px int,
      height_px int,
      created_at timestamptz NOT NULL DEFAULT now())`);
    await q.query(`CREATE INDEX merged_results_stack_idx ON merged_results (stack_id, created_at)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE IF EXISTS merged_results`);
    await q.query(`DROP TABLE IF EXISTS share_links`);
  }
}
