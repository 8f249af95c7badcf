import { ApiError } from '../errors.ts';

const strict = new TextDecoder('utf-8', { fatal: true });

/** Text that is not UTF-8 is refused rather than read with replacement characters. */
export function decodeUtf8(bytes: Uint8Array, field: string): string {
  try {
    return strict.decode(bytes).replace(/^\uFEFF/, '');
  } catch {
    throw new ApiError('invalid-encoding', undefined, [{ path: field, message: 'not valid UTF-8 (save the file as UTF-8)' }]);
  }
}
