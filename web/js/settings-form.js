import { api, ApiFailure } from './api.js';
import { fill, h } from './dom.js';

/**
 * @import { Failure } from './api.js'
 * @import { Tolerance } from '../../schemas/common.ts'
 * @import { Assignment } from '../../schemas/api/assignments.ts'
 * @import { Rubric, Settings, SettingsInput, Tolerances } from '../../kinds/first-order-catalysis/schemas.ts'
 */
/** @typedef {[value: string, label: string][]} Choices */
/**
 * @typedef {object} SettingsFormOptions
 * @property {Assignment} [assignment] to edit
 * @property {number} [courseId] where a new assignment goes
 * @property {(saved: Assignment) => void} done
 * @property {Failure} failure
 */

/**
 * An assignment's settings as a form. The service validates them with the same schema as the API and
 * its messages appear beside the fields they name. Parts the form does not show (a class dataset,
 * reference bands) are kept as they are.
 */
/** @type {Record<'fitModel' | 'rateLawFit' | 'weightedErrors', Choices>} */
const CHOICES = {
  fitModel: [['origin', 'ln F = -k t (through the origin)'], ['intercept', 'ln F = a - k t (with an intercept)']],
  rateLawFit: [['ordinary', 'ordinary least squares'], ['weighted', 'weighted by 1/SE² of each k_obs']],
  weightedErrors: [['either', 'either convention'], ['absolute', 'SEs of k_obs taken as absolute'], ['scaled', 'scaled by the scatter about the line']],
};
/** @type {['k' | 'kN' | 'kA', string][]} */
const UNITS = [['k', 'k_obs'], ['kN', 'k_N'], ['kA', 'k_A']];
// [key, label, kind]: relative tolerances are shown in per cent, absolute ones in the quantity's unit.
/** @type {[keyof Tolerances, string, 'relative' | 'absolute'][]} */
const TOLERANCES = [
  ['reading', 'Readings (deg)', 'absolute'],
  ['lnF', 'ln F entries', 'absolute'],
  ['k', 'k_obs', 'relative'],
  ['kUncertainty', 'SE of k_obs', 'relative'],
  ['kN', 'k_N', 'relative'],
  ['kA', 'k_A', 'relative'],
  ['rateLawUncertainty', 'SEs of k_N and k_A', 'relative'],
];
/** @type {[keyof Rubric, string][]} */
const RUBRIC = [
  ['readings', 'Readings, per run (with a class dataset)'],
  ['lnF', 'ln F column, per run'],
  ['k', 'k_obs, per run'],
  ['kUncertainty', 'SE of k_obs, per run'],
  ['kN', 'k_N'],
  ['kNUncertainty', 'SE of k_N'],
  ['kA', 'k_A'],
  ['kAUncertainty', 'SE of k_A'],
  ['sigFigs', 'Rounding, once'],
];

/**
 * The schema's defaults, which a new assignment's form starts from.
 * @satisfies {SettingsInput}
 */
const DEFAULTS = {
  kind: 'first-order-catalysis',
  fitModel: 'origin',
  rateLawFit: 'ordinary',
  weightedErrors: 'either',
  units: { k: 'min^-1', kN: 'min^-1', kA: 'M^-1 min^-1' },
  tolerances: { reading: { absolute: 0.0005 }, lnF: { absolute: 0.002 }, k: { relative: 0.01 }, kUncertainty: { relative: 0.25 }, kN: { relative: 0.02 }, kA: { relative: 0.02 }, rateLawUncertainty: { relative: 0.25 } },
  rubric: { readings: 1, lnF: 1, k: 2, kUncertainty: 1, kN: 2, kNUncertainty: 1, kA: 2, kAUncertainty: 1, sigFigs: 0 },
};

/** Settings that may be left out (empty means unset), and those that are yes or no. */
const OPTIONAL = new Set(['instrumentNoise']);
const BOOLEAN = new Set(['temperature.required']);

let formCount = 0;

/**
 * The kinds of experiment an assignment can be, with their names in words.
 * @type {Choices}
 */
const KINDS = [
  ['first-order-catalysis', 'First-order runs and the catalysis rate law'],
  ['temperature-dependence', 'Rate constants at several temperatures (Arrhenius, Eyring)'],
];

/**
 * `assignment` to edit, or undefined for a new one in `courseId`; `done(saved)` after a save, `failure`
 * for what the form cannot show. The first kind has a form of fields; any other kind's settings are
 * edited as JSON, which the service validates and answers field by field.
 * @param {SettingsFormOptions} options
 */
export function settingsForm(options) {
  if (options.assignment) return options.assignment.kind === DEFAULTS.kind ? catalysisForm(options) : jsonForm(options, options.assignment.kind);
  const holder = h('div', {});
  /** @type {HTMLSelectElement} */
  const kind = h('select', { id: `kind-${++formCount}`, onchange: () => show() }, KINDS.map(([value, text]) => h('option', { value }, text)));
  const show = () => fill(holder, kind.value === DEFAULTS.kind ? catalysisForm(options) : jsonForm(options, kind.value));
  show();
  return h('div', {}, h('div', { class: 'field' }, h('label', { for: kind.id }, 'Kind of experiment'), kind), holder);
}

/**
 * Settings as JSON text, saved as they are; the service's messages are listed by field.
 * @param {SettingsFormOptions} options
 * @param {string} kind
 */
function jsonForm({ courseId, assignment, done, failure }, kind) {
  const n = ++formCount;
  const text = h('textarea', { id: `json-${n}`, rows: '12', class: 'json-settings', spellcheck: 'false' });
  text.value = JSON.stringify(assignment?.settings ?? { kind }, null, 2);
  const title = h('input', { id: `title-${n}`, type: 'text', required: true });
  const messages = h('ul', { class: 'form-error', role: 'alert' });
  async function save() {
    fill(messages);
    let settings;
    try {
      settings = JSON.parse(text.value);
    } catch (error) {
      fill(messages, h('li', {}, `The settings are not valid JSON: ${/** @type {SyntaxError} */ (error).message}`));
      return text.focus();
    }
    try {
      const saved = assignment
        ? await api('PUT', `/v1/assignments/${assignment.id}/settings`, { settings })
        : await api('POST', `/v1/courses/${courseId}/assignments`, { title: title.value, settings });
      done(/** @type {Assignment} */ (saved));
    } catch (error) {
      if (!(error instanceof ApiFailure) || (error.status !== 400 && error.status !== 422)) return failure(error);
      fill(messages, error.details.map((d) => h('li', {}, `${d.path.replace(/^body\.(settings\.)?/, '')}: ${d.message}`)));
    }
  }
  return h(
    'form',
    { class: 'settings', novalidate: true, onsubmit: (e) => (e.preventDefault(), save()) },
    assignment ? null : h('div', { class: 'field' }, h('label', { for: title.id }, 'Title'), title),
    h('div', { class: 'field' }, h('label', { for: text.id }, 'Settings (JSON; docs/kinds/ lists the fields of each kind)'), text),
    h('button', { type: 'submit', class: 'primary' }, assignment ? 'Save the settings' : 'Create the assignment'),
    messages,
  );
}

/** @param {SettingsFormOptions} options */
function catalysisForm({ courseId, assignment, done, failure }) {
  const n = ++formCount;
  // Stored settings were parsed by the kind's schema, so every setting with a default is there.
  const current = { ...DEFAULTS, .../** @type {Partial<Settings>} */ (assignment?.settings ?? {}) };
  /** @type {Map<string, HTMLInputElement | HTMLSelectElement>} */
  const fields = new Map();
  /** @type {Map<string, HTMLSpanElement>} */
  const messages = new Map();
  /** @param {string} path */
  const id = (path) => `f${n}-${path.replace(/\./g, '-')}`;

  /**
   * @param {string} path
   * @param {string} label
   * @param {HTMLInputElement | HTMLSelectElement} control
   * @param {string} [hint]
   */
  function field(path, label, control, hint) {
    control.id = id(path);
    const message = h('span', { class: 'form-error', id: `${id(path)}-message`, role: 'alert' });
    control.setAttribute('aria-describedby', message.id);
    fields.set(path, control);
    messages.set(path, message);
    return h('div', { class: 'field' }, h('label', { for: control.id }, label), control, hint ? h('span', { class: 'hint' }, hint) : null, message);
  }
  /**
   * @param {string} path
   * @param {string} label
   * @param {Choices} options
   * @param {string} value
   */
  const select = (path, label, options, value) => field(path, label, h('select', {}, options.map(([v, text]) => h('option', { value: v, selected: v === value }, text))));
  /**
   * @param {string} path
   * @param {string} label
   * @param {number | undefined} value
   * @param {string} [hint]
   */
  const number = (path, label, value, hint) => field(path, label, h('input', { type: 'number', step: 'any', value: value === undefined ? '' : String(value) }), hint);

  const titleInput = h('input', { type: 'text', required: true });
  const title = assignment ? null : field('title', 'Title', titleInput);
  const summary = h('p', { class: 'form-error', role: 'alert' });
  /**
   * @param {keyof Tolerances} key
   * @returns {Tolerance}
   */
  const tol = (key) => current.tolerances?.[key] ?? DEFAULTS.tolerances[key];
  const form = h(
    'form',
    { class: 'settings', novalidate: true, onsubmit: (e) => (e.preventDefault(), save()) },
    title,
    h('fieldset', {}, h('legend', {}, 'Fits'), select('fitModel', 'ln F against t', CHOICES.fitModel, current.fitModel), select('rateLawFit', 'k_obs against [catalyst]', CHOICES.rateLawFit, current.rateLawFit), select('weightedErrors', 'Right SEs of a weighted fit', CHOICES.weightedErrors, current.weightedErrors)),
    h('fieldset', {}, h('legend', {}, 'Units values are reported in'), UNITS.map(([key, label]) => field(`units.${key}`, label, h('input', { type: 'text', value: current.units?.[key] ?? DEFAULTS.units[key] })))),
    h(
      'fieldset',
      {},
      h('legend', {}, 'Tolerances'),
      TOLERANCES.map(([key, label, kind]) => {
        const value = tol(key)[kind];
        return kind === 'relative' ? number(`tolerances.${key}.relative`, `${label}, %`, value === undefined ? undefined : Number((value * 100).toPrecision(12))) : number(`tolerances.${key}.absolute`, label, value);
      }),
    ),
    h(
      'fieldset',
      {},
      h('legend', {}, 'The instrument (for signals to review, never points)'),
      number('displayStep', 'Display step of a reading', current.displayStep ?? 0.001),
      number('instrumentNoise', 'Stated noise of one reading (SD)', current.instrumentNoise, 'optional: leave empty to compare with the section alone'),
      number('temperature.maxSpread', 'Largest spread of run temperatures, degC', current.temperature?.maxSpread ?? 1),
      select('temperature.required', 'Each run records its temperature', [['false', 'optional'], ['true', 'required']], String(current.temperature?.required ?? false)),
    ),
    h('fieldset', {}, h('legend', {}, 'Rubric points'), RUBRIC.map(([key, label]) => number(`rubric.${key}`, label, current.rubric?.[key] ?? DEFAULTS.rubric[key]))),
    h('p', { class: 'hint' }, 'A class dataset and reference bands, where set, are kept as they are (the API edits them). Saving changes no result until you regrade.'),
    h('button', { type: 'submit', class: 'primary' }, assignment ? 'Save the settings' : 'Create the assignment'),
    summary,
  );

  function read() {
    // Walked by the fields' paths (`tolerances.k.relative`), so indexed by name.
    /** @type {Record<string, any>} */
    const settings = structuredClone(current);
    for (const [path, control] of fields) {
      if (path === 'title') continue;
      const parts = path.split('.');
      let target = settings;
      for (const p of parts.slice(0, -1)) target = target[p] = { ...(target[p] ?? {}) };
      const last = parts[parts.length - 1];
      // An optional setting left empty is sent as null: not set (a PUT must state every setting the assignment has).
      if (OPTIONAL.has(path) && control.value.trim() === '') target[last] = null;
      else if (BOOLEAN.has(path)) target[last] = control.value === 'true';
      else if (control.type === 'number') {
        // An empty or unreadable number is sent as it is, for the schema to name.
        const value = control.value.trim() === '' ? null : Number(control.value);
        target[last] = value !== null && parts[0] === 'tolerances' && last === 'relative' ? value / 100 : value;
      } else target[last] = control.value;
    }
    // A tolerance kept whole: the other part of it is replaced, not merged.
    for (const [key, , kind] of TOLERANCES) settings.tolerances[key] = { [kind]: settings.tolerances[key][kind] };
    return settings;
  }

  async function save() {
    for (const m of messages.values()) m.textContent = '';
    summary.textContent = '';
    try {
      const saved = assignment
        ? await api('PUT', `/v1/assignments/${assignment.id}/settings`, { settings: read() })
        : await api('POST', `/v1/courses/${courseId}/assignments`, { title: titleInput.value, settings: read() });
      done(/** @type {Assignment} */ (saved));
    } catch (error) {
      if (!(error instanceof ApiFailure) || (error.status !== 400 && error.status !== 422)) return failure(error);
      const unplaced = [];
      for (const d of error.details) {
        const path = d.path.replace(/^body\.(settings\.)?/, '');
        const message = messages.get(path);
        if (message) message.textContent = d.message;
        else unplaced.push(`${path}: ${d.message}`);
      }
      summary.textContent = `The settings were not saved: ${error.details.length} field${error.details.length === 1 ? '' : 's'} to correct${unplaced.length ? ` (${unplaced.join('; ')})` : ''}.`;
      const first = error.details.map((d) => d.path.replace(/^body\.(settings\.)?/, '')).find((p) => fields.has(p));
      if (first) fields.get(first)?.focus();
    }
  }
  return form;
}
