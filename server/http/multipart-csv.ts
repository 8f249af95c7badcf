import fastifyMultipart from '@fastify/multipart';
import type { FastifyInstance, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import type { ExperimentKind } from '../checks/experiment-kind.ts';
import { ApiError } from '../errors.ts';
import { layoutProblems } from '../input/csv-layout.ts';
import { decodeUtf8 } from './utf8.ts';

/** A multipart upload's files by field name, read before the assignment (and so the kind's layout) is known. */
export interface CsvUpload {
  csvFiles: Record<string, string>;
}

declare module 'fastify' {
  interface FastifyRequest {
    /** The files of a multipart upload, read by `readUpload` on a route that takes one; null otherwise. */
    upload: CsvUpload | null;
  }
}

// More files than any layout has is no upload to read.
const MAX_FILES = 8;

async function filesFromMultipart(request: FastifyRequest): Promise<CsvUpload> {
  const csvFiles: Record<string, string> = {};
  for await (const part of request.parts()) {
    if (part.type !== 'file') continue;
    if (Object.keys(csvFiles).length >= MAX_FILES) throw new ApiError('invalid-input', undefined, [{ path: part.fieldname, message: `at most ${MAX_FILES} files` }]);
    csvFiles[part.fieldname] = decodeUtf8(await part.toBuffer(), part.fieldname);
  }
  return { csvFiles };
}

/** preHandler hook of a route that takes CSV files: reads a multipart upload into `request.upload`. */
export async function readUpload(request: FastifyRequest): Promise<void> {
  if (request.isMultipart()) request.upload = await filesFromMultipart(request);
}

export const uploadPlugin = fp(async (app: FastifyInstance, options: { fileSize: number }) => {
  app.decorateRequest('upload', null);
  await app.register(fastifyMultipart, { limits: { fileSize: options.fileSize, files: 2 } });
}, { name: 'rateproof-upload' });

/**
 * The submissions in an upload, read by the kind's CSV layout in file order; a file the layout does
 * not have, a missing one, or a structural problem in one is a 400 naming the file (and line).
 */
export async function submissionsFromCsv(kind: ExperimentKind, upload: CsvUpload): Promise<{ submissions: unknown[]; lines: number[]; file: string }> {
  const layout = kind.csvLayout;
  if (!layout) throw new ApiError('invalid-input', undefined, [{ path: 'body', message: `the kind ${kind.kind} has no CSV layout: send the submissions as a JSON array` }]);
  const problems = layoutProblems(layout, Object.keys(upload.csvFiles));
  if (problems.length > 0) throw new ApiError('invalid-input', undefined, problems);
  const { submissions, lines, rowErrors } = await layout.read(upload.csvFiles);
  if (rowErrors.length > 0) {
    throw new ApiError('invalid-input', 'the CSV cannot be read', rowErrors.map((e) => ({ path: `${e.file} line ${e.row}`, message: e.message })));
  }
  return { submissions, lines, file: layout.main };
}
