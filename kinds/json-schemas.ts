import { z } from 'zod';
import { KindList } from '../schemas/api/kinds.ts';
import { SubmissionDisplay } from '../schemas/display.ts';
import { CheckResult } from '../schemas/result.ts';
import { fastPathAsExact } from '../schemas/common.ts';
import { registeredKinds } from './registry.ts';

/** The public contract as JSON Schema, one document per file name under schemas/json/: each registered kind's two, the result's, the kinds' descriptions and the student page's display. */
export function jsonSchemas(): Record<string, unknown> {
  return {
    ...Object.fromEntries(
      registeredKinds().flatMap((kind) => [
        [`${kind.kind}.settings.schema.json`, z.toJSONSchema(kind.settingsSchema, { io: 'input', override: (ctx) => fastPathAsExact(ctx, 'input') })],
        [`${kind.kind}.submission.schema.json`, z.toJSONSchema(kind.submissionSchema, { io: 'input', override: (ctx) => fastPathAsExact(ctx, 'input') })],
      ]),
    ),
    'check-result.schema.json': z.toJSONSchema(CheckResult, { io: 'output' }),
    'kinds.schema.json': z.toJSONSchema(KindList, { io: 'output' }),
    'submission-display.schema.json': z.toJSONSchema(SubmissionDisplay, { io: 'output' }),
  };
}
