import type { BrowserServer } from 'playwright-core';
import type { TestProject } from 'vitest/node';

import { chromiumLaunchOptions } from '../support/browser.js';

declare module 'vitest' {
  export interface ProvidedContext {
    /** A Chromium started once for the project's files (test/support/browser.ts connects to it). */
    browserWsEndpoint?: string;
  }
}

/**
 * One Chromium for all the browser test files of a run instead of one launch per file: each file still
 * works in its own browser contexts (separate cookies and storage) and `browser.close()` only
 * disconnects it.
 */
export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  const { chromium } = await import('playwright-core');
  const server: BrowserServer = await chromium.launchServer(chromiumLaunchOptions());
  project.provide('browserWsEndpoint', server.wsEndpoint());
  return () => server.close();
}
