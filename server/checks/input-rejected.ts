import type { Rejection } from '../../schemas/result.ts';

/** Raw data that pass the schema but cannot be analysed (an unknown time unit, times out of order). */
export class InputRejected extends Error {
  override readonly name = 'InputRejected';
  constructor(readonly rejections: Rejection[]) {
    super(rejections.map((r) => `${r.path}: ${r.message}`).join('; '));
  }
}
