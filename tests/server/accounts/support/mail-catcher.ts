import { simpleParser, type ParsedMail } from 'mailparser';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { readStoredMessages, startFakeSmtpServer, type FakeSmtpServer } from '../../../../server/mail/fake-smtp-server';

/** The fake SMTP server for one test file, and ways to read what it received. */
export interface MailCatcher {
  readonly server: FakeSmtpServer;
  /** Environment that points the app's mail at this server. */
  readonly env: Record<string, string>;
  /** Every message received so far, parsed, oldest first. */
  messages(): Promise<ParsedMail[]>;
  /** The newest message to this address, waiting for it to arrive when it is sent after the answer. */
  waitForMessageTo(address: string, { after }?: { after?: number }): Promise<ParsedMail>;
  stop(): Promise<void>;
}

/** How long a message may take to reach the fake server before the test fails (ms). */
const ARRIVAL_TIMEOUT_MS = 5_000;

export async function startMailCatcher(): Promise<MailCatcher> {
  const mailDir = mkdtempSync(join(tmpdir(), 'heapsight-mail-'));
  const server = await startFakeSmtpServer({ mailDir });
  const messages = () => Promise.all(readStoredMessages(mailDir).map((message) => simpleParser(message.raw)));
  const recipients = (message: ParsedMail) =>
    [message.to].flat().flatMap((to) => to?.value ?? []).map((entry) => entry.address?.toLowerCase());
  return {
    server,
    env: { SMTP_HOST: server.host, SMTP_PORT: String(server.port), PUBLIC_URL: 'http://heapsight.test' },
    messages,
    async waitForMessageTo(address, { after = 0 } = {}) {
      const deadline = Date.now() + ARRIVAL_TIMEOUT_MS;
      for (;;) {
        const found = (await messages()).slice(after).filter((message) => recipients(message).includes(address.toLowerCase()));
        if (found.length > 0) {
          return found[found.length - 1] as ParsedMail;
        }
        if (Date.now() > deadline) {
          throw new Error(`no e-mail to ${address} arrived within ${ARRIVAL_TIMEOUT_MS} ms`);
        }
        await new Promise((resolve) => setTimeout(resolve, 20));
      }
    },
    async stop() {
      await server.stop();
      rmSync(mailDir, { recursive: true, force: true });
    },
  };
}

/** The set-password link in a message's text, and the token inside it. */
export function linkIn(message: ParsedMail): { url: string; token: string } {
  const url = /https?:\/\/\S+\/set-password\?token=[A-Za-z0-9_-]+/.exec(message.text ?? '')?.[0];
  if (!url) {
    throw new Error(`no set-password link in:\n${message.text}`);
  }
  return { url, token: new URL(url).searchParams.get('token') as string };
}
