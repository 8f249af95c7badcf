import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { builtinModules } from 'node:module';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parse as parseYaml } from 'yaml';
import { ConfigSchema, readConfig } from '../../server/config.ts';
import { interpolate, MissingVariable } from './deployment/compose-interpolation.ts';
import { copyOf, envOf, healthcheckCommand, parseDockerfile, type Stage } from './deployment/dockerfile.ts';

/**
 * What can be checked of the Dockerfile, docker-compose.yml and deploy/Caddyfile without a Docker
 * engine: the files they copy exist and are sent to the build, the image runs on production
 * dependencies only and as an unprivileged user, and the ports and variables agree with the
 * configuration module (server/config.ts, read here, not restated). Meaning of the files: the
 * Dockerfile reference (docs.docker.com/reference/dockerfile/), the Compose Specification
 * (github.com/compose-spec/compose-spec: services.md, interpolation.md; `<<` is the YAML 1.1 merge
 * key, yaml.org/type/merge.html), Caddy's reverse_proxy directive (caddyserver.com/docs/caddyfile/directives/reverse_proxy).
 */
const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const read = (path: string) => readFileSync(join(ROOT, path), 'utf8');

const dockerfile = parseDockerfile(read('Dockerfile'));
const buildStage = dockerfile.stages.find((s) => s.name === 'build')!;
const runtime = dockerfile.stages.at(-1)!;
const pkg = JSON.parse(read('package.json')) as { engines: { node: string }; bin: Record<string, string>; dependencies: Record<string, string>; devDependencies: Record<string, string> };
const CONFIG_VARIABLES = new Set(Object.keys(ConfigSchema.shape));
const DEFAULTS = readConfig({});

const instructions = (stage: Stage, keyword: string) => stage.instructions.filter((i) => i.keyword === keyword);
const copies = (stage: Stage) => instructions(stage, 'COPY').map(copyOf);
const runs = (stage: Stage) => instructions(stage, 'RUN').map((i) => i.text);
/** Paths named relative to the repository, without `./` or a trailing `/`. */
const tidy = (path: string) => path.replace(/^\.\//, '').replace(/\/$/, '');

/** .dockerignore's patterns, read as Docker does for the simple forms used: a name, a folder, `*.ext`. */
function ignoredByDockerignore(path: string): string | undefined {
  const patterns = read('.dockerignore').split('\n').map((l) => l.trim()).filter((l) => l && !l.startsWith('#'));
  if (patterns.some((p) => p.startsWith('!') || p.includes('**'))) throw new Error('.dockerignore uses a pattern this test does not read');
  return patterns.find((p) => {
    const glob = new RegExp(`^${tidy(p).replace(/[.+^${}()|[\]\\]/g, '\\$&').replace(/\*/g, '[^/]*')}(/.*)?$`);
    return glob.test(path) || path.split('/').some((part) => glob.test(part) && !p.includes('/'));
  });
}

/** Every file under a folder of the repository (or the file itself). */
function filesUnder(path: string): string[] {
  const full = join(ROOT, path);
  if (!statSync(full).isDirectory()) return [path];
  return readdirSync(full, { withFileTypes: true }).flatMap((e) => filesUnder(join(path, e.name)));
}

describe('the Dockerfile', () => {
  it('has a build stage and a runtime stage, built on one Node image', () => {
    expect(dockerfile.stages.map((s) => s.name)).toEqual(['build', 'runtime']);
    expect(runtime.image).toMatch(/^node:\d+/);
    expect(buildStage.image).toBe(runtime.image);
    // The Node release the image runs is one the project supports (package.json engines) and CI smoke-tests (22, 24).
    const major = Number(/^node:(\d+)/.exec(runtime.image)![1]);
    expect(major).toBeGreaterThanOrEqual(Number(/>=\s*(\d+)/.exec(pkg.engines.node)![1]));
    const smoked = /versions=\(([\d ]+)\)/.exec(read('.ci/smoke-node'))![1].split(' ').map(Number);
    expect(smoked).toContain(major);
  });

  it('copies only files and folders that exist in the repository and that .dockerignore sends to the build', () => {
    const fromContext = dockerfile.stages.flatMap(copies).filter((c) => c.from === undefined).flatMap((c) => c.sources.map(tidy));
    expect(fromContext.length).toBeGreaterThan(0);
    for (const source of fromContext) {
      expect(existsSync(join(ROOT, source)), `${source} exists`).toBe(true);
      expect(ignoredByDockerignore(source), `${source} is not left out of the build context`).toBeUndefined();
    }
  });

  it('keeps the local install, build output, data and git out of the build context', () => {
    for (const path of ['node_modules', 'dist', 'data', '.git', 'demo-output']) expect(ignoredByDockerignore(path), path).toBeDefined();
  });

  it('gives the build stage every source the build compiles (tsconfig.build.json) and the lock file', () => {
    const copied = new Set(copies(buildStage).flatMap((c) => c.sources.map(tidy)));
    const tsconfig = JSON.parse(read('tsconfig.build.json')) as { extends: string; include: string[] };
    for (const path of [...tsconfig.include, tidy(tsconfig.extends), 'tsconfig.build.json', 'package.json', 'package-lock.json']) expect(copied, path).toContain(path);
    expect(runs(buildStage).some((r) => /\bnpm ci\b/.test(r)), 'installs from the lock file').toBe(true);
    expect(runs(buildStage).some((r) => /\bnpm run build\b/.test(r))).toBe(true);
  });

  it('runs on production dependencies only, installed from the lock file, and takes only the compiled build from the build stage', () => {
    const installs = runs(runtime).filter((r) => /\bnpm (ci|install|i)\b/.test(r));
    expect(installs).toHaveLength(1);
    expect(installs[0]).toMatch(/\bnpm ci\b/);
    expect(installs[0]).toMatch(/--omit=dev\b/);
    const fromBuild = copies(runtime).filter((c) => c.from !== undefined);
    expect(fromBuild.map((c) => [c.from, c.sources.map((s) => s.replace(/^\/app\//, ''))])).toEqual([['build', ['dist']]]);
    expect(envOf(runtime).get('NODE_ENV')).toBe('production');
  });

  it('holds what the command needs at run time: its bin entry, the workspace files, the lock file', () => {
    const copied = new Set(copies(runtime).flatMap((c) => c.sources.map(tidy)));
    for (const bin of Object.values(pkg.bin)) expect([...copied].some((c) => tidy(bin) === c || tidy(bin).startsWith(`${c}/`)), bin).toBe(true);
    for (const path of ['web', 'package.json', 'package-lock.json']) expect(copied, path).toContain(path);
    // The folders the build stage compiles reach the runtime as dist/ only: sources stay out.
    for (const source of ['server', 'kinds', 'reports', 'schemas', 'migrations', 'test']) expect(copied, source).not.toContain(source);
  });

  it('runs as an unprivileged user, set before the command', () => {
    const users = instructions(runtime, 'USER');
    expect(users).toHaveLength(1);
    expect(users[0].args[0]).not.toMatch(/^(root|0)(:|$)/);
    const order = runtime.instructions.map((i) => i.keyword);
    expect(order.indexOf('USER')).toBeLessThan(order.indexOf('CMD'));
    expect(instructions(runtime, 'CMD')[0].args).toEqual(['node', ...Object.values(pkg.bin).map(tidy), 'serve']);
  });

  it("exposes the port the service listens on and listens on every interface (the configuration's defaults would be this machine only)", () => {
    const env = envOf(runtime);
    for (const name of env.keys()) if (name !== 'NODE_ENV') expect(CONFIG_VARIABLES, name).toContain(name);
    const config = readConfig(Object.fromEntries(env));
    expect(instructions(runtime, 'EXPOSE').map((i) => i.args)).toEqual([[String(config.port)]]);
    expect(config.port).toBe(DEFAULTS.port);
    expect(config.host).toBe('0.0.0.0');
  });

  it('checks /health (alive) with the probe the build compiles from server/probe-cli.ts', () => {
    const [healthcheck] = instructions(runtime, 'HEALTHCHECK');
    expect(healthcheckCommand(healthcheck)).toEqual(['node', 'dist/server/probe-cli.js', '/health']);
    expect(existsSync(join(ROOT, 'server/probe-cli.ts'))).toBe(true);
  });
});

describe('the runtime on production dependencies', () => {
  /** The files the build compiles (tsconfig.build.json), and bin/. */
  function runtimeSources(): string[] {
    const tsconfig = JSON.parse(read('tsconfig.build.json')) as { include: string[]; exclude: string[] };
    return [...tsconfig.include, 'bin']
      .flatMap(filesUnder)
      .filter((f) => /\.(ts|js)$/.test(f) && !tsconfig.exclude.includes(f));
  }

  /** Packages a file imports or requires by name (`pkg`, `@scope/pkg`, their subpaths cut off). */
  function packagesImported(file: string): string[] {
    const text = read(file);
    const names = [...text.matchAll(/(?:\bfrom\s*|\bimport\s*\(\s*|\brequire(?:\.resolve)?\s*\(\s*|\)\(\s*)'([^'.][^']*)'/g)].map((m) => m[1]);
    return names.filter((n) => !n.startsWith('/')).map((n) => /^(@[^/]+\/[^/]+|[^/]+)/.exec(n)![1]);
  }

  it('imports no development dependency: every package the service loads is a dependency or part of Node', () => {
    const builtins = new Set(builtinModules.flatMap((m) => [m, `node:${m}`]));
    const offending: string[] = [];
    for (const file of runtimeSources()) {
      for (const name of packagesImported(file)) {
        if (builtins.has(name) || name in pkg.dependencies) continue;
        // The worker pool loads tsx only when it runs from the TypeScript sources (tests, development),
        // never from the compiled dist/ the image runs.
        if (name === 'tsx' && file === join('server', 'pool', 'worker-pool.ts')) continue;
        offending.push(`${file} imports ${name}${name in pkg.devDependencies ? ' (a development dependency)' : ''}`);
      }
    }
    expect(offending).toEqual([]);
  });

  it('needs no install script (the image installs with --ignore-scripts): only development packages have one', () => {
    const lock = JSON.parse(read('package-lock.json')) as { packages: Record<string, { hasInstallScript?: boolean; dev?: boolean }> };
    const production = Object.entries(lock.packages).filter(([path, p]) => path && p.hasInstallScript && !p.dev).map(([path]) => path);
    expect(production).toEqual([]);
    expect(runs(runtime).find((r) => /\bnpm ci\b/.test(r))).toMatch(/--ignore-scripts\b/);
  });
});

describe('docker-compose.yml and deploy/Caddyfile', () => {
  interface Service {
    image?: string;
    build?: string | { context?: string; dockerfile?: string };
    environment?: Record<string, string>;
    ports?: string[];
    volumes?: string[];
    depends_on?: Record<string, { condition: string }>;
    healthcheck?: { test: string[] };
  }
  const compose = parseYaml(read('docker-compose.yml'), { merge: true }) as { services: Record<string, Service> };
  const services = Object.entries(compose.services);
  const built = services.filter(([, s]) => s.build === '.' || (typeof s.build === 'object' && (s.build.context ?? '.') === '.' && (s.build.dockerfile ?? 'Dockerfile') === 'Dockerfile'));
  const database = services.find(([, s]) => /^postgres:/.test(s.image ?? ''));
  const proxy = services.find(([, s]) => /^caddy:/.test(s.image ?? ''));

  /** A service's environment after Compose's interpolation, required variables given a sample value. */
  function environmentOf(service: Service): Record<string, string> {
    const samples = { POSTGRES_PASSWORD: 'sample0password' };
    return Object.fromEntries(Object.entries(service.environment ?? {}).map(([name, raw]) => [name, interpolate(String(raw), samples).value]));
  }

  it('runs PostgreSQL, two service processes from the Dockerfile and a proxy', () => {
    expect(database).toBeDefined();
    expect(built.map(([name]) => name)).toHaveLength(2);
    expect(new Set(built.map(([, s]) => s.image)).size, 'one image, built once, for every process').toBe(1);
    expect(proxy).toBeDefined();
  });

  it("gives every process the same environment, named as server/config.ts names it, valid by the configuration's own schema", () => {
    const environments = built.map(([, s]) => environmentOf(s));
    expect(new Set(environments.map((e) => JSON.stringify(e))).size).toBe(1);
    for (const name of Object.keys(environments[0])) expect(CONFIG_VARIABLES, name).toContain(name);
    expect(() => readConfig({ ...Object.fromEntries(envOf(runtime)), ...environments[0] })).not.toThrow();
  });

  it('refuses to start without the database password rather than running with a known one', () => {
    expect(() => interpolate(String(database![1].environment!.POSTGRES_PASSWORD), {})).toThrow(MissingVariable);
    for (const [, service] of built) expect(() => interpolate(service.environment!.DATABASE_URL, {})).toThrow(MissingVariable);
  });

  it('points every process at the PostgreSQL service, with its user, password and database', () => {
    const [dbName, db] = database!;
    const dbEnv = environmentOf(db);
    for (const [, service] of built) {
      const url = new URL(readConfig(environmentOf(service)).databaseUrl!);
      expect([url.hostname, url.port || '5432', url.username, url.password, url.pathname.slice(1)]).toEqual([
        dbName, '5432', dbEnv.POSTGRES_USER, dbEnv.POSTGRES_PASSWORD, dbEnv.POSTGRES_DB,
      ]);
      expect(service.depends_on?.[dbName]?.condition).toBe('service_healthy');
    }
  });

  it('checks each process with /ready (its database reachable, its migrations applied)', () => {
    for (const [, service] of built) expect(service.healthcheck?.test).toEqual(['CMD', 'node', 'dist/server/probe-cli.js', '/ready']);
  });

  it('has the proxy balance between exactly the service processes, at the port they listen on, sending traffic only to a ready one', () => {
    const [, caddy] = proxy!;
    const mount = caddy.volumes!.find((v) => v.endsWith(':/etc/caddy/Caddyfile:ro') || v.endsWith(':/etc/caddy/Caddyfile'))!;
    const caddyfile = read(tidy(mount.split(':')[0]));
    const lines = caddyfile.split('\n').map((l) => l.replace(/#.*/, '').trim()).filter(Boolean);
    const upstreams = lines.filter((l) => l.startsWith('reverse_proxy ')).map((l) => l.split(/\s+/).slice(1).filter((w) => w !== '{'));
    expect(upstreams).toHaveLength(1);
    const ports = built.map(([, s]) => readConfig({ ...Object.fromEntries(envOf(runtime)), ...environmentOf(s) }).port);
    expect(upstreams[0].sort()).toEqual(built.map(([name], i) => `${name}:${ports[i]}`).sort());
    expect(lines).toContain('health_uri /ready');
    for (const [name] of built) expect(caddy.depends_on?.[name]?.condition).toBe('service_healthy');
  });

  it('publishes only the proxy: the processes and the database are reached through it or not at all', () => {
    for (const [name, service] of services) if (service !== proxy![1]) expect(service.ports, name).toBeUndefined();
    expect(proxy![1].ports).toHaveLength(1);
    // Caddy listens on :80 in its container (the site address of the Caddyfile).
    expect(read('deploy/Caddyfile')).toMatch(/^:80 \{/m);
    expect(proxy![1].ports![0]).toMatch(/:80$/);
  });

  it('names in docs/operations.md every variable the compose file reads from the shell or .env', () => {
    const variables = new Set<string>();
    const collect = (value: unknown): void => {
      if (typeof value === 'string') interpolate(value, new Proxy({}, { get: () => 'x' })).variables.forEach((v) => variables.add(v.name));
      else if (value && typeof value === 'object') Object.values(value).forEach(collect);
    };
    collect(parseYaml(read('docker-compose.yml'), { merge: true }));
    const operations = read('docs/operations.md');
    expect(variables.size).toBeGreaterThan(0);
    for (const name of variables) expect(operations, name).toContain(`\`${name}\``);
  });
});
