import { afterAll, describe, expect, it } from 'vitest';
import { registeredKinds, registerKindModule } from '../../kinds/registry.ts';
import { createWorkerPool } from '../../server/pool/worker-pool.ts';
import { DECAY_RUNS } from '../support/decay-runs/schemas.ts';
import { decaySubmission, EXPECTED } from '../support/decay-runs/data.ts';

await registerKindModule(new URL('../support/decay-runs/index.ts', import.meta.url));

/**
 * Worker threads import the registry for themselves: a kind registered at run time in the calling
 * thread (the test kind, by its module's address) must be known in every one of them, as must the
 * kinds built in.
 */
describe('the worker pool', () => {
  const pool = createWorkerPool(2);
  afterAll(() => pool.close());

  it('knows in each of its threads every kind the calling thread knows, the test kind among them', async () => {
    const mine = registeredKinds().map((k) => k.kind);
    expect(mine).toContain(DECAY_RUNS);
    // Two at once: the pool starts a second thread for the second task.
    const answers = await Promise.all([pool.run('registered-kinds', undefined), pool.run('registered-kinds', undefined)]);
    expect(pool.use().threads).toBe(2);
    for (const theirs of answers) expect(theirs).toEqual(mine);
  });

  it('checks a batch of the test kind in a thread, with the values scipy gives', async () => {
    const batch = { text: JSON.stringify(decaySubmission('S-001', 0.12, 0.25)), line: 1, column: 1 };
    const checked = await pool.run('check-json-batch', { settingsJson: JSON.stringify({ kind: DECAY_RUNS }), batch, jsonLines: false, output: 'json', arrays: false, keep: { reads: false, submissions: false } });
    const [result] = checked.results!;
    expect(result.findings).toEqual([]);
    const runs = (result.refit as { runs: Array<{ k: { value: number; standardError: number } }> }).runs;
    expect(runs[0].k.value).toBeCloseTo(EXPECTED.A.k, 12);
    expect(runs[0].k.standardError).toBeCloseTo(EXPECTED.A.standardError, 12);
    expect(runs[1].k.value).toBeCloseTo(EXPECTED.B.k, 12);
    expect(result.signals).toEqual([expect.objectContaining({ code: 'few-readings', path: 'runs[1].readings', evidence: { readings: 4, minReadings: 6 } })]);
  });
});
