import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { describe, expect, it } from 'vitest';
import { seedDemo } from '../../seed/demo.ts';
import { backupDatabase, restoreDatabase, tableChecksums } from '../../scripts/lib/backup.ts';
import { pgBinDir } from '../../scripts/lib/pg-cluster.ts';
import { readConfig } from '../../server/config.ts';
import { useTestApp } from './helpers.ts';

const ctx = useTestApp();

describe('db:backup and db:restore', () => {
  it('round-trip the data exactly: same row counts and checksums in every table', async () => {
    await seedDemo(ctx.ds);
    const config = readConfig();
    const target = { host: config.db.host, port: config.db.port, user: config.db.user, database: config.db.database };
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'bw-backup-'));
    const file = path.join(dir, 'test.dump');
    const before = await tableChecksums((ctx.ds.driver as unknown as { master: pg.Pool }).master);
    backupDatabase(pgBinDir(), target, file);
    expect(fs.statSync(file).size).toBeGreaterThan(1000);

    // Restore into a second database of the same cluster and compare.
    const copy = { ...target, database: `${target.database}_restore` };
    await restoreDatabase(pgBinDir(), copy, file);
    const client = new pg.Client({ host: copy.host, port: copy.port, user: copy.user, database: copy.database });
    await client.connect();
    const after = await tableChecksums(client);
    await client.end();
    expect(after).toEqual(before);
    expect(before.app_user.rows).toBeGreaterThanOrEqual(4);
    fs.rmSync(dir, { recursive: true, force: true });
  });
});
