import { execFile } from 'node:child_process';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

/**
 * The container health check's probe (server/probe-cli.ts), run as a container runs it, against a
 * stand-in server answering 200 on /health and 503 on /ready. Exit codes as the Dockerfile reference's
 * HEALTHCHECK section defines them (docs.docker.com/reference/dockerfile/#healthcheck): 0 healthy,
 * 1 unhealthy, 2 reserved.
 */
const probe = fileURLToPath(new URL('../../server/probe-cli.ts', import.meta.url));
let server: Server;
let port: number;

beforeAll(async () => {
  server = createServer((request, response) => {
    response.statusCode = request.url === '/health' ? 200 : 503;
    response.end(JSON.stringify({ url: request.url }));
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  port = (server.address() as AddressInfo).port;
});
afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())));

async function runProbe(args: string[], env: Record<string, string>): Promise<{ code: number; stderr: string }> {
  try {
    const { stderr } = await promisify(execFile)(process.execPath, ['--import', 'tsx', probe, ...args], { env: { PATH: process.env.PATH, ...env } });
    return { code: 0, stderr };
  } catch (error) {
    const failed = error as { code: number; stderr: string };
    return { code: failed.code, stderr: failed.stderr };
  }
}

describe('the health-check probe', () => {
  it('exits 0 when the path answers 200, at the PORT of the configuration, asking this machine when HOST is every interface', async () => {
    expect(await runProbe(['/health'], { PORT: String(port), HOST: '0.0.0.0' })).toEqual({ code: 0, stderr: '' });
  });

  it('exits 1 when the path answers otherwise, saying what it answered', async () => {
    const result = await runProbe(['/ready'], { PORT: String(port), HOST: '127.0.0.1' });
    expect(result.code).toBe(1);
    expect(result.stderr).toContain('/ready answered 503');
  });

  it('exits 1 when nothing listens at the port', async () => {
    const closed = createServer();
    await new Promise<void>((resolve) => closed.listen(0, '127.0.0.1', resolve));
    const unused = (closed.address() as AddressInfo).port;
    await new Promise<void>((resolve) => closed.close(() => resolve()));
    const result = await runProbe(['/health'], { PORT: String(unused) });
    expect(result.code).toBe(1);
    expect(result.stderr).toContain('no answer (ECONNREFUSED)');
  });

  it('refuses a path other than the two probes, and an invalid configuration, with 1 (never the reserved 2)', async () => {
    const path = await runProbe(['/metrics'], { PORT: String(port) });
    expect(path.code).toBe(1);
    expect(path.stderr).toContain('not /metrics');
    const config = await runProbe(['/health'], { PORT: 'eighty' });
    expect(config.code).toBe(1);
    expect(config.stderr).toContain('PORT: a port number');
  });
});
