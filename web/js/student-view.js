import { api, ApiFailure } from './api.js';
import { fill, h, marked, num, when } from './dom.js';
import { askToConfirm } from './confirm.js';
import { kindDescription } from './kinds.js';
import { comparisonTable, plotFigures, pointsText, rejectedList, stageSections } from './display-parts.js';

/**
 * @import { Failure } from './api.js'
 * @import { Place } from './place.js'
 * @import { DisplayPlace, SubmissionDisplay } from '../../schemas/display.ts'
 * @import { CheckResult, Finding, Signal } from '../../schemas/result.ts'
 * @import { SubmissionVersion, SubmissionView } from '../../schemas/api/submissions.ts'
 */
/**
 * A result as the service sends it, with the TAs' overrides applied. The schema lets a check result's
 * fields through unnamed; these are the ones the page reads.
 * @typedef {{ status: CheckResult['status'], score: number | null, maxScore: number, findings: Array<Finding & { override?: { originalPointsLost: number, by: string } }>, signals?: Signal[] }} Result
 * @typedef {Omit<SubmissionView, 'result'> & { result: Result | null }} View
 */

/**
 * One student's latest result: findings by stage, overrides, the comparison, the plots, the versions.
 * @param {Place} place
 * @param {number} submissionId
 * @param {Failure} failure
 */
export async function studentView(place, submissionId, failure) {
  const base = `#/section/${place.section.id}/assignment/${place.assignment.id}`;
  const displayUrl = `/v1/submissions/${submissionId}/display`;
  const [viewBody, displayBody, kind] = await Promise.all([api('GET', `/v1/submissions/${submissionId}`), api('GET', displayUrl), kindDescription(place.assignment.kind)]);
  // The kind's words for its signals; a kind the service no longer describes shows the codes alone.
  const signalWords = new Map((kind?.signals.codes ?? []).map((c) => [c.code, c.label]));
  let view = /** @type {View} */ (viewBody);
  let display = /** @type {SubmissionDisplay} */ (displayBody);
  const history = /** @type {SubmissionVersion[]} */ (await api('GET', `/v1/sections/${place.section.id}/students/${encodeURIComponent(view.studentId)}/history?assignmentId=${place.assignment.id}`));
  const root = h('div', { class: 'student-view' });

  /**
   * @param {string} findingId
   * @param {number} pointsLost
   * @param {string} reason
   * @param {boolean} showReason
   * @param {HTMLElement} message where a refusal is shown
   */
  async function override(findingId, pointsLost, reason, showReason, message) {
    try {
      view = /** @type {View} */ (await api('POST', `/v1/submissions/${submissionId}/overrides`, { findingId, pointsLost, reason, showReason }));
      // The cards' points come with the display, made again from the result with the override.
      display = /** @type {SubmissionDisplay} */ (await api('GET', displayUrl));
      draw();
      /** @type {HTMLElement | null} */ (root.querySelector('[role=status]'))?.focus();
    } catch (error) {
      if (error instanceof ApiFailure && error.status === 400) message.textContent = error.details.map((d) => `${d.path.replace('body.', '')}: ${d.message}`).join('; ') || error.message;
      else failure(error);
    }
  }

  /**
   * @param {Signal} sig
   * @param {boolean} onSheet
   */
  async function chooseSignal(sig, onSheet) {
    try {
      view = /** @type {View} */ (await api('POST', `/v1/submissions/${submissionId}/signals`, { code: sig.code, path: sig.path, onSheet }));
      draw();
    } catch (error) {
      failure(error);
    }
  }

  /** @param {Signal} sig */
  function signalItem(sig) {
    const trail = view.signalChoices.filter((c) => c.code === sig.code && c.path === sig.path);
    return h(
      'li',
      { class: sig.onSheet ? 'signal on-sheet' : 'signal' },
      h('p', {}, signalWords.has(sig.code) ? [h('strong', {}, signalWords.get(sig.code)), ' '] : null, h('code', {}, sig.code), ' ', sig.message),
      h(
        'p',
        { class: 'signal-choice' },
        h('span', {}, sig.onSheet ? 'On the student’s sheet. ' : 'Not on the student’s sheet. '),
        h('button', { type: 'button', onclick: () => chooseSignal(sig, !sig.onSheet) }, sig.onSheet ? 'Take it off the sheet' : 'Show it on the sheet'),
      ),
      trail.length ? h('ul', { class: 'trail' }, trail.map((c) => h('li', {}, `${when(c.at)}: ${c.by} ${c.onSheet ? 'put it on' : 'took it off'} the sheet`))) : null,
    );
  }

  /**
   * One place of a card, for the TA: the checker's code and path, the override trail and the form to
   * change its points.
   * @param {DisplayPlace} p
   * @param {boolean} alone whether the card has this place only
   */
  function placeDetail(p, alone) {
    const f = (view.result?.findings ?? []).find((x) => x.id === p.findingId);
    const trail = view.overrides.filter((o) => o.findingId === p.findingId);
    const message = h('p', { class: 'form-error', role: 'alert' });
    const key = p.findingId.replace(/[^A-Za-z0-9]/g, '-');
    const points = h('input', { id: `points-${key}`, type: 'number', min: '0', step: '0.5', value: String(p.pointsLost), required: true });
    const reason = h('textarea', { id: `reason-${key}`, rows: '2', required: true, minlength: '3' });
    const showReason = h('input', { id: `show-reason-${key}`, type: 'checkbox' });
    const form = h(
      'form',
      { class: 'override', onsubmit: (/** @type {Event} */ e) => (e.preventDefault(), override(p.findingId, Number(points.value), reason.value, showReason.checked, message)) },
      h('label', { for: `points-${key}` }, 'Points lost'),
      points,
      h('label', { for: `reason-${key}` }, 'Reason (kept in the audit trail)'),
      reason,
      h('label', { class: 'check', for: `show-reason-${key}` }, showReason, ' Show the reason to the student (on the feedback sheet)'),
      h('button', { type: 'submit' }, 'Save the change'),
      message,
    );
    return [
      f?.override ? h('p', { class: 'overridden' }, ...(alone ? [] : [...marked(p.place), ': ']), `${pointsText(p.pointsLost)} (changed from ${num(f.override.originalPointsLost)} by ${f.override.by})`) : null,
      trail.length ? h('ul', { class: 'trail' }, trail.map((o) => h('li', {}, `${when(o.at)}: ${o.by} changed ${num(o.pointsBefore)} to ${num(o.pointsAfter)} points lost: “${o.reason}”${o.reasonShown ? ' (shown to the student)' : ''}`))) : null,
      h(
        'details',
        { class: 'place-detail' },
        h('summary', {}, ...(alone ? ['Change the points of this finding'] : ['Change the points at ', ...marked(p.place)])),
        h('p', { class: 'hint' }, h('code', {}, p.code), ' at ', h('code', { class: 'path' }, p.path)),
        form,
      ),
    ];
  }

  function draw() {
    const result = view.result;
    const versions = h(
      'select',
      { id: 'version', onchange: () => { location.hash = `${base}/submission/${versions.value}`; } },
      history.map((v) => h('option', { value: String(v.submissionId), selected: v.submissionId === submissionId }, `version ${v.version}, ${when(v.submittedAt)}${v.result ? `, ${v.result.score ?? '–'} / ${v.result.maxScore}` : ''}`)),
    );
    const releaseArea = h('div', { class: 'release' });
    const askRelease = () =>
      askToConfirm(releaseArea, {
        question: `Release this result (${view.studentId}, version ${view.version}) to the student?`,
        yes: 'Release to the student',
        act: async () => {
          await api('POST', `/v1/submissions/${submissionId}/release`);
          view = /** @type {View} */ (await api('GET', `/v1/submissions/${submissionId}`));
          draw();
        },
        cancel: draw,
        failure,
      });
    const release = view.release;
    // Only the latest version can be released: a student sees their latest release of any version.
    const latestVersion = Math.max(...history.map((v) => v.version));
    const acceptLate = async () => {
      try {
        await api('POST', `/v1/submissions/${submissionId}/accept-late`);
        view = /** @type {View} */ (await api('GET', `/v1/submissions/${submissionId}`));
        draw();
      } catch (error) {
        failure(error);
      }
    };
    // Late work held under the assignment's setting is released only once a TA accepts it.
    const releaseButton = (/** @type {string} */ label) =>
      view.version < latestVersion
        ? h('p', {}, `Version ${latestVersion} is the latest; only it can be released.`)
        : view.held
          ? h('p', { class: 'changed-note' }, 'Handed in after the deadline and held until accepted. ', h('button', { type: 'button', onclick: acceptLate }, 'Accept late work'))
          : h('button', { type: 'button', class: 'primary', onclick: askRelease, disabled: !result }, label);
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
      view.late && !view.held ? h('p', { class: 'late-mark' }, 'Handed in after the deadline.') : null,
      h('div', { class: 'toolbar' }, h('div', {}, h('label', { for: 'version' }, 'Version '), versions), releaseArea, h('nav', { class: 'downloads', 'aria-label': 'Downloads' }, h('a', { href: `/v1/submissions/${submissionId}/feedback.pdf`, download: '' }, 'Feedback sheet (PDF)'))),
      h('p', { class: 'score', role: 'status', tabindex: '-1' }, result ? (result.status === 'checked' ? `Score ${num(result.score)} of ${num(result.maxScore)}` : 'Refused by the checker: the data could not be graded') : 'Not graded yet'),
      h('p', { class: 'caution' }, 'Each cause named below is a likely cause read from the numbers, for you to review: not a verdict. You can change the points of any finding, with a reason; nothing reaches the student until you release it.'),
      rejectedList(display.rejected),
      display.counts && display.stages.length ? h('p', { class: 'counts' }, display.counts) : null,
      stageSections(display, placeDetail),
      display.stages.length === 0 && result?.status === 'checked' ? h('p', {}, 'No findings: every checked value agrees with the refit.') : null,
      result?.signals?.length
        ? h(
            'section',
            { class: 'panel signals' },
            h('h2', {}, `For review: how the ${kind?.signals.unit ?? 'part'}s were measured`),
            h('p', { class: 'hint' }, 'What the readings suggest about the measurement. Prompts to look and ask, not findings: no points depend on them, and one reaches the student’s sheet only if you show it there.'),
            h('ul', {}, result.signals.map(signalItem)),
          )
        : null,
      display.comparison || display.plots.length ? h('section', {}, h('h2', {}, 'Reported and refitted'), display.comparison ? comparisonTable(display.comparison) : null, plotFigures(display.plots, 'Drawn as on the feedback sheet, from the refit of the student’s own data: solid lines are the refit, dashed lines the student’s own values.')) : null,
    );
  }
  draw();
  return root;
}
