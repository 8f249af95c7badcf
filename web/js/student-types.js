/**
 * The student routes' answers as the page reads them.
 *
 * @import { SubmissionDisplay } from '../../schemas/display.ts'
 * @typedef {{ policy: 'grade' | 'deduct' | 'hold', points: number }} LateWork
 * @typedef {{ version: number, submittedAt: string, late: boolean, held: boolean }} StudentVersion
 * @typedef {{ id: number, title: string, kind: string, dueAt: string | null, late: LateWork, versions: StudentVersion[], feedback: { version: number, releasedAt: string, firstReadAt: string | null } | null }} StudentAssignment
 * @typedef {{ studentId: string, displayName: string | null, course: { id: number, name: string }, section: { id: number, name: string }, csrfToken: string, assignments: StudentAssignment[] }} StudentMe
 * @typedef {{ version: number, submittedAt: string, late: boolean, held: boolean, form: { lines: string[] } }} StudentSubmitted
 * @typedef {{ version: number, releasedAt: string, score: number | null, maxScore: number, display: SubmissionDisplay }} StudentFeedback
 */
export {};
