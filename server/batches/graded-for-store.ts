import type { CheckResult, Rejection } from '../../schemas/result.ts';
import { checkSettingsBatch } from './check-settings-batch.ts';

/**
 * A checked submission in the form the store keeps it: the submission as read and the result's refit
 * and findings already written as JSON text. Made in a worker, so that the service's event loop
 * neither copies the whole results back nor serialises them again: a batch of 500 is megabytes.
 */
export interface GradedForStore {
  studentId: string | null;
  status: CheckResult['status'];
  score: number | null;
  maxScore: number;
  engineVersion: string;
  rejected: Rejection[];
  /** The submission as its schema reads it (unknown fields left out); absent when it could not be read. */
  payloadJson?: string;
  refitJson: string | null;
  findingsJson: string;
}

export function gradeForStore(input: { settingsJson: string; submissions: unknown[] }): GradedForStore[] {
  return checkSettingsBatch(input).map(({ result, read }) => ({
    studentId: result.studentId,
    status: result.status,
    score: result.score,
    maxScore: result.maxScore,
    engineVersion: result.engineVersion,
    rejected: result.rejected ?? [],
    payloadJson: read === undefined ? undefined : JSON.stringify(read),
    refitJson: result.refit === null ? null : JSON.stringify(result.refit),
    findingsJson: JSON.stringify({ findings: result.findings, rejected: result.rejected ?? [], items: result.items, signals: result.signals }),
  }));
}
