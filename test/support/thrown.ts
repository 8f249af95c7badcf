import { EngineError } from '../../server/engine/engine-error.ts';

/** The EngineError that fn throws, so that its code, message and field can all be checked. */
export function thrown(fn: () => unknown): EngineError {
  try {
    fn();
  } catch (error) {
    if (error instanceof EngineError) return error;
    throw error;
  }
  throw new Error('expected an EngineError, none was thrown');
}

/** Whatever fn throws (undefined if it returns), for errors of any class. */
export function caught(fn: () => unknown): unknown {
  try {
    fn();
  } catch (error) {
    return error;
  }
  return undefined;
}
