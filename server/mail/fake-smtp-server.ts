import { randomUUID } from 'node:crypto';
import { mkdirSync, readdirSync, readFileSync } from 'node:fs';
import { writeFile } from 'node:fs/promises';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import { SMTPServer } from 'smtp-server';

/** A local SMTP server that accepts every message and stores it as an .eml file. */
export interface FakeSmtpServer {
  readonly host: string;
  readonly port: number;
  readonly mailDir: string;
  stop(): Promise<void>;
}

/** Lab submissions and reports are small; this bounds a runaway message (bytes). */
const MAX_MESSAGE_BYTES = 25 * 1024 * 1024;

/**
 * Starts the fake mail server used in demo mode and by tests: plain SMTP on localhost, any
 * sender, any recipient, no real delivery. Each message lands in `mailDir` before the server
 * acknowledges it, so once the sender's call returns the file is there.
 */
export async function startFakeSmtpServer({ mailDir, host = '127.0.0.1', port = 0 }: { mailDir: string; host?: string; port?: number }): Promise<FakeSmtpServer> {
  mkdirSync(mailDir, { recursive: true });
  // Names sort in arrival order even within one millisecond.
  let sequence = 0;
  const server = new SMTPServer({
    banner: 'Heapsight fake SMTP server (demo and tests; nothing leaves this machine)',
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    size: MAX_MESSAGE_BYTES,
    logger: false,
    onAuth(auth, _session, callback) {
      callback(null, { user: auth.username ?? 'anyone' });
    },
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        if (stream.sizeExceeded) {
          callback(Object.assign(new Error('Message too large'), { responseCode: 552 }));
          return;
        }
        sequence += 1;
        const file = join(mailDir, `${Date.now()}-${String(sequence).padStart(6, '0')}-${randomUUID()}.eml`);
        writeFile(file, Buffer.concat(chunks)).then(() => callback(), (error: Error) => callback(error));
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve());
  });
  const address = server.server.address() as AddressInfo;
  return {
    host,
    port: address.port,
    mailDir,
    stop: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

/** The raw messages the fake server has stored, oldest first. */
export function readStoredMessages(mailDir: string): { file: string; raw: Buffer }[] {
  return readdirSync(mailDir)
    .filter((name) => name.endsWith('.eml'))
    .sort()
    .map((name) => ({ file: name, raw: readFileSync(join(mailDir, name)) }));
}
