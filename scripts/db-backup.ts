/** `npm run db:backup [-- <file.dump>]`: a consistent backup of the database and the stored documents. */
import path from 'node:path';
import { readConfig } from '../server/config.ts';
import { backupDatabase } from './lib/backup.ts';
import { pgBinDir, startCluster, StartupError } from './lib/pg-cluster.ts';

async function main() {
  const config = readConfig();
  const stamp = new Date().toISOString().replace(/[:.]/g, '-').slice(0, 19);
  const out = path.resolve(process.argv[2] ?? path.join(config.dataDir, 'backups', `binwright-${stamp}.dump`));
  const cluster = await startCluster({ dataDir: path.join(config.dataDir, 'postgres'), port: config.db.port, database: config.db.database, log: console.log });
  try {
    const files = backupDatabase(pgBinDir(), { host: cluster.host, port: cluster.port, user: cluster.user, database: config.db.database }, out, path.join(config.dataDir, 'documents'));
    console.log(`Backup written:\n  ${files.join('\n  ')}\nRestore with: npm run db:restore -- ${out}`);
  } finally {
    cluster.stop();
  }
}

main().catch((e) => {
  console.error(e instanceof StartupError ? e.message : e);
  process.exit(1);
});
