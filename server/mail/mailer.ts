import nodemailer, { type Transporter } from 'nodemailer';
import type SMTPTransport from 'nodemailer/lib/smtp-transport';
import type { Config } from '../config';
import type { Logger } from '../logger';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
  attachments?: { filename: string; content: string | Buffer; contentType: string; method?: string }[];
  /** Extra headers, e.g. a stable Message-ID for threading. */
  headers?: Record<string, string>;
}

export interface Mailer {
  send: (mail: OutgoingMail) => Promise<void>;
  close: () => void;
}

/**
 * nodemailer to the configured SMTP server (maildev locally). E-mails never carry health
 * details: templates link to the app instead. Without SMTP_URL (misconfigured production) mail is
 * logged as dropped rather than crashing the request that triggered it.
 */
export function createMailer(config: Pick<Config, 'SMTP_URL' | 'MAIL_FROM'>, logger: Logger): Mailer {
  if (!config.SMTP_URL) {
    logger.warn('SMTP_URL is not set: e-mail will be logged and dropped.');
    return {
      send: async (mail) => logger.warn({ to: mail.to, subject: mail.subject }, 'e-mail dropped (no SMTP_URL)'),
      close: () => {},
    };
  }
  const local = /^smtp:\/\/(127\.0\.0\.1|localhost)[:/]/.test(config.SMTP_URL);
  const transport: Transporter = nodemailer.createTransport({
    url: config.SMTP_URL,
    // maildev on loopback speaks plain SMTP; anything remote must use TLS.
    ...(local ? { ignoreTLS: true } : { requireTLS: !config.SMTP_URL.startsWith('smtps://') }),
  } as SMTPTransport.Options);
  return {
    send: async (mail) => {
      await transport.sendMail({ from: config.MAIL_FROM, ...mail });
    },
    close: () => transport.close(),
  };
}
