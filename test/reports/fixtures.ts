import type { Settings, Submission } from '../../kinds/first-order-catalysis/schemas.ts';
import type { CheckResult } from '../../schemas/result.ts';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import type { FeedbackInput } from '../../reports/feedback-input.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { generateAssignment, generateSubmission, inject, type AssignmentOptions, type SlipCode } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';

/**
 * Feedback inputs from the seeded generator (invented data, pseudonymous ids): a section of one
 * assignment, each student clean or with one injected slip, checked by the real checker.
 */
export interface Student {
  submission: Submission;
  result: CheckResult;
}

export interface Section {
  settings: Settings;
  students: Student[];
}

export const GRADED_AT = '2025-03-04T14:30:00Z';

export function section(seed: number, slips: Array<SlipCode | undefined>, options: AssignmentOptions = {}): Section {
  const random = seededRandom(seed);
  const settings = generateAssignment(random, options);
  const assignment = parseAssignment(settings);
  const students = slips.map((slip, n) => {
    const clean = generateSubmission(random, settings, n + 1);
    // A temperature on every run, as a lab sheet records it (the degree sign must print).
    for (const run of clean.runs) run.temperatureC = 25;
    const submission = slip ? inject(slip, clean, random, settings).submission : clean;
    return { submission, result: checkSubmission(assignment, submission) };
  });
  return { settings, students };
}

export function feedbackInput(settings: Settings, student: Student, invented = true): FeedbackInput {
  return {
    header: {
      course: 'Kinetics laboratory (invented)',
      section: 'Thursday B',
      assignment: 'Mutarotation kinetics',
      studentId: student.submission.studentId,
      version: 1,
      gradedAt: GRADED_AT,
    },
    settings,
    submission: student.submission,
    result: student.result,
    invented,
  };
}
