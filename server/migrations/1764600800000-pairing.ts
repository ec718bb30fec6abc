import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Pairing: kits of matched sets reserved from positioned stock and pulled by scan.
 *
 * kit_request — one request (code KIT-YYYYMMDD-NNNN from kit_code_counter), its part type(s),
 * set size, sets wanted, tolerances, mode, status and reservation end.
 * kit_set — the matched sets of a kit with their mismatch figures.
 * kit_part — one part of a set: the container position it was reserved in, its measurement, lot
 * and container (kept after the pull, for traceability both ways), and when and by whom it was
 * pulled, or when the reservation was given back (released_at).
 *
 * A container position belongs to at most one kit at a time: the partial unique index on
 * kit_part (container_position_id) WHERE released_at IS NULL backs up the row locks of the
 * reservation, so no part can ever be reserved twice, even if a code path forgot the lock.
 */
export class Pairing1764600800000 implements MigrationInterface {
  name = 'Pairing1764600800000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE kit_code_counter (
        day date PRIMARY KEY,
        last integer NOT NULL
      )`);
    await q.query(`
      CREATE TABLE kit_request (
        id serial PRIMARY KEY,
        code varchar(30) NOT NULL UNIQUE,
        mode varchar(15) NOT NULL CHECK (mode IN ('same','complementary')),
        part_type_id integer NOT NULL REFERENCES part_type(id) ON DELETE RESTRICT,
        complement_part_type_id integer REFERENCES part_type(id) ON DELETE RESTRICT,
        set_size integer NOT NULL CHECK (set_size IN (2,4)),
        sets_wanted integer NOT NULL CHECK (sets_wanted BETWEEN 1 AND 500),
        hfe_tolerance_pct double precision NOT NULL CHECK (hfe_tolerance_pct >= 0),
        vbe_tolerance_mv double precision NOT NULL CHECK (vbe_tolerance_mv >= 0),
        status varchar(10) NOT NULL DEFAULT 'reserved' CHECK (status IN ('planned','reserved','picking','pulled','expired','cancelled')),
        reserved_until timestamptz,
        note varchar(300),
        created_by integer NOT NULL REFERENCES app_user(id),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        completed_at timestamptz,
        expired_at timestamptz,
        cancelled_at timestamptz,
        cancelled_by integer REFERENCES app_user(id),
        CHECK ((mode = 'complementary') = (complement_part_type_id IS NOT NULL)),
        CHECK (status NOT IN ('reserved','picking') OR reserved_until IS NOT NULL)
      )`);
    await q.query(`CREATE INDEX kit_request_status_idx ON kit_request (status, reserved_until)`);
    await q.query(`CREATE INDEX kit_request_created_idx ON kit_request (created_at DESC, id DESC)`);

    await q.query(`
      CREATE TABLE kit_set (
        id serial PRIMARY KEY,
        kit_id integer NOT NULL REFERENCES kit_request(id) ON DELETE RESTRICT,
        set_index integer NOT NULL CHECK (set_index >= 1),
        hfe_spread_pct double precision NOT NULL,
        vbe_spread_mv double precision NOT NULL,
        mismatch double precision NOT NULL,
        mirror_ratio double precision NOT NULL,
        offset_mv double precision NOT NULL,
        hfe_ratio double precision NOT NULL,
        UNIQUE (kit_id, set_index)
      )`);

    await q.query(`
      CREATE TABLE kit_part (
        id bigserial PRIMARY KEY,
        kit_id integer NOT NULL REFERENCES kit_request(id) ON DELETE RESTRICT,
        kit_set_id integer NOT NULL REFERENCES kit_set(id) ON DELETE RESTRICT,
        container_position_id bigint NOT NULL REFERENCES container_position(id) ON DELETE RESTRICT,
        container_id integer NOT NULL REFERENCES container(id) ON DELETE RESTRICT,
        position integer NOT NULL CHECK (position > 0),
        measurement_id bigint NOT NULL REFERENCES measurement(id) ON DELETE RESTRICT,
        lot_id integer NOT NULL REFERENCES lot(id) ON DELETE RESTRICT,
        pulled_at timestamptz,
        pulled_by integer REFERENCES app_user(id),
        released_at timestamptz,
        CHECK ((pulled_at IS NULL) = (pulled_by IS NULL)),
        CHECK (pulled_at IS NULL OR released_at IS NULL)
      )`);
    await q.query(`CREATE UNIQUE INDEX kit_part_position_held_key ON kit_part (container_position_id) WHERE released_at IS NULL`);
    await q.query(`CREATE INDEX kit_part_kit_idx ON kit_part (kit_id)`);
    await q.query(`CREATE INDEX kit_part_lot_idx ON kit_part (lot_id, kit_id)`);
    await q.query(`CREATE INDEX kit_part_container_idx ON kit_part (container_id, position)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE kit_part`);
    await q.query(`DROP TABLE kit_set`);
    await q.query(`DROP TABLE kit_request`);
    await q.query(`DROP TABLE kit_code_counter`);
  }
}
