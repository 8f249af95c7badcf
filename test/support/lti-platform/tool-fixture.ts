import { PassThrough } from 'node:stream';
import type { FastifyInstance } from 'fastify';
import { buildApp } from '../../../server/app.ts';
import type { Config } from '../../../server/config.ts';
import { ADMIN_TOKEN, call, seedCourse, testConfig, type Seed } from '../api-fixture.ts';
import { openTestDatabase, type TestDatabase } from '../test-database.ts';
import { TestPlatform } from './test-platform.ts';

export interface ToolAndPlatform {
  database: TestDatabase;
  app: FastifyInstance;
  platform: TestPlatform;
  seed: Seed;
  /** Our id of the test platform, registered for the seeded course. */
  platformId: number;
  close(): Promise<void>;
}

/**
 * The tool, a test platform and a seeded course the platform is registered for: what every LTI test
 * starts from. `log` collects the tool's log lines at info (for checks that no personal data reaches
 * it); `served` puts the tool on a real port and points the platform at our key set as served, for
 * the services where the platform checks our client assertions.
 */
export async function openToolAndPlatform(options: { log?: string[]; served?: boolean; config?: Partial<Config> } = {}): Promise<ToolAndPlatform> {
  const database = await openTestDatabase('postgres');
  let logger: { stream: PassThrough } | undefined;
  if (options.log) {
    const stream = new PassThrough();
    stream.on('data', (chunk) => options.log!.push(...String(chunk).split('\n').filter(Boolean)));
    logger = { stream };
  }
  const config = { ...testConfig, ...(logger ? { logLevel: 'info' as const } : {}), ...options.config };
  const app = await buildApp({ config, store: database.store, ...(logger ? { logger } : {}) });
  const platform = await TestPlatform.start();
  if (options.served) {
    await app.listen({ port: 0, host: '127.0.0.1' });
    platform.toolKeySetUrl = `http://127.0.0.1:${(app.server.address() as { port: number }).port}/v1/lti/jwks`;
  }
  const seed = await seedCourse(app);
  const platformId = await registerPlatform(app, platform, seed.course.id);
  const close = async () => {
    await app.close();
    await platform.close();
    await database.close();
  };
  return { database, app, platform, seed, platformId, close };
}

/** Registers a test platform for a course; answers our id of it. */
export async function registerPlatform(app: FastifyInstance, platform: TestPlatform, courseId: number): Promise<number> {
  return (await call(app, 'POST', '/v1/lti/platforms', ADMIN_TOKEN, platform.registration(courseId), 201)).body.id as number;
}

/** The instructor places the platform's resource link on the seeded assignment in section A. */
export async function placeOnSectionA(app: FastifyInstance, seed: Seed, platform: TestPlatform, platformId: number) {
  const placement = { platformId, contextId: platform.contextId, resourceLinkId: platform.resourceLinkId };
  await call(app, 'PUT', `/v1/sections/${seed.sectionA.id}/assignments/${seed.assignment.id}/lti-placement`, seed.instructorToken, placement, 200);
}
