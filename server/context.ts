import type { DataSource } from 'typeorm';
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
  /** Where unexpected errors are reported; defaults to console.error. */
  logError?: (error: unknown) => void;
}
