import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Who a stack is handed to: a retoucher member, or an outside retoucher by e-mail. */
export class StackHandoffColumns1733000003000 implements MigrationInterface {
  name = 'StackHandoffColumns1733000003000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE stacks
      ADD COLUMN handed_to_user_id uuid REFERENCES users(id) ON DELETE SET NULL,
      ADD COLUMN handed_to_email text,
      ADD COLUMN handed_off_at timestamptz,
      ADD COLUMN merged_at timestamptz`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE stacks DROP COLUMN handed_to_user_id, DROP COLUMN handed_to_email, DROP COLUMN handed_off_at, DROP COLUMN merged_at`);
  }
}
