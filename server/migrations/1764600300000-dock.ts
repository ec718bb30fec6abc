import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Site settings (scanner substitutes) and the rule that a lot never holds the same file twice. */
export class Dock1764600300000 implements MigrationInterface {
  name = 'Dock1764600300000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE site_setting (
        key varchar(60) PRIMARY KEY,
        value jsonb NOT NULL,
        updated_by integer REFERENCES app_user(id),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE UNIQUE INDEX lot_document_lot_sha256_key ON lot_document (lot_id, sha256)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX lot_document_lot_sha256_key`);
    await q.query(`DROP TABLE site_setting`);
  }
}
