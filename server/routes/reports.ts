import { z } from 'zod';
import { documentName } from '../../reports/file-names.ts';
import { gradebookCsv } from '../../reports/gradebook-csv.ts';
import { sectionZip } from '../../reports/section-zip.ts';
import { ApiError } from '../errors.ts';
import { sectionFeedback, sectionResults, submissionFeedback } from '../grading/report-inputs.ts';
import { attachment } from '../http/download-header.ts';
import { defineRoute } from '../http/route-table.ts';
import { IdParam } from '../http/schemas.ts';
import { reportNames } from '../store/names.ts';
import { studentsWithoutSubmission, withdrawnStudents } from '../store/students.ts';

const params = z.object({ sectionId: IdParam, assignmentId: IdParam });
const file = z.any().describe('a file');

/** The course, section and assignment a download is named after, in that order. */
const placeOf = (names: { course: string; section: string; assignment: string }) => [names.course, names.section, names.assignment];

export const reportRoutes = [
  defineRoute({
    method: 'GET',
    url: '/v1/submissions/:submissionId/feedback.pdf',
    access: 'section',
    summary:
      "A student's feedback sheet (PDF): what the student was shown where a result was released, else the latest result marked as a draft; `latest=true` previews the latest result (overrides applied) before it is released",
    schema: { params: z.object({ submissionId: IdParam }), querystring: z.object({ latest: z.enum(['true', 'false']).default('false') }), response: { 200: file } },
    async handler({ db, server, scope, query }, reply) {
      const input = await submissionFeedback(db, scope.submission, query.latest === 'true' ? 'latest' : 'released');
      if (!input) throw new ApiError('not-found', 'this submission has no checked result to report');
      const pdf = await server.grader.renderSheet(input);
      return reply.type('application/pdf').headers(attachment(documentName([...placeOf(input.header), input.header.studentId, `v${input.header.version}`], 'feedback', '.pdf'))).send(pdf);
    },
  }),
  defineRoute({
    method: 'GET',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/feedback.zip',
    access: 'section',
    summary: "Every student's feedback sheet in one ZIP, streamed: what each student was shown, or the latest result (a draft) where nothing was released",
    schema: { params, response: { 200: file } },
    async handler({ db, server, scope }, reply) {
      const [sectionId, assignmentId] = [scope.section.id, scope.assignment.id];
      const inputs = await sectionFeedback(db, sectionId, assignmentId);
      const sheets = server.grader.renderSheets(inputs.map((input) => ({ input })));
      const name = documentName(placeOf(await reportNames(db, sectionId, assignmentId)), 'feedback', '.zip');
      return reply.type('application/zip').headers(attachment(name)).send(sectionZip(sheets));
    },
  }),
  defineRoute({
    method: 'GET',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/summary.pdf',
    access: 'section',
    summary: "The section summary (PDF): score distribution, the class's k_N and k_A, how often each finding occurred, who needs attention",
    schema: { params, response: { 200: file } },
    async handler({ db, server, scope }, reply) {
      const { grader } = server;
      // For the TAs, not the students: the latest results, released or not.
      const inputs = await sectionFeedback(db, scope.section.id, scope.assignment.id, 'latest');
      if (inputs.length === 0) throw new ApiError('not-found', 'no checked submissions in this section yet');
      const pdf = await grader.renderSummary({
        header: { course: inputs[0].header.course, section: inputs[0].header.section, assignment: inputs[0].header.assignment, gradedAt: new Date() },
        settings: inputs[0].settings,
        results: inputs.map((i) => i.result),
        submissions: inputs.map((i) => i.submission),
        signals: await grader.sectionSignals(inputs[0].settings, inputs.map((i) => i.submission)),
      });
      return reply.type('application/pdf').headers(attachment(documentName(placeOf(inputs[0].header), 'summary', '.pdf'))).send(pdf);
    },
  }),
  defineRoute({
    method: 'GET',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/gradebook.csv',
    access: 'section',
    summary: 'The gradebook (CSV, one row per student; cells that a spreadsheet would run as formulas are neutralised)',
    schema: { params, querystring: z.object({ bom: z.enum(['true', 'false']).default('false') }), response: { 200: file } },
    async handler({ db, scope, query }, reply) {
      const [sectionId, assignmentId] = [scope.section.id, scope.assignment.id];
      const notSubmitted = (await studentsWithoutSubmission(db, sectionId, assignmentId)).map((s) => ({ studentId: s.studentId, withdrawn: s.status === 'withdrawn' }));
      const withdrawn = new Set(await withdrawnStudents(db, sectionId));
      const names = await reportNames(db, sectionId, assignmentId);
      const csv = gradebookCsv(await sectionResults(db, sectionId, assignmentId), { assignment: names.assignment, bom: query.bom === 'true', notSubmitted, withdrawn });
      return reply.type('text/csv; charset=utf-8').headers(attachment(documentName(placeOf(names), 'gradebook', '.csv'))).send(csv);
    },
  }),
];
