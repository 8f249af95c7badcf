import { api } from './api.js';
import { fill, h, marked, num, when } from './dom.js';
import { askToConfirm } from './confirm.js';
import { lnFPlot, ratePlot } from './plots.js';
import { rateLawPlotSeries, runPlotSeries } from './plot-series.js';

function tolerance(tol, unit) {
  if (!tol) return '–';
  const parts = [];
  if (tol.relative !== undefined) parts.push(`${num(tol.relative * 100)} %`);
  if (tol.absolute !== undefined) parts.push(`${num(tol.absolute)}${unit ? ` ${unit}` : ''}`);
  return `± ${parts.join(' or ')}`;
}

const SYMBOLS = { kN: 'k_N', kA: 'k_A', Ea: 'E_a', A: 'A', dH: 'ΔH‡', dS: 'ΔS‡' };

const valueText = (v, unit) => (v ? `${v.value}${v.uncertainty !== undefined ? ` ± ${v.uncertainty}` : ''} ${v.unit ?? unit ?? ''}`.trim() : 'not given');
// A fit through two points has no standard error (null): its value is shown alone.
const estimateText = (e) => (e ? (typeof e.standardError === 'number' ? `${num(e.value)} ± ${num(e.standardError)} ${e.unit}` : `${num(e.value)} ${e.unit} (SE not defined)`) : '–');

/** Reported against refit, with the tolerance each is judged by. */
function comparisonTable(payload, refit, settings) {
  const rows = (payload.runs ?? []).map((run, i) => [`k_obs, run ${run.label}`, valueText(run.reported?.k), estimateText(refit?.runs?.[i]?.k?.instructor), tolerance(settings?.tolerances?.k)]);
  // Every value reported for the submission as a whole beside the refit's value of the same name
  // (k_N and k_A, E_a and A, ...), whatever the kind.
  const isEstimate = (e) => e && typeof e.value === 'number';
  // In the order of SYMBOLS (a stored payload's keys may come back in another order), then any other.
  const known = Object.keys(SYMBOLS).filter((key) => payload.reported?.[key] || isEstimate(refit?.[key]));
  const keys = [...known, ...Object.keys(payload.reported ?? {}).filter((key) => !known.includes(key))];
  for (const key of keys) rows.push([SYMBOLS[key] ?? key, valueText(payload.reported?.[key]), estimateText(isEstimate(refit?.[key]) ? refit[key] : undefined), tolerance(settings?.tolerances?.[key], settings?.units?.[key])]);
  return h(
    'table',
    { class: 'comparison' },
    h('caption', {}, 'Reported values against the refit from the student’s own readings'),
    h('thead', {}, h('tr', {}, ['Quantity', 'Reported', 'Refit', 'Tolerance'].map((t) => h('th', { scope: 'col' }, t)))),
    h('tbody', {}, rows.map(([q, ...cells]) => h('tr', {}, h('th', { scope: 'row' }, q), cells.map((c) => h('td', {}, c))))),
  );
}

function plots(payload, refit, settings, findings) {
  const runs = (payload.runs ?? []).map((run, i) => runPlotSeries(run, refit?.runs?.[i], settings, findings, i)).filter((r) => r && r.points.length > 0);
  const out = [];
  // One time unit on one axis: runs in another unit are left out of the plot, never rescaled silently.
  if (runs.length) out.push(lnFPlot(runs.filter((r) => r.timeUnit === runs[0].timeUnit), runs[0].timeUnit));
  const law = refit?.kN && refit?.kA ? rateLawPlotSeries(payload, refit, settings) : undefined;
  if (law) out.push(ratePlot(law));
  const notes = [...runs.flatMap((r) => r.notes.map((n) => `Run ${r.label}: ${n}.`)), ...(law?.notes ?? []).map((n) => `Rate law: ${n}.`)];
  return out.length
    ? h(
        'figure',
        { class: 'plots' },
        out,
        h('figcaption', { class: 'hint' }, 'Drawn from the refit of the student’s own readings: points are ln F of each reading, solid lines the refit k_obs, dashed lines the student’s k_obs (for a run with a finding, or where theirs differs); in the second plot, k_obs of each run against its catalyst concentration, with the refit line k_N + k_A [catalyst] and the student’s.'),
        notes.length ? h('ul', { class: 'hint' }, notes.map((n) => h('li', {}, n))) : null,
      )
    : h('p', { class: 'hint' }, refit ? 'The plots of this kind of experiment are on the feedback sheet.' : 'No refit to plot.');
}

/** One student's latest result: findings by stage, overrides, the comparison, the plots, the versions. */
export async function studentView(place, submissionId, failure) {
  const base = `#/section/${place.section.id}/assignment/${place.assignment.id}`;
  let view = await api('GET', `/v1/submissions/${submissionId}`);
  const [history, assignment] = await Promise.all([
    api('GET', `/v1/sections/${place.section.id}/students/${encodeURIComponent(view.studentId)}/history?assignmentId=${place.assignment.id}`),
    api('GET', `/v1/assignments/${place.assignment.id}`),
  ]);
  const root = h('div', { class: 'student-view' });

  async function override(findingId, pointsLost, reason, showReason, message) {
    try {
      view = await api('POST', `/v1/submissions/${submissionId}/overrides`, { findingId, pointsLost, reason, showReason });
      draw();
      root.querySelector('[role=status]')?.focus();
    } catch (error) {
      if (error.status === 400) message.textContent = error.details.map((d) => `${d.path.replace('body.', '')}: ${d.message}`).join('; ') || error.message;
      else failure(error);
    }
  }

  async function chooseSignal(sig, onSheet) {
    try {
      view = await api('POST', `/v1/submissions/${submissionId}/signals`, { code: sig.code, path: sig.path, onSheet });
      draw();
    } catch (error) {
      failure(error);
    }
  }

  function signalItem(sig) {
    const trail = view.signalChoices.filter((c) => c.code === sig.code && c.path === sig.path);
    return h(
      'li',
      { class: sig.onSheet ? 'signal on-sheet' : 'signal' },
      h('p', {}, h('code', {}, sig.code), ' ', sig.message),
      h(
        'p',
        { class: 'signal-choice' },
        h('span', {}, sig.onSheet ? 'On the student’s sheet. ' : 'Not on the student’s sheet. '),
        h('button', { type: 'button', onclick: () => chooseSignal(sig, !sig.onSheet) }, sig.onSheet ? 'Take it off the sheet' : 'Show it on the sheet'),
      ),
      trail.length ? h('ul', { class: 'trail' }, trail.map((c) => h('li', {}, `${when(c.at)}: ${c.by} ${c.onSheet ? 'put it on' : 'took it off'} the sheet`))) : null,
    );
  }

  function findingCard(f) {
    const trail = view.overrides.filter((o) => o.findingId === f.id);
    const message = h('p', { class: 'form-error', role: 'alert' });
    const key = f.id.replace(/[^A-Za-z0-9]/g, '-');
    const points = h('input', { id: `points-${key}`, type: 'number', min: '0', step: '0.5', value: String(f.pointsLost), required: true });
    const reason = h('textarea', { id: `reason-${key}`, rows: '2', required: true, minlength: '3' });
    const showReason = h('input', { id: `show-reason-${key}`, type: 'checkbox' });
    const form = h(
      'form',
      { class: 'override', onsubmit: (e) => (e.preventDefault(), override(f.id, Number(points.value), reason.value, showReason.checked, message)) },
      h('label', { for: `points-${key}` }, 'Points lost'),
      points,
      h('label', { for: `reason-${key}` }, 'Reason (kept in the audit trail)'),
      reason,
      h('label', { class: 'check', for: `show-reason-${key}` }, showReason, ' Show the reason to the student (on the feedback sheet)'),
      h('button', { type: 'submit' }, 'Save the change'),
      message,
    );
    return h(
      'li',
      { class: `finding ${f.severity}` },
      h('p', { class: 'finding-head' }, h('span', { class: `badge ${f.severity}` }, f.severity), ' ', h('code', {}, f.code), ' · ', h('span', {}, `${num(f.pointsLost)} point${f.pointsLost === 1 ? '' : 's'} lost`), f.override ? h('span', { class: 'overridden' }, ` (changed from ${num(f.override.originalPointsLost)} by ${f.override.by})`) : null),
      h('p', {}, f.message),
      h('p', { class: 'hint' }, h('code', {}, f.path)),
      trail.length ? h('ul', { class: 'trail' }, trail.map((o) => h('li', {}, `${when(o.at)}: ${o.by} changed ${num(o.pointsBefore)} to ${num(o.pointsAfter)} points lost: “${o.reason}”${o.reasonShown ? ' (shown to the student)' : ''}`))) : null,
      h('details', {}, h('summary', {}, 'Change the points of this finding'), form),
    );
  }

  function draw() {
    const result = view.result;
    const findings = result?.findings ?? [];
    const versions = h(
      'select',
      { id: 'version', onchange: (e) => (location.hash = `${base}/submission/${e.target.value}`) },
      history.map((v) => h('option', { value: String(v.submissionId), selected: v.submissionId === submissionId }, `version ${v.version}, ${when(v.submittedAt)}${v.result ? `, ${v.result.score ?? '–'} / ${v.result.maxScore}` : ''}`)),
    );
    const releaseArea = h('div', { class: 'release' });
    const askRelease = () =>
      askToConfirm(releaseArea, {
        question: `Release this result (${view.studentId}, version ${view.version}) to the student?`,
        yes: 'Release to the student',
        act: async () => {
          await api('POST', `/v1/submissions/${submissionId}/release`);
          view = await api('GET', `/v1/submissions/${submissionId}`);
          draw();
        },
        cancel: draw,
        failure,
      });
    const release = view.release;
    // Only the latest version can be released: a student sees their latest release of any version.
    const latestVersion = Math.max(...history.map((v) => v.version));
    const releaseButton = (label) =>
      view.version < latestVersion ? h('p', {}, `Version ${latestVersion} is the latest; only it can be released.`) : h('button', { type: 'button', class: 'primary', onclick: askRelease, disabled: !result }, label);
    releaseArea.append(
      ...(release && !release.changedSinceRelease
        ? [h('p', {}, `Released ${when(release.at)}.`)]
        : release
          ? [
              h(
                'p',
                { class: 'changed-note' },
                release.version === view.version
                  ? `Released ${when(release.at)} with a score of ${num(release.score)}; changed since (a regrade or an override): the student still sees the released result.`
                  : `Version ${release.version} released ${when(release.at)} with a score of ${num(release.score)}: the student still sees it until this version is released.`,
              ),
              releaseButton('Release the new result…'),
            ]
          : [releaseButton('Release this result…')]),
    );
    fill(root,
      h('p', { class: 'crumbs' }, h('a', { href: '#/' }, 'Your sections'), ' / ', h('a', { href: base }, `Section ${place.section.name} · ${place.assignment.title}`)),
      h('h1', {}, `Student ${view.studentId}`),
      h('div', { class: 'toolbar' }, h('div', {}, h('label', { for: 'version' }, 'Version '), versions), releaseArea, h('nav', { class: 'downloads', 'aria-label': 'Downloads' }, h('a', { href: `/v1/submissions/${submissionId}/feedback.pdf`, download: '' }, 'Feedback sheet (PDF)'))),
      h('p', { class: 'score', role: 'status', tabindex: '-1' }, result ? (result.status === 'checked' ? `Score ${num(result.score)} of ${num(result.maxScore)}` : 'Refused by the checker: the data could not be graded') : 'Not graded yet'),
      h('p', { class: 'caution' }, 'Each cause named below is a likely cause read from the numbers, for you to review: not a verdict. You can change the points of any finding, with a reason; nothing reaches the student until you release it.'),
      result?.status === 'rejected' ? h('ul', {}, (result.rejected ?? []).map((r) => h('li', {}, h('code', {}, r.path), ` ${r.message}`))) : null,
      // The kind's stages, in its order; a finding of a stage the kind no longer names still shows, last.
      ...[...assignment.stages, ...[...new Set(findings.map((f) => f.stage))].filter((id) => !assignment.stages.some((s) => s.id === id)).map((id) => ({ id, title: id }))].map(({ id, title }) => {
        const here = findings.filter((f) => f.stage === id);
        return here.length ? h('section', { class: 'stage' }, h('h2', {}, ...marked(title)), h('ul', { class: 'findings' }, here.map(findingCard))) : null;
      }),
      findings.length === 0 && result?.status === 'checked' ? h('p', {}, 'No findings: every checked value agrees with the refit.') : null,
      result?.signals?.length
        ? h(
            'section',
            { class: 'panel signals' },
            h('h2', {}, 'For review: how the runs were measured'),
            h('p', { class: 'hint' }, 'What the readings suggest about the measurement. Prompts to look and ask, not findings: no points depend on them, and one reaches the student’s sheet only if you show it there.'),
            h('ul', {}, result.signals.map(signalItem)),
          )
        : null,
      h('section', {}, h('h2', {}, 'Reported and refitted'), comparisonTable(view.payload ?? {}, result?.refit, assignment.settings), plots(view.payload ?? {}, result?.refit, assignment.settings, findings)),
    );
  }
  draw();
  return root;
}
