import { z } from 'zod';
import { Settings, Submission } from './kinds/first-order-catalysis.ts';
import { CheckResult } from './result.ts';

/** The public contract as JSON Schema, one document per file name under schemas/json/. */
export function jsonSchemas(): Record<string, unknown> {
  return {
    'first-order-catalysis.settings.schema.json': z.toJSONSchema(Settings, { io: 'input' }),
    'first-order-catalysis.submission.schema.json': z.toJSONSchema(Submission, { io: 'input' }),
    'check-result.schema.json': z.toJSONSchema(CheckResult, { io: 'output' }),
  };
}
