import { Router } from 'express';
import type { DataSource } from 'typeorm';
import type { HealthResponse } from '../../../shared/api/health.ts';

export function healthRouter(ds: DataSource): Router {
  const r = Router();
  r.get('/', async (_req, res) => {
    let database: HealthResponse['database'] = 'ok';
    try {
      if (!ds.isInitialized) throw new Error('not initialised');
      await Promise.race([
        ds.query('SELECT 1'),
        new Promise((_, reject) => setTimeout(() => reject(new Error('timeout')), 2000)),
      ]);
    } catch {
      database = 'unreachable';
    }
    const body: HealthResponse = { status: database === 'ok' ? 'ok' : 'degraded', database };
    res.status(database === 'ok' ? 200 : 503).json(body);
  });
  return r;
}
