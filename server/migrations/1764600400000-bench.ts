import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The Bench: measurement sessions, measurements (append-only, corrections supersede), tester
 * column mappings per instrument, the switching state per supplier and part type, and the lot
 * disposition (locked once signed).
 */
export class Bench1764600400000 implements MigrationInterface {
  name = 'Bench1764600400000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE measurement_session (
        id serial PRIMARY KEY,
        lot_id integer NOT NULL REFERENCES lot(id) ON DELETE RESTRICT,
        instrument varchar(80) NOT NULL,
        ambient_c double precision NOT NULL CHECK (ambient_c > -40 AND ambient_c < 85),
        operator_id integer NOT NULL REFERENCES app_user(id),
        mode varchar(10) NOT NULL CHECK (mode IN ('sample','screen')),
        started_at timestamptz NOT NULL DEFAULT now(),
        closed_at timestamptz
      )`);
    await q.query(`CREATE INDEX measurement_session_lot_idx ON measurement_session (lot_id)`);

    await q.query(`CREATE UNIQUE INDEX measurement_session_lot_key ON measurement_session (id, lot_id)`);
    await q.query(`
      CREATE FUNCTION measurement_session_kept() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION 'measurement sessions are records and are never deleted';
      END $$`);
    await q.query(`
      CREATE TRIGGER measurement_session_no_delete BEFORE DELETE ON measurement_session
      FOR EACH ROW EXECUTE FUNCTION measurement_session_kept()`);

    // Raw readings (hfe, vbe_mv at the session's ambient temperature) and the values referred to
    // 25 °C side by side. Values are never updated: a correction inserts a new row that names the
    // row it supersedes, and only the old row's `superseded` flag changes (trigger below).
    //
    // References are checked once per statement over the inserted rows (a transition table), not
    // row by row: row-level foreign keys were about 70 % of the time of a 100 000-row insert or COPY
    // (docs/benchmarks.md). The statement check is stricter than the foreign keys it replaces (the
    // session must belong to the row's lot; a correction must supersede a reading of the same lot and
    // position), and the parents refuse deletion (sessions never; users and lots through the keys of
    // measurement_session and audit_entry and the trigger on app_user below).
    await q.query(`
      CREATE TABLE measurement (
        id bigserial PRIMARY KEY,
        lot_id integer NOT NULL,
        session_id integer NOT NULL,
        position integer NOT NULL CHECK (position > 0),
        hfe double precision NOT NULL,
        vbe_mv double precision NOT NULL,
        vce_sat_mv double precision,
        leakage_na double precision,
        hfe_25 double precision NOT NULL,
        vbe_mv_25 double precision NOT NULL,
        source varchar(10) NOT NULL DEFAULT 'grid' CHECK (source IN ('grid','import')),
        source_row integer,
        supersedes_id bigint,
        superseded boolean NOT NULL DEFAULT false,
        correction_reason varchar(300),
        created_by integer NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX measurement_current_lot_idx ON measurement (lot_id) WHERE NOT superseded`);
    await q.query(`CREATE UNIQUE INDEX measurement_current_position_key ON measurement (lot_id, position) WHERE NOT superseded`);
    await q.query(`
      CREATE FUNCTION measurement_values_fixed() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF TG_OP = 'DELETE' THEN
          RAISE EXCEPTION 'measurement rows are never deleted';
        END IF;
        IF OLD.superseded OR NOT NEW.superseded
           OR (to_jsonb(NEW) - 'superseded') IS DISTINCT FROM (to_jsonb(OLD) - 'superseded') THEN
          RAISE EXCEPTION 'measurement values are never changed: record a correction instead';
        END IF;
        RETURN NEW;
      END $$`);
    await q.query(`
      CREATE TRIGGER measurement_no_change BEFORE UPDATE OR DELETE ON measurement
      FOR EACH ROW EXECUTE FUNCTION measurement_values_fixed()`);
    await q.query(`
      CREATE FUNCTION measurement_references_check() RETURNS trigger LANGUAGE plpgsql AS $$
      DECLARE
        r record;
      BEGIN
        IF EXISTS (SELECT 1 FROM (SELECT DISTINCT session_id, lot_id FROM new_rows) n
                   LEFT JOIN measurement_session s ON s.id = n.session_id AND s.lot_id = n.lot_id
                   WHERE s.id IS NULL) THEN
          RAISE EXCEPTION 'measurement: session_id must name a session of the same lot'
            USING ERRCODE = 'foreign_key_violation';
        END IF;
        IF EXISTS (SELECT 1 FROM (SELECT DISTINCT created_by FROM new_rows) n
                   LEFT JOIN app_user u ON u.id = n.created_by WHERE u.id IS NULL) THEN
          RAISE EXCEPTION 'measurement: created_by must name a user' USING ERRCODE = 'foreign_key_violation';
        END IF;
        -- Corrections are few: look each one up by primary key rather than let the planner join the
        -- whole table against the inserted rows.
        FOR r IN SELECT supersedes_id, lot_id, position FROM new_rows WHERE supersedes_id IS NOT NULL LOOP
          IF NOT EXISTS (SELECT 1 FROM measurement o WHERE o.id = r.supersedes_id AND o.lot_id = r.lot_id AND o.position = r.position) THEN
            RAISE EXCEPTION 'measurement: supersedes_id must name a reading of the same lot and position'
              USING ERRCODE = 'foreign_key_violation';
          END IF;
        END LOOP;
        RETURN NULL;
      END $$`);
    await q.query(`
      CREATE TRIGGER measurement_references AFTER INSERT ON measurement
      REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION measurement_references_check()`);
    await q.query(`
      CREATE FUNCTION app_user_keep_measured() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF EXISTS (SELECT 1 FROM measurement WHERE created_by = OLD.id) THEN
          RAISE EXCEPTION 'user % recorded measurements and cannot be deleted; deactivate instead', OLD.id
            USING ERRCODE = 'foreign_key_violation';
        END IF;
        RETURN OLD;
      END $$`);
    await q.query(`
      CREATE TRIGGER app_user_keep_measured BEFORE DELETE ON app_user
      FOR EACH ROW EXECUTE FUNCTION app_user_keep_measured()`);

    await q.query(`
      CREATE TABLE instrument_mapping (
        instrument varchar(80) PRIMARY KEY,
        mapping jsonb NOT NULL,
        units jsonb NOT NULL,
        updated_by integer REFERENCES app_user(id),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);

    await q.query(`
      CREATE TABLE switching_state (
        supplier_id integer NOT NULL REFERENCES supplier(id) ON DELETE RESTRICT,
        part_type_id integer NOT NULL REFERENCES part_type(id) ON DELETE RESTRICT,
        state jsonb NOT NULL,
        reason varchar(500) NOT NULL,
        reduced_approved boolean NOT NULL DEFAULT false,
        production_steady boolean NOT NULL DEFAULT true,
        updated_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (supplier_id, part_type_id)
      )`);

    await q.query(`
      CREATE TABLE disposition (
        lot_id integer PRIMARY KEY REFERENCES lot(id) ON DELETE RESTRICT,
        recommended varchar(12) NOT NULL CHECK (recommended IN ('accept','reject','incomplete','blocked')),
        recommendation jsonb NOT NULL,
        proposed_decision varchar(10) NOT NULL CHECK (proposed_decision IN ('accept','reject','mrb')),
        proposed_mrb_action varchar(20) CHECK (proposed_mrb_action IN ('use-as-is','return-to-supplier','scrap','screen-100')),
        proposed_by integer NOT NULL REFERENCES app_user(id),
        proposed_at timestamptz NOT NULL DEFAULT now(),
        proposal_reason varchar(1000) NOT NULL,
        decision varchar(10) CHECK (decision IN ('accept','reject','mrb')),
        mrb_action varchar(20) CHECK (mrb_action IN ('use-as-is','return-to-supplier','scrap','screen-100')),
        reason varchar(1000),
        signed_by integer REFERENCES app_user(id),
        signed_at timestamptz,
        CHECK ((decision = 'mrb') = (mrb_action IS NOT NULL) OR decision IS NULL),
        CHECK ((signed_at IS NULL) = (decision IS NULL) AND (signed_at IS NULL) = (signed_by IS NULL))
      )`);
    await q.query(`
      CREATE FUNCTION disposition_locked() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF OLD.signed_at IS NOT NULL THEN
          RAISE EXCEPTION 'a signed disposition is locked';
        END IF;
        IF TG_OP = 'DELETE' THEN
          RETURN OLD;
        END IF;
        RETURN NEW;
      END $$`);
    await q.query(`
      CREATE TRIGGER disposition_lock BEFORE UPDATE OR DELETE ON disposition
      FOR EACH ROW EXECUTE FUNCTION disposition_locked()`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TRIGGER disposition_lock ON disposition`);
    await q.query(`DROP FUNCTION disposition_locked()`);
    await q.query(`DROP TABLE disposition`);
    await q.query(`DROP TABLE switching_state`);
    await q.query(`DROP TABLE instrument_mapping`);
    await q.query(`DROP TRIGGER app_user_keep_measured ON app_user`);
    await q.query(`DROP FUNCTION app_user_keep_measured()`);
    await q.query(`DROP TABLE measurement`);
    await q.query(`DROP FUNCTION measurement_references_check()`);
    await q.query(`DROP FUNCTION measurement_values_fixed()`);
    await q.query(`DROP TABLE measurement_session`);
    await q.query(`DROP FUNCTION measurement_session_kept()`);
  }
}
