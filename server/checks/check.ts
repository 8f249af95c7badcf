import type { z } from 'zod';
import type { CheckResult, Rejection } from '../../schemas/result.ts';
import type { ExperimentKind } from './experiment-kind.ts';
import { InputRejected } from './input-rejected.ts';
import { EngineError } from '../engine/engine-error.ts';
import { ENGINE_VERSION } from './version.ts';

/** Assignment settings that failed validation; `issues` name each field and the reason. */
export class SettingsError extends Error {
  override readonly name = 'SettingsError';
  constructor(readonly issues: Rejection[]) {
    super(`invalid assignment settings: ${issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`);
  }
}

export interface Assignment {
  kind: ExperimentKind;
  settings: unknown;
}

/** `runs[2].readings[0]` from a zod path. */
export function pathText(path: ReadonlyArray<PropertyKey>): string {
  return path.reduce<string>((text, key) => (typeof key === 'number' ? `${text}[${key}]` : text ? `${text}.${String(key)}` : String(key)), '');
}

export function issuesOf(error: z.ZodError): Rejection[] {
  return error.issues.map((issue) => ({ path: pathText(issue.path) || '(root)', message: issue.message }));
}

function rejected(studentId: string | null, maxScore: number, rejections: Rejection[]): CheckResult {
  return {
    studentId,
    status: 'rejected',
    score: null,
    maxScore,
    refit: null,
    findings: [],
    rejected: rejections,
    engineVersion: ENGINE_VERSION,
  };
}

function idOf(submission: unknown): string | null {
  const id = typeof submission === 'object' && submission !== null ? (submission as { studentId?: unknown }).studentId : undefined;
  return typeof id === 'string' ? id : null;
}

/** A submission's result, and the submission as its schema reads it (unknown fields left out), when it could be read. */
export interface CheckedSubmission {
  result: CheckResult;
  read?: unknown;
}

/**
 * Checks one submission. Invalid input never throws: it comes back as a rejected result naming
 * each field and the reason, so one bad submission never stops a batch.
 */
export function checkAndRead(assignment: Assignment, submission: unknown): CheckedSubmission {
  const { kind, settings } = assignment;
  const parsed = kind.submissionSchema.safeParse(submission);
  if (!parsed.success) return { result: rejected(idOf(submission), 0, issuesOf(parsed.error)) };
  const read = parsed.data;
  try {
    return { result: { ...kind.check(settings, read), engineVersion: ENGINE_VERSION }, read };
  } catch (error) {
    if (error instanceof InputRejected) {
      return { result: rejected(idOf(submission), kind.maxScore(settings, read), error.rejections), read };
    }
    // Data that pass every check above but still defeat a fit are the submission's problem, not a crash.
    if (error instanceof EngineError) {
      return { result: rejected(idOf(submission), kind.maxScore(settings, read), [{ path: error.field ?? '(data)', message: error.message }]), read };
    }
    throw error;
  }
}

export function checkSubmission(assignment: Assignment, submission: unknown): CheckResult {
  return checkAndRead(assignment, submission).result;
}

export function checkBatch(assignment: Assignment, submissions: unknown[]): CheckResult[] {
  return submissions.map((s) => checkSubmission(assignment, s));
}
