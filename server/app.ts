import rateLimit from '@fastify/rate-limit';
import Fastify, { type FastifyInstance, type FastifyRequest } from 'fastify';
import { serializerCompiler, validatorCompiler } from 'fastify-type-provider-zod';
import type { Config } from './config.ts';
import { ApiError } from './errors.ts';
import { poolGrader, type Grader } from './grading/grader.ts';
import { Regrades } from './grading/regrade.ts';
import { startServiceJobs } from './grading/service-jobs.ts';
import { JobQueue } from './jobs/job-queue.ts';
import { BIG_SECTION, SectionFiles } from './grading/section-files.ts';
import { createWorkerPool } from './pool/worker-pool.ts';
import { sameThreadPool } from './pool/same-thread-pool.ts';
import { bodyParsersPlugin } from './http/body-parsers.ts';
import { callerPlugin } from './http/caller.ts';
import { docsPlugin } from './http/docs.ts';
import { errorHandlerPlugin, frameworkErrors, MAX_PATH_PARAM } from './http/error-handler.ts';
import { idempotencyPlugin } from './http/idempotency.ts';
import { loggableUrl, urlWords } from './http/loggable-url.ts';
import { metricsPlugin } from './http/metrics.ts';
import { uploadPlugin } from './http/multipart-csv.ts';
import { probesPlugin } from './http/probes.ts';
import { routeTablePlugin } from './http/route-table.ts';
import { scopePlugin } from './http/scope.ts';
import { servicesPlugin } from './http/services.ts';
import { transactionPlugin } from './http/transaction.ts';
import { workspaceFilesPlugin } from './http/workspace-files.ts';
import { serviceMetrics } from './metrics/service-metrics.ts';
import { routes } from './routes/index.ts';
import type { Store } from './store/connection.ts';

export interface AppOptions {
  config: Config;
  store: Store;
  /** Where checking and drawing run; by default a worker pool of the app's own, closed with it. */
  grader?: Grader;
  /** Off in tests; pino otherwise. Logs carry request ids and URLs only, never bodies or tokens. */
  logger?: boolean | { stream: NodeJS.WritableStream };
}

/** Believes the nearest `hops` addresses of X-Forwarded-For (hop 0 is the connection), as Fastify's numeric trustProxy does. */
const trustHops = (hops: number) => (_address: string, hop: number) => hop < hops;

/** Access-code sign-ins one address may try in a minute, unless configured. */
const CODE_TRIES_PER_MINUTE = 10;

const ROUTE_WORDS = urlWords(routes);

/** Request lines for the log: method and URL with student ids taken out; no headers, no body. */
function logRequest(request: FastifyRequest) {
  return { id: request.id, method: request.method, url: loggableUrl(request, ROUTE_WORDS) };
}

/** Builds the app: its plugins (server/http/), OpenAPI, and every route. Never listens. */
export async function buildApp(options: AppOptions): Promise<FastifyInstance> {
  const app = Fastify({
    logger: options.logger
      ? { level: options.config.logLevel, serializers: { req: logRequest }, ...(typeof options.logger === 'object' ? { stream: options.logger.stream } : {}) }
      : false,
    bodyLimit: options.config.bodyLimitBytes,
    // Behind a proxy every request comes from the proxy: the code sign-in's limit must count the client.
    ...(options.config.proxyHops ? { trustProxy: trustHops(options.config.proxyHops) } : {}),
    frameworkErrors,
    routerOptions: { maxParamLength: MAX_PATH_PARAM },
  });
  app.setValidatorCompiler(validatorCompiler);
  app.setSerializerCompiler(serializerCompiler);

  const workers = options.config.workers;
  const pool = options.grader ? undefined : workers === 0 ? sameThreadPool() : createWorkerPool(workers);
  const grader = options.grader ?? poolGrader(pool!);
  const metrics = serviceMetrics({ store: options.store, pool });
  // Every process adds jobs; one that serves requests only leaves their working and upkeep to others.
  const working = options.config.role !== 'requests';
  const jobs = await JobQueue.open(options.store, { upkeep: working, watch: metrics.jobWatch });
  metrics.countJobs(jobs);
  const regrades = new Regrades(grader, jobs);
  const sectionFiles = new SectionFiles(grader, jobs, options.config.bigSection ?? BIG_SECTION);
  app.addHook('onClose', async () => {
    // Jobs under way finish first (or are handed back to the queue): they need the workers and the database.
    await jobs.stop();
    await pool?.close();
  });
  await startServiceJobs(jobs, { db: options.store.db, regrades, sectionFiles, work: working, concurrency: pool?.size ?? 1, passbackRetrySeconds: options.config.passbackRetrySeconds });

  await app.register(servicesPlugin, { config: options.config, store: options.store, grader, regrades, sectionFiles, jobs });
  await app.register(errorHandlerPlugin);
  await app.register(bodyParsersPlugin);
  await app.register(uploadPlugin, { fileSize: options.config.bodyLimitBytes });
  await app.register(callerPlugin);
  await app.register(transactionPlugin);
  await app.register(scopePlugin);
  await app.register(idempotencyPlugin);
  await app.register(metricsPlugin, { metrics, token: options.config.metricsToken });
  await app.register(docsPlugin);
  await app.register(probesPlugin);

  // Off unless a route asks (`rateLimited`): only guessable secrets, such as access codes, are limited per address.
  await app.register(rateLimit, {
    global: false,
    max: options.config.codeTriesPerMinute ?? CODE_TRIES_PER_MINUTE,
    timeWindow: 60_000,
    errorResponseBuilder: (_request, context) => new ApiError('too-many-requests', `too many tries from this address; try again in ${context.after}`),
  });

  await app.register(routeTablePlugin, { routes });
  await app.register(workspaceFilesPlugin);
  return app;
}
