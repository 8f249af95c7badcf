import { z } from 'zod';
import { documentName } from '../../reports/file-names.ts';
import { gradebookCsv } from '../../reports/gradebook-csv.ts';
import { ApiError } from '../errors.ts';
import type { FastifyReply } from 'fastify';
import type { Kysely } from 'kysely';
import { sectionResults, submissionFeedback } from '../grading/report-inputs.ts';
import { placeOf, sectionFeedbackZip, sectionSummaryPdf } from '../grading/section-documents.ts';
import { attachment } from '../http/download-header.ts';
import { defineRoute } from '../http/route-table.ts';
import { IdParam } from '../http/schemas.ts';
import type { Database } from '../store/database.ts';
import { reportNames } from '../store/names.ts';
import { getSectionFile, sectionFileContent, type SectionFileRow } from '../store/section-files.ts';
import { SectionFileView } from '../../schemas/api/section-files.ts';
import { studentsWithoutSubmission, withdrawnStudents } from '../store/students.ts';

const params = z.object({ sectionId: IdParam, assignmentId: IdParam });
const file = z.any().describe('a file');

const fileParams = params.extend({ fileId: z.string().uuid() });

const fileUrl = (row: SectionFileRow) => `/v1/sections/${row.sectionId}/assignments/${row.assignmentId}/files/${row.fileId}`;
const fileView = (row: SectionFileRow) => ({ ...row, poll: fileUrl(row), download: row.status === 'finished' ? `${fileUrl(row)}/content` : null });

/** 202: the file is drawn by a job; Location is its progress. */
const queued = (reply: FastifyReply, row: SectionFileRow) => reply.code(202).header('location', fileUrl(row)).send(fileView(row));

/** The file within the section and assignment asked about (the caller's access to them checked already), else 404. */
async function sectionFileOf(db: Kysely<Database>, scope: { section: { id: number }; assignment: { id: number } }, fileId: string): Promise<SectionFileRow> {
  const row = await getSectionFile(db, fileId, scope.section.id, scope.assignment.id);
  if (!row) throw new ApiError('not-found', 'no such file of this section and assignment (it may have expired: ask for the download again)');
  return row;
}

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
    summary:
      "Every student's feedback sheet in one ZIP, streamed: what each student was shown, or the latest result (a draft) where nothing was released. A section larger than the service's limit (200 submissions unless configured) answers 202: a job draws the file; poll the Location, then fetch its `download`",
    schema: { params, response: { 200: file, 202: SectionFileView } },
    async handler({ db, server, scope }, reply) {
      const [sectionId, assignmentId] = [scope.section.id, scope.assignment.id];
      if (await server.sectionFiles.isBig(db, sectionId, assignmentId)) return queued(reply, await server.sectionFiles.request(db, sectionId, assignmentId, 'feedback.zip'));
      const { name, zip } = await sectionFeedbackZip(db, server.grader, sectionId, assignmentId);
      return reply.type('application/zip').headers(attachment(name)).send(zip);
    },
  }),
  defineRoute({
    method: 'GET',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/summary.pdf',
    access: 'section',
    summary:
      "The section summary (PDF): score distribution, the class's k_N and k_A, how often each finding occurred, who needs attention. A section larger than the service's limit answers 202, as the ZIP does",
    schema: { params, response: { 200: file, 202: SectionFileView } },
    async handler({ db, server, scope }, reply) {
      const [sectionId, assignmentId] = [scope.section.id, scope.assignment.id];
      if (await server.sectionFiles.isBig(db, sectionId, assignmentId)) return queued(reply, await server.sectionFiles.request(db, sectionId, assignmentId, 'summary.pdf'));
      // For the TAs, not the students: the latest results, released or not.
      const summary = await sectionSummaryPdf(db, server.grader, sectionId, assignmentId);
      if (!summary) throw new ApiError('not-found', 'no checked submissions in this section yet');
      return reply.type('application/pdf').headers(attachment(summary.name)).send(summary.pdf);
    },
  }),
  defineRoute({
    method: 'GET',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/files/:fileId',
    access: 'section',
    summary: "How far a large section's ZIP or summary is drawn: sheets done of the total, running, finished (with its `download`) or failed; any process answers",
    schema: { params: fileParams, response: { 200: SectionFileView } },
    async handler({ db, scope, params }) {
      return fileView(await sectionFileOf(db, scope, params.fileId));
    },
  }),
  defineRoute({
    method: 'GET',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/files/:fileId/content',
    access: 'section',
    summary: "A large section's finished ZIP or summary, as stored by its job (the same bytes the direct download gives); 409 while it is drawn",
    schema: { params: fileParams, response: { 200: file } },
    async handler({ db, scope, params }, reply) {
      const row = await sectionFileOf(db, scope, params.fileId);
      const stored = row.status === 'finished' ? await sectionFileContent(db, row.fileId) : undefined;
      if (!stored?.content) throw new ApiError('conflict', row.status === 'failed' ? `the file was not drawn: ${row.error}` : 'the file is still being drawn; poll its progress');
      return reply.type(row.document === 'feedback.zip' ? 'application/zip' : 'application/pdf').headers(attachment({ ascii: stored.ascii ?? row.document, unicode: stored.unicode ?? row.document })).send(stored.content);
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
      const { results, held } = await sectionResults(db, sectionId, assignmentId);
      const csv = gradebookCsv(results, { assignment: names.assignment, bom: query.bom === 'true', notSubmitted, withdrawn, held });
      return reply.type('text/csv; charset=utf-8').headers(attachment(documentName(placeOf(names), 'gradebook', '.csv'))).send(csv);
    },
  }),
];
