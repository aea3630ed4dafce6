import type { MigrationInterface, QueryRunner } from 'typeorm';

export class SessionsAndFrames1733000002000 implements MigrationInterface {
  name = 'SessionsAndFrames1733000002000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE shoot_sessions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      studio_id uuid NOT NULL REFERENCES studios(id) ON DELETE CASCADE,
      title text NOT NULL,
      shoot_date date NOT NULL,
      subject text NOT NULL DEFAULT '',
      location text NOT NULL DEFAULT '',
      notes text NOT NULL DEFAULT '',
      grouping_options jsonb NOT NULL DEFAULT '{}',
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now())`);
    await q.query(`CREATE INDEX shoot_sessions_studio_idx ON shoot_sessions (studio_id, shoot_date DESC)`);
    await q.query(`CREATE TABLE card_imports (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      session_id uuid NOT NULL REFERENCES shoot_sessions(id) ON DELETE CASCADE,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      completed_at timestamptz,
      expected_files int,
      stored_count int NOT NULL DEFAULT 0,
      duplicate_count int NOT NULL DEFAULT 0,
      refused_count int NOT NULL DEFAULT 0)`);
    await q.query(`CREATE TABLE stacks (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      session_id uuid NOT NULL REFERENCES shoot_sessions(id) ON DELETE CASCADE,
      name text NOT NULL,
      state text NOT NULL DEFAULT 'draft' CHECK (state IN ('draft','ready','handed-off','merged','archived')),
      position int NOT NULL,
      start_reason text NOT NULL DEFAULT 'first',
      plan_id uuid,
      version int NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now())`);
    await q.query(`CREATE INDEX stacks_session_idx ON stacks (session_id, position)`);
    await q.query(`CREATE TABLE frames (
      id uuid PRIMARY KEY,
      session_id uuid NOT NULL REFERENCES shoot_sessions(id) ON DELETE CASCADE,
      primary_file_id uuid NOT NULL,
      picture_file_id uuid,
      file_name text NOT NULL,
      capture_time_ms bigint,
      body_serial text,
      f_number double precision,
      focal_length_mm double precision,
      exposure_time_s double precision,
      iso int,
      orientation int,
      file_number bigint,
      stack_id uuid REFERENCES stacks(id) ON DELETE SET NULL,
      position int NOT NULL DEFAULT 0,
      excluded boolean NOT NULL DEFAULT false,
      flags text[] NOT NULL DEFAULT '{}',
      preview_status text NOT NULL DEFAULT 'pending',
      preview_error text,
      preview_small_key text,
      preview_large_key text,
      stats jsonb,
      created_at timestamptz NOT NULL DEFAULT now())`);
    await q.query(`CREATE INDEX frames_session_idx ON frames (session_id, capture_time_ms)`);
    await q.query(`CREATE INDEX frames_stack_idx ON frames (stack_id, position)`);
    await q.query(`CREATE TABLE stored_files (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      session_id uuid NOT NULL REFERENCES shoot_sessions(id) ON DELETE CASCADE,
      import_id uuid REFERENCES card_imports(id) ON DELETE SET NULL,
      sha256 text NOT NULL,
      original_name text NOT NULL,
      display_name text NOT NULL,
      storage_key text NOT NULL,
      size_bytes bigint NOT NULL,
      kind text NOT NULL,
      mime text NOT NULL,
      is_raw boolean NOT NULL,
      file_mtime_ms bigint,
      metadata jsonb NOT NULL,
      capture_time_ms bigint,
      flags text[] NOT NULL DEFAULT '{}',
      frame_id uuid REFERENCES frames(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (session_id, sha256))`);
    await q.query(`CREATE TABLE sorting_snapshots (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      session_id uuid NOT NULL REFERENCES shoot_sessions(id) ON DELETE CASCADE,
      label text NOT NULL,
      snapshot jsonb NOT NULL,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now())`);
    await q.query(`CREATE INDEX sorting_snapshots_session_idx ON sorting_snapshots (session_id, created_at DESC)`);
    await q.query(`CREATE TABLE stack_events (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      stack_id uuid NOT NULL REFERENCES stacks(id) ON DELETE CASCADE,
      actor_id uuid REFERENCES users(id) ON DELETE SET NULL,
      actor_label text NOT NULL DEFAULT '',
      action text NOT NULL,
      detail jsonb NOT NULL DEFAULT '{}',
      at timestamptz NOT NULL DEFAULT now())`);
    await q.query(`CREATE INDEX stack_events_stack_idx ON stack_events (stack_id, at)`);
  }

  async down(q: QueryRunner): Promise<void> {
    for (const t of ['stack_events', 'sorting_snapshots', 'stored_files', 'frames', 'stacks', 'card_imports', 'shoot_sessions']) {
      await q.query(`DROP TABLE IF EXISTS ${t}`);
    }
  }
}
