import type { DrawnKind, KindReport } from '../reports/kind-report.ts';
import type { ExperimentKind } from '../server/checks/experiment-kind.ts';
import { firstOrderCatalysis } from './first-order-catalysis/checks/kind.ts';
import { temperatureDependence } from './temperature-dependence/checks/kind.ts';

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

registerKind(firstOrderCatalysis as ExperimentKind, async () => (await import('./first-order-catalysis/report/report.ts')).firstOrderCatalysisReport);
registerKind(temperatureDependence as ExperimentKind, async () => (await import('./temperature-dependence/report/report.ts')).temperatureDependenceReport);

/** Every registered kind's checker, in the order registered. */
export function registeredKinds(): ExperimentKind[] {
  return [...kinds.values()].map((k) => k.checker);
}

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
