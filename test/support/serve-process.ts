import { spawn, type ChildProcess } from 'node:child_process';
import type { FastifyInstance } from 'fastify';
import { fileURLToPath } from 'node:url';

const bin = fileURLToPath(new URL('../../bin/rateproof.js', import.meta.url));

/** Starts the compiled `rateproof serve` (with `args`) with `env` on a free port; `listening` gives the port once it listens. */
export function serve(env: Record<string, string>, args: string[] = []): { child: ChildProcess; listening: Promise<number>; exited: Promise<{ code: number | null; stderr: string }> } {
  const child = spawn(process.execPath, [bin, 'serve', ...args], { env: { ...process.env, DATABASE_URL: '', PORT: '0', LOG_LEVEL: 'info', ...env } });
  let stderr = '';
  child.stderr!.on('data', (d) => (stderr += d));
  const exited = new Promise<{ code: number | null; stderr: string }>((resolve) => child.on('exit', (code) => resolve({ code, stderr })));
  const listening = new Promise<number>((resolve, reject) => {
    let out = '';
    child.stdout!.on('data', (d) => {
      out += d;
      const port = /listening at http:\/\/127\.0\.0\.1:(\d+)/.exec(out)?.[1];
      if (port) resolve(Number(port));
    });
    void exited.then(({ code, stderr: err }) => reject(new Error(`serve exited ${code}: ${err}`)));
  });
  listening.catch(() => {});
  return { child, listening, exited };
}

/** Just enough of `app.inject` over real HTTP for the seeding helpers to talk to a service process. */
export function overHttp(port: number) {
  return {
    async inject({ method, url, headers, payload }: { method: string; url: string; headers?: Record<string, string>; payload?: unknown }) {
      const res = await fetch(`http://127.0.0.1:${port}${url}`, {
        method,
        headers: { ...headers, ...(payload === undefined ? {} : { 'content-type': 'application/json' }) },
        body: payload === undefined ? undefined : JSON.stringify(payload),
      });
      const body = await res.text();
      return { statusCode: res.status, headers: Object.fromEntries(res.headers), body, json: () => JSON.parse(body) };
    },
  } as unknown as FastifyInstance;
}
