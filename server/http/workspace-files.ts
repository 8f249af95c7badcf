import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { extname, join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';

/**
 * The browser workspace: the files under web/, read once at start-up and served from memory at `/`
 * (index.html, the staff's workspace), `/student` (student.html, the students' own pages, the
 * address printed on their access codes) and `/web/...`. No build step and nothing from another origin: the page works
 * offline. A Content-Security-Policy allows scripts and styles from this origin only, never inline.
 */
export const CONTENT_SECURITY_POLICY =
  "default-src 'none'; script-src 'self'; style-src 'self'; img-src 'self' data:; connect-src 'self'; form-action 'self'; frame-ancestors 'none'; base-uri 'none'";

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.svg': 'image/svg+xml',
};

/** web/ beside server/ in the sources, two levels further up from the compiled dist/server/http/. */
function webFolder(): string {
  const here = fileURLToPath(new URL('.', import.meta.url));
  const found = [join(here, '../../web'), join(here, '../../../web')].find((dir) => existsSync(join(dir, 'index.html')));
  if (!found) throw new Error('the workspace files (web/index.html) are missing from the installation');
  return found;
}

function filesUnder(dir: string, root = dir): Map<string, { body: Buffer; type: string }> {
  const out = new Map<string, { body: Buffer; type: string }>();
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const path = join(dir, entry.name);
    if (entry.isDirectory()) for (const [k, v] of filesUnder(path, root)) out.set(k, v);
    else if (TYPES[extname(entry.name)]) out.set(`/web/${relative(root, path).split('\\').join('/')}`, { body: readFileSync(path), type: TYPES[extname(entry.name)] });
  }
  return out;
}

export const workspaceFilesPlugin = fp(async (app: FastifyInstance) => {
  const files = filesUnder(webFolder());
  const index = files.get('/web/index.html')!;
  const student = files.get('/web/student.html')!;
  const headers = {
    'content-security-policy': CONTENT_SECURITY_POLICY,
    'x-content-type-options': 'nosniff',
    'referrer-policy': 'no-referrer',
    // Served from memory and small: always revalidated, so an upgrade is seen at the next load.
    'cache-control': 'no-cache',
  };
  app.get('/', { schema: { hide: true } }, async (_request, reply) => reply.headers(headers).type(index.type).send(index.body));
  app.get('/student', { schema: { hide: true } }, async (_request, reply) => reply.headers(headers).type(student.type).send(student.body));
  app.get('/web/*', { schema: { hide: true } }, async (request, reply) => {
    const file = files.get(request.url.split('?')[0]);
    if (!file) return reply.callNotFound();
    return reply.headers(headers).type(file.type).send(file.body);
  });
}, { name: 'rateproof-workspace-files' });
