import { createHash, timingSafeEqual } from 'node:crypto';

/** Compares two secrets in time that does not depend on where they differ (hashed first, so lengths may differ). */
export function sameSecret(a: string, b: string): boolean {
  return timingSafeEqual(createHash('sha256').update(a).digest(), createHash('sha256').update(b).digest());
}
