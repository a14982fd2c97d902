import { afterEach, describe, expect, it, vi } from 'vitest';

import { mockApi, type MockRequest } from '../../../testing/mock-api';

import { getDepthProfileSvg } from './download-depth-profile';
import { getSchematicSvg } from './download-schematic';
import { getSitePlanSvg } from './download-site-plan';

const SVG = '<svg xmlns="http://www.w3.org/2000/svg"/>';

describe('drawing download endpoints (one file per route)', () => {
  afterEach(() => vi.restoreAllMocks());

  it.each([
    ['download-site-plan', 'GET /api/jobs/j%2F1/drawings/site-plan.svg?units=imperial', () => getSitePlanSvg({ jobId: 'j/1', units: 'imperial', layersOff: [] })],
    [
      'download-site-plan (layers off)',
      'GET /api/jobs/j%2F1/drawings/site-plan.svg?units=metric&layers=ties%2Cdepths',
      () => getSitePlanSvg({ jobId: 'j/1', units: 'metric', layersOff: ['ties', 'depths'] }),
    ],
    ['download-schematic', 'GET /api/jobs/j%2F1/drawings/schematic.svg?units=imperial', () => getSchematicSvg({ jobId: 'j/1', units: 'imperial' })],
    [
      'download-depth-profile',
      'GET /api/jobs/j%2F1/drawings/runs/r%2F2/depth-profile.svg?units=metric',
      () => getDepthProfileSvg({ jobId: 'j/1', runId: 'r/2', units: 'metric' }),
    ],
  ])('%s should ask its own route for an SVG and give back the file', async (_file, route, fetchDrawing) => {
    const seen: MockRequest[] = [];
    mockApi({
      [route]: (request) => {
        seen.push(request);
        return new Response(SVG, { status: 200, headers: { 'Content-Type': 'image/svg+xml' } });
      },
    });
    const blob = await fetchDrawing();
    expect(await blob.text()).toBe(SVG);
    expect(seen.map((request) => request.headers.get('Accept'))).toEqual(['image/svg+xml']);
  });
});
