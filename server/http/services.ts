import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import type { Config } from '../config.ts';
import type { Grader } from '../grading/grader.ts';
import type { Regrades } from '../grading/regrade.ts';
import type { SectionFiles } from '../grading/section-files.ts';
import type { JobQueue } from '../jobs/job-queue.ts';
import type { Store } from '../store/connection.ts';

/** What the routes work with, on the app: `request.server.grader` and so on. */
export interface Services {
  config: Config;
  store: Store;
  /** Checking and drawing, done off the event loop. */
  grader: Grader;
  /** Regrades, worked as jobs by any process, and how far each is. */
  regrades: Regrades;
  /** A large section's ZIP and summary, drawn by jobs and stored for download. */
  sectionFiles: SectionFiles;
  /** The job queue shared by every process on the database. */
  jobs: JobQueue;
}

declare module 'fastify' {
  interface FastifyInstance extends Services {}
}

export const servicesPlugin = fp(async (app: FastifyInstance, services: Services) => {
  app.decorate('config', services.config);
  app.decorate('store', services.store);
  app.decorate('grader', services.grader);
  app.decorate('regrades', services.regrades);
  app.decorate('sectionFiles', services.sectionFiles);
  app.decorate('jobs', services.jobs);
}, { name: 'rateproof-services' });
