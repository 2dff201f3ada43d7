import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Users, one-time password links, projects with memberships, and the session store. */
export class Platform1764600000000 implements MigrationInterface {
  name = 'Platform1764600000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE users (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        email text NOT NULL UNIQUE CHECK (email = lower(email)),
        display_name text NOT NULL,
        password_hash text,
        site_role text NOT NULL DEFAULT 'member' CHECK (site_role IN ('admin', 'member')),
        active boolean NOT NULL DEFAULT true,
        last_sign_in_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE password_tokens (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        token_hash text NOT NULL UNIQUE,
        user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        purpose text NOT NULL CHECK (purpose IN ('reset', 'invite')),
        expires_at timestamptz NOT NULL,
        used_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX password_tokens_user_idx ON password_tokens (user_id)`);
    await q.query(`
      CREATE TABLE projects (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        code text NOT NULL UNIQUE,
        name text NOT NULL,
        description text NOT NULL DEFAULT '',
        status text NOT NULL DEFAULT 'active' CHECK (status IN ('active', 'archived')),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE project_memberships (
        project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
        user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        role text NOT NULL CHECK (role IN ('lead', 'researcher', 'reviewer', 'guest')),
        added_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (project_id, user_id)
      )`);
    await q.query(`CREATE INDEX project_memberships_user_idx ON project_memberships (user_id)`);
    // The layout connect-pg-simple expects (its table.sql), under our own table name.
    await q.query(`
      CREATE TABLE user_sessions (
        sid varchar NOT NULL PRIMARY KEY,
        sess json NOT NULL,
        expire timestamp(6) NOT NULL
      )`);
    await q.query(`CREATE INDEX user_sessions_expire_idx ON user_sessions (expire)`);
    // Marks one-off loads such as the demo scenario, so re-running `npm start` never loads twice.
    await q.query(`
      CREATE TABLE app_state (
        key text PRIMARY KEY,
        value jsonb NOT NULL,
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE app_state, user_sessions, project_memberships, projects, password_tokens, users`);
  }
}
