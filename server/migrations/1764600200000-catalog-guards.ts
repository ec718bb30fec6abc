import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Catalog guards: part numbers unique regardless of case; a gain-bin scheme version that is
 * locked or referenced by a lot refuses any change to its bins, and a lock cannot be undone;
 * indexes for the "is this version used" and "which suppliers map this part" look-ups.
 */
export class CatalogGuards1764600200000 implements MigrationInterface {
  name = 'CatalogGuards1764600200000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE UNIQUE INDEX part_type_part_number_ci_idx ON part_type (lower(part_number))`);
    await q.query(`CREATE INDEX lot_bin_scheme_idx ON lot (bin_scheme_id) WHERE bin_scheme_id IS NOT NULL`);
    await q.query(`CREATE INDEX supplier_part_part_type_idx ON supplier_part (part_type_id)`);
    await q.query(`CREATE INDEX gain_bin_scheme_part_type_idx ON gain_bin_scheme (part_type_id, version DESC)`);

    await q.query(`
      CREATE FUNCTION gain_bin_scheme_is_frozen(sid integer) RETURNS boolean LANGUAGE sql STABLE AS $$
        SELECT EXISTS (SELECT 1 FROM gain_bin_scheme WHERE id = sid AND locked_at IS NOT NULL)
            OR EXISTS (SELECT 1 FROM lot WHERE bin_scheme_id = sid)
      $$`);
    await q.query(`
      CREATE FUNCTION gain_bin_frozen_guard() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF TG_OP <> 'INSERT' AND gain_bin_scheme_is_frozen(OLD.scheme_id) THEN
          RAISE EXCEPTION 'gain-bin scheme % is frozen (locked or used by a lot): create a new version', OLD.scheme_id
            USING ERRCODE = 'integrity_constraint_violation';
        END IF;
        IF TG_OP <> 'DELETE' AND gain_bin_scheme_is_frozen(NEW.scheme_id) THEN
          RAISE EXCEPTION 'gain-bin scheme % is frozen (locked or used by a lot): create a new version', NEW.scheme_id
            USING ERRCODE = 'integrity_constraint_violation';
        END IF;
        RETURN COALESCE(NEW, OLD);
      END $$`);
    await q.query(`
      CREATE TRIGGER gain_bin_frozen BEFORE INSERT OR UPDATE OR DELETE ON gain_bin
      FOR EACH ROW EXECUTE FUNCTION gain_bin_frozen_guard()`);

    await q.query(`
      CREATE FUNCTION gain_bin_scheme_lock_guard() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF OLD.locked_at IS NOT NULL AND (
             NEW.locked_at IS DISTINCT FROM OLD.locked_at
             OR NEW.version <> OLD.version
             OR NEW.part_type_id <> OLD.part_type_id) THEN
          RAISE EXCEPTION 'gain-bin scheme % is locked and cannot be unlocked or renumbered', OLD.id
            USING ERRCODE = 'integrity_constraint_violation';
        END IF;
        RETURN NEW;
      END $$`);
    await q.query(`
      CREATE TRIGGER gain_bin_scheme_lock BEFORE UPDATE ON gain_bin_scheme
      FOR EACH ROW EXECUTE FUNCTION gain_bin_scheme_lock_guard()`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TRIGGER gain_bin_scheme_lock ON gain_bin_scheme`);
    await q.query(`DROP FUNCTION gain_bin_scheme_lock_guard()`);
    await q.query(`DROP TRIGGER gain_bin_frozen ON gain_bin`);
    await q.query(`DROP FUNCTION gain_bin_frozen_guard()`);
    await q.query(`DROP FUNCTION gain_bin_scheme_is_frozen(integer)`);
    await q.query(`DROP INDEX gain_bin_scheme_part_type_idx`);
    await q.query(`DROP INDEX supplier_part_part_type_idx`);
    await q.query(`DROP INDEX lot_bin_scheme_idx`);
    await q.query(`DROP INDEX part_type_part_number_ci_idx`);
  }
}
