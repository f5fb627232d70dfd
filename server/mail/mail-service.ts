/**
 * Outgoing mail over SMTP with nodemailer. Features call `send`; in development and tests the
 * transport points at the in-process sink (see sink.ts).
 */
import nodemailer, { type Transporter } from 'nodemailer';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html?: string;
  /** Files to attach; one with a `cid` is shown inline where the HTML names `cid:<cid>`. */
  attachments?: MailAttachment[];
}

export interface MailAttachment {
  filename: string;
  content: Buffer;
  contentType: string;
  cid?: string;
}

export interface MailService {
  send(mail: OutgoingMail): Promise<void>;
  close(): void;
}

export function createMailService(smtpUrl: string, from: string, options: { local?: boolean } = {}): MailService {
  const url = new URL(smtpUrl);
  const transport: Transporter = nodemailer.createTransport({
    host: url.hostname,
    port: Number(url.port || (url.protocol === 'smtps:' ? 465 : 587)),
    secure: url.protocol === 'smtps:',
    auth: url.username ? { user: decodeURIComponent(url.username), pass: decodeURIComponent(url.password) } : undefined,
    // The local sink speaks plain SMTP on loopback only.
    ignoreTLS: options.local === true,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 20_000,
  });
  return {
    async send(mail) {
      await transport.sendMail({ from, ...mail });
    },
    close() {
      transport.close();
    },
  };
}

/** Escapes text for the HTML part of a message. */
export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** A plain HTML version of a few paragraphs and one link, no external images. */
export function simpleHtml(paragraphs: string[], link?: { href: string; label: string }): string {
  const body = paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n');
  const a = link ? `\n<p><a href="${escapeHtml(link.href)}">${escapeHtml(link.label)}</a></p>` : '';
  return `<!doctype html><html><body style="font-family: sans-serif; color: #222;">\n${body}${a}\n<p style="color:#666">— Planewright</p></body></html>`;
}
