import { randomUUID } from 'node:crypto';
import nodemailer, { type Transporter } from 'nodemailer';
import type { Logger } from 'pino';
import type { Database } from '../db/database';
import type { Config } from '../lib/config';
import { MailMessage, type MailStatus } from './mail-message.model';

/** A file sent with a message (a lab submission CSV, a report PDF). */
export interface MailAttachment {
  readonly filename: string;
  readonly content: Buffer | string;
  readonly contentType?: string;
}

/** One e-mail the system sends. */
export interface OutgoingMail {
  readonly to: string | readonly string[];
  readonly subject: string;
  readonly text: string;
  readonly html?: string;
  readonly attachments?: readonly MailAttachment[];
  /** Whose `Outbox` lists the message. */
  readonly organizationId?: string | null;
  /**
   * Strings (such as a password link) sent in the message but blanked in the stored copy, so an
   * admin reading `Outbox` cannot use them. Demo mode keeps them so the demo can follow the link.
   */
  readonly secrets?: readonly string[];
}

/** What became of a message: its `Outbox` id and whether the SMTP server took it. */
export interface SentMail {
  readonly id: string;
  readonly status: MailStatus;
  readonly errorMessage: string | null;
}

/** The one way the system sends e-mail; later components (lab batches, reports) use it too. */
export interface MailService {
  sendMail(mail: OutgoingMail): Promise<SentMail>;
}

/** SMTP timeouts: a camp link is slow, but a request should not hang on a dead server (ms). */
const SMTP_TIMEOUT_MS = 15_000;
const HIDDEN = '[hidden: sent by e-mail only]';

/**
 * Sends through nodemailer over SMTP (the configured host, or the fake server in demo mode) and
 * keeps a copy of every message with its outcome. A refused or unreachable server never throws:
 * the message is stored as `failed` with the reason, for `Outbox` to show.
 */
export function createMailService(context: { config: Config; database: Database; logger: Logger }): MailService {
  const { config, database, logger } = context;
  const transport: Transporter | null = config.smtp.host
    ? nodemailer.createTransport({
        host: config.smtp.host,
        port: config.smtp.port ?? (config.smtp.isSecure ? 465 : 587),
        secure: config.smtp.isSecure,
        auth: config.smtp.user ? { user: config.smtp.user, pass: config.smtp.password ?? '' } : undefined,
        connectionTimeout: SMTP_TIMEOUT_MS,
        greetingTimeout: SMTP_TIMEOUT_MS,
        socketTimeout: SMTP_TIMEOUT_MS,
      })
    : null;

  return {
    async sendMail(mail) {
      const recipients = typeof mail.to === 'string' ? [mail.to] : [...mail.to];
      const hide = (body: string) =>
        config.isDemo ? body : (mail.secrets ?? []).reduce((text, secret) => text.split(secret).join(HIDDEN), body);
      const id = randomUUID();
      await database.transaction((transaction) =>
        MailMessage.create(
          {
            id, organizationId: mail.organizationId ?? null, recipients: recipients.join(', '), subject: mail.subject,
            textBody: hide(mail.text), htmlBody: mail.html ? hide(mail.html) : null,
            attachments: JSON.stringify((mail.attachments ?? []).map((attachment) => ({
              filename: attachment.filename, contentType: attachment.contentType ?? 'application/octet-stream',
              sizeBytes: Buffer.byteLength(attachment.content),
            }))),
            status: 'sending', errorMessage: null, transportMessageId: null,
          },
          { transaction },
        ),
      );

      let outcome: { status: MailStatus; errorMessage: string | null; transportMessageId: string | null };
      if (!transport) {
        outcome = { status: 'failed', errorMessage: 'No SMTP server is configured (set SMTP_HOST)', transportMessageId: null };
      } else {
        try {
          const info = await transport.sendMail({
            from: config.smtp.from, to: recipients, subject: mail.subject, text: mail.text, html: mail.html,
            attachments: (mail.attachments ?? []).map((attachment) => ({ ...attachment })),
          });
          outcome = { status: 'sent', errorMessage: null, transportMessageId: String(info.messageId ?? '').slice(0, 300) || null };
        } catch (error) {
          logger.warn({ err: error, mailId: id }, 'e-mail not sent');
          outcome = { status: 'failed', errorMessage: (error instanceof Error ? error.message : String(error)).slice(0, 500), transportMessageId: null };
        }
      }
      await database.transaction((transaction) => MailMessage.update(outcome, { where: { id }, transaction }));
      return { id, status: outcome.status, errorMessage: outcome.errorMessage };
    },
  };
}
