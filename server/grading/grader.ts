import type { FeedbackInput, SectionSummaryInput } from '../../reports/feedback-input.ts';
import type { SectionSignals } from '../signals/section-report.ts';
import type { GradedForStore } from '../batches/graded-for-store.ts';
import { inParts } from '../store/in-parts.ts';
import type { WorkerPool } from '../pool/worker-pool.ts';

/**
 * The service's CPU-bound work, done in the worker pool so that the event loop keeps answering other
 * requests while a batch is checked or a section's sheets are drawn.
 */
export interface Grader {
  /** Checks submissions against stored (already validated) assignment settings, in the form the store keeps. */
  check(settings: unknown, submissions: unknown[]): Promise<GradedForStore[]>;
  renderSheet(input: FeedbackInput): Promise<Buffer>;
  renderSummary(input: SectionSummaryInput): Promise<Buffer>;
  /** A section's signals for review (every pair of students compared). */
  sectionSignals(settings: { kind: string }, submissions: unknown[]): Promise<SectionSignals>;
  /** Sheets for many inputs, yielded in their order while the next few are drawn. */
  renderSheets<T extends { input: FeedbackInput }>(items: T[]): AsyncIterable<T & { pdf: Buffer }>;
}

const CHECK_CHUNK = 250;

// A PDF comes back from a worker as a Uint8Array; the ZIP writer and fastify want a Buffer.
const asBuffer = (bytes: Uint8Array) => Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);

export function poolGrader(pool: WorkerPool): Grader {
  const renderSheet = async (input: FeedbackInput) => {
    try {
      return asBuffer(await pool.run('render-sheet', input));
    } catch {
      // The worker itself stopped (a drawing error is answered inside it with a page saying why).
      const { renderUndrawableSheet } = await import('../../reports/undrawable-sheet.ts');
      return renderUndrawableSheet(input, 'the process drawing it stopped');
    }
  };
  return {
    async check(settings, submissions) {
      // A large batch or regrade is spread over every worker, a few hundred submissions at a time.
      const settingsJson = JSON.stringify(settings);
      return (await Promise.all(inParts(submissions, CHECK_CHUNK).map((part) => pool.run('grade-for-store', { settingsJson, submissions: part })))).flat();
    },
    renderSheet,
    renderSummary: async (input) => asBuffer(await pool.run('render-summary', input)),
    sectionSignals: (settings, submissions) => pool.run('section-signals', { settings, submissions }),
    async *renderSheets(items) {
      // Two sheets per worker in flight: every core draws while the reader takes the finished ones.
      const ahead = 2 * pool.size;
      const pending: Array<Promise<Buffer>> = [];
      let next = 0;
      const fill = () => {
        while (next < items.length && pending.length < ahead) {
          const sheet = renderSheet(items[next++].input);
          // A sheet whose turn has not come may fail: its error is raised when its turn comes.
          sheet.catch(() => {});
          pending.push(sheet);
        }
      };
      for (let i = 0; i < items.length; i++) {
        fill();
        const pdf = await pending.shift()!;
        yield { ...items[i], pdf };
      }
    },
  };
}
