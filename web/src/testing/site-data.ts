import type { SiteResponse } from '@domain/sites/site.schema';

import { JOB_IDS } from './job-data';

/** The site of the invented job in job-data.ts, with its plan image fields as the site answer gives them. */
export function buildSite(
  overrides: Partial<SiteResponse> & { planImage?: { widthPx: number; heightPx: number; contentType: string; url: string } | null } = {},
): SiteResponse {
  return {
    id: JOB_IDS.site,
    label: 'Thistledown garden',
    customer: { id: JOB_IDS.customer, name: 'Perrin Ashgrove' },
    addressLine1: '4 Quillet Lane',
    addressLine2: null,
    city: 'Marrowby',
    region: null,
    postalCode: null,
    country: 'Examplia',
    northAzimuthDeg: 0,
    origin: null,
    planImageRef: null,
    planCalibration: null,
    notes: null,
    referencePoints: [],
    homeowners: [],
    jobs: [],
    version: 1,
    createdAt: '2026-04-01T09:00:00.000Z',
    updatedAt: '2026-04-01T09:00:00.000Z',
    planImage: null,
    ...overrides,
  } as SiteResponse;
}
