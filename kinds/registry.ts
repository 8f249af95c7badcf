import type { DrawnKind, KindReport } from '../reports/kind-report.ts';
import type { KindDescription } from '../schemas/api/kinds.ts';
import type { ExperimentKind } from '../server/checks/experiment-kind.ts';
import { firstOrderCatalysis } from '../server/checks/first-order-catalysis/kind.ts';
import { temperatureDependence } from '../server/checks/temperature-dependence/kind.ts';

/**
 * Every experiment kind the service knows, by name: its checker, and its parts of the documents,
 * loaded only when a document is drawn. Registering a kind is one call. The registry stands above
 * checks/ and reports/, which each give their part of a kind and know nothing of the other.
 */
interface RegisteredKind {
  checker: ExperimentKind;
  report(): Promise<KindReport>;
}

const kinds = new Map<string, RegisteredKind>();

export function registerKind(checker: ExperimentKind, report: () => Promise<KindReport>): void {
  kinds.set(checker.kind, { checker, report });
}

registerKind(firstOrderCatalysis as ExperimentKind, async () => (await import('../reports/first-order-catalysis/report.ts')).firstOrderCatalysisReport);
registerKind(temperatureDependence as ExperimentKind, async () => (await import('../reports/temperature-dependence/report.ts')).temperatureDependenceReport);

export function kindFor(name: string): ExperimentKind | undefined {
  return kinds.get(name)?.checker;
}

function registered(name: string): RegisteredKind {
  const kind = kinds.get(name);
  if (!kind) throw new Error(`no experiment kind ${name}`);
  return kind;
}

/** The kind's parts of the documents; the kind must be registered (settings name only known kinds). */
export async function reportFor(name: string): Promise<KindReport> {
  return registered(name).report();
}

/** The kind as the documents draw it: its report with its checker's stages and finding codes. */
export async function drawnKind(name: string): Promise<DrawnKind> {
  const { checker, report } = registered(name);
  return { report: await report(), stages: checker.stages, findingCodes: checker.findingCodes };
}

/** Its stages, in order, with their titles. */
export function stagesOf(name: string): ExperimentKind['stages'] {
  return kinds.get(name)?.checker.stages ?? [];
}

/** Every kind as the workspace draws it, in the order they were registered. */
export async function kindDescriptions(): Promise<KindDescription[]> {
  return Promise.all([...kinds.values()].map(async (kind) => (await kind.report()).description));
}
