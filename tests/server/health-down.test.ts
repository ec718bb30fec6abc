import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { readConfig } from '../../server/config.ts';
import { createDataSource } from '../../server/data-source.ts';

describe('GET /api/health when PostgreSQL is unreachable', () => {
  it('answers 503 with database not ok', async () => {
    const config = readConfig({ ...process.env, BINWRIGHT_DB_HOST: '127.0.0.1', BINWRIGHT_DB_PORT: '1' });
    const ds = createDataSource(config);
    const app = createApp({ dataSource: ds, config });
    const res = await request(app).get('/api/health').expect(503);
    expect(res.body).toEqual({ status: 'degraded', database: 'unreachable' });
  });
});
