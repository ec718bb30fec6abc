import type { MigrationInterface, QueryRunner } from 'typeorm';

export class Foundation1764600000000 implements MigrationInterface {
  name = 'Foundation1764600000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE app_user (
        id serial PRIMARY KEY,
        email varchar(254) NOT NULL,
        name varchar(120) NOT NULL,
        role varchar(20) NOT NULL CHECK (role IN ('inspector','quality','buyer','assembler')),
        password_hash varchar(200) NOT NULL,
        active boolean NOT NULL DEFAULT true,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE UNIQUE INDEX app_user_email_key ON app_user (email)`);
    await q.query(`
      CREATE TABLE audit_entry (
        id bigserial PRIMARY KEY,
        at timestamptz NOT NULL DEFAULT now(),
        actor_id integer REFERENCES app_user(id),
        actor_name varchar(120) NOT NULL,
        action varchar(60) NOT NULL,
        entity_type varchar(60) NOT NULL,
        entity_id varchar(80) NOT NULL,
        before jsonb,
        after jsonb,
        note varchar(500)
      )`);
    await q.query(`CREATE INDEX audit_entry_entity_idx ON audit_entry (entity_type, entity_id)`);
    await q.query(`CREATE INDEX audit_entry_at_idx ON audit_entry (at DESC)`);
    await q.query(`
      CREATE FUNCTION audit_entry_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION 'audit_entry is append-only';
      END $$`);
    await q.query(`
      CREATE TRIGGER audit_entry_no_change BEFORE UPDATE OR DELETE ON audit_entry
      FOR EACH ROW EXECUTE FUNCTION audit_entry_append_only()`);
    // Session table of connect-pg-simple (its documented schema).
    await q.query(`
      CREATE TABLE "session" (
        sid varchar NOT NULL COLLATE "default" PRIMARY KEY,
        sess json NOT NULL,
        expire timestamp(6) NOT NULL
      )`);
    await q.query(`CREATE INDEX "IDX_session_expire" ON "session" (expire)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "session"`);
    await q.query(`DROP TRIGGER audit_entry_no_change ON audit_entry`);
    await q.query(`DROP FUNCTION audit_entry_append_only()`);
    await q.query(`DROP TABLE audit_entry`);
    await q.query(`DROP TABLE app_user`);
  }
}
