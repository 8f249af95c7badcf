import type {} from '@fastify/multipart';
import type { FastifyRequest } from 'fastify';
import { ApiError } from '../errors.ts';
import { parseSubmissionsCsv } from '../input/csv-submissions.ts';
import { decodeUtf8 } from './utf8.ts';

/**
 * A multipart upload of the CSV layout: a file field `readings` and, optionally, `reported`. Returns
 * the submissions in file order; a structural problem in a file is a 400 naming the file and line.
 */
export async function submissionsFromMultipart(request: FastifyRequest): Promise<unknown[]> {
  const files = new Map<string, string>();
  for await (const part of request.parts()) {
    if (part.type !== 'file') continue;
    if (part.fieldname !== 'readings' && part.fieldname !== 'reported') {
      throw new ApiError('invalid-input', undefined, [{ path: part.fieldname, message: 'expected a file field named readings or reported' }]);
    }
    files.set(part.fieldname, decodeUtf8(await part.toBuffer(), part.fieldname));
  }
  const readings = files.get('readings');
  if (readings === undefined) throw new ApiError('invalid-input', undefined, [{ path: 'readings', message: 'a readings file is required' }]);
  const { submissions, rowErrors } = parseSubmissionsCsv(readings, files.get('reported'));
  if (rowErrors.length > 0) {
    throw new ApiError('invalid-input', 'the CSV cannot be read', rowErrors.map((e) => ({ path: `${e.file} line ${e.row}`, message: e.message })));
  }
  return submissions;
}
