import type { MigrationInterface, QueryRunner } from 'typeorm';

export class KitAndPlans1733000001000 implements MigrationInterface {
  name = 'KitAndPlans1733000001000';

  async up(q: QueryRunner): Promise<void> {
    const kitItem = `id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      studio_id uuid NOT NULL REFERENCES studios(id) ON DELETE CASCADE,
      name text NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()`;
    await q.query(`CREATE TABLE kit_bodies (${kitItem},
      sensor_format text NOT NULL CHECK (sensor_format IN ('full-frame','aps-c-23.5','aps-c-22.3','four-thirds','one-inch','custom')),
      sensor_width_mm double precision NOT NULL CHECK (sensor_width_mm > 0),
      sensor_height_mm double precision NOT NULL CHECK (sensor_height_mm > 0),
      pixels_across integer NOT NULL CHECK (pixels_across > 0))`);
    await q.query(`CREATE TABLE kit_lenses (${kitItem},
      focal_length_mm double precision NOT NULL CHECK (focal_length_mm > 0),
      widest_f_number double precision NOT NULL CHECK (widest_f_number > 0),
      narrowest_f_number double precision NOT NULL CHECK (narrowest_f_number >= widest_f_number),
      max_magnification double precision NOT NULL CHECK (max_magnification >= 0),
      pupil_magnification double precision NOT NULL DEFAULT 1 CHECK (pupil_magnification > 0))`);
    await q.query(`CREATE TABLE kit_extension_sets (${kitItem},
      tube_lengths_mm double precision[] NOT NULL CHECK (cardinality(tube_lengths_mm) > 0))`);
    await q.query(`CREATE TABLE kit_rails (${kitItem},
      travel_mm double precision NOT NULL CHECK (travel_mm > 0),
      smallest_step_um double precision NOT NULL CHECK (smallest_step_um > 0))`);
    for (const t of ['kit_bodies', 'kit_lenses', 'kit_extension_sets', 'kit_rails']) {
      await q.query(`CREATE INDEX ${t}_studio_idx ON ${t} (studio_id)`);
    }
    await q.query(`CREATE TABLE plans (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      studio_id uuid NOT NULL REFERENCES studios(id) ON DELETE CASCADE,
      name text NOT NULL,
      notes text NOT NULL DEFAULT '',
      inputs jsonb NOT NULL,
      kit jsonb NOT NULL,
      focusing_method text NOT NULL CHECK (focusing_method IN ('rail','camera')),
      result jsonb NOT NULL,
      sweep jsonb NOT NULL,
      magnification double precision NOT NULL,
      frames double precision NOT NULL,
      step_mm double precision,
      session_id uuid,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now())`);
    await q.query(`CREATE INDEX plans_studio_updated_idx ON plans (studio_id, updated_at DESC)`);
    await q.query(`CREATE INDEX plans_session_idx ON plans (session_id) WHERE session_id IS NOT NULL`);
  }

  async down(q: QueryRunner): Promise<void> {
    for (const t of ['plans', 'kit_rails', 'kit_extension_sets', 'kit_lenses', 'kit_bodies']) {
      await q.query(`DROP TABLE IF EXISTS ${t}`);
    }
  }
}
