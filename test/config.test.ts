import { describe, expect, it } from 'vitest';
import { ConfigError, processRole, readConfig } from '../server/config.ts';

/** The ConfigError readConfig throws for `env` (fails the test when it does not throw one). */
function configError(env: NodeJS.ProcessEnv): ConfigError {
  try {
    readConfig(env);
  } catch (error) {
    expect(error).toBeInstanceOf(ConfigError);
    return error as ConfigError;
  }
  throw new Error(`readConfig accepted ${JSON.stringify(env)}`);
}

const TOKEN_24 = 'abcdefghijklmnopqrstuvwx';

describe('readConfig', () => {
  it('fills the defaults from an empty environment', () => {
    expect(readConfig({})).toEqual({
      databaseUrl: undefined,
      dataDir: './data',
      host: '127.0.0.1',
      port: 3000,
      adminToken: undefined,
      metricsToken: undefined,
      bodyLimitBytes: 5 * 1024 * 1024,
      logLevel: 'info',
      secureCookie: 'auto',
      workers: undefined,
    });
  });

  it('reads every variable that is set', () => {
    const config = readConfig({
      DATABASE_URL: 'postgres://app@db.example:5432/rateproof',
      RATEPROOF_DATA_DIR: '/var/lib/rateproof',
      HOST: '0.0.0.0',
      PORT: '8080',
      RATEPROOF_ADMIN_TOKEN: TOKEN_24,
      RATEPROOF_METRICS_TOKEN: `metrics-${TOKEN_24}`,
      RATEPROOF_BODY_LIMIT_MB: '12',
      LOG_LEVEL: 'warn',
      RATEPROOF_SECURE_COOKIE: 'always',
      RATEPROOF_WORKERS: '0',
      RATEPROOF_CODE_TRIES: '25',
      RATEPROOF_PROXY_HOPS: '1',
    });
    expect(config).toEqual({
      databaseUrl: 'postgres://app@db.example:5432/rateproof',
      dataDir: '/var/lib/rateproof',
      host: '0.0.0.0',
      port: 8080,
      adminToken: TOKEN_24,
      metricsToken: `metrics-${TOKEN_24}`,
      bodyLimitBytes: 12 * 1024 * 1024,
      logLevel: 'warn',
      secureCookie: 'always',
      workers: 0,
      codeTriesPerMinute: 25,
      proxyHops: 1,
    });
  });

  it('names RATEPROOF_CODE_TRIES when it is not a whole number of at least one', () => {
    expect(configError({ RATEPROOF_CODE_TRIES: 'ten' }).message).toContain('RATEPROOF_CODE_TRIES: a whole number of tries');
    expect(configError({ RATEPROOF_CODE_TRIES: '0' }).message).toContain('RATEPROOF_CODE_TRIES');
  });

  it('names RATEPROOF_WORKERS when it is not a whole number', () => {
    expect(configError({ RATEPROOF_WORKERS: 'two' }).message).toContain('RATEPROOF_WORKERS: a whole number of threads');
  });

  it('ignores variables it does not know', () => {
    expect(readConfig({ PATH: '/usr/bin', HOME: '/root' }).port).toBe(3000);
  });

  describe('DATABASE_URL', () => {
    it.each(['postgres://postgres@127.0.0.1:5432/postgres', 'postgresql://user:secret@db/rateproof?sslmode=require'])('accepts %s', (url) => {
      expect(readConfig({ DATABASE_URL: url }).databaseUrl).toBe(url);
    });

    it.each(['mysql://x', 'sqlite:///tmp/db', 'http://127.0.0.1:5432/postgres', '127.0.0.1:5432', 'Postgres://x'])('rejects %s, naming DATABASE_URL', (url) => {
      const error = configError({ DATABASE_URL: url });
      expect(error.name).toBe('ConfigError');
      expect(error.message).toMatch(/^\s*DATABASE_URL: a postgres:\/\/ connection URL$/m);
    });
  });

  describe('PORT', () => {
    it.each([
      ['0', 0],
      ['65535', 65535],
    ])('accepts %s', (text, port) => {
      expect(readConfig({ PORT: text }).port).toBe(port);
    });

    it.each(['abc', '80a', '3000.5', '-1', '65536'])('rejects %s, naming PORT', (text) => {
      expect(configError({ PORT: text }).message).toMatch(/^\s*PORT: /m);
    });
  });

  describe('RATEPROOF_ADMIN_TOKEN', () => {
    it('accepts a token of 24 characters or more', () => {
      expect(readConfig({ RATEPROOF_ADMIN_TOKEN: TOKEN_24 }).adminToken).toBe(TOKEN_24);
      expect(readConfig({ RATEPROOF_ADMIN_TOKEN: `${TOKEN_24}-and-more` }).adminToken).toBe(`${TOKEN_24}-and-more`);
    });

    it.each(['x', TOKEN_24.slice(0, 23)])('rejects a shorter token (%s), naming the variable', (token) => {
      const error = configError({ RATEPROOF_ADMIN_TOKEN: token });
      expect(error.message).toMatch(/^\s*RATEPROOF_ADMIN_TOKEN: at least 24 characters$/m);
      // The token itself never appears in the message.
      expect(error.message).not.toContain(token);
    });
  });

  it('names RATEPROOF_METRICS_TOKEN when it is shorter than 24 characters, without quoting it', () => {
    const error = configError({ RATEPROOF_METRICS_TOKEN: 'short-token' });
    expect(error.message).toMatch(/^\s*RATEPROOF_METRICS_TOKEN: at least 24 characters$/m);
    expect(error.message).not.toContain('short-token');
  });

  describe('the body limit and the log level', () => {
    it('turns megabytes into bytes', () => {
      expect(readConfig({ RATEPROOF_BODY_LIMIT_MB: '0.5' }).bodyLimitBytes).toBe(524_288);
    });

    it.each(['0', '-5', '101', 'lots'])('rejects a body limit of %s', (text) => {
      expect(configError({ RATEPROOF_BODY_LIMIT_MB: text }).message).toMatch(/^\s*RATEPROOF_BODY_LIMIT_MB: /m);
    });

    it('rejects an unknown log level', () => {
      expect(configError({ LOG_LEVEL: 'verbose' }).message).toMatch(/^\s*LOG_LEVEL: /m);
    });
  });

  it('names every invalid variable at once', () => {
    const message = configError({ DATABASE_URL: 'mysql://x', PORT: 'abc', RATEPROOF_ADMIN_TOKEN: 'short' }).message;
    expect(message).toMatch(/^invalid configuration:/);
    expect(message).toMatch(/^\s*DATABASE_URL: /m);
    expect(message).toMatch(/^\s*PORT: /m);
    expect(message).toMatch(/^\s*RATEPROOF_ADMIN_TOKEN: /m);
  });

  it('counts empty strings as unset', () => {
    const config = readConfig({
      DATABASE_URL: '',
      RATEPROOF_DATA_DIR: '',
      HOST: '',
      PORT: '',
      RATEPROOF_ADMIN_TOKEN: '',
      RATEPROOF_BODY_LIMIT_MB: '',
      LOG_LEVEL: '',
    });
    expect(config).toEqual(readConfig({}));
  });
});

describe('processRole (rateproof serve --no-jobs | --jobs-only)', () => {
  const server = { databaseUrl: 'postgres://postgres@127.0.0.1:5432/rateproof' };
  it('serves requests and works jobs by default; each flag keeps one', () => {
    expect(processRole([], server)).toBe('both');
    expect(processRole([], {})).toBe('both');
    expect(processRole(['--no-jobs'], server)).toBe('requests');
    expect(processRole(['--jobs-only'], server)).toBe('jobs');
  });
  it('refuses both flags, an unknown one, and a split on the embedded database, naming why', () => {
    expect(() => processRole(['--no-jobs', '--jobs-only'], server)).toThrow(new ConfigError('--no-jobs and --jobs-only exclude each other'));
    expect(() => processRole(['--jobs'], server)).toThrow(/unexpected argument '--jobs'/);
    expect(() => processRole(['--no-jobs'], {})).toThrow(/--no-jobs needs DATABASE_URL/);
  });
});
