import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { findingCodes as catalysisCodes } from '../../kinds/first-order-catalysis/schemas.ts';
import { findingCodes as temperatureCodes } from '../../kinds/temperature-dependence/schemas.ts';
import { findingCodes as orderCodes } from '../../kinds/reaction-order/schemas.ts';
import type { CheckResult } from '../../schemas/result.ts';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';

/**
 * The casebook: hand-worked submissions, each with the verdict a careful TA would give, worked out
 * apart from the checker (see docs/casebook.md and each case's `source` and `worked`). The checker is
 * run on each case and its verdict compared: the findings that cost points (code, path, points), the
 * uncharged findings the case lists, the findings it rules out, and the score.
 */
const here = import.meta.dirname;

interface Charged {
  code: string;
  path: string;
  points: number;
}
interface Located {
  code: string;
  path?: string;
}
/** A finding whose code the case leaves open (behaviour still to be named): where it is, what it costs, what it mentions. */
interface Present {
  pathPrefix: string;
  points: number;
  /** Its message names at least one of these (what was probably meant, in any of its spellings). */
  mentionsOneOf?: string[];
}
interface Expected {
  score?: number;
  maxScore?: number;
  /** Where more than one maximum is defensible (an item that cannot be graded left out, or given): [score, maxScore] pairs. */
  scoreOneOf?: Array<[number, number]>;
  charged: Charged[];
  uncharged?: Located[];
  absent?: Located[];
  present?: Present[];
  why?: string;
}
interface Case {
  id: string;
  kind: string;
  topic: string;
  source: string;
  worked: string;
  settings: string | Record<string, unknown>;
  expected: Expected;
  submission: unknown;
}

const readJson = (path: string): unknown => JSON.parse(readFileSync(path, 'utf8'));
const cases = readdirSync(join(here, 'cases'))
  .filter((name) => name.endsWith('.json'))
  .sort()
  .map((name) => ({ file: name, ...(readJson(join(here, 'cases', name)) as Case) }));

function settingsOf(c: Case): Record<string, unknown> {
  return typeof c.settings === 'string' ? (readJson(join(here, 'settings', `${c.settings}.json`)) as Record<string, unknown>) : c.settings;
}

/** The codes each kind can give, from its schema: a case naming another code could never pass. */
const codesOf: Record<string, readonly string[]> = { 'first-order-catalysis': catalysisCodes, 'temperature-dependence': temperatureCodes, 'reaction-order': orderCodes };

const chargedKey = (f: { code: string; path: string; points: number }) => `${f.code}@${f.path} -${f.points}`;

/** Every way the checker's verdict departs from the case's, one line each (empty when they agree). */
function mismatches(c: Case, result: CheckResult): string[] {
  const e = c.expected;
  if (result.status !== 'checked') return [`refused: ${(result.rejected ?? []).map((r) => `${r.path}: ${r.message}`).join('; ')}`];
  const out: string[] = [];
  const got = result.findings.filter((f) => f.pointsLost > 0).map((f) => chargedKey({ code: f.code, path: f.path, points: f.pointsLost }));
  const want = e.charged.map(chargedKey);
  for (const key of want) if (!got.includes(key)) out.push(`expected charged ${key}, not found`);
  for (const key of got) if (!want.includes(key)) out.push(`charged ${key}, not expected`);
  for (const u of e.uncharged ?? []) {
    const f = result.findings.find((g) => g.code === u.code && g.path === u.path);
    if (!f) out.push(`expected uncharged ${u.code}@${u.path}, not found`);
    else if (f.pointsLost !== 0) out.push(`expected ${u.code}@${u.path} uncharged, got -${f.pointsLost}`);
  }
  for (const a of e.absent ?? []) {
    const f = result.findings.find((g) => g.code === a.code && (a.path === undefined || g.path === a.path));
    if (f) out.push(`expected no ${a.code}${a.path ? `@${a.path}` : ''}, got ${f.code}@${f.path} -${f.pointsLost}: ${f.message}`);
  }
  for (const p of e.present ?? []) {
    const mentions = p.mentionsOneOf ?? [];
    const f = result.findings.find((g) => g.path.startsWith(p.pathPrefix) && g.pointsLost === p.points && (mentions.length === 0 || mentions.some((m) => g.message.includes(m))));
    if (!f) out.push(`expected a finding at ${p.pathPrefix}... costing ${p.points}${mentions.length ? ` that mentions one of ${mentions.map((m) => `"${m}"`).join(', ')}` : ''}, not found`);
  }
  const pairs = e.scoreOneOf ?? [[e.score, e.maxScore]];
  if (!pairs.some(([s, m]) => s === result.score && m === result.maxScore)) {
    out.push(`score ${result.score}/${result.maxScore}, expected ${pairs.map(([s, m]) => `${s}/${m}`).join(' or ')}`);
  }
  return out;
}

describe('the casebook', () => {
  it('holds at least 60 cases of every kind, each with its source and its working', () => {
    expect(cases.length).toBeGreaterThanOrEqual(60);
    for (const kind of ['first-order-catalysis', 'temperature-dependence']) expect(cases.filter((c) => c.kind === kind).length, kind).toBeGreaterThanOrEqual(20);
    expect(cases.filter((c) => c.kind === 'reaction-order').length, 'reaction-order').toBeGreaterThanOrEqual(9);
    for (const c of cases) {
      expect(c.file, 'file named by its id').toBe(`${c.id}.json`);
      expect(settingsOf(c).kind, `${c.id}: settings of its kind`).toBe(c.kind);
      expect(c.source.length, `${c.id}: source`).toBeGreaterThan(20);
      expect(c.worked.length, `${c.id}: worked`).toBeGreaterThan(20);
      expect(c.expected.scoreOneOf ?? [c.expected.score, c.expected.maxScore], `${c.id}: a score to compare`).not.toContain(undefined);
      const named = [...c.expected.charged, ...(c.expected.uncharged ?? []), ...(c.expected.absent ?? [])].map((f) => f.code);
      expect(named.filter((code) => !codesOf[c.kind].includes(code)), `${c.id}: codes its kind gives`).toEqual([]);
    }
  });

  it.each(cases.map((c) => [c.id, c] as const))('%s', (_, c) => {
    const result = checkSubmission(parseAssignment(settingsOf(c)), c.submission);
    const found = mismatches(c, result);
    const seen = result.findings.map((f) => `${f.code}@${f.path} -${f.pointsLost}`).join(', ') || 'none';
    expect(found, `case ${c.id} (${c.topic}): expected vs got\n  ${found.join('\n  ')}\n  all findings: ${seen}`).toEqual([]);
  });
});
