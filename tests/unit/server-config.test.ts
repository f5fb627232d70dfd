import { mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from '../../server/config.js';

const dirs: string[] = [];
const tmp = () => {
  const d = mkdtempSync(join(tmpdir(), 'planewright-config-'));
  dirs.push(d);
  return d;
};
afterEach(() => {
  for (const d of dirs.splice(0)) rmSync(d, { recursive: true, force: true });
});

describe('loadConfig', () => {
  it('fills the defaults and derives PUBLIC_URL from PORT', () => {
    const dir = tmp();
    const c = loadConfig({ DATABASE_PATH: join(dir, 'db.sqlite'), PORT: '4123' });
    expect(c).toMatchObject({ port: 4123, host: '0.0.0.0', publicUrl: 'http://localhost:4123', loginRateLimit: 10, nodeEnv: 'development', smtpUrl: undefined });
  });

  it('generates a session secret once, stores it with 0600 beside the database, and reuses it', () => {
    const dir = tmp();
    const env = { DATABASE_PATH: join(dir, 'db.sqlite') };
    const first = loadConfig(env).sessionSecret;
    expect(first.length).toBeGreaterThanOrEqual(32);
    expect(readFileSync(join(dir, 'session-secret'), 'utf8').trim()).toBe(first);
    expect(statSync(join(dir, 'session-secret')).mode & 0o777).toBe(0o600);
    expect(loadConfig(env).sessionSecret).toBe(first);
  });

  it('requires SESSION_SECRET in production', () => {
    expect(() => loadConfig({ NODE_ENV: 'production', DATABASE_PATH: join(tmp(), 'db.sqlite') })).toThrow(/SESSION_SECRET: required when NODE_ENV=production/);
  });

  it('names every bad variable', () => {
    let message = '';
    try {
      loadConfig({ PORT: 'eighty', SMTP_URL: 'not a url', LOGIN_RATE_LIMIT: '-3', SESSION_SECRET: 'short' });
    } catch (e) {
      expect(e).toBeInstanceOf(ConfigError);
      message = (e as Error).message;
    }
    for (const name of ['PORT', 'SMTP_URL', 'LOGIN_RATE_LIMIT', 'SESSION_SECRET']) expect(message).toContain(`${name}:`);
  });

  it('treats empty variables as unset and trims a trailing slash from PUBLIC_URL', () => {
    const c = loadConfig({ DATABASE_PATH: join(tmp(), 'db.sqlite'), SMTP_URL: '', PUBLIC_URL: 'https://planewright.example.org/' });
    expect(c.smtpUrl).toBeUndefined();
    expect(c.publicUrl).toBe('https://planewright.example.org');
  });
});
