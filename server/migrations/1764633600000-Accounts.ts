import type { MigrationInterface, QueryRunner } from 'typeorm'

/** Users, workspaces, memberships, invitations, password resets, audit events, and the session table. */
export class Accounts1764633600000 implements MigrationInterface {
  name = 'Accounts1764633600000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE EXTENSION IF NOT EXISTS pgcrypto`)
    await q.query(`CREATE TABLE users (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      email varchar(254) NOT NULL UNIQUE,
      name varchar(120) NOT NULL,
      password_hash varchar(100) NOT NULL,
      units varchar(8) NOT NULL DEFAULT 'si',
      created_at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE TABLE workspaces (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name varchar(120) NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE TABLE memberships (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      role varchar(16) NOT NULL CHECK (role IN ('viewer','technician','designer','owner')),
      created_at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE UNIQUE INDEX memberships_workspace_user ON memberships (workspace_id, user_id)`)
    await q.query(`CREATE TABLE invitations (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid NOT NULL REFERENCES workspaces(id) ON DELETE CASCADE,
      email varchar(254) NOT NULL,
      role varchar(16) NOT NULL,
      token_hash varchar(64) NOT NULL UNIQUE,
      invited_by uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      expires_at timestamptz NOT NULL,
      accepted_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE TABLE password_resets (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      token_hash varchar(64) NOT NULL UNIQUE,
      expires_at timestamptz NOT NULL,
      used_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE TABLE audit_events (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      workspace_id uuid REFERENCES workspaces(id) ON DELETE CASCADE,
      actor_id uuid REFERENCES users(id) ON DELETE SET NULL,
      action varchar(64) NOT NULL,
      entity_type varchar(40) NOT NULL,
      entity_id varchar(64),
      data jsonb NOT NULL DEFAULT '{}',
      at timestamptz NOT NULL DEFAULT now())`)
    await q.query(`CREATE INDEX audit_events_workspace_at ON audit_events (workspace_id, at)`)
    // The session store's table (connect-pg-simple layout), created here rather than at run time.
    await q.query(`CREATE TABLE session (
      sid varchar NOT NULL PRIMARY KEY,
      sess json NOT NULL,
      expire timestamp(6) NOT NULL)`)
    await q.query(`CREATE INDEX session_expire ON session (expire)`)
  }

  async down(q: QueryRunner): Promise<void> {
    for (const t of ['session', 'audit_events', 'password_resets', 'invitations', 'memberships', 'workspaces', 'users']) {
      await q.query(`DROP TABLE IF EXISTS ${t}`)
    }
  }
}
