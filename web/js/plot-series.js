/**
 * What the workspace's plots show, without the page: for each run the points, our line and the
 * student's line in the run's own time unit, and for the rate law our line and the student's. Pure, so
 * that it can be checked outside a browser.
 */

// Seconds and molar (mol dm^-3) per unit: the spellings of rate-constant units the engine reads for
// time and concentration. A unit outside these leaves its line out with a note, never guessed.
const ATOMS = {
  s: [1, 0, 1], sec: [1, 0, 1], secs: [1, 0, 1], second: [1, 0, 1], seconds: [1, 0, 1], ms: [1, 0, 1e-3],
  min: [1, 0, 60], mins: [1, 0, 60], minute: [1, 0, 60], minutes: [1, 0, 60],
  h: [1, 0, 3600], hr: [1, 0, 3600], hrs: [1, 0, 3600], hour: [1, 0, 3600], hours: [1, 0, 3600],
  d: [1, 0, 86400], day: [1, 0, 86400], days: [1, 0, 86400],
  M: [0, 1, 1], mM: [0, 1, 1e-3], uM: [0, 1, 1e-6], µM: [0, 1, 1e-6], nM: [0, 1, 1e-9],
};
const SUPERSCRIPTS = '⁰¹²³⁴⁵⁶⁷⁸⁹';

/**
 * A unit as [power of time, power of concentration, factor to s and M], or undefined when not read.
 * Reads products of atoms with integer powers (`M^-1 min^-1`, `min-1`, `min⁻¹`) and one `/`.
 */
export function readUnit(text) {
  if (typeof text !== 'string') return undefined;
  const plain = text.trim().replace(/[⁻−]/g, '-').replace(/[⁰¹²³⁴⁵⁶⁷⁸⁹]/g, (c) => String(SUPERSCRIPTS.indexOf(c))).replace(/[·*⋅]/g, ' ');
  const [top, bottom, ...rest] = plain.split('/');
  if (rest.length > 0) return undefined;
  const out = [0, 0, 1];
  for (const [part, sign] of [[top, 1], [bottom ?? '', -1]]) {
    for (const token of part.trim().split(/\s+/).filter(Boolean)) {
      const m = /^([A-Za-zµ]+)\^?(-?\d+)?$/.exec(token);
      if (token === '1' && sign === 1) continue;
      const atom = m && ATOMS[m[1]];
      if (!atom) return undefined;
      const power = sign * Number(m[2] ?? 1);
      out[0] += atom[0] * power;
      out[1] += atom[1] * power;
      out[2] *= atom[2] ** power;
    }
  }
  return out;
}

/** `value` in unit `from` expressed in unit `to`, or undefined when either is unread or they differ in kind. */
export function convertUnit(value, from, to) {
  const [a, b] = [readUnit(from), readUnit(to)];
  if (!a || !b || a[0] !== b[0] || a[1] !== b[1] || !Number.isFinite(Number(value))) return undefined;
  return (Number(value) * a[2]) / b[2];
}

const mean = (values) => values.reduce((x, y) => x + y, 0) / values.length;
// The least-squares intercept for a fixed slope: the line through the points' centroid.
const centred = (points, slope) => (points.length ? mean(points.map((p) => p.y)) - slope * mean(points.map((p) => p.t)) : 0);

function beyond(tolerance, value, reference) {
  return Math.abs(value - reference) > Math.max((tolerance?.relative ?? 0) * Math.abs(reference), tolerance?.absolute ?? 0);
}

/** Whether a finding names run `index` (its path starts `runs[index]`). */
const namesRun = (finding, index) => typeof finding.path === 'string' && finding.path.startsWith(`runs[${index}]`);

/**
 * One run's plot in its own time unit: our ln F points, our line (slope −k converted from the
 * instructor's unit, which may be per minute while the run is timed in seconds), and the student's line
 * (slope −their k) where the run has a finding or their k differs from ours beyond the tolerance.
 * Returns undefined when there is nothing to plot.
 */
export function runPlotSeries(run, fit, settings, findings = [], index = 0) {
  const readings = run?.readings ?? [];
  if (!fit?.lnF?.length || readings.length === 0) return undefined;
  const timeUnit = run.timeUnit;
  const perTime = `${timeUnit}^-1`;
  const t0 = Number(readings[0][0]);
  const points = [];
  fit.lnF.forEach((y, i) => {
    if (typeof y === 'number' && Number.isFinite(y) && readings[i]) points.push({ t: Number(readings[i][0]) - t0, y });
  });
  const series = { label: run.label, timeUnit, points, notes: [] };
  const ours = fit.k?.instructor;
  const ourK = ours && convertUnit(ours.value, ours.unit, perTime);
  if (ourK !== undefined) series.ourLine = { slope: -ourK, intercept: fit.model === 'intercept' ? centred(points, -ourK) : 0, k: ourK };
  else if (ours) series.notes.push(`the refit line is not drawn: “${ours.unit}” cannot be put per ${timeUnit}`);
  const reported = run.reported?.k;
  if (!reported) return series;
  const theirK = convertUnit(reported.value, reported.unit, perTime);
  if (theirK === undefined) {
    series.notes.push(`the student’s line is not drawn: their unit “${reported.unit}” could not be read`);
    return series;
  }
  const hasFinding = findings.some((f) => namesRun(f, index));
  if (hasFinding || ourK === undefined || beyond(settings?.tolerances?.k ?? { relative: 0.01 }, theirK, ourK)) {
    series.theirLine = { slope: -theirK, intercept: settings?.fitModel === 'intercept' ? centred(points, -theirK) : 0, k: theirK };
  }
  return series;
}

/**
 * k_obs against [catalyst] in the instructor's k unit, [catalyst] in M: our k_obs, the student's, our
 * line k_N + k_A c and the student's from their reported k_N and k_A.
 */
export function rateLawPlotSeries(payload, refit, settings) {
  const kUnit = settings?.units?.k ?? refit?.runs?.find((r) => r.k)?.k?.instructor?.unit;
  if (!kUnit || !refit?.runs) return undefined;
  const kAUnit = `M^-1 ${kUnit}`;
  const ours = [];
  const theirs = [];
  (payload?.runs ?? []).forEach((run, i) => {
    const c = run?.catalyst && convertUnit(run.catalyst.value, run.catalyst.unit, 'M');
    if (c === undefined) return;
    const estimate = refit.runs[i]?.k?.instructor;
    const k = estimate && convertUnit(estimate.value, estimate.unit, kUnit);
    if (k !== undefined) ours.push({ label: run.label, c, k });
    const their = run.reported?.k && convertUnit(run.reported.k.value, run.reported.k.unit, kUnit);
    if (their !== undefined) theirs.push({ label: run.label, c, k: their });
  });
  if (ours.length < 2) return undefined;
  const line = (kN, kA) => {
    const intercept = kN && convertUnit(kN.value, kN.unit, kUnit);
    const slope = kA && convertUnit(kA.value, kA.unit, kAUnit);
    return intercept === undefined || slope === undefined ? undefined : { intercept, slope };
  };
  const notes = [];
  const ourLine = line(refit.kN, refit.kA);
  const reported = payload?.reported;
  const theirLine = line(reported?.kN, reported?.kA);
  if (!reported?.kN || !reported?.kA) notes.push('the student’s line is not drawn: k_N or k_A was not reported');
  else if (!theirLine) notes.push('the student’s line is not drawn: the unit of their k_N or k_A could not be read');
  return { kUnit, ours, theirs, ourLine, theirLine, notes };
}
