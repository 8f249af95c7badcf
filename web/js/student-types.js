/**
 * The student routes' answers as the page reads them, named as the pages name them.
 *
 * @import { OwnFeedback, OwnSubmissionStored, StudentMe as StudentMeOfService } from '../../schemas/api/student-pages.ts'
 * @typedef {StudentMeOfService} StudentMe
 * @typedef {StudentMe['assignments'][number]} StudentAssignment
 * @typedef {StudentAssignment['late']} LateWork
 * @typedef {StudentAssignment['versions'][number]} StudentVersion
 * @typedef {OwnSubmissionStored} StudentSubmitted
 * @typedef {OwnFeedback} StudentFeedback
 */
export {};
