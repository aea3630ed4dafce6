import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The stored outcome of the stack checks (one row per stack: the latest run) and each studio's
 * own check thresholds. `input_key` names the exact input a run saw (frames in order with their
 * statistics, the linked plan, the thresholds), so a reader can tell whether it is still current.
 */
export class StackChecks1733000006000 implements MigrationInterface {
  name = 'StackChecks1733000006000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE stack_checks (
      stack_id uuid PRIMARY KEY REFERENCES stacks(id) ON DELETE CASCADE,
      stack_version int NOT NULL,
      input_key text NOT NULL,
      thresholds jsonb NOT NULL,
      results jsonb NOT NULL,
      computed_at timestamptz NOT NULL DEFAULT now())`);
    await q.query(`CREATE TABLE studio_check_thresholds (
      studio_id uuid PRIMARY KEY REFERENCES studios(id) ON DELETE CASCADE,
      thresholds jsonb NOT NULL DEFAULT '{}',
      updated_by uuid REFERENCES users(id) ON DELETE SET NULL,
      updated_at timestamptz NOT NULL DEFAULT now())`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE IF EXISTS studio_check_thresholds`);
    await q.query(`DROP TABLE IF EXISTS stack_checks`);
  }
}
