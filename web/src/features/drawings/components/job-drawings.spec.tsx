import { screen, waitFor, within } from '@testing-library/react';
import { beforeEach, describe, expect, it } from 'vitest';
import { DEMO_AS_BUILT } from '@domain/as-built/demo-as-built';
import type { SiteResponse } from '@domain/sites/site.schema';

import { buildJobAsBuilt, JOB_IDS } from '../../../testing/job-data';
import { mockApi } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const AS_BUILT = `GET /api/jobs/${JOB_IDS.job}/as-built`;
const SITE = `GET /api/sites/${JOB_IDS.site}`;
const URL_ = `/jobs/${JOB_IDS.job}/drawings`;
/** A 1×1 PNG: enough for the drawing, which only embeds the bytes. */
const PNG_BASE64 = 'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAQAAAC1HAwCAAAAC0lEQVR42mNkYAAAAAYAAjCB0C8AAAAASUVORK5CYII=';

function site(overrides: Partial<SiteResponse> = {}): SiteResponse {
  return {
    id: JOB_IDS.site,
    label: 'Demo yard',
    customer: { id: JOB_IDS.customer, name: 'Demo customer' },
    addressLine1: '1 Invented Row',
    addressLine2: null,
    city: 'Nowhereton',
    region: null,
    postalCode: null,
    country: 'Testland',
    northAzimuthDeg: 12,
    origin: null,
    planImage: null,
    planCalibration: null,
    notes: null,
    referencePoints: [],
    homeowners: [],
    jobs: [],
    version: 1,
    createdAt: '2026-04-18T09:00:00.000Z',
    updatedAt: '2026-04-18T09:00:00.000Z',
    ...overrides,
  };
}

async function drawing(name: string): Promise<HTMLElement> {
  return waitFor(() => screen.getByRole('img', { name }), { timeout: 15_000 });
}

describe('JobDrawings', () => {
  beforeEach(() => localStorage.setItem('loamline.units', JSON.stringify({ length: 'metric', gauge: 'mm2' })));

  it('should draw the site plan, the schematic and each depth profile in the browser, in the chosen units', async () => {
    mockApi({ [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(DEMO_AS_BUILT)), [SITE]: () => jsonResponse(site()) });
    renderApp({ url: URL_ });

    const plan = await drawing('Site plan');
    for (const item of DEMO_AS_BUILT.items) expect(plan.textContent).toContain(item.label);
    expect(plan.querySelector('svg')?.getAttribute('data-drawing')).toBe('site-plan');
    // Depths in the chosen units (the tie distances are on the ties sheet now).
    expect(plan.textContent).toMatch(/min depth \d+(\.\d)? cm/);
    expect(plan.textContent).not.toMatch(/\d+ (ft|in)\b/);
    expect(plan.querySelector('image')).toBeNull();

    const schematic = await drawing('Wiring schematic');
    expect(schematic.querySelector('svg')?.getAttribute('data-drawing')).toBe('wiring-schematic');
    // Runs with depth readings that are buried get a profile (the indoor trunk does not).
    const profiled = DEMO_AS_BUILT.runs.filter((r) => r.method !== 'indoor' && (r.depthReadings?.length ?? 0) > 0);
    for (const run of profiled) expect(await drawing(`Depth profile of ${run.label}`)).toBeInTheDocument();
    expect(screen.queryByRole('img', { name: /Depth profile of Trunk, amp to main wall entry/ })).toBeNull();
  }, 40_000);

  it('should turn site-plan layers off and on with the switches', async () => {
    mockApi({ [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(DEMO_AS_BUILT)), [SITE]: () => jsonResponse(site()) });
    const { user } = renderApp({ url: URL_ });
    let plan = await drawing('Site plan');
    expect(plan.querySelectorAll('[data-label-for]').length).toBeGreaterThan(0);
    expect(plan.querySelectorAll('[data-accuracy-for]').length).toBeGreaterThan(0);

    await user.click(screen.getByRole('switch', { name: 'Labels' }));
    await waitFor(() => expect(screen.getByRole('img', { name: 'Site plan' }).querySelectorAll('[data-label-for]').length).toBe(0));
    await user.click(screen.getByRole('switch', { name: 'Reference points and accuracy' }));
    await waitFor(() => expect(screen.getByRole('img', { name: 'Site plan' }).querySelectorAll('[data-kind="reference_point"]').length).toBe(0));
    expect(screen.getByRole('img', { name: 'Site plan' }).querySelectorAll('[data-accuracy-for]').length).toBe(0);

    await user.click(screen.getByRole('switch', { name: 'Labels' }));
    plan = await waitFor(() => {
      const current = screen.getByRole('img', { name: 'Site plan' });
      expect(current.querySelectorAll('[data-label-for]').length).toBeGreaterThan(0);
      return current;
    });
    expect(within(plan).queryByText('House corner, west')).toBeNull();
  }, 40_000);

  it('should put the calibrated plan image underneath, fetched through the API', async () => {
    const url = `/api/sites/${JOB_IDS.site}/plan-image?v=0123456789ab`;
    const requests: string[] = [];
    let siteRequests = 0;
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(DEMO_AS_BUILT)),
      [SITE]: () => {
        siteRequests += 1;
        return jsonResponse(
          site({
            planImage: { widthPx: 3000, heightPx: 2000, contentType: 'image/png', url },
            planCalibration: { a: { x: 100, y: 1900 }, b: { x: 2900, y: 1900 }, distanceM: 28 },
          }),
        );
      },
      [`GET ${url}`]: (request) => {
        requests.push(request.headers.get('Authorization') ?? '');
        return new Response(Uint8Array.from(atob(PNG_BASE64), (c) => c.charCodeAt(0)), { headers: { 'Content-Type': 'image/png' } });
      },
    });
    renderApp({ url: URL_ });
    const plan = await drawing('Site plan');
    const image = plan.querySelector('image');
    expect(image?.getAttribute('href')).toBe(`data:image/png;base64,${PNG_BASE64}`);
    expect(requests).toEqual([expect.stringMatching(/^Bearer /)]);
    // One site answer serves the page and the image (the site query's cache entry, issue 20).
    expect(siteRequests).toBe(1);
  }, 40_000);
});
