import { api } from './api.js';

/** @import { KindDescription } from '../../schemas/api/kinds.ts' */

/** @type {Promise<KindDescription[]> | undefined} */
let loading;

/**
 * The experiment kinds the service knows, as it describes them for the page; asked once per page
 * load, and again after a failed attempt.
 * @returns {Promise<KindDescription[]>}
 */
export function kinds() {
  loading ??= /** @type {Promise<KindDescription[]>} */ (api('GET', '/v1/kinds')).catch((error) => {
    loading = undefined;
    throw error;
  });
  return loading;
}

/**
 * One kind's description; undefined for a kind the service no longer lists.
 * @param {string} name
 */
export async function kindDescription(name) {
  return (await kinds()).find((k) => k.kind === name);
}
