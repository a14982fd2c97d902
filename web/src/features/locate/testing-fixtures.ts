import type { SiteMap } from '@domain/locate/site-map.schema';

import type { LocateViewResponse } from './api/get-locate-view';

const from = { revisionId: '00000000-0000-4000-8000-000000000101', revision: 1, jobId: '00000000-0000-4000-8000-000000000201', jobTitle: 'Backyard audio' };

/** A small cumulative map: one run between two speakers, a wall entry and a reference point. */
export function buildSiteMap(): SiteMap {
  return {
    frame: { northAzimuthDeg: 15, origin: null },
    revisions: [{ ...from, issuedAt: '2026-05-01T10:00:00.000Z' }],
    referencePoints: [{ id: 'rp-1', label: 'House corner NE', x: 0, y: 0 }],
    siteFeatures: [
      { id: 'f-house', kind: 'house', name: 'House', shape: 'polygon', points: [{ x: -6, y: 0 }, { x: 0, y: 0 }, { x: 0, y: -5 }, { x: -6, y: -5 }] },
      { id: 'f-fence', kind: 'fence', name: 'East fence', shape: 'line', points: [{ x: 11, y: -2 }, { x: 11, y: 9 }] },
    ],
    items: [
      { ...from, id: 'it-wall', kind: 'wall_entry', label: 'Garage wall', position: { x: 1, y: 1, source: 'ties', accuracyM: 0.05 }, ties: [], wallEntry: { wallMaterial: 'brick', holeDiameterM: 0.02, sleeve: null, sealant: null, insideLocation: null, outsideLocation: null }, isCapped: null },
      { ...from, id: 'it-spk', kind: 'speaker', label: 'Speaker L', position: { x: 9, y: 6, source: 'ties', accuracyM: 0.05 }, ties: [], wallEntry: null, isCapped: null },
    ],
    runs: [
      {
        ...from,
        id: 'run-1',
        label: 'Run A',
        fromItemId: 'it-wall',
        toItemId: 'it-spk',
        cableType: 'CL2 direct burial',
        gauge: '14 AWG',
        conductors: 2,
        method: 'direct_burial',
        location: 'along the fence',
        measuredLengthM: 11,
        minDepthM: 0.3048,
        maxDepthM: 0.4572,
        depthReadings: [
          { stationM: 0, depthM: 0.4572 },
          { stationM: 5.5, depthM: 0.3048 },
          { stationM: 11, depthM: 0.4 },
        ],
        minCoverM: 0.15,
        isShallow: false,
        route: [
          { x: 1, y: 1 },
          { x: 9, y: 6 },
        ],
        isRouteDrawn: true,
        isSpare: false,
        isAbandoned: false,
      },
    ],
    geojson: null,
  };
}

export function buildLocateView(token = 'tok'): LocateViewResponse {
  const base = `/api/locate/${token}`;
  return {
    site: { label: 'Wrenfold Close', addressLine1: '12 Wrenfold Close', addressLine2: null, city: 'Quellbrook', region: 'XX', postalCode: '00000', country: 'US', northAzimuthDeg: 15 },
    installer: { companyName: 'Garden Sound Co', phone: '+1 555 0100', email: 'office@gardensound.test', licenceNumbers: ['LV-1234'] },
    locateSteps: [{ title: 'Call 811', body: 'Contact the one-call centre before digging.' }],
    cautions: [{ title: 'Hand-dig', body: 'Hand-dig within 18 in of a mapped route.' }],
    cautionSummary: 'Before any digging, contact the one-call centre (811 in the United States).',
    toleranceZoneM: 0.457,
    units: 'imperial',
    locale: 'en-US',
    timeZone: 'America/Chicago',
    map: buildSiteMap(),
    runs: [
      {
        id: 'run-1',
        label: 'Run A',
        cable: 'CL2 direct burial',
        gauge: '14 AWG',
        method: 'direct_burial',
        minDepthM: 0.3048,
        maxDepthM: 0.4572,
        minCoverM: 0.15,
        isShallow: false,
        isSpare: false,
        isAbandoned: false,
        revision: 1,
        depthProfileUrl: `${base}/runs/run-1/depth-profile.svg`,
        photos: [
          { id: '00000000-0000-4000-8000-000000000301', caption: 'Open trench by the fence', takenAt: null, thumbUrl: `${base}/photos/p1/thumb`, screenUrl: `${base}/photos/p1/screen` },
        ],
      },
    ],
    geojsonUrl: `${base}/map.geojson`,
    sheetUrl: `${base}/sheet.pdf`,
    link: { expiresAt: '2026-12-31T00:00:00.000Z', note: 'For the fence crew' },
    generatedAt: '2026-06-01T00:00:00.000Z',
  };
}
