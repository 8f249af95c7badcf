import { describe, expect, it } from 'vitest';
import { serve } from './support/serve-process.ts';

describe('rateproof serve: a start-up that cannot reach its database', () => {
  it('ends with one line naming the database and the reason, exit 1, no stack trace', async () => {
    // Port 1 on the loopback: nothing listens there, so the connection is refused at once.
    const { code, stderr } = await serve({ DATABASE_URL: 'postgres://postgres@127.0.0.1:1/rateproof' }).exited;
    expect(code).toBe(1);
    expect(stderr).toMatch(/^rateproof: cannot open the PostgreSQL server in DATABASE_URL: .*ECONNREFUSED.*\n$/);
  });
});

describe('rateproof serve: its flags', () => {
  it('refuses to split the work on the embedded database: one line, exit 2', async () => {
    const { code, stderr } = await serve({ RATEPROOF_DATA_DIR: 'memory://' }, ['--jobs-only']).exited;
    expect(code).toBe(2);
    expect(stderr).toBe('rateproof: --jobs-only needs DATABASE_URL: on the embedded database one process serves requests and works jobs\n');
  });
  it('refuses a flag it does not know: one line, exit 2', async () => {
    const { code, stderr } = await serve({ RATEPROOF_DATA_DIR: 'memory://' }, ['--background']).exited;
    expect(code).toBe(2);
    expect(stderr).toBe("rateproof: unexpected argument '--background' (serve takes --no-jobs or --jobs-only)\n");
  });
});
