import { api, ApiFailure } from './api.js';
import { fill, h } from './dom.js';

/**
 * @import { Failure } from './api.js'
 * @import { SectionFileView } from '../../schemas/api/section-files.ts'
 */

/**
 * A link to a section's ZIP or summary. A small section's file comes in the answer; a large one's is
 * drawn by a job on the server (202): the link then shows the job's progress, polled from the server,
 * and fetches the stored file once it is drawn.
 * @param {string} href
 * @param {string} label
 * @param {Failure} failure
 */
export function sectionDownload(href, label, failure) {
  const progress = h('span', { class: 'download-progress', 'aria-live': 'polite' });
  /** @type {HTMLAnchorElement} */
  const link = h('a', { href, download: '', onclick: (/** @type {MouseEvent} */ event) => {
    event.preventDefault();
    if (link.getAttribute('aria-busy') === 'true') return;
    link.setAttribute('aria-busy', 'true');
    fetchFile(href, progress).then(() => fill(progress), (error) => (fill(progress), failure(error))).finally(() => link.removeAttribute('aria-busy'));
  } }, label);
  return h('span', {}, link, progress);
}

/**
 * @param {string} href
 * @param {Element} progress
 */
async function fetchFile(href, progress) {
  const res = await fetch(href, { credentials: 'same-origin' });
  if (res.status !== 202) return save(res);
  let file = /** @type {SectionFileView} */ (await res.json());
  const bar = h('progress', { max: '1', value: '0', 'aria-label': 'Drawing progress' });
  const text = h('span', {});
  fill(progress, ' ', bar, ' ', text);
  while (file.status === 'running') {
    bar.max = Math.max(file.total, 1);
    bar.value = file.done;
    text.textContent = `${file.done} of ${file.total} drawn`;
    await new Promise((r) => setTimeout(r, 500));
    file = /** @type {SectionFileView} */ (await api('GET', file.poll));
  }
  if (!file.download) throw new ApiFailure(409, { error: { code: 'conflict', message: `The file was not drawn: ${file.error ?? 'unknown reason'}` } });
  text.textContent = 'Drawn; downloading…';
  bar.value = bar.max;
  await save(await fetch(file.download, { credentials: 'same-origin' }));
}

/**
 * Saves the answer's file under the name the server gave it.
 * @param {Response} res
 */
async function save(res) {
  if (!res.ok) throw new ApiFailure(res.status, (res.headers.get('content-type') ?? '').includes('json') ? await res.json() : null);
  const disposition = res.headers.get('content-disposition') ?? '';
  const full = /filename\*=UTF-8''([^;]+)/.exec(disposition);
  const plain = /filename="([^"]+)"/.exec(disposition);
  const url = URL.createObjectURL(await res.blob());
  const a = h('a', { href: url, download: full ? decodeURIComponent(full[1]) : (plain?.[1] ?? '') });
  document.body.append(a);
  a.click();
  a.remove();
  // The click has handed the file to the browser; the object URL is no longer needed.
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}
