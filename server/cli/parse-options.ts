import { parseArgs, type ParseArgsConfig } from 'node:util';
import { UsageError } from './cli-errors.ts';

/** node's argument parser, strict, with its complaints as usage errors. */
export function parseOptions<const Options extends NonNullable<ParseArgsConfig['options']>>(args: string[], options: Options) {
  try {
    return parseArgs({ args, options, allowPositionals: true, strict: true });
  } catch (error) {
    throw new UsageError((error as Error).message);
  }
}
