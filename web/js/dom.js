/**
 * Building the page without HTML strings: every text, student-supplied or not, enters the document
 * as a text node or an attribute value, so a label like <img src=x onerror=...> is shown, never run.
 */

/**
 * A listener as a method's type, so that one written for a particular event (a DragEvent) is accepted.
 * @typedef {{ listen(event: Event): unknown }['listen']} Listener
 */
/**
 * Attributes (true for one present without a value; null, undefined and false for none), and `on…` listeners.
 * @typedef {{ [name: string]: string | number | boolean | null | undefined | Listener }} Props
 */
/** @typedef {Node | string | number | null | undefined | false} Child */
/**
 * A child, or a list of them (a list within the list is flattened too).
 * @typedef {Child | (Child | Child[])[]} Children
 */

/**
 * @template {keyof HTMLElementTagNameMap} K
 * @param {K} tag
 * @param {Props} [props]
 * @param {...Children} children
 * @returns {HTMLElementTagNameMap[K]}
 */
export function h(tag, props = {}, ...children) {
  const el = document.createElement(tag);
  setProps(el, props);
  append(el, children);
  return el;
}

const SVG = 'http://www.w3.org/2000/svg';

/**
 * @template {keyof SVGElementTagNameMap} K
 * @param {K} tag
 * @param {Props} [props]
 * @param {...Children} children
 * @returns {SVGElementTagNameMap[K]}
 */
export function s(tag, props = {}, ...children) {
  const el = document.createElementNS(SVG, tag);
  setProps(el, props);
  append(el, children);
  return el;
}

/**
 * @param {Element} el
 * @param {Props} props
 */
function setProps(el, props) {
  for (const [key, value] of Object.entries(props)) {
    if (value === undefined || value === null || value === false) continue;
    if (key.startsWith('on')) el.addEventListener(key.slice(2), /** @type {Listener} */ (value));
    else if (key === 'class') el.setAttribute('class', String(value));
    else el.setAttribute(key, value === true ? '' : String(value));
  }
}

/**
 * Replaces an element's children, skipping null, undefined and false (replaceChildren would print them).
 * @template {Element} E
 * @param {E} el
 * @param {...Children} children
 * @returns {E}
 */
export function fill(el, ...children) {
  el.replaceChildren();
  append(el, children);
  return el;
}

/**
 * @param {Element} el
 * @param {Children[]} children
 */
function append(el, children) {
  for (const child of children.flat(Infinity)) {
    if (child === null || child === undefined || child === false) continue;
    el.append(child instanceof Node ? child : String(child));
  }
}

/**
 * A number the page prints itself (scores, points, a signal's figures; a submission's values come
 * formatted by the server) in the sheets' style: up to 4 significant figures, the minus sign, × 10ⁿ.
 * @param {number | null | undefined} value
 */
export function num(value) {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–';
  if (value === 0) return '0';
  const a = Math.abs(value);
  if (a >= 1e-3 && a < 1e5) return String(Number(value.toPrecision(4))).replace('-', '\u2212');
  const [mantissa, exponent] = value.toExponential(3).split('e');
  return `${mantissa.replace('-', '\u2212')}\u00a0×\u00a010${[...String(Number(exponent))].map((c) => SUPERSCRIPT[c]).join('')}`;
}

/** @type {Record<string, string>} */
const SUPERSCRIPT = { '-': '⁻', 0: '⁰', 1: '¹', 2: '²', 3: '³', 4: '⁴', 5: '⁵', 6: '⁶', 7: '⁷', 8: '⁸', 9: '⁹' };

/** A time in a table cell, short and unbroken: `5 Dec, 18:38`. @param {string} iso */
export function shortWhen(iso) {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? '' : d.toLocaleString(undefined, { month: 'short', day: 'numeric', hour: '2-digit', minute: '2-digit' });
}

/** A time to the minute with its date in words, for a deadline: `Dec 7, 2026, 5:00 PM`. @param {string} iso */
export function minuteWhen(iso) {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? '' : d.toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

/** @param {string} iso */
export function when(iso) {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? '' : d.toLocaleString();
}

/** The reader's time zone as their browser names it (`Europe/Berlin`), else its offset. */
export function zoneName() {
  return Intl.DateTimeFormat().resolvedOptions().timeZone || `UTC${-new Date().getTimezoneOffset() / 60 >= 0 ? '+' : ''}${-new Date().getTimezoneOffset() / 60}`;
}

/**
 * Text with `_{sub}` and `^{sup}` markup as text nodes and sub/sup elements (never as HTML).
 * @param {string} text
 */
export function marked(text) {
  return text.split(/([_^]\{[^}]*\})/).filter((part) => part !== '').map((part) => {
    const m = /^([_^])\{([^}]*)\}$/.exec(part);
    return m ? h(m[1] === '_' ? 'sub' : 'sup', {}, m[2]) : part;
  });
}

/** The text a reader of the markup sees, where no element can carry it (an option, a title): `x_{0}` → `x0`. @param {string} text */
export const plain = (text) => text.replace(/[_^]\{([^}]*)\}/g, '$1');
