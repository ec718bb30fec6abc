import path from 'node:path';

/** Settings read from the environment. Secrets are never logged. */
export interface ServerConfig {
  port: number;
  dataDir: string;
  db: {
    host: string;
    port: number;
    database: string;
    user: string;
    password?: string;
    /** How long a new connection may take before the request fails (ms); 0 waits forever. */
    connectTimeoutMs: number;
  };
  smtp: {
    host: string;
    port: number;
    user?: string;
    pass?: string;
    /** true for implicit TLS (port 465); the local sink speaks plain SMTP. */
    secure: boolean;
    from: string;
    /** Folder where the local sink keeps messages (shown on the Outbox page). */
    sinkFolder: string;
  };
  sessionSecret: string;
  production: boolean;
  loginRateLimit: number;
}

export function readConfig(env: NodeJS.ProcessEnv = process.env): ServerConfig {
  const dataDir = path.resolve(env.BINWRIGHT_DATA_DIR ?? '.data');
  return {
    port: Number(env.PORT ?? 5180),
    dataDir,
    db: {
      host: env.BINWRIGHT_DB_HOST ?? '127.0.0.1',
      port: Number(env.BINWRIGHT_DB_PORT ?? 54329),
      database: env.BINWRIGHT_DB_NAME ?? 'binwright',
      user: env.BINWRIGHT_DB_USER ?? 'binwright',
      password: env.BINWRIGHT_DB_PASSWORD,
      connectTimeoutMs: Number(env.BINWRIGHT_DB_CONNECT_TIMEOUT_MS ?? 5000),
    },
    smtp: {
      host: env.BINWRIGHT_SMTP_HOST ?? '127.0.0.1',
      port: Number(env.BINWRIGHT_SMTP_PORT ?? 2525),
      user: env.BINWRIGHT_SMTP_USER || undefined,
      pass: env.BINWRIGHT_SMTP_PASS || undefined,
      secure: env.BINWRIGHT_SMTP_SECURE === 'true',
      from: env.BINWRIGHT_MAIL_FROM ?? 'Binwright quality <quality@harrowpoint.test>',
      sinkFolder: path.join(dataDir, 'mail'),
    },
    sessionSecret: env.BINWRIGHT_SESSION_SECRET ?? 'binwright-local-session-secret-change-me',
    production: env.NODE_ENV === 'production',
    loginRateLimit: Number(env.BINWRIGHT_LOGIN_LIMIT ?? 10),
  };
}
