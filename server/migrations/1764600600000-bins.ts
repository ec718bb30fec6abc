import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Bins: containers of screened parts (per lot and gain bin), their numbered positions (one
 * measured part each — what Pairing reserves and pulls), the append-only stock ledger, the
 * screening set-up per lot and the record of printed bin labels.
 *
 * Concurrency: every change to a container runs in a transaction that first takes the
 * container's row lock (SELECT … FOR UPDATE), and the CHECKs below refuse a count below zero or
 * above the capacity even if a code path forgot it. Pairing reserves positions with
 * SELECT … FROM container_position … FOR UPDATE SKIP LOCKED on state = 'in-stock'.
 */
export class Bins1764600600000 implements MigrationInterface {
  name = 'Bins1764600600000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE container_code_counter (
        day date PRIMARY KEY,
        last integer NOT NULL
      )`);
    await q.query(`
      CREATE TABLE screening_setup (
        lot_id integer PRIMARY KEY REFERENCES lot(id) ON DELETE RESTRICT,
        kind varchar(10) NOT NULL CHECK (kind IN ('bag','tube','tray','strip')),
        capacity integer NOT NULL CHECK (capacity BETWEEN 1 AND 100000),
        has_positions boolean NOT NULL,
        location varchar(60) NOT NULL,
        updated_by integer REFERENCES app_user(id),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE container (
        id serial PRIMARY KEY,
        code varchar(30) NOT NULL UNIQUE,
        lot_id integer NOT NULL REFERENCES lot(id) ON DELETE RESTRICT,
        part_type_id integer NOT NULL REFERENCES part_type(id) ON DELETE RESTRICT,
        bin_scheme_id integer NOT NULL REFERENCES gain_bin_scheme(id) ON DELETE RESTRICT,
        gain_bin_id integer REFERENCES gain_bin(id) ON DELETE RESTRICT,
        bin_code varchar(20),
        kind varchar(10) NOT NULL CHECK (kind IN ('bag','tube','tray','strip')),
        capacity integer NOT NULL CHECK (capacity BETWEEN 1 AND 100000),
        has_positions boolean NOT NULL,
        quantity integer NOT NULL DEFAULT 0,
        location varchar(60) NOT NULL,
        status varchar(10) NOT NULL DEFAULT 'open' CHECK (status IN ('open','full','closed','empty')),
        version integer NOT NULL DEFAULT 1,
        created_by integer NOT NULL REFERENCES app_user(id),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT container_quantity_not_negative CHECK (quantity >= 0),
        CONSTRAINT container_quantity_within_capacity CHECK (quantity <= capacity),
        CHECK ((gain_bin_id IS NULL) = (bin_code IS NULL))
      )`);
    await q.query(`CREATE INDEX container_lot_idx ON container (lot_id)`);
    await q.query(`CREATE INDEX container_stock_idx ON container (part_type_id, bin_code)`);
    await q.query(`CREATE INDEX container_open_idx ON container (lot_id, bin_code) WHERE status = 'open'`);
    await q.query(`CREATE INDEX container_location_idx ON container (location)`);

    await q.query(`
      CREATE TABLE container_position (
        id bigserial PRIMARY KEY,
        container_id integer NOT NULL REFERENCES container(id) ON DELETE RESTRICT,
        position integer NOT NULL CHECK (position > 0),
        measurement_id bigint NOT NULL UNIQUE REFERENCES measurement(id) ON DELETE RESTRICT,
        state varchar(10) NOT NULL DEFAULT 'in-stock' CHECK (state IN ('in-stock','reserved','pulled','scrapped','rebinned')),
        placed_at timestamptz NOT NULL DEFAULT now(),
        state_changed_at timestamptz NOT NULL DEFAULT now()
      )`);
    // A place holds at most one part at a time; a place freed by a pull or scrap can be refilled.
    await q.query(`
      CREATE UNIQUE INDEX container_position_occupied_key ON container_position (container_id, position)
      WHERE state IN ('in-stock','reserved')`);
    await q.query(`CREATE INDEX container_position_container_idx ON container_position (container_id, position)`);

    await q.query(`
      CREATE TABLE stock_movement (
        id bigserial PRIMARY KEY,
        container_id integer NOT NULL REFERENCES container(id) ON DELETE RESTRICT,
        kind varchar(10) NOT NULL CHECK (kind IN ('screen-in','move','adjust','scrap','pull','close')),
        quantity_delta integer NOT NULL,
        quantity_after integer NOT NULL CHECK (quantity_after >= 0),
        from_location varchar(60),
        to_location varchar(60),
        positions integer[],
        measurement_id bigint REFERENCES measurement(id) ON DELETE RESTRICT,
        reason varchar(300),
        user_id integer REFERENCES app_user(id),
        at timestamptz NOT NULL DEFAULT now(),
        CHECK (kind <> 'screen-in' OR measurement_id IS NOT NULL)
      )`);
    await q.query(`CREATE INDEX stock_movement_container_idx ON stock_movement (container_id, id)`);
    // A screened part enters stock once: this makes placing idempotent even under a race.
    await q.query(`CREATE UNIQUE INDEX stock_movement_screen_in_key ON stock_movement (measurement_id) WHERE kind = 'screen-in'`);
    await q.query(`
      CREATE FUNCTION stock_movement_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION 'stock_movement is append-only';
      END $$`);
    await q.query(`
      CREATE TRIGGER stock_movement_no_change BEFORE UPDATE OR DELETE ON stock_movement
      FOR EACH ROW EXECUTE FUNCTION stock_movement_append_only()`);

    await q.query(`
      CREATE TABLE label_print (
        id bigserial PRIMARY KEY,
        job_id uuid NOT NULL,
        container_id integer NOT NULL REFERENCES container(id) ON DELETE RESTRICT,
        stock varchar(20) NOT NULL,
        page integer NOT NULL CHECK (page >= 0),
        cell integer NOT NULL CHECK (cell >= 0),
        reprint boolean NOT NULL,
        quantity integer NOT NULL CHECK (quantity >= 0),
        payload text NOT NULL,
        printed_by integer NOT NULL REFERENCES app_user(id),
        printed_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX label_print_container_idx ON label_print (container_id, id)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE label_print`);
    await q.query(`DROP TRIGGER stock_movement_no_change ON stock_movement`);
    await q.query(`DROP FUNCTION stock_movement_append_only()`);
    await q.query(`DROP TABLE stock_movement`);
    await q.query(`DROP TABLE container_position`);
    await q.query(`DROP TABLE container`);
    await q.query(`DROP TABLE screening_setup`);
    await q.query(`DROP TABLE container_code_counter`);
  }
}
