import { api, ApiFailure } from './api.js';
import { fill, h, marked, plain } from './dom.js';
import { kinds } from './kinds.js';

/**
 * @import { Failure } from './api.js'
 * @import { Assignment } from '../../schemas/api/assignments.ts'
 * @import { FormField, KindDescription } from '../../schemas/api/kinds.ts'
 */
/**
 * @typedef {object} SettingsFormOptions
 * @property {Assignment} [assignment] to edit
 * @property {number} [courseId] where a new assignment goes
 * @property {(saved: Assignment) => void} done
 * @property {Failure} failure
 */
/**
 * A field's controls and how its value is read back into the settings.
 * @typedef {{ field: FormField, focus: HTMLElement, read: () => unknown }} Control
 */

let formCount = 0;

/**
 * An assignment's settings as a form drawn from its kind's description, which the service makes from
 * the kind's settings schema. The service validates the settings with the same schema as the API and
 * its messages appear beside the fields they name. Parts the form does not show (a class dataset,
 * reference bands) are kept as they are.
 * `assignment` to edit, or undefined for a new one in `courseId`; `done(saved)` after a save, `failure`
 * for what the form cannot show.
 * @param {SettingsFormOptions} options
 */
export function settingsForm(options) {
  const holder = h('div', {}, h('p', { class: 'hint' }, 'Loading the kinds of experiment…'));
  kinds().then((list) => {
    if (options.assignment) {
      const kind = list.find((k) => k.kind === options.assignment?.kind);
      fill(holder, kind ? kindForm(options, kind) : h('p', { class: 'form-error' }, 'The service no longer knows this kind of experiment; its settings cannot be edited here.'));
      return;
    }
    const form = h('div', {});
    /** @type {HTMLSelectElement} */
    const choice = h('select', { id: `kind-${++formCount}`, onchange: () => show() }, list.map((k) => h('option', { value: k.kind }, k.title)));
    const show = () => fill(form, kindForm(options, list[choice.selectedIndex]));
    show();
    fill(holder, h('div', { class: 'field kind-choice' }, h('label', { for: choice.id }, 'Kind of experiment'), choice), form);
  }, options.failure);
  return holder;
}

/**
 * The value at a dotted path of the settings, if there is one.
 * @param {unknown} settings
 * @param {string} path
 * @returns {unknown}
 */
function valueAt(settings, path) {
  /** @type {any} */
  let at = settings;
  for (const part of path.split('.')) at = at && typeof at === 'object' ? at[part] : undefined;
  return at;
}

/**
 * A number as the input shows it: a share in per cent without binary noise (0.07 → 7).
 * @param {number | undefined} value
 * @param {number} [scale]
 */
const shown = (value, scale = 1) => (value === undefined || value === null ? '' : String(Number((value * scale).toPrecision(12))));

/**
 * A number input's value for the settings: empty or unreadable is sent as it is, for the schema to name.
 * @param {HTMLInputElement} input
 * @param {number} [scale]
 */
function numberOf(input, scale = 1) {
  if (input.value.trim() === '') return null;
  return Number(input.value) / scale;
}

/**
 * The controls of one field, with the value it starts from.
 * @param {FormField} field
 * @param {unknown} value the stored value, undefined for a new assignment
 * @param {string} id
 * @returns {{ controls: HTMLElement[], control: Control }}
 */
function controlsOf(field, value, id) {
  switch (field.type) {
    case 'select': {
      /** @type {HTMLSelectElement} */
      const select = h('select', { id }, field.options.map((o) => h('option', { value: o.value, selected: o.value === (value ?? field.default) }, plain(o.label))));
      return { controls: [select], control: { field, focus: select, read: () => select.value } };
    }
    case 'boolean': {
      /** @type {HTMLInputElement} */
      const box = h('input', { id, type: 'checkbox', checked: Boolean(value ?? field.default) });
      return { controls: [box], control: { field, focus: box, read: () => box.checked } };
    }
    case 'text': {
      /** @type {HTMLInputElement} */
      const input = h('input', { id, type: 'text', value: typeof value === 'string' ? value : field.default });
      return { controls: [input], control: { field, focus: input, read: () => input.value } };
    }
    case 'number': {
      const start = typeof value === 'number' ? value : field.default;
      /** @type {HTMLInputElement} */
      const input = h('input', { id, type: 'number', step: field.integer ? '1' : 'any', value: shown(start), ...(field.max !== undefined && { max: String(field.max) }), ...(field.min !== undefined && !field.minExclusive && { min: String(field.min) }) });
      // An optional setting left empty is sent as null: not set (a PUT states every setting the assignment has).
      return { controls: [input], control: { field, focus: input, read: () => numberOf(input) } };
    }
    case 'tolerance': {
      // A tolerance is kept whole: relative or absolute, the other part replaced, not merged.
      const start = /** @type {{ relative?: number, absolute?: number } | undefined} */ (value) ?? field.default;
      const relative = start.relative !== undefined;
      /** @type {HTMLInputElement} */
      const input = h('input', { id, type: 'number', step: 'any', min: '0', value: relative ? shown(start.relative, 100) : shown(start.absolute) });
      /** @type {HTMLSelectElement} */
      const how = h('select', { 'aria-label': `${plain(field.label)}: relative or absolute` }, h('option', { value: 'relative', selected: relative }, '% of value'), h('option', { value: 'absolute', selected: !relative }, 'absolute'));
      const read = () => (how.value === 'relative' ? { relative: numberOf(input, 100) } : { absolute: numberOf(input) });
      return { controls: [h('span', { class: 'tolerance' }, input, how)], control: { field, focus: input, read } };
    }
  }
}

/**
 * @param {SettingsFormOptions} options
 * @param {KindDescription} kind
 */
function kindForm({ courseId, assignment, done, failure }, kind) {
  const n = ++formCount;
  /** @param {string} path */
  const id = (path) => `f${n}-${path.replace(/\./g, '-')}`;
  /** @type {Control[]} */
  const controls = [];
  /** @type {Map<string, HTMLSpanElement>} */
  const messages = new Map();

  /**
   * @param {string} path
   * @param {string} label
   * @param {HTMLElement[]} inputs
   * @param {string} [hint]
   * @param {HTMLElement} [described] the control the label and message belong to
   */
  function fieldBox(path, label, inputs, hint, described = inputs[0]) {
    const message = h('span', { class: 'form-error', id: `${id(path)}-message`, role: 'alert' });
    described.setAttribute('aria-describedby', message.id);
    messages.set(path, message);
    // A yes-or-no reads as the box and its words on one line.
    const labelled = described instanceof HTMLInputElement && described.type === 'checkbox' ? [h('label', { class: 'check' }, ...inputs, ' ', marked(label))] : [h('label', { for: id(path) }, marked(label)), ...inputs];
    return h('div', { class: 'field' }, ...labelled, hint ? h('span', { class: 'hint' }, hint) : null, message);
  }

  /** @param {FormField} field */
  function fieldOf(field) {
    const { controls: inputs, control } = controlsOf(field, valueAt(assignment?.settings, field.name), id(field.name));
    controls.push(control);
    const unit = field.type === 'number' && field.unit ? `, ${field.unit}` : '';
    const absoluteIn = field.type === 'tolerance' && field.unit ? `absolute in ${field.unit}` : undefined;
    const help = [field.help, field.type === 'number' && field.optional && !field.help ? 'optional' : undefined, absoluteIn].filter(Boolean).join('; ');
    const box = fieldBox(field.name, `${field.label}${unit}`, inputs, help || undefined, control.focus);
    // A choice worded at length takes two columns, so that it reads whole.
    if (field.type === 'select' && Math.max(...field.options.map((o) => plain(o.label).length)) > 24) box.classList.add('wide');
    return box;
  }

  /** @type {HTMLInputElement} */
  const titleInput = h('input', { id: id('title'), type: 'text', required: true });
  const summary = h('p', { class: 'form-error', role: 'alert' });
  const form = h(
    'form',
    { class: 'settings', novalidate: true, onsubmit: (e) => (e.preventDefault(), save()) },
    assignment ? null : fieldBox('title', 'Title', [titleInput]),
    kind.settings.form.map((group) => h('fieldset', {}, h('legend', {}, group.label), group.help ? h('p', { class: 'hint' }, group.help) : null, group.fields.map(fieldOf))),
    h('p', { class: 'hint' }, [kind.settings.note, 'Saving changes no result until you regrade.'].filter(Boolean).join(' ')),
    h('button', { type: 'submit', class: 'primary' }, assignment ? 'Save the settings' : 'Create the assignment'),
    summary,
  );

  function read() {
    // Walked by the fields' paths (`tolerances.k`), so indexed by name.
    /** @type {Record<string, any>} */
    const settings = { ...structuredClone(assignment?.settings ?? {}), kind: kind.kind };
    for (const { field, read: value } of controls) {
      const parts = field.name.split('.');
      let target = settings;
      for (const p of parts.slice(0, -1)) target = target[p] = { ...(target[p] ?? {}) };
      target[parts[parts.length - 1]] = value();
    }
    return settings;
  }

  /**
   * The field a message of the service belongs to: the one whose path is the message's or holds it
   * (`tolerances.k.relative` belongs to the tolerance `tolerances.k`).
   * @param {string} path
   */
  const fieldFor = (path) => [...messages.keys()].filter((name) => path === name || path.startsWith(`${name}.`)).sort((a, b) => b.length - a.length)[0];

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
      /** @type {string | undefined} */
      let first;
      for (const d of error.details) {
        const path = d.path.replace(/^body\.(settings\.)?/, '');
        const name = fieldFor(path);
        const message = name === undefined ? undefined : messages.get(name);
        if (message) {
          message.textContent = d.message;
          first ??= name;
        } else unplaced.push(`${path}: ${d.message}`);
      }
      summary.textContent = `The settings were not saved: ${error.details.length} field${error.details.length === 1 ? '' : 's'} to correct${unplaced.length ? ` (${unplaced.join('; ')})` : ''}.`;
      if (first === 'title') titleInput.focus();
      else controls.find((c) => c.field.name === first)?.focus.focus();
    }
  }
  return form;
}
