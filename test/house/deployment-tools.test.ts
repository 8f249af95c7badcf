import { execFileSync, spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parse as parseYaml } from 'yaml';
import { interpolate } from './deployment/compose-interpolation.ts';

/**
 * Caddy and Compose themselves read deploy/Caddyfile and docker-compose.yml, where they are installed
 * (neither needs a Docker engine for this): Caddy's own adapter turns the Caddyfile into its JSON
 * configuration, Compose's `config` resolves the file with its variables. They check what
 * deployment-files.test.ts reads by hand. Skipped, saying so, where the program is absent
 * (Debian: `apt-get install caddy docker-compose`).
 */
const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const SAMPLE_PASSWORD = 'sample0password';

function runs(command: string, args: string[]): boolean {
  return spawnSync(command, args, { stdio: 'ignore' }).status === 0;
}
/** Compose v2 (`docker compose`) or v1 (`docker-compose`), whichever answers. */
const compose = runs('docker', ['compose', 'version']) ? ['docker', 'compose'] : runs('docker-compose', ['version']) ? ['docker-compose'] : undefined;
const caddy = runs('caddy', ['version']);
if (!caddy) console.warn('caddy is not installed: deploy/Caddyfile is not read by Caddy on this machine');
if (!compose) console.warn('docker compose is not installed: docker-compose.yml is not read by Compose on this machine');

const composeFile = parseYaml(readFileSync(`${ROOT}/docker-compose.yml`, 'utf8'), { merge: true }) as {
  services: Record<string, { build?: unknown; environment?: Record<string, string> }>;
};
const processes = Object.entries(composeFile.services).filter(([, s]) => s.build !== undefined);

/** Every object in a JSON tree for which `test` holds. */
function findAll(node: unknown, test: (o: Record<string, unknown>) => boolean): Record<string, unknown>[] {
  if (Array.isArray(node)) return node.flatMap((n) => findAll(n, test));
  if (!node || typeof node !== 'object') return [];
  const object = node as Record<string, unknown>;
  return [...(test(object) ? [object] : []), ...Object.values(object).flatMap((v) => findAll(v, test))];
}

describe.skipIf(!caddy)('deploy/Caddyfile, as Caddy reads it', () => {
  // Read when a test runs, not when the suite is collected (it is collected even where skipped).
  const adapted = () => JSON.parse(execFileSync('caddy', ['adapt', '--adapter', 'caddyfile', '--config', 'deploy/Caddyfile'], { cwd: ROOT, encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] })) as unknown;

  it('balances between the compose file’s service processes, checking each at /ready', () => {
    const [proxy, ...more] = findAll(adapted(), (o) => o.handler === 'reverse_proxy');
    expect(more).toEqual([]);
    const dials = (proxy.upstreams as { dial: string }[]).map((u) => u.dial).sort();
    expect(dials).toEqual(processes.map(([name, s]) => `${name}:${s.environment!.PORT}`).sort());
    expect((proxy.health_checks as { active: { uri: string; expect_status: number } }).active).toMatchObject({ uri: '/ready', expect_status: 200 });
  });

  it('answers /metrics itself with 404, before any request reaches a process', () => {
    const routes = findAll(adapted(), (o) => Array.isArray(o.match) && JSON.stringify(o.match).includes('/metrics'));
    expect(routes).toHaveLength(1);
    expect(findAll(routes[0], (o) => o.handler === 'static_response')).toEqual([expect.objectContaining({ status_code: 404 })]);
    expect(findAll(routes[0], (o) => o.handler === 'reverse_proxy')).toEqual([]);
  });
});

describe.skipIf(!compose)('docker-compose.yml, as Compose reads it', () => {
  const config = (env: Record<string, string>) =>
    spawnSync(compose![0], [...compose!.slice(1), '-f', 'docker-compose.yml', 'config'], { cwd: ROOT, encoding: 'utf8', env: { PATH: process.env.PATH, HOME: process.env.HOME, ...env } });

  it('resolves, and gives each process the environment this repository’s tests read from it', () => {
    const result = config({ POSTGRES_PASSWORD: SAMPLE_PASSWORD });
    expect(result.status, result.stderr).toBe(0);
    const resolved = parseYaml(result.stdout) as { services: Record<string, { environment: Record<string, string> }> };
    for (const [name, service] of processes) {
      const ours = Object.fromEntries(Object.entries(service.environment!).map(([k, v]) => [k, interpolate(String(v), { POSTGRES_PASSWORD: SAMPLE_PASSWORD }).value]));
      expect(resolved.services[name].environment, name).toEqual(ours);
    }
  });

  it('refuses to start without POSTGRES_PASSWORD, saying so', () => {
    const result = config({});
    expect(result.status).not.toBe(0);
    expect(result.stderr).toContain('POSTGRES_PASSWORD');
  });
});
