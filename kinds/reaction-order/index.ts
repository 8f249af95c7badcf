import type { KindEntry } from '../kind-entry.ts';
import { reactionOrder } from './checks/kind.ts';
import type { Refit, Settings, Submission } from './schemas.ts';

/** The kind `reaction-order` as the registry lists it. */
export const reactionOrderKind: KindEntry<Settings, Submission, Refit> = {
  checker: reactionOrder,
  report: async () => (await import('./report/report.ts')).reactionOrderReport,
  demo: async () => (await import('./demo/demo-assignment.ts')).reactionOrderDemo,
};
