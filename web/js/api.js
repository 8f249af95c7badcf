/** Calls to the service under the session cookie; every change carries the page's x-csrf-token. */

/** @import { Rejection } from '../../schemas/result.ts' */
/**
 * What the service answers when it refuses a request. The page shows the message and the details
 * and acts on the status alone, so any code will do.
 * @typedef {{ error?: { code: string, message: string, details?: Rejection[] } }} ErrorBody
 */
/**
 * What a view calls with an error it does not show itself.
 * @typedef {(error: unknown) => void} Failure
 */

/** @type {string | null} */
let csrfToken = null;

/** @param {string | null | undefined} token */
export function setCsrfToken(token) {
  csrfToken = token ?? null;
}

export class ApiFailure extends Error {
  /**
   * @param {number} status the HTTP status, 0 when the service could not be reached
   * @param {unknown} body
   */
  constructor(status, body) {
    const error = body && typeof body === 'object' ? /** @type {ErrorBody} */ (body).error : undefined;
    super(error?.message ?? `the service answered ${status}`);
    this.status = status;
    this.details = error?.details ?? [];
  }
}

/**
 * `contentType` for a text body other than JSON (text/plain, text/csv). The answer is the route's
 * response body, which the caller names by its type from schemas/api/.
 * @param {'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE'} method
 * @param {string} url
 * @param {unknown} [body] sent as JSON, as it is when a string, or as multipart when FormData
 * @param {string} [contentType]
 * @returns {Promise<unknown>}
 */
export async function api(method, url, body, contentType = 'application/json') {
  /** @type {Record<string, string>} */
  const headers = {};
  if (method !== 'GET') headers['x-csrf-token'] = csrfToken ?? '';
  let payload;
  if (body instanceof FormData) payload = body;
  else if (body !== undefined) {
    headers['content-type'] = contentType;
    payload = typeof body === 'string' ? body : JSON.stringify(body);
  }
  const res = await fetch(url, { method, headers, body: payload, credentials: 'same-origin' });
  const type = res.headers.get('content-type') ?? '';
  const data = res.status === 204 ? null : type.includes('json') ? await res.json() : await res.text();
  if (!res.ok) throw new ApiFailure(res.status, data);
  return data;
}

/**
 * A POST with upload progress (fetch reports none): `onProgress(fraction)` as the body goes out.
 * @param {string} url
 * @param {string | FormData} body
 * @param {string | undefined} contentType none for FormData, which sets its own
 * @param {(fraction: number) => void} onProgress
 * @returns {Promise<unknown>}
 */
export function upload(url, body, contentType, onProgress) {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', url);
    xhr.setRequestHeader('x-csrf-token', csrfToken ?? '');
    if (contentType) xhr.setRequestHeader('content-type', contentType);
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded / e.total);
    xhr.onload = () => {
      let data = null;
      try {
        data = JSON.parse(xhr.responseText);
      } catch {
        data = xhr.responseText;
      }
      if (xhr.status >= 200 && xhr.status < 300) resolve(data);
      else reject(new ApiFailure(xhr.status, data));
    };
    xhr.onerror = () => reject(new ApiFailure(0, null));
    xhr.send(body);
  });
}
