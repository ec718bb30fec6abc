import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { startCluster, StartupError } from '../../scripts/lib/pg-cluster.ts';

describe('project-local PostgreSQL start-up faults', () => {
  it('when the data folder was made by another PostgreSQL version, stops with a clear message', async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'bw-pgver-'));
    fs.chmodSync(dir, 0o755);
    fs.mkdirSync(path.join(dir, 'pgdata'));
    fs.writeFileSync(path.join(dir, 'pgdata', 'PG_VERSION'), '9\n');
    const err = await startCluster({ dataDir: dir, port: 54398, database: 'x', log: () => {} }).catch((e) => e);
    expect(err).toBeInstanceOf(StartupError);
    expect(err.message).toMatch(/made by PostgreSQL 9/);
    expect(err.message).toMatch(/BINWRIGHT_DATA_DIR|BINWRIGHT_PG_BIN/);
    fs.rmSync(dir, { recursive: true, force: true });
  });

  it('when the database port is taken, stops with a message naming the port and the variable', async () => {
    const blocker = net.createServer();
    await new Promise<void>((r) => blocker.listen(54399, '127.0.0.1', () => r()));
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'bw-pgport-'));
    fs.chmodSync(dir, 0o755);
    try {
      const err = await startCluster({ dataDir: dir, port: 54399, database: 'x', log: () => {} }).catch((e) => e);
      expect(err).toBeInstanceOf(StartupError);
      expect(err.message).toMatch(/54399/);
      expect(err.message).toMatch(/BINWRIGHT_DB_PORT/);
    } finally {
      blocker.close();
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});
