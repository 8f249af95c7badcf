/**
 * Byte arrays a pool task gives up to the thread that asked for it: the pool moves them across rather
 * than copying (a batch's sheets are some 6 MB, copied twice on the way otherwise). A symbol key, which
 * the structured clone of the output leaves behind.
 */
const MOVED = Symbol('moved buffers');

/** `value`, its named byte arrays to be moved with it; each must own its whole buffer (checked), or it is copied. */
export function withMoved<T extends object>(value: T, arrays: Uint8Array[]): T {
  const buffers = arrays.filter((a) => a.byteOffset === 0 && a.byteLength === a.buffer.byteLength).map((a) => a.buffer as ArrayBuffer);
  return Object.assign(value, { [MOVED]: [...new Set(buffers)] });
}

/** What a task's output gives up (see `withMoved`); none for any other value. */
export function movedBuffers(value: unknown): ArrayBuffer[] {
  return (typeof value === 'object' && value !== null && (value as { [MOVED]?: ArrayBuffer[] })[MOVED]) || [];
}
