/**
 * Starts Planewright: config → database (migrations) → demo seed → mail → HTTP.
 * Run with `npx tsx --tsconfig tsconfig.server.json server/index.ts`.
 */
import 'reflect-metadata';
import type { Server } from 'node:http';
import { dirname, join, resolve } from 'node:path';
import { createApp } from './app.js';
import { createAuditPool } from './audits/pool.js';
import { createAuditRunner } from './audits/runner.js';
import { ConfigError, loadConfig } from './config.js';
import { openDatabase } from './db/data-source.js';
import { systemClock } from './lib/clock.js';
import { createMailService } from './mail/mail-service.js';
import { startMailSink, type MailSink } from './mail/sink.js';
import { reminderJob } from './notifications/reminders.js';
import { notifier } from './notifications/service.js';
import { bootstrapInstall } from './seed/bootstrap.js';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, seedDemoIfEmpty } from './seed/demo.js';

async function main(): Promise<void> {
  const config = loadConfig();
  const dataSource = await openDatabase(config.databasePath);
  const seeded = config.nodeEnv === 'production' ? false : await seedDemoIfEmpty(dataSource, { env: config.nodeEnv });
  const bootstrap = config.nodeEnv === 'production' ? await bootstrapInstall(dataSource, config.bootstrapAdmin, systemClock.now()) : 'not-empty';

  let sink: MailSink | null = null;
  if (!config.smtpUrl) sink = await startMailSink(dataSource, systemClock);
  const mail = createMailService(config.smtpUrl ?? sink!.url, config.mailFrom, { local: sink !== null });

  const blobDir = config.databasePath === ':memory:' ? resolve('data/blobs') : join(dirname(config.databasePath), 'blobs');
  const audits = createAuditRunner({ dataSource, pool: createAuditPool(), clock: systemClock, notifier: notifier({ dataSource, mail, clock: systemClock }), publicUrl: config.publicUrl });
  const app = createApp({ config, dataSource, mail, clock: systemClock, clientDir: resolve('dist/client'), audits, blobDir });
  // Audits a crash left queued or running start again; due reminders go out now and every minute.
  const resumed = audits.resumeStale();
  const reminders = reminderJob({ dataSource, mail, clock: systemClock, config });
  reminders.start();
  const server: Server = await new Promise((ok, fail) => {
    const s = app.listen(config.port, config.host, (err?: Error) => (err ? fail(err) : ok(s)));
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.port;
  const shownHost = config.host === '0.0.0.0' || config.host === '::' ? 'localhost' : config.host;

  console.log(`Planewright is running at http://${shownHost}:${port}`);
  console.log(`  database: ${config.databasePath}${seeded ? ' (demo data added)' : ''}`);
  if (bootstrap === 'created') console.log(`  first admin: ${config.bootstrapAdmin!.email}; starting material catalogue added`);
  if (bootstrap === 'no-admin-configured') {
    console.log('  no accounts yet: set ADMIN_EMAIL and ADMIN_PASSWORD (at least 10 characters) and start again to create the first admin');
  }
  if (resumed > 0) console.log(`  audits: ${resumed} unfinished audit${resumed === 1 ? '' : 's'} queued again`);
  console.log(sink ? `  mail: in-process sink on ${sink.url} (admin → Outbox shows every message)` : `  mail: ${new URL(config.smtpUrl!).host}`);
  if (config.nodeEnv !== 'production') {
    console.log(`  demo accounts (password "${DEMO_PASSWORD}"):`);
    for (const a of DEMO_ACCOUNTS.slice(0, 5)) console.log(`    ${a.email.padEnd(26)} ${a.globalRole ?? a.studioRole}`);
  }

  let closing = false;
  const shutdown = (signal: string) => {
    if (closing) return;
    closing = true;
    console.log(`\n${signal}: shutting down`);
    const force = setTimeout(() => process.exit(1), 10_000);
    force.unref();
    server.closeAllConnections?.();
    server.close(async () => {
      try {
        reminders.stop();
        await audits.close();
        mail.close();
        await sink?.close();
        await dataSource.destroy();
      } finally {
        clearTimeout(force);
        process.exit(0);
      }
    });
  };
  process.on('SIGINT', () => shutdown('SIGINT'));
  process.on('SIGTERM', () => shutdown('SIGTERM'));
}

main().catch((e: unknown) => {
  if (e instanceof ConfigError) console.error(e.message);
  else console.error('Planewright could not start:', e);
  process.exit(1);
});
