import fs from 'node:fs';
import path from 'node:path';
import { SMTPServer } from 'smtp-server';

export interface SmtpSink {
  port: number;
  folder: string;
  close(): Promise<void>;
}

/**
 * A local SMTP sink on 127.0.0.1: it accepts every message and stores it as an .eml file in
 * `folder`; nothing leaves the machine. STARTTLS and AUTH are off (local use only).
 */
export function startSmtpSink(opts: { port: number; folder: string }): Promise<SmtpSink> {
  fs.mkdirSync(opts.folder, { recursive: true });
  let counter = 0;
  const server = new SMTPServer({
    disabledCommands: ['STARTTLS', 'AUTH'],
    authOptional: true,
    logger: false,
    size: 25 * 1024 * 1024,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        const name = `${new Date().toISOString().replace(/[:.]/g, '-')}-${process.pid}-${counter++}.eml`;
        fs.writeFile(path.join(opts.folder, name), Buffer.concat(chunks), (err) => callback(err ?? null));
      });
    },
  });
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port, '127.0.0.1', () => {
      const address = server.server.address();
      const port = typeof address === 'object' && address ? address.port : opts.port;
      resolve({ port, folder: opts.folder, close: () => new Promise<void>((r) => server.close(() => r())) });
    });
  });
}
