import 'reflect-metadata';
import { DataSource } from 'typeorm';
import { readConfig } from './config.ts';
import { entities } from './entities.ts';
import { migrations } from './migrations/index.ts';

/** Builds the one DataSource of the app. Schema changes come only from migrations. */
export function createDataSource(config = readConfig()): DataSource {
  return new DataSource({
    type: 'postgres',
    host: config.db.host,
    port: config.db.port,
    username: config.db.user,
    password: config.db.password,
    database: config.db.database,
    entities,
    migrations,
    synchronize: false,
    migrationsRun: false,
    logging: ['error'],
    // pg Pool options. Without a connect timeout a request waits forever for a database host that
    // accepts the connection but never answers; with it the request fails (503) after a few seconds.
    extra: { connectionTimeoutMillis: config.db.connectTimeoutMs },
  });
}

/** Used by the TypeORM CLI (`npm run migration:run`). */
export const AppDataSource = createDataSource();
