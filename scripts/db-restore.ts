/**
 * `npm run db:restore -- <file.dump>`: replaces the database (and documents, when the backup has
 * them) with a backup. Stop the app first.
 */
import path from 'node:path';
import { readConfig } from '../server/config.ts';
import { restoreDatabase } from './lib/backup.ts';
import { pgBinDir, startCluster, StartupError } from './lib/pg-cluster.ts';

async function main() {
  const file = process.argv[2];
  if (!file) throw new StartupError('Name the backup to restore: npm run db:restore -- .data/backups/binwright-….dump');
  const config = readConfig();
  const cluster = await startCluster({ dataDir: path.join(config.dataDir, 'postgres'), port: config.db.port, database: 'postgres', log: console.log });
  try {
    await restoreDatabase(pgBinDir(), { host: cluster.host, port: cluster.port, user: cluster.user, database: config.db.database }, path.resolve(file), path.join(config.dataDir, 'documents'));
    console.log(`Restored ${config.db.database} from ${file}.`);
  } finally {
    cluster.stop();
  }
}

main().catch((e) => {
  console.error(e instanceof StartupError ? e.message : e);
  process.exit(1);
});
