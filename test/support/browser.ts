import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { type Browser, type BrowserContextOptions, chromium, type LaunchOptions } from 'playwright-core';
import { inject } from 'vitest';

/** Debian's Chromium, launched the way this machine allows (no sandbox as root, no background network). */
export function chromiumLaunchOptions(): LaunchOptions {
  return {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--disable-dev-shm-usage',
      // Pages as a user who asked for less motion sees them (Fluent's transitions shortened or skipped):
      // the browser tests check what the pages do, not their animations. The e2e project alone, side by
      // side on 2 cores: 141 s of CPU and 200 s instead of 170 s and 234 s.
      '--force-prefers-reduced-motion',
    ],
  };
}

/**
 * A Chromium for this test file: the project's shared one (test/setup/browser.global.ts) when it runs,
 * else a new one. Close it in afterAll either way (for the shared one that only disconnects); work in
 * `browser.newContext()` so files do not share cookies.
 */
export async function launchChromium(): Promise<Browser> {
  const wsEndpoint = inject('browserWsEndpoint');
  if (wsEndpoint) return withoutServiceWorkers(await chromium.connect(wsEndpoint));
  return chromium.launch(chromiumLaunchOptions());
}

/**
 * In the browser tests (the e2e project's shared Chromium) a new context blocks the app's service
 * worker unless the test asks for it (`serviceWorkers: 'allow'`, as the offline tests do). The worker
 * precaches the whole build (about 165 files, 5 MB) in every fresh context, which those tests never use:
 * side by side on 2 cores, opening the sign-in page in a fresh context cost the browser and the server
 * 6.7 s of CPU with the worker and 3.7 s without (median of 5 each, alternated, under load). The journey
 * (test/journeys) launches its own Chromium and keeps the worker, as users get it.
 */
function withoutServiceWorkers(browser: Browser): Browser {
  const newContext = browser.newContext.bind(browser);
  // Browser.newPage() opens its own context through newContext, so this covers both.
  browser.newContext = (options: BrowserContextOptions = {}) => newContext({ serviceWorkers: 'block', ...options });
  return browser;
}

/** A throwaway folder for screenshots or downloads, removed by the returned function. */
export function tempDir(prefix: string): { path: string; remove: () => void } {
  const path = mkdtempSync(join(tmpdir(), prefix));
  return { path, remove: () => rmSync(path, { recursive: true, force: true }) };
}
