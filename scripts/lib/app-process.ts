/**
 * Runs the Express app in its own Node process (scripts/lib/app-process-main.ts through tsx's
 * loader, no wrapper process): the PID is the server itself, so SIGKILL kills exactly it.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export interface AppProcess {
  child: ChildProcess;
  port: number;
  baseUrl: string;
  /** Everything the process wrote to stderr so far (for failure messages). */
  stderr(): string;
  /** Resolves when the process has exited (with its signal or code). */
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
  /** SIGTERM (graceful) or SIGKILL; waits for the exit. */
  stop(signal?: NodeJS.Signals): Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
}

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

/** Starts the app with the given environment (database, data folder) added to this process's. */
export function startAppProcess(env: Record<string, string>, opts: { timeoutMs?: number; nodeArgs?: string[] } = {}): Promise<AppProcess> {
  const timeoutMs = opts.timeoutMs ?? 30_000;
  const child = spawn(process.execPath, [...(opts.nodeArgs ?? []), '--import', 'tsx', path.join(root, 'scripts/lib/app-process-main.ts')], {
    cwd: root,
    env: { ...process.env, TSX_TSCONFIG_PATH: path.join(root, 'tsconfig.server.json'), PORT: '0', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let err = '';
  child.stderr!.on('data', (d: Buffer) => {
    err = (err + d.toString()).slice(-20_000);
  });
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    child.once('exit', (code, signal) => resolve({ code, signal })),
  );
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => {
      child.kill('SIGKILL');
      reject(new Error(`The app process did not start within ${timeoutMs} ms.\n${err}`));
    }, timeoutMs);
    let out = '';
    const onData = (d: Buffer) => {
      out += d.toString();
      const m = /\{"listening":(\d+)\}/.exec(out);
      if (!m) return;
      clearTimeout(timer);
      child.stdout!.off('data', onData);
      child.stdout!.resume();
      const port = Number(m[1]);
      resolve({
        child,
        port,
        baseUrl: `http://127.0.0.1:${port}`,
        stderr: () => err,
        exited,
        stop: async (signal = 'SIGTERM') => {
          if (child.exitCode === null && child.signalCode === null) child.kill(signal);
          return exited;
        },
      });
    };
    child.stdout!.on('data', onData);
    void exited.then(({ code, signal }) => {
      clearTimeout(timer);
      reject(new Error(`The app process exited before listening (code ${code}, signal ${signal}).\n${err}`));
    });
  });
}
