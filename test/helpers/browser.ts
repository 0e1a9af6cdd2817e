/**
 * The headless browser of the page tests and benchmarks: Debian's chromium driven by playwright-core.
 * Without /usr/bin/chromium the page tests are skipped with a message, except in CI (CI=true), where
 * they fail: .ci/run installs chromium first.
 */

import { existsSync } from 'node:fs';
import { chromium, type Browser } from 'playwright-core';

export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
];

export const chromiumAvailable = existsSync(CHROMIUM_PATH);
export const inCi = process.env.CI === 'true';

/** Why the page tests do not run here, or null when they do (in CI a missing browser is an error, not a skip). */
export function browserSkipReason(): string | null {
  if (chromiumAvailable) return null;
  if (inCi) throw new Error(`no chromium at ${CHROMIUM_PATH}: CI must install it (.ci/run: apt-get install chromium)`);
  return `page tests skipped: no chromium at ${CHROMIUM_PATH} (apt-get install -y chromium, or set CHROMIUM_PATH)`;
}

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: CHROMIUM_PATH, args: CHROMIUM_ARGS, headless: true });
}
