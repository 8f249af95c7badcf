/**
 * Invented runs of the test kind and the values expected of them, worked out apart from our code:
 * readings x = x_inf + (x_0 − x_inf) e^{−kt} plus noise (numpy 2.4.6, default_rng(23), rounded to 4
 * decimals), each run fitted by scipy 1.17.1 stats.linregress of ln[(x − x_inf)/(x_0 − x_inf)] on t.
 */
export const RUN_A = { label: 'A', timeUnit: 'min' as const, infinity: 0.05, readings: [[0, 1.0011], [2, 0.7977], [4, 0.6377], [6, 0.5078], [8, 0.4146], [10, 0.3319], [12, 0.2769]] as Array<[number, number]> };
/** Four readings only: under the six the settings ask for by default, so few-readings is raised. */
export const RUN_B = { label: 'B', timeUnit: 'min' as const, infinity: 0.04, readings: [[0, 0.9012], [2, 0.5633], [4, 0.358], [6, 0.2325]] as Array<[number, number]> };

/** scipy 1.17.1 linregress: k = −slope and its standard error, the intercept of ln F, per minute. */
export const EXPECTED = {
  A: { k: 0.12013650114737998, standardError: 0.0008108671728284442, interceptLnF: -0.002209815349530464 },
  B: { k: 0.2496397682942546, standardError: 0.00032965182752578025, interceptLnF: 0.0007498432366523922 },
};

/** A submission of the two runs with the k reported for each. */
export function decaySubmission(studentId: string, kA: number, kB: number) {
  return { studentId, runs: [{ ...RUN_A, reported: { k: { value: kA } } }, { ...RUN_B, reported: { k: { value: kB } } }] };
}

/**
 * Three students (hand-worked verdicts, tolerance 3 %): S-001 right in both runs; S-002 kept the sign
 * in A (−0.120) and took log10 F in B (0.108 ≈ 0.2496/ln 10 = 0.1084); S-003 gave A's half-life
 * (5.77 ≈ ln 2/0.12014 = 5.770 min) and an unexplained 0.40 in B.
 */
export const SECTION = [decaySubmission('S-001', 0.12, 0.25), decaySubmission('S-002', -0.12, 0.108), decaySubmission('S-003', 5.77, 0.4)];
