import type { DrawnKind, KindReport } from '../reports/kind-report.ts';
import type { KindDescription } from '../schemas/api/kinds.ts';
import type { KindSettings } from '../reports/feedback-input.ts';
import type { ExperimentKind } from '../server/checks/experiment-kind.ts';
import type { KindDemo, KindEntry } from './kind-entry.ts';
import type { CheckResult } from '../schemas/result.ts';
import { firstOrderCatalysisKind } from './first-order-catalysis/index.ts';
import { temperatureDependenceKind } from './temperature-dependence/index.ts';
import { reactionOrderKind } from './reaction-order/index.ts';

/**
 * Every experiment kind the service knows, by name. A kind is a folder, kinds/<kind>/, whose index.ts
 * gives its checker and its parts of the documents; registering it is one line below. The registry
 * stands above every kind and above checks/ and reports/, which name no kind. Worker threads import
 * this same module (through kinds/documents.ts and the batches), so every kind listed here reaches them.
 */
const kinds = new Map<string, KindEntry>();

/**
 * Adds a kind. Its parts are typed by its own settings, submission and refit; here they are kept as
 * any kind's, since the registry hands them only settings, submissions and results of that kind.
 */
export function registerKind<Settings extends KindSettings, Submission, Refit extends CheckResult['refit']>(entry: KindEntry<Settings, Submission, Refit>): void {
  kinds.set(entry.checker.kind, entry);
}

registerKind(firstOrderCatalysisKind);
registerKind(temperatureDependenceKind);
registerKind(reactionOrderKind);

/**
 * Kinds beyond those built in, as the addresses of modules that each export `kind`, a KindEntry,
 * separated by spaces. Worker threads copy the environment when they start and import this module, so
 * a kind named here reaches every thread; `registerKindModule` adds to it.
 */
export const KIND_MODULES = 'RATEPROOF_KIND_MODULES';

const listedModules = () => (process.env[KIND_MODULES] ?? '').split(' ').filter((address) => address !== '');

async function entryIn(address: string): Promise<KindEntry> {
  const { kind } = (await import(address)) as { kind?: KindEntry };
  if (!kind?.checker) throw new Error(`${KIND_MODULES}: ${address} exports no kind`);
  return kind;
}

// A module listed here must not import the registry: it would wait on this very import.
for (const address of listedModules()) registerKind(await entryIn(address));

/**
 * Registers the kind a module exports as `kind`, here and in every worker thread started from now on
 * (and in any process started with this environment): one line, for a kind that lives outside
 * kinds/ (a test's). The pool starts its threads on its first task, so register before that.
 */
export async function registerKindModule(address: URL | string): Promise<void> {
  const href = String(address);
  registerKind(await entryIn(href));
  if (!listedModules().includes(href)) process.env[KIND_MODULES] = [...listedModules(), href].join(' ');
}

/** Every registered kind's checker, in the order registered. */
export function registeredKinds(): ExperimentKind[] {
  return [...kinds.values()].map((k) => k.checker);
}

export function kindFor(name: string): ExperimentKind | undefined {
  return kinds.get(name)?.checker;
}

function registered(name: string): KindEntry {
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

/** The signal codes its checker can raise (none for a kind not registered). */
export function signalCodesOf(name: string): readonly string[] {
  return kinds.get(name)?.checker.signalCodes ?? [];
}

/** Its stages, in order, with their titles. */
export function stagesOf(name: string): ExperimentKind['stages'] {
  return kinds.get(name)?.checker.stages ?? [];
}

/** Every kind as the workspace draws it, in the order they were registered. */
export async function kindDescriptions(): Promise<KindDescription[]> {
  return Promise.all([...kinds.values()].map(async (kind) => (await kind.report()).description));
}

/** Every kind's assignment in `npm run demo`, in the order registered; kinds without one are left out. */
export async function kindDemos(): Promise<Array<{ kind: string; demo: KindDemo }>> {
  const entries = [...kinds.values()];
  return (await Promise.all(entries.map(async (entry) => (entry.demo ? [{ kind: entry.checker.kind, demo: await entry.demo() }] : [])))).flat();
}
