/**
 * Backup and restore of the Binwright database (pg_dump custom format) and its stored files
 * (documents). The dump is taken inside one snapshot, so it is consistent while the app runs.
 */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import { StartupError } from './pg-cluster.ts';

export interface DbTarget {
  host: string;
  port: number;
  user: string;
  database: string;
}

function run(bin: string, args: string[]) {
  const r = spawnSync(bin, args, { encoding: 'utf8' });
  if (r.status !== 0) throw new StartupError(`${path.basename(bin)} failed: ${r.stderr || r.stdout}`);
}

/** Writes `<out>.dump` (database) and, when the documents folder exists, `<out>-documents.tar`. */
export function backupDatabase(binDir: string, target: DbTarget, outFile: string, documentsDir?: string): string[] {
  fs.mkdirSync(path.dirname(outFile), { recursive: true });
  run(path.join(binDir, 'pg_dump'), ['-h', target.host, '-p', String(target.port), '-U', target.user, '-Fc', '--no-owner', '-f', outFile, target.database]);
  const files = [outFile];
  if (documentsDir && fs.existsSync(documentsDir)) {
    const tarFile = outFile.replace(/\.dump$/, '') + '-documents.tar';
    run('tar', ['-cf', tarFile, '-C', path.dirname(documentsDir), path.basename(documentsDir)]);
    files.push(tarFile);
  }
  return files;
}

/** Replaces the database with the dump (drop, create, pg_restore) and the documents with the tar. */
export async function restoreDatabase(binDir: string, target: DbTarget, dumpFile: string, documentsDir?: string): Promise<void> {
  if (!fs.existsSync(dumpFile)) throw new StartupError(`No backup file at ${dumpFile}.`);
  const admin = new pg.Client({ host: target.host, port: target.port, user: target.user, database: 'postgres' });
  await admin.connect();
  try {
    const name = target.database.replace(/"/g, '');
    await admin.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
    await admin.query(`CREATE DATABASE "${name}"`);
  } finally {
    await admin.end();
  }
  run(path.join(binDir, 'pg_restore'), ['-h', target.host, '-p', String(target.port), '-U', target.user, '--no-owner', '--exit-on-error', '-d', target.database, dumpFile]);
  const tarFile = dumpFile.replace(/\.dump$/, '') + '-documents.tar';
  if (documentsDir && fs.existsSync(tarFile)) {
    fs.rmSync(documentsDir, { recursive: true, force: true });
    fs.mkdirSync(path.dirname(documentsDir), { recursive: true });
    run('tar', ['-xf', tarFile, '-C', path.dirname(documentsDir)]);
  }
}

/** Row count and an md5 over every row (in primary-key order) of each table: a fingerprint of the data. */
export async function tableChecksums(client: pg.Client | pg.Pool): Promise<Record<string, { rows: number; md5: string }>> {
  const { rows: tables } = await client.query<{ t: string }>(
    `SELECT table_name AS t FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE' AND table_name <> 'session' ORDER BY 1`,
  );
  const out: Record<string, { rows: number; md5: string }> = {};
  for (const { t } of tables) {
    const r = await client.query<{ n: string; h: string | null }>(
      `SELECT count(*) AS n, md5(string_agg(x::text, '|' ORDER BY x::text)) AS h FROM "${t}" x`,
    );
    out[t] = { rows: Number(r.rows[0].n), md5: r.rows[0].h ?? '' };
  }
  return out;
}
