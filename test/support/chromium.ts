import { existsSync } from 'node:fs';
import { chromium, type Browser } from 'playwright-core';

/**
 * Debian's chromium, driven by playwright-core (no browser download). The browser tests are skipped,
 * saying why, on a machine without it; `.ci/run` installs it.
 */
export const CHROMIUM = '/usr/bin/chromium';
export const chromiumPresent = existsSync(CHROMIUM);
export const CHROMIUM_ABSENT = `chromium is not installed at ${CHROMIUM}: the workspace is not checked in a browser on this machine`;

export function launchChromium(): Promise<Browser> {
  // As root (CI containers) Chromium's sandbox cannot start; the pages are our own.
  return chromium.launch({ executablePath: CHROMIUM, args: ['--no-sandbox'] });
}
