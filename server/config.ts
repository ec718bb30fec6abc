import path from 'node:path';

/** Settings read from the environment. Secrets are never logged. */
export interface ServerConfig {
  port: number;
  dataDir: string;
  db: { host: string; port: number; database: string; user: string; password?: string };
  smtp: { host: string; port: number };
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
    },
    smtp: { host: '127.0.0.1', port: Number(env.BINWRIGHT_SMTP_PORT ?? 2525) },
    sessionSecret: env.BINWRIGHT_SESSION_SECRET ?? 'binwright-local-session-secret-change-me',
    production: env.NODE_ENV === 'production',
    loginRateLimit: Number(env.BINWRIGHT_LOGIN_LIMIT ?? 10),
  };
}
