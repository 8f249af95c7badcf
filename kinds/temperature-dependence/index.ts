import type { KindEntry } from '../kind-entry.ts';
import { temperatureDependence } from './checks/kind.ts';
import type { Refit, Settings, Submission } from './schemas.ts';

/** The kind `temperature-dependence` as the registry lists it. */
export const temperatureDependenceKind: KindEntry<Settings, Submission, Refit> = {
  checker: temperatureDependence,
  report: async () => (await import('./report/report.ts')).temperatureDependenceReport,
  demo: async () => (await import('./demo/demo-assignment.ts')).temperatureDemo,
};
