/**
 * The in-process SMTP sink used when SMTP_URL is unset: smtp-server on 127.0.0.1 (a free port),
 * every message parsed with mailparser and stored in the outbox table before the SMTP exchange
 * answers 250, so a sender that got "accepted" can read the message back at once.
 */
import type { AddressInfo } from 'node:net';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import type { DataSource } from 'typeorm';
import { MailMessage } from '../db/entities/index.js';
import type { Clock } from '../lib/clock.js';
import { systemClock } from '../lib/clock.js';

export const SINK_SIZE_LIMIT = 10 * 1024 * 1024;

export interface MailSink {
  port: number;
  /** `smtp://127.0.0.1:<port>` for nodemailer. */
  url: string;
  close(): Promise<void>;
}

const addresses = (a: AddressObject | AddressObject[] | undefined): string =>
  (Array.isArray(a) ? a : a ? [a] : []).map((x) => x.text).join(', ');

export async function startMailSink(dataSource: DataSource, clock: Clock = systemClock, onError: (e: unknown) => void = console.error): Promise<MailSink> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    size: SINK_SIZE_LIMIT,
    banner: 'Planewright development mail sink',
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('error', (e) => callback(e));
      stream.on('end', () => {
        if (stream.sizeExceeded) {
          const err = Object.assign(new Error('Message is larger than the sink accepts'), { responseCode: 552 });
          callback(err);
          return;
        }
        const raw = Buffer.concat(chunks);
        simpleParser(raw)
          .then(async (parsed) => {
            const envelopeTo = session.envelope.rcptTo.map((r) => r.address).join(', ');
            const mailFrom = session.envelope.mailFrom ? session.envelope.mailFrom.address : '';
            await dataSource.getRepository(MailMessage).insert({
              from: addresses(parsed.from) || mailFrom,
              to: addresses(parsed.to) || envelopeTo,
              subject: parsed.subject ?? '',
              text: parsed.text ?? '',
              html: typeof parsed.html === 'string' ? parsed.html : null,
              rawSize: raw.length,
              receivedAt: clock.now(),
            });
            callback();
          })
          .catch((e: unknown) => {
            onError(e);
            callback(Object.assign(new Error('The sink could not store the message'), { responseCode: 451 }));
          });
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      server.off('error', reject);
      resolve();
    });
  });
  server.on('error', onError);
  const port = (server.server.address() as AddressInfo).port;
  return {
    port,
    url: `smtp://127.0.0.1:${port}`,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
