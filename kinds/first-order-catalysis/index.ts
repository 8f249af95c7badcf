import type { KindEntry } from '../kind-entry.ts';
import { firstOrderCatalysis } from './checks/kind.ts';
import type { Refit, Settings, Submission } from './schemas.ts';

/** The kind `first-order-catalysis` as the registry lists it. */
export const firstOrderCatalysisKind: KindEntry<Settings, Submission, Refit> = {
  checker: firstOrderCatalysis,
  report: async () => (await import('./report/report.ts')).firstOrderCatalysisReport,
  demo: async () => (await import('./demo/demo-assignment.ts')).catalysisDemo,
};
