import { describe, expect, it } from 'vitest';
import { accessCodeHash, newAccessCode, normaliseAccessCode } from '../../server/store/student-access.ts';

/** The form of an access code: Crockford's base32 (its published alphabet and look-alike rule), grouped for reading. */
describe('access codes', () => {
  it('are twelve symbols of Crockford base32 in three groups of four', () => {
    const codes = Array.from({ length: 500 }, newAccessCode);
    for (const code of codes) expect(code).toMatch(/^[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{4}$/);
    // 60 random bits each: 500 codes drawn alike would mean no randomness at all (hand-worked bound, not a statistical test).
    expect(new Set(codes).size).toBe(500);
  });

  it.each([
    // Hand-worked: case, dashes and spaces dropped; O read as 0, I and L as 1, as Crockford's decoding does.
    ['abcd-efgh-jkmn', 'ABCDEFGHJKMN'],
    [' 7Q2X 9P0R M4ZT ', '7Q2X9P0RM4ZT'],
    ['OOII-LLoo-il10', '001111001110'],
    ['7q2x-9pOr-m4zt', '7Q2X9P0RM4ZT'],
  ])('reads %j as %j', (typed, normal) => {
    expect(normaliseAccessCode(typed)).toBe(normal);
  });

  it('hashes a code and the same code typed differently alike', () => {
    expect(accessCodeHash('7q2x 9pOr m4zt')).toBe(accessCodeHash('7Q2X-9P0R-M4ZT'));
    expect(accessCodeHash('7Q2X-9P0R-M4ZT')).not.toBe(accessCodeHash('7Q2X-9P0R-M4ZV'));
  });
});
