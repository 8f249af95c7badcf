import type { Choices } from './launch.ts';
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

/**
 * The choice a deep linking request asks of the instructor: one assignment and one section of the
 * course, posted with the request's ticket to this origin.
 */
export function choosePage(ticket: string, choices: Choices): string {
  const options = (items: { id: number; label: string }[]) => items.map((i) => `<option value="${i.id}">${escape(i.label)}</option>`).join('');
  return page(
    'Place an assignment',
    `<h1>Place a Rateproof assignment in the course</h1><form method="post" action="/v1/lti/deep-link"><input type="hidden" name="ticket" value="${escape(ticket)}">` +
      `<p><label>Assignment <select name="assignmentId" required>${options(choices.assignments.map((a) => ({ id: a.id, label: a.title })))}</select></label></p>` +
      `<p><label>Section <select name="sectionId" required>${options(choices.sections.map((s) => ({ id: s.id, label: s.name })))}</select></label></p>` +
      '<p>Students of the section who open the activity land on this assignment.</p><button type="submit">Place it</button></form>',
  );
}

/** The headers of the page that posts a deep linking response: its form goes to the platform, and nowhere else. */
export function returnPageHeaders(returnUrl: string): Record<string, string> {
  return { ...PAGE_HEADERS, 'content-security-policy': PAGE_HEADERS['content-security-policy'].replace("form-action 'self'", `form-action ${new URL(returnUrl).origin}`) };
}

/**
 * The deep linking response's page (Deep Linking 2.0, 4.5): the signed JWT form-posted to the
 * platform's return URL at once (the same script of this origin; a button without scripts).
 */
export function returnPage(returnUrl: string, jwt: string): string {
  return page(
    'Back to the course',
    `<form method="post" action="${escape(returnUrl)}"><input type="hidden" name="JWT" value="${escape(jwt)}"><p>Placing the assignment…</p><button type="submit">Continue</button></form>`,
    '<script src="/web/js/lti-continue.js" defer></script>',
  );
}

export function notPlacedPage(): string {
  return page('Not placed yet', '<h1>This activity is not placed yet</h1><p>Your instructor has not yet tied this link to an assignment and section in Rateproof. Try again once they have.</p>');
}

export function refusedPage(code: RefusalCode): string {
  return page('Launch refused', `<h1>Rateproof could not open this launch</h1><p>Go back to the course and open the activity again. If this keeps happening, tell the course staff the reason code: <code>${escape(code)}</code>.</p>`);
}
