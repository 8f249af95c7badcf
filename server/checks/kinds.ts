import type { ExperimentKind } from './experiment-kind.ts';
import { firstOrderCatalysis } from './first-order-catalysis/kind.ts';

/** Every experiment kind the checker knows, by name. */
const kinds = new Map<string, ExperimentKind>([[firstOrderCatalysis.kind, firstOrderCatalysis as ExperimentKind]]);

export function kindFor(name: string): ExperimentKind | undefined {
  return kinds.get(name);
}
