import { randomUUID } from 'node:crypto';
import { mkdir, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { SMTPServer } from 'smtp-server';

/** Where the fake server keeps messages, one `.eml` file each. */
export function outboxDir(storageDir: string): string {
  return path.join(storageDir, 'mail-outbox');
}

/**
 * A local SMTP server on loopback that accepts every message and keeps it as a file,
 * so local mode and tests exercise the real SMTP path without sending anything anywhere.
 */
export async function startFakeSmtp(host: string, port: number, storageDir: string): Promise<{ close(): Promise<void> }> {
  const dir = outboxDir(storageDir);
  await mkdir(dir, { recursive: true });
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    size: 10 * 1024 * 1024,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('error', callback);
      stream.on('end', () => {
        const name = `${new Date().toISOString().replace(/[:.]/g, '-')}-${randomUUID()}.eml`;
        writeFile(path.join(dir, name), Buffer.concat(chunks)).then(() => callback(), callback);
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve());
  });
  return { close: () => new Promise<void>((resolve) => server.close(() => resolve())) };
}
