import { describe, expect, it } from 'vitest';
import type { Finding, RubricCount } from '../../schemas/result.ts';
import { overrideLimit } from '../../server/checks/rubric-books.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { effectiveResult, type EffectiveResult } from '../../server/grading/effective-result.ts';
import type { OverrideRow, ResultRow } from '../../server/store/submissions.ts';
import { rubricLinesOf } from '../../reports/feedback/rubric-lines.ts';

/**
 * The books over random results, overrides and regrades: every figure below is checked against sums
 * the test works out itself from the items and the findings (an independent computation), never
 * against the module's own account.
 */
const RESULTS = 3000;
const EPS = 1e-9;
const PER_RUN = ['readings', 'lnF', 'k', 'kUncertainty'];
const ONCE = ['kN', 'kA', 'sigFigs'];
const CODES = ['sign-flipped', 'log-base', 'unexplained', 'sig-figs', 'transcription'];
const WORTHS = [0, 0.5, 1, 1.5, 2, 3];

type Random = () => number;

// Plain checks in the hot loop (vitest's expect is slow over a million checks); each says what failed.
function holds(ok: boolean, what: string): void {
  if (!ok) throw new Error(what);
}
const close = (a: number, b: number) => holds(Math.abs(a - b) < EPS, `${a} is not ${b}`);
const atMost = (a: number, b: number) => holds(a <= b + EPS, `${a} is more than ${b}`);
const pick = <T>(random: Random, list: readonly T[]): T => list[Math.floor(random() * list.length)];

function randomItems(random: Random): RubricCount[] {
  const items: RubricCount[] = [];
  const runs = 1 + Math.floor(random() * 4);
  for (const item of PER_RUN) if (random() < 0.8) items.push({ item, count: runs, each: pick(random, WORTHS) });
  for (const item of ONCE) if (random() < 0.6) items.push({ item, count: 1, each: pick(random, WORTHS) });
  return items;
}

/** Findings as a checker stores them: each instance of an item loses at most its worth (capped here, in order). */
function randomFindings(random: Random, items: RubricCount[], withKeys: boolean): Finding[] {
  const n = Math.floor(random() * 9);
  const findings: Finding[] = [];
  const spent = new Map<string, number>();
  for (let i = 0; i < n; i++) {
    // Now and then a finding on an item this submission is not graded on.
    const item = random() < 0.9 && items.length > 0 ? pick(random, items) : { item: 'kAUncertainty', count: 1, each: 1 };
    const perRun = PER_RUN.includes(item.item);
    const run = Math.floor(random() * item.count);
    const path = perRun ? `runs[${run}].${item.item}.${i}` : `${item.item}.${i}`;
    const code = pick(random, CODES);
    const f: Finding = {
      id: `${code}@${path}`,
      code,
      stage: 'run',
      path,
      severity: 'error',
      pointsLost: pick(random, [0, 0.5, 1, 1.5, 2, 3, 5]),
      rubricItem: item.item,
      ...(withKeys && { itemKey: perRun ? `${item.item}@runs[${run}]` : item.item }),
      message: 'invented',
    };
    const w = worthOf(items, f);
    const points = Math.min(f.pointsLost, w.instanceWorth - (spent.get(w.instance) ?? 0));
    spent.set(w.instance, (spent.get(w.instance) ?? 0) + points);
    findings.push({ ...f, pointsLost: points });
  }
  return findings;
}

function storedRow(items: RubricCount[], findings: Finding[], resultId: number): ResultRow {
  const maxScore = items.reduce((s, c) => s + c.each * c.count, 0);
  return {
    resultId,
    submissionId: 1,
    engineVersion: 'test',
    settingsVersion: 1,
    status: 'checked',
    score: maxScore,
    maxScore,
    findings: { findings, rejected: [], items, signals: [] },
    releasedAt: null,
    gradedAt: new Date(0),
    settings: null,
    refit: null,
  };
}

/** The test's own account: what each item and each instance is worth, and what was asked of each finding. */
function worthOf(items: RubricCount[], f: Finding): { instance: string; instanceWorth: number; itemWorth: number } {
  const item = items.find((c) => c.item === f.rubricItem);
  if (!item) return { instance: `none:${f.rubricItem}`, instanceWorth: 0, itemWorth: 0 };
  const whole = item.each * item.count;
  return f.itemKey ? { instance: f.itemKey, instanceWorth: item.each, itemWorth: whole } : { instance: item.item, instanceWorth: whole, itemWorth: whole };
}

function sumBy(findings: Finding[], key: (f: Finding) => string): Map<string, number> {
  const sums = new Map<string, number>();
  for (const f of findings) sums.set(key(f), (sums.get(key(f)) ?? 0) + f.pointsLost);
  return sums;
}

function expectBooksHold(items: RubricCount[], r: EffectiveResult, asked: Map<string, number>): void {
  const max = items.reduce((s, c) => s + c.each * c.count, 0);
  const lost = r.findings.reduce((s, f) => s + f.pointsLost, 0);
  close(r.maxScore, max);
  close(r.score!, max - lost);
  atMost(-EPS, r.score!);
  atMost(r.score!, max + EPS);
  for (const f of r.findings) {
    atMost(0, f.pointsLost);
    // Never more than the checker or the TA asked.
    atMost(f.pointsLost, asked.get(f.id)! + EPS);
  }
  for (const [instance, sum] of sumBy(r.findings, (f) => worthOf(items, f).instance)) {
    const f = r.findings.find((x) => worthOf(items, x).instance === instance)!;
    atMost(sum, worthOf(items, f).instanceWorth + EPS);
  }
  // The sheet's rows: one per item, between 0 and its worth, summing to the points lost.
  const rows = rubricLinesOf({ studentId: 'x', status: 'checked', score: r.score, maxScore: r.maxScore, items, refit: null, findings: r.findings, engineVersion: 'test' }, {});
  holds(rows.map((row) => row.item).join() === items.map((c) => c.item).join(), 'one row per item');
  const byItem = sumBy(r.findings, (f) => f.rubricItem ?? '');
  for (const row of rows) {
    const item = items.find((c) => c.item === row.item)!;
    close(row.available, item.each * item.count);
    close(row.lost, byItem.get(row.item) ?? 0);
    atMost(0, row.lost);
    atMost(row.lost, row.available + EPS);
    close(row.earned, row.available - row.lost);
  }
  close(rows.reduce((s, row) => s + row.lost, 0), max - r.score!);
}

/** What the test itself says a finding may be set to: its instance's and its item's worth less the others' points. */
function ownLimit(items: RubricCount[], findings: Finding[], target: Finding): number {
  const w = worthOf(items, target);
  const others = findings.filter((f) => f.id !== target.id);
  const onInstance = others.filter((f) => worthOf(items, f).instance === w.instance).reduce((s, f) => s + f.pointsLost, 0);
  const onItem = others.filter((f) => f.rubricItem === target.rubricItem && items.some((c) => c.item === f.rubricItem)).reduce((s, f) => s + f.pointsLost, 0);
  return Math.max(0, Math.min(w.instanceWorth - onInstance, w.itemWorth - onItem));
}

describe('the books, over random findings, overrides and regrades', () => {
  it(`hold for ${RESULTS} random results: rows sum to the points lost, score = max - lost, every row within its worth`, () => {
    const random = seededRandom(20261205);
    let accepted = 0;
    let refused = 0;
    let regrades = 0;
    for (let n = 0; n < RESULTS; n++) {
      const withKeys = random() < 0.85;
      let items = randomItems(random);
      let findings = randomFindings(random, items, withKeys);
      const overrides: OverrideRow[] = [];
      const askedOf = (fs: Finding[]) => new Map(fs.map((f) => [f.id, [...overrides].reverse().find((o) => o.findingId === f.id)?.pointsAfter ?? f.pointsLost]));
      let result = effectiveResult(storedRow(items, findings, n), overrides);
      expectBooksHold(items, result, askedOf(findings));
      for (let step = 0; step < 6; step++) {
        if (result.findings.length > 0 && random() < 0.75) {
          // An override, as the API would judge it: within the limit it is stored, beyond it refused.
          const target = pick(random, result.findings);
          const limit = overrideLimit(items, result.maxScore, result.findings, target.id)!;
          const own = ownLimit(items, result.findings, target);
          close(limit, own);
          const points = random() < 0.6 ? Math.round(random() * own * 4) / 4 : own + 0.25 + Math.floor(random() * 8) / 4;
          if (points <= limit + EPS) {
            overrides.push({ id: overrides.length + 1, submissionId: 1, findingId: target.id, pointsBefore: target.pointsLost, pointsAfter: points, reason: 'test', reasonShown: false, by: 'ta', at: new Date(0) });
            const before = result;
            result = effectiveResult(storedRow(items, findings, n), overrides);
            // The finding costs what was set; and where every finding cost what was asked of it (no regrade
            // had shrunk an item under its findings), no other finding moved.
            close(result.findings.find((f) => f.id === target.id)!.pointsLost, points);
            const asked = askedOf(findings);
            if (before.findings.every((f) => f.id === target.id || Math.abs(f.pointsLost - asked.get(f.id)!) < EPS)) {
              for (const f of result.findings) if (f.id !== target.id) close(f.pointsLost, before.findings.find((b) => b.id === f.id)!.pointsLost);
            }
            accepted++;
          } else {
            // Refused: stored, it would make the instance or the item lose more than it is worth.
            const w = worthOf(items, target);
            const onInstance = result.findings.filter((f) => f.id !== target.id && worthOf(items, f).instance === w.instance).reduce((s, f) => s + f.pointsLost, 0);
            const onItem = result.findings.filter((f) => f.id !== target.id && f.rubricItem === target.rubricItem).reduce((s, f) => s + f.pointsLost, 0);
            holds(onInstance + points > w.instanceWorth + EPS || onItem + points > w.itemWorth + EPS, 'a refused override would have broken the books');
            refused++;
          }
        } else {
          // A regrade: the rubric's worths change, some findings go, new ones come; overrides follow their finding's id.
          items = items.map((c) => (random() < 0.5 ? { ...c, each: pick(random, WORTHS) } : c));
          findings = [...findings.filter(() => random() < 0.7), ...randomFindings(random, items, withKeys).slice(0, 2)];
          findings = findings.filter((f, i) => findings.findIndex((g) => g.id === f.id) === i);
          result = effectiveResult(storedRow(items, findings, n), overrides);
          regrades++;
        }
        expectBooksHold(items, result, askedOf(findings));
      }
    }
    // The run covered every branch it claims to.
    expect(accepted).toBeGreaterThan(RESULTS);
    expect(refused).toBeGreaterThan(RESULTS / 2);
    expect(regrades).toBeGreaterThan(RESULTS / 2);
    console.log(`books property: ${RESULTS} results, ${accepted} overrides accepted, ${refused} refused, ${regrades} regrades`);
  });
});
