import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { type Browser, chromium, type LaunchOptions } from 'playwright-core';
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
  if (wsEndpoint) return chromium.connect(wsEndpoint);
  return chromium.launch(chromiumLaunchOptions());
}

/** A throwaway folder for screenshots or downloads, removed by the returned function. */
export function tempDir(prefix: string): { path: string; remove: () => void } {
  const path = mkdtempSync(join(tmpdir(), prefix));
  return { path, remove: () => rmSync(path, { recursive: true, force: true }) };
}
