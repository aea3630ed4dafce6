import type { MigrationInterface, QueryRunner } from 'typeorm';

export class Foundation1733000000000 implements MigrationInterface {
  name = 'Foundation1733000000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE EXTENSION IF NOT EXISTS pgcrypto`);
    await q.query(`CREATE TABLE users (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      email text NOT NULL UNIQUE,
      name text NOT NULL,
      password_hash text NOT NULL,
      last_studio_id uuid,
      created_at timestamptz NOT NULL DEFAULT now())`);
    await q.query(`CREATE TABLE studios (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name text NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now())`);
    await q.query(`CREATE TABLE memberships (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      studio_id uuid NOT NULL REFERENCES studios(id) ON DELETE CASCADE,
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      role text NOT NULL CHECK (role IN ('owner','photographer','retoucher','guest')),
      created_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (studio_id, user_id))`);
    await q.query(`CREATE TABLE invitations (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      studio_id uuid NOT NULL REFERENCES studios(id) ON DELETE CASCADE,
      email text NOT NULL,
      role text NOT NULL CHECK (role IN ('owner','photographer','retoucher','guest')),
      token_hash text NOT NULL UNIQUE,
      expires_at timestamptz NOT NULL,
      accepted_at timestamptz,
      revoked_at timestamptz,
      invited_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now())`);
    await q.query(`CREATE TABLE password_resets (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      token_hash text NOT NULL UNIQUE,
      expires_at timestamptz NOT NULL,
      used_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now())`);
    await q.query(`CREATE TABLE caught_mail (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      from_address text NOT NULL,
      to_addresses text[] NOT NULL,
      subject text NOT NULL,
      text_body text NOT NULL,
      received_at timestamptz NOT NULL DEFAULT now())`);
    // The session table connect-pg-simple expects (its table.sql).
    await q.query(`CREATE TABLE session (
      sid varchar NOT NULL PRIMARY KEY,
      sess json NOT NULL,
      expire timestamp(6) NOT NULL)`);
    await q.query(`CREATE INDEX session_expire_idx ON session (expire)`);
  }

  async down(q: QueryRunner): Promise<void> {
    for (const t of ['session', 'caught_mail', 'password_resets', 'invitations', 'memberships', 'studios', 'users']) {
      await q.query(`DROP TABLE IF EXISTS ${t}`);
    }
  }
}
