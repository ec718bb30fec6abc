/** `npm run demo:reset`: drops the demo database and loads the demo scenario afresh. Stop the app first. */
import 'reflect-metadata';
import fs from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import { readConfig } from '../server/config.ts';
import { createDataSource } from '../server/data-source.ts';
import { seedDemo } from '../seed/demo.ts';
import { clusterEnv, startCluster, StartupError } from './lib/pg-cluster.ts';

async function main() {
  const base = readConfig();
  const cluster = await startCluster({ dataDir: path.join(base.dataDir, 'postgres'), port: base.db.port, database: 'postgres' });
  try {
    const admin = new pg.Client({ host: cluster.host, port: cluster.port, user: cluster.user, database: 'postgres' });
    await admin.connect();
    await admin.query(`DROP DATABASE IF EXISTS "${base.db.database}" WITH (FORCE)`);
    await admin.query(`CREATE DATABASE "${base.db.database}"`);
    await admin.end();
    for (const sub of ['documents', 'mail']) fs.rmSync(path.join(base.dataDir, sub), { recursive: true, force: true });
    Object.assign(process.env, clusterEnv({ ...cluster, database: base.db.database }));
    const ds = createDataSource(readConfig());
    await ds.initialize();
    await ds.runMigrations({ transaction: 'each' });
    await seedDemo(ds, console.log);
    await ds.destroy();
    console.log('Demo data reset. Run npm start.');
  } finally {
    cluster.stop();
  }
}

main().catch((e) => {
  console.error(e instanceof StartupError ? e.message : e);
  process.exit(1);
});
