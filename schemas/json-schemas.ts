import { z } from 'zod';
import * as firstOrderCatalysis from './kinds/first-order-catalysis.ts';
import * as temperatureDependence from './kinds/temperature-dependence.ts';
import { KindList } from './api/kinds.ts';
import { CheckResult } from './result.ts';
import { fastPathAsExact } from './common.ts';

/** The public contract as JSON Schema, one document per file name under schemas/json/. */
export function jsonSchemas(): Record<string, unknown> {
  return {
    ...Object.fromEntries(
      [firstOrderCatalysis, temperatureDependence].flatMap((kind) => [
        [`${kind.KIND}.settings.schema.json`, z.toJSONSchema(kind.Settings, { io: 'input', override: (ctx) => fastPathAsExact(ctx, 'input') })],
        [`${kind.KIND}.submission.schema.json`, z.toJSONSchema(kind.Submission, { io: 'input', override: (ctx) => fastPathAsExact(ctx, 'input') })],
      ]),
    ),
    'check-result.schema.json': z.toJSONSchema(CheckResult, { io: 'output' }),
    'kinds.schema.json': z.toJSONSchema(KindList, { io: 'output' }),
  };
}
