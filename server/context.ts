import type { DataSource } from 'typeorm';
import type { AuditRunner } from './audits/runner.js';
import type { Config } from './config.js';
import type { Clock } from './lib/clock.js';
import type { MailService } from './mail/mail-service.js';

/** What the app is built from; `index.ts` makes the real one, tests make their own. */
export interface AppContext {
  config: Pick<Config, 'sessionSecret' | 'publicUrl' | 'loginRateLimit' | 'trustProxy' | 'nodeEnv'>;
  dataSource: DataSource;
  mail: MailService;
  clock: Clock;
  /** Folder of the built client (`dist/client`); null serves no client. */
  clientDir: string | null;
  /** Runs audits in the worker pool (index.ts and the test helpers build it; one per process). */
  audits: AuditRunner;
  /** Folder of the content-addressed file store (`blobs` beside the database). */
  blobDir: string;
  /** Where unexpected errors are reported; defaults to console.error. */
  logError?: (error: unknown) => void;
}
