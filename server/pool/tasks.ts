/**
 * The work a pool worker does, by name. Each task's module loads in a worker on its first use, so a
 * worker that only checks never loads the PDF code. Inputs and outputs cross threads by structured clone.
 */
export const tasks = {
  'check-json-batch': () => import('../batches/check-json-batch.ts').then((m) => m.checkJsonBatch),
  'check-and-draw': () => import('../batches/check-and-draw.ts').then((m) => m.checkAndDraw),
  'grade-for-store': () => import('../batches/graded-for-store.ts').then((m) => m.gradeForStore),
  'render-sheet': () => import('../../kinds/documents.ts').then((m) => m.feedbackSheetOrReason),
  'section-files': () => import('../batches/section-files.ts').then((m) => m.sectionFiles),
  'render-summary': () => import('../../kinds/documents.ts').then((m) => m.sectionSummary),
  'section-signals': () => import('../../kinds/section-signals.ts').then((m) => m.sectionSignalsTask),
  // The kinds a worker knows, so that a test can see they are the caller's (a kind registered at run time among them).
  'registered-kinds': () => import('../../kinds/registry.ts').then((m) => () => m.registeredKinds().map((k) => k.kind)),
};

export type TaskName = keyof typeof tasks;
type TaskFunction<N extends TaskName> = Awaited<ReturnType<(typeof tasks)[N]>>;
export type TaskInput<N extends TaskName> = Parameters<TaskFunction<N>>[0];
export type TaskOutput<N extends TaskName> = Awaited<ReturnType<TaskFunction<N>>>;
