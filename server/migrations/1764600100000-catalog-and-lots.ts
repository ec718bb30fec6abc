import type { MigrationInterface, QueryRunner } from 'typeorm';

export class CatalogAndLots1764600100000 implements MigrationInterface {
  name = 'CatalogAndLots1764600100000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE part_type (
        id serial PRIMARY KEY,
        part_number varchar(60) NOT NULL UNIQUE,
        description varchar(200) NOT NULL,
        polarity varchar(3) NOT NULL CHECK (polarity IN ('NPN','PNP')),
        package varchar(40) NOT NULL,
        hfe_ic_ma double precision NOT NULL CHECK (hfe_ic_ma > 0),
        hfe_vce_v double precision NOT NULL CHECK (hfe_vce_v > 0),
        vbe_ic_ma double precision NOT NULL CHECK (vbe_ic_ma > 0),
        hfe_min double precision,
        hfe_max double precision,
        vbe_min_mv double precision,
        vbe_max_mv double precision,
        vbe_tc_mv_per_c double precision NOT NULL DEFAULT -2,
        hfe_tc_pct_per_c double precision NOT NULL DEFAULT 0.5,
        msl varchar(20) NOT NULL DEFAULT 'not-classified',
        esd_hbm_class varchar(4),
        sampling_method varchar(20) NOT NULL DEFAULT 'attribute' CHECK (sampling_method IN ('attribute','zero-acceptance','variables')),
        inspection_level varchar(4) NOT NULL DEFAULT 'II',
        aql double precision NOT NULL DEFAULT 1.0,
        match_hfe_pct double precision NOT NULL DEFAULT 5,
        match_vbe_mv double precision NOT NULL DEFAULT 2,
        active boolean NOT NULL DEFAULT true,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CHECK (hfe_min IS NULL OR hfe_max IS NULL OR hfe_min < hfe_max),
        CHECK (vbe_min_mv IS NULL OR vbe_max_mv IS NULL OR vbe_min_mv < vbe_max_mv)
      )`);
    await q.query(`
      CREATE TABLE gain_bin_scheme (
        id serial PRIMARY KEY,
        part_type_id integer NOT NULL REFERENCES part_type(id) ON DELETE RESTRICT,
        version integer NOT NULL,
        note varchar(300),
        locked_at timestamptz,
        created_by integer REFERENCES app_user(id),
        created_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (part_type_id, version)
      )`);
    await q.query(`
      CREATE TABLE gain_bin (
        id serial PRIMARY KEY,
        scheme_id integer NOT NULL REFERENCES gain_bin_scheme(id) ON DELETE CASCADE,
        position integer NOT NULL,
        code varchar(20) NOT NULL,
        label varchar(80) NOT NULL,
        hfe_min double precision NOT NULL,
        hfe_max double precision NOT NULL,
        vbe_min_mv double precision,
        vbe_max_mv double precision,
        gap_before_intended boolean NOT NULL DEFAULT false,
        UNIQUE (scheme_id, position),
        UNIQUE (scheme_id, code),
        CHECK (hfe_min < hfe_max)
      )`);
    await q.query(`
      CREATE TABLE supplier (
        id serial PRIMARY KEY,
        code varchar(20) NOT NULL UNIQUE,
        name varchar(120) NOT NULL,
        approval varchar(20) NOT NULL DEFAULT 'approved' CHECK (approval IN ('approved','conditional','not-approved')),
        notes varchar(1000),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE supplier_contact (
        id serial PRIMARY KEY,
        supplier_id integer NOT NULL REFERENCES supplier(id) ON DELETE CASCADE,
        name varchar(120) NOT NULL,
        email varchar(254) NOT NULL,
        phone varchar(40),
        duty varchar(40)
      )`);
    await q.query(`
      CREATE TABLE supplier_part (
        id serial PRIMARY KEY,
        supplier_id integer NOT NULL REFERENCES supplier(id) ON DELETE CASCADE,
        supplier_part_number varchar(60) NOT NULL,
        part_type_id integer NOT NULL REFERENCES part_type(id) ON DELETE RESTRICT,
        UNIQUE (supplier_id, supplier_part_number)
      )`);
    await q.query(`CREATE INDEX supplier_part_number_idx ON supplier_part (supplier_part_number)`);
    await q.query(`
      CREATE TABLE lot_code_counter (
        day date PRIMARY KEY,
        last integer NOT NULL
      )`);
    await q.query(`
      CREATE TABLE lot (
        id serial PRIMARY KEY,
        code varchar(30) NOT NULL UNIQUE,
        supplier_id integer NOT NULL REFERENCES supplier(id) ON DELETE RESTRICT,
        part_type_id integer NOT NULL REFERENCES part_type(id) ON DELETE RESTRICT,
        quantity integer NOT NULL CHECK (quantity > 0),
        purchase_order varchar(60),
        supplier_part_number varchar(60),
        supplier_lot varchar(60),
        date_code varchar(20),
        country_of_origin varchar(2),
        msl varchar(20),
        dry_bag varchar(20) NOT NULL DEFAULT 'not-applicable' CHECK (dry_bag IN ('sealed','opened','not-applicable')),
        bag_opened_at timestamptz,
        status varchar(24) NOT NULL DEFAULT 'received'
          CHECK (status IN ('received','inspecting','awaiting-signature','accepted','rejected','mrb')),
        label_raw text,
        label_fingerprint varchar(64) UNIQUE,
        label_elements jsonb,
        bin_scheme_id integer REFERENCES gain_bin_scheme(id) ON DELETE RESTRICT,
        received_by integer NOT NULL REFERENCES app_user(id),
        received_at timestamptz NOT NULL DEFAULT now(),
        override_by integer REFERENCES app_user(id),
        override_reason varchar(500),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX lot_status_idx ON lot (status)`);
    await q.query(`CREATE INDEX lot_supplier_idx ON lot (supplier_id)`);
    await q.query(`CREATE INDEX lot_part_type_idx ON lot (part_type_id)`);
    await q.query(`CREATE INDEX lot_received_at_idx ON lot (received_at DESC)`);
    await q.query(`
      CREATE TABLE lot_document (
        id serial PRIMARY KEY,
        lot_id integer NOT NULL REFERENCES lot(id) ON DELETE RESTRICT,
        kind varchar(20) NOT NULL CHECK (kind IN ('coc','photo','test-report','other')),
        original_name varchar(255) NOT NULL,
        media_type varchar(60) NOT NULL,
        size_bytes integer NOT NULL,
        sha256 varchar(64) NOT NULL,
        storage_key varchar(200) NOT NULL UNIQUE,
        uploaded_by integer NOT NULL REFERENCES app_user(id),
        uploaded_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX lot_document_lot_idx ON lot_document (lot_id)`);
  }

  async down(q: QueryRunner): Promise<void> {
    for (const t of ['lot_document', 'lot', 'lot_code_counter', 'supplier_part', 'supplier_contact', 'supplier', 'gain_bin', 'gain_bin_scheme', 'part_type']) {
      await q.query(`DROP TABLE ${t}`);
    }
  }
}
