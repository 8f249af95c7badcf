import type { Page } from 'playwright-core';

/** Signs in on the workspace at `origin` with a staff token, as a person does. */
export async function signIn(page: Page, origin: string, token: string): Promise<void> {
  await page.goto(origin);
  await page.getByLabel('Staff token').fill(token);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByText(/^Signed in as/).waitFor();
}

/**
 * Collects what a person following the README should never meet on a page: a console error, a script
 * error, a failed request or an answer of 400 and above. The list is filled as the page is used.
 */
export function watchProblems(page: Page, problems: string[] = []): string[] {
  page.on('console', (m) => m.type() === 'error' && problems.push(`console: ${m.text()}`));
  page.on('pageerror', (e) => problems.push(`script: ${String(e)}`));
  page.on('requestfailed', (r) => problems.push(`failed: ${r.url()}`));
  page.on('response', (r) => r.status() >= 400 && problems.push(`${r.status()}: ${r.url()}`));
  return problems;
}

/**
 * The page's own width against the window's: more means the whole page scrolls sideways. The
 * elements reaching past the window's edge are named, so a failure says where to look.
 */
export function pageOverflow(page: Page): Promise<{ scroll: number; client: number; past: string[] }> {
  return page.evaluate(() => {
    const client = document.documentElement.clientWidth;
    const past = [...document.querySelectorAll('body *')]
      .filter((el) => el.getBoundingClientRect().right > client + 0.5)
      .slice(0, 5)
      .map((el) => `${el.tagName.toLowerCase()}.${el.getAttribute('class') ?? ''} (${Math.round(el.getBoundingClientRect().right)} px)`);
    return { scroll: document.documentElement.scrollWidth, client, past };
  });
}

/** A block of cells as a spreadsheet puts it on the clipboard (tab-separated lines), pasted into the element `selector` finds. */
export async function pasteCells(page: Page, selector: string, rows: string[][]): Promise<void> {
  await page.locator(selector).evaluate((el, text) => {
    const data = new DataTransfer();
    data.setData('text/plain', text);
    el.dispatchEvent(new ClipboardEvent('paste', { clipboardData: data, bubbles: true, cancelable: true }));
  }, rows.map((r) => r.join('\t')).join('\r\n'));
}
