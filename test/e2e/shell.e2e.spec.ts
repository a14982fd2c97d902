import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import { launchChromium } from '../support/browser.js';

describe('the served app shell', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;

  beforeAll(async () => {
    browser = await launchChromium();
  });

  afterAll(async () => {
    await browser.close();
  });

  it.each([
    { name: 'phone', width: 375, height: 812 },
    { name: 'desktop', width: 1280, height: 800 },
  ])('should show the Loamline heading and a healthy API on a $name', async ({ width, height }) => {
    const page = await browser.newPage({ viewport: { width, height } });
    const failed: string[] = [];
    // A request the browser itself cancels because the test navigates on (the service worker's helper,
    // loaded once the page is idle; the sign-up status) is not a failure: ERR_ABORTED is left out.
    page.on('requestfailed', (req) => {
      if (req.failure()?.errorText !== 'net::ERR_ABORTED') failed.push(`${req.url()} ${req.failure()?.errorText ?? ''}`);
    });
    page.on('pageerror', (error) => failed.push(error.message));
    // Home needs a session, so a signed-out visitor lands on the sign-in page, which carries the name too.
    await page.goto(`${baseUrl}/`);
    await page.getByRole('heading', { name: 'Loamline', exact: true }).waitFor();
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    // System status stays public: it holds no company data and helps when signing in fails.
    await page.goto(`${baseUrl}/status`);
    await page.getByText(/database/i).first().waitFor();
    await page.getByText(/\bup\b/i).first().waitFor();
    // Our own fonts, not a fallback: Inter is loaded from the app's assets.
    const interLoaded = await page.evaluate(async () => {
      await document.fonts.ready;
      return [...document.fonts].some((f) => /inter/i.test(f.family) && f.status === 'loaded');
    });
    expect(interLoaded).toBe(true);
    expect(failed).toEqual([]);
    await page.close();
  });

  it('should serve client-side routes on reload and a 404 page for unknown ones', async () => {
    const page = await browser.newPage();
    const res = await page.goto(`${baseUrl}/no/such/page`);
    expect(res?.status()).toBe(200);
    await page.getByText(/page not found/i).first().waitFor();
    await page.getByRole('link', { name: /home/i }).first().waitFor();
    await page.close();
  });
});
