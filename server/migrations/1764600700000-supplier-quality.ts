import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Suppliers area: the drift check made once per disposed lot (idempotence marker with its figures),
 * drift alerts with their acknowledgement, and nonconformance reports with their own yearly
 * counter (NCR-2026-0001), e-mail and the supplier's answer.
 */
export class SupplierQuality1764600700000 implements MigrationInterface {
  name = 'SupplierQuality1764600700000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE drift_check (
        lot_id integer PRIMARY KEY REFERENCES lot(id) ON DELETE RESTRICT,
        checked_at timestamptz NOT NULL DEFAULT now(),
        alert boolean NOT NULL,
        result jsonb NOT NULL
      )`);
    await q.query(`
      CREATE TABLE drift_alert (
        id serial PRIMARY KEY,
        lot_id integer NOT NULL UNIQUE REFERENCES drift_check(lot_id) ON DELETE RESTRICT,
        supplier_id integer NOT NULL REFERENCES supplier(id) ON DELETE RESTRICT,
        part_type_id integer NOT NULL REFERENCES part_type(id) ON DELETE RESTRICT,
        figures jsonb NOT NULL,
        flags jsonb NOT NULL,
        explanation text NOT NULL,
        suggested_checks jsonb NOT NULL,
        status varchar(12) NOT NULL DEFAULT 'open' CHECK (status IN ('open','acknowledged')),
        raised_at timestamptz NOT NULL DEFAULT now(),
        acknowledged_by integer REFERENCES app_user(id),
        acknowledged_at timestamptz,
        acknowledge_note varchar(1000),
        CHECK ((status = 'acknowledged') = (acknowledged_at IS NOT NULL AND acknowledged_by IS NOT NULL AND acknowledge_note IS NOT NULL))
      )`);
    await q.query(`CREATE INDEX drift_alert_status_idx ON drift_alert (status, raised_at DESC)`);
    await q.query(`CREATE INDEX drift_alert_supplier_idx ON drift_alert (supplier_id, part_type_id)`);

    await q.query(`
      CREATE TABLE ncr_counter (
        year integer PRIMARY KEY,
        last integer NOT NULL
      )`);
    await q.query(`
      CREATE TABLE ncr (
        id serial PRIMARY KEY,
        code varchar(20) NOT NULL UNIQUE,
        lot_id integer NOT NULL REFERENCES lot(id) ON DELETE RESTRICT,
        alert_id integer REFERENCES drift_alert(id) ON DELETE RESTRICT,
        supplier_id integer NOT NULL REFERENCES supplier(id) ON DELETE RESTRICT,
        part_type_id integer NOT NULL REFERENCES part_type(id) ON DELETE RESTRICT,
        findings text NOT NULL,
        disposition varchar(1000) NOT NULL,
        corrective_action varchar(2000) NOT NULL,
        due_date date NOT NULL,
        status varchar(10) NOT NULL DEFAULT 'open' CHECK (status IN ('open','sent','answered','closed')),
        sent_at timestamptz,
        sent_to varchar(254),
        mail_id integer REFERENCES outgoing_mail(id) ON DELETE SET NULL,
        answer_text text,
        answer_doc_name varchar(255),
        answer_doc_media_type varchar(60),
        answer_doc_size integer,
        answer_doc_sha256 varchar(64),
        answer_doc_key varchar(200) UNIQUE,
        answered_at timestamptz,
        answered_by integer REFERENCES app_user(id),
        closed_at timestamptz,
        closed_by integer REFERENCES app_user(id),
        close_note varchar(1000),
        created_by integer NOT NULL REFERENCES app_user(id),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CHECK (status IN ('open','sent') OR (answer_text IS NOT NULL AND answer_doc_key IS NOT NULL AND answered_at IS NOT NULL)),
        CHECK ((status = 'closed') = (closed_at IS NOT NULL))
      )`);
    await q.query(`CREATE INDEX ncr_status_idx ON ncr (status, created_at DESC)`);
    await q.query(`CREATE INDEX ncr_supplier_idx ON ncr (supplier_id)`);
    await q.query(`CREATE INDEX ncr_lot_idx ON ncr (lot_id)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE ncr`);
    await q.query(`DROP TABLE ncr_counter`);
    await q.query(`DROP TABLE drift_alert`);
    await q.query(`DROP TABLE drift_check`);
  }
}
