import type { RefusalCode } from './refusal.ts';

const escape = (text: string) => text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/**
 * The headers of a launch's pages: scripts and form posts to this origin only, never framed (the
 * workspace is not framed either; a platform opens the tool in a window of its own), and no referrer.
 */
export const PAGE_HEADERS = {
  'content-security-policy': "default-src 'none'; script-src 'self'; style-src 'self'; form-action 'self'; frame-ancestors 'none'; base-uri 'none'",
  'referrer-policy': 'same-origin',
  'cache-control': 'no-store',
  'x-content-type-options': 'nosniff',
};

const page = (title: string, body: string, script = '') =>
  `<!doctype html>\n<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${escape(title)}</title>${script}</head>\n<body>${body}</body></html>\n`;

/**
 * The answer to a verified launch: a form that posts the one-time ticket to this origin, sent at once
 * by a script of this origin (a button when scripts are off). The session cookie is set on that
 * same-site step, not here (docs/lti.md says why).
 */
export function continuePage(ticket: string): string {
  return page(
    'Opening Rateproof',
    `<form method="post" action="/v1/lti/enter"><input type="hidden" name="ticket" value="${escape(ticket)}"><p>Opening Rateproof…</p><button type="submit">Continue</button></form>`,
    '<script src="/web/js/lti-continue.js" defer></script>',
  );
}

export function notPlacedPage(): string {
  return page('Not placed yet', '<h1>This activity is not placed yet</h1><p>Your instructor has not yet tied this link to an assignment and section in Rateproof. Try again once they have.</p>');
}

export function refusedPage(code: RefusalCode): string {
  return page('Launch refused', `<h1>Rateproof could not open this launch</h1><p>Go back to the course and open the activity again. If this keeps happening, tell the course staff the reason code: <code>${escape(code)}</code>.</p>`);
}
