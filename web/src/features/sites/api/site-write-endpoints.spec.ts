import { afterEach, describe, expect, it, vi } from 'vitest';

import { mockApi, type MockRequest } from '../../../testing/mock-api';
import { jsonResponse } from '../../../testing/render-app';
import { buildSite } from '../../../testing/site-data';

import { createReferencePoint } from './create-reference-point';
import { createSite } from './create-site';
import { createSiteFeature } from './create-site-feature';
import { deleteSiteFeature } from './delete-site-feature';
import { updateReferencePoint } from './update-reference-point';
import { updateSite } from './update-site';
import { updateSiteFeature } from './update-site-feature';

const SITE_ID = 'site/1';
const feature = {
  id: 'f1',
  kind: 'tree',
  name: 'Old oak',
  shape: 'polygon',
  points: [{ x: 1, y: 2 }, { x: 3, y: 2 }, { x: 2, y: 4 }],
  createdAt: '2026-04-01T09:00:00.000Z',
  updatedAt: '2026-04-01T09:00:00.000Z',
} as const;
const point = { label: 'Gate post', x: 1.5, y: -2 };
const pointAnswer = { id: 'p1', notes: null, ...point };
const versions = { siteVersion: 5, jobVersions: { j1: 3 } };
const input = { kind: 'tree' as const, name: 'Old oak', shape: 'polygon' as const, points: [{ x: 1, y: 2 }, { x: 3, y: 2 }, { x: 2, y: 4 }] };

describe('site write endpoints (one file per route)', () => {
  afterEach(() => vi.restoreAllMocks());

  it.each([
    ['create-site', 'POST /api/sites', () => createSite({ customerId: 'c1', label: 'Yard', addressLine1: '1 Lane', city: 'Town', country: 'Land' }), jsonResponse(buildSite()), null],
    ['update-site', 'PATCH /api/sites/site%2F1', () => updateSite({ id: SITE_ID, input: { label: 'Yard' }, version: 4 }), jsonResponse({ ...buildSite(), ...versions }), '"4"'],
    ['create-site-feature', 'POST /api/sites/site%2F1/features', () => createSiteFeature({ siteId: SITE_ID, input, version: 4 }), jsonResponse({ ...feature, ...versions }), '"4"'],
    ['update-site-feature', 'PATCH /api/sites/site%2F1/features/f%2F1', () => updateSiteFeature({ siteId: SITE_ID, featureId: 'f/1', input: { name: 'Oak' }, version: 4 }), jsonResponse({ ...feature, ...versions }), '"4"'],
    ['create-reference-point', 'POST /api/sites/site%2F1/reference-points', () => createReferencePoint({ siteId: SITE_ID, input: point, version: 4 }), jsonResponse({ ...pointAnswer, ...versions }), '"4"'],
    ['update-reference-point', 'PATCH /api/sites/site%2F1/reference-points/p%2F1', () => updateReferencePoint({ siteId: SITE_ID, pointId: 'p/1', input: point, version: 4 }), jsonResponse({ ...pointAnswer, ...versions }), '"4"'],
    ['delete-site-feature', 'DELETE /api/sites/site%2F1/features/f%2F1', () => deleteSiteFeature({ siteId: SITE_ID, featureId: 'f/1', version: 4 }), jsonResponse(versions), '"4"'],
  ])('%s should send its own route, with If-Match where it changes a site', async (_file, route, send, response, ifMatch) => {
    const seen: MockRequest[] = [];
    mockApi({
      [route]: (request) => {
        seen.push(request);
        return response;
      },
    });
    await expect(send()).resolves.toBeDefined();
    expect(seen).toHaveLength(1);
    expect(seen[0]!.headers.get('If-Match')).toBe(ifMatch);
  });

  it('should refuse an answer that is not its route’s: a feature write answers the feature, not only the versions', async () => {
    mockApi({ 'PATCH /api/sites/site%2F1/features/f1': () => jsonResponse(versions) });
    await expect(updateSiteFeature({ siteId: SITE_ID, featureId: 'f1', input: { name: 'Oak' }, version: 4 })).rejects.toMatchObject({ code: 'UNEXPECTED_RESPONSE' });
  });
});
