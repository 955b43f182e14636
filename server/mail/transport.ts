import { createHash } from 'node:crypto';
import nodemailer, { type SendMailOptions, type Transporter } from 'nodemailer';
import type { Config } from '../config';
import { headerText, isSafeAddress } from './headerSafe';

export interface OutgoingRow {
  id: number;
  recipientAddress: string;
  recipientName: string | null;
  subject: string;
  textBody: string;
  htmlBody: string;
  unsubscribeUrl: string | null;
  dedupeKey: string;
}

/** SMTP from the settings; file and URL access off so a body can never pull in local files. */
export function createMailer(config: Config): Transporter {
  return nodemailer.createTransport({
    host: config.smtpHost,
    port: config.smtpPort,
    secure: config.smtpSecure,
    auth: config.smtpUser ? { user: config.smtpUser, pass: config.smtpPass ?? '' } : undefined,
    connectionTimeout: config.smtpTimeoutMs,
    greetingTimeout: config.smtpTimeoutMs,
    socketTimeout: config.smtpTimeoutMs,
    disableFileAccess: true,
    disableUrlAccess: true,
  });
}

/** The same dedupe key always yields the same Message-ID, so a receiver can drop a repeat (RFC 5322 §3.6.4). */
export function messageIdFor(dedupeKey: string, config: Pick<Config, 'publicUrl'>): string {
  let domain = 'parapet.invalid';
  try {
    domain = new URL(config.publicUrl).hostname || domain;
  } catch {
    // an unparsable public address keeps the placeholder domain
  }
  return `<${createHash('sha256').update(dedupeKey).digest('hex').slice(0, 40)}@${domain}>`;
}

export function toMailOptions(row: OutgoingRow, config: Config): SendMailOptions {
  if (!isSafeAddress(row.recipientAddress)) throw new Error(`refusing to send to an unsafe address (message ${row.id})`);
  const headers: Record<string, string> = {};
  if (row.unsubscribeUrl && !/[\r\n]/.test(row.unsubscribeUrl)) {
    // One-click unsubscribe (RFC 8058): the receiver POSTs List-Unsubscribe=One-Click to the URL.
    headers['List-Unsubscribe'] = `<${row.unsubscribeUrl}>`;
    headers['List-Unsubscribe-Post'] = 'List-Unsubscribe=One-Click';
  }
  return {
    from: headerText(config.mailFrom),
    to: { name: headerText(row.recipientName ?? '', 120), address: row.recipientAddress },
    subject: headerText(row.subject, 300),
    text: row.textBody,
    html: row.htmlBody,
    messageId: messageIdFor(row.dedupeKey, config),
    headers,
  };
}
